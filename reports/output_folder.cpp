#include "reports/output_folder.hpp"

#include "reports/atomic_file.hpp"
#include "reports/breakdown_csv.hpp"
#include "reports/metrics_csv.hpp"
#include "reports/pairs_csv.hpp"
#include "reports/replications_csv.hpp"
#include "reports/substitution_csv.hpp"
#include "reports/summary_json.hpp"

namespace larder {

void write_run_outputs(const RunResult& result, const std::filesystem::path& dir) {
  ensure_directory(dir);
  write_file_atomically(dir / "summary.json", summary_json_text(result));
  write_file_atomically(dir / "metrics.csv", metrics_csv(result));
  write_file_atomically(dir / "replications.csv", replications_csv(result));
  write_file_atomically(dir / "breakdown.csv", breakdown_csv(result));
  // Files only some runs have are removed otherwise, so none is left over from an earlier run.
  const auto optional_file = [&](const char* name, const std::string& text) {
    if (!text.empty()) {
      write_file_atomically(dir / name, text);
    } else {
      std::filesystem::remove(dir / name);
    }
  };
  optional_file("pairs.csv", pairs_csv(result));
  optional_file("substitution.csv", substitution_csv(result));
}

}  // namespace larder
