#include "reports/output_folder.hpp"

#include "reports/atomic_file.hpp"
#include "reports/breakdown_csv.hpp"
#include "reports/metrics_csv.hpp"
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
  const std::string substitution = substitution_csv(result);
  if (!substitution.empty()) {
    write_file_atomically(dir / "substitution.csv", substitution);
  } else {
    std::filesystem::remove(dir / "substitution.csv");  // not left over from an earlier run
  }
}

}  // namespace larder
