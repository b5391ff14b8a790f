#include "reports/output_folder.hpp"

#include <algorithm>

#include "reports/breakdown_csv.hpp"
#include "reports/metrics_csv.hpp"
#include "reports/pairs_csv.hpp"
#include "reports/replications_csv.hpp"
#include "reports/substitution_csv.hpp"
#include "reports/summary_json.hpp"

namespace larder {

std::vector<std::string> run_output_names() {
  return {"summary.json", "metrics.csv",      "replications.csv", "breakdown.csv",
          "pairs.csv",    "substitution.csv", "report.html"};
}

void write_run_outputs(const RunResult& result, const std::filesystem::path& dir,
                       std::vector<ResultFile> extra) {
  std::vector<ResultFile> files = {{"summary.json", summary_json_text(result)},
                                   {"metrics.csv", metrics_csv(result)},
                                   {"replications.csv", replications_csv(result)},
                                   {"breakdown.csv", breakdown_csv(result)}};
  // Files only some runs have are left out otherwise, so none is left over from an earlier run.
  if (std::string text = pairs_csv(result); !text.empty()) {
    files.push_back({"pairs.csv", std::move(text)});
  }
  if (std::string text = substitution_csv(result); !text.empty()) {
    files.push_back({"substitution.csv", std::move(text)});
  }
  for (ResultFile& f : extra) files.push_back(std::move(f));
  std::vector<std::string> retired;
  for (const std::string& name : run_output_names()) {
    const bool written = std::any_of(files.begin(), files.end(),
                                     [&](const ResultFile& f) { return f.name == name; });
    if (!written) retired.push_back(name);
  }
  publish_result_set(dir, files, retired);
}

}  // namespace larder
