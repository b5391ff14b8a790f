#include "reports/output_folder.hpp"

#include <catch2/catch.hpp>
#include <fstream>
#include <sstream>

#include "reports/breakdown_csv.hpp"
#include "reports/metrics_csv.hpp"
#include "reports/pairs_csv.hpp"
#include "reports/replications_csv.hpp"
#include "reports/sample_run.test.hpp"
#include "reports/summary_json.hpp"

namespace fs = std::filesystem;

using larder::test::read_all;

TEST_CASE("write_run_outputs creates the folder and writes its files", "[reports]") {
  larder::test::ScratchDir scratch("output-folder");
  const fs::path dir = scratch.path() / "larder-out" / "two-shops";
  larder::RunResult r = larder::test::sample_run();
  larder::write_run_outputs(r, dir);
  CHECK(larder::test::folder_entries(dir) ==
        std::vector<std::string>{".larder-run", "breakdown.csv", "metrics.csv", "pairs.csv",
                                 "replications.csv", "summary.json"});
  CHECK(read_all(dir / "breakdown.csv") == larder::breakdown_csv(r));
  CHECK(read_all(dir / "summary.json") == larder::summary_json_text(r));
  CHECK(read_all(dir / "metrics.csv") == larder::metrics_csv(r));
  CHECK(read_all(dir / "replications.csv") == larder::replications_csv(r));
  CHECK(read_all(dir / "pairs.csv") == larder::pairs_csv(r));

  // A second run into the same folder replaces the files whole; with one policy there are no
  // pairs, and the earlier pairs.csv is gone.
  r.policies.resize(1);
  r.values.resize(1);
  larder::write_run_outputs(r, dir);
  CHECK(larder::test::folder_entries(dir).size() == 5);  // with the record .larder-run
  CHECK(read_all(dir / "metrics.csv") == larder::metrics_csv(r));
  CHECK(larder::test::parse_csv(read_all(dir / "replications.csv")).size() == 1 + 5);
}

TEST_CASE("write_run_outputs reports a folder it cannot create", "[reports]") {
  larder::test::ScratchDir scratch("output-blocked");
  const fs::path blocker = scratch.path() / "larder-out";
  std::ofstream(blocker) << "a file, not a folder";
  CHECK_THROWS_WITH(larder::write_run_outputs(larder::test::sample_run(), blocker / "two-shops"),
                    Catch::Contains("two-shops"));
}
