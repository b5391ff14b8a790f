#pragma once
#include <fstream>
#include <sstream>
// A small run result built by hand for the report tests: 3 policies x 5 replications x 6
// metrics, with values chosen so that the differences against the baseline cover significantly
// better, significantly worse, neutral-but-significant and not significant. Expected statistics
// of these values were computed with scipy (see the tests), not with larder's own code.

#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <limits>
#include <string>
#include <string_view>
#include <vector>

#include "sim/runner/run_result.hpp"

namespace larder::test {

/// The sample run. Policy 0 ("fixed_order") is the baseline; policy 2's name holds a comma to
/// exercise CSV quoting. Metrics that are not reported are NaN so any use of them shows.
inline RunResult sample_run() {
  RunResult r;
  r.info.scenario_name = "two-shops";
  r.info.scenario_file = "scenarios/two-shops.yaml";
  r.info.seed = 20270104;
  r.info.replications = 5;
  r.info.horizon_days = 91;
  r.info.warmup_days = 14;
  r.info.stores = 2;
  r.info.items = 3;
  r.info.currency = "EUR";
  r.info.command = "larder run scenarios/two-shops.yaml --replications 5 --seed 20270104";
  r.info.version = "0.1.0";
  r.info.threads = 2;
  r.info.seconds = 0.25;
  r.policies = {"fixed_order", "newsvendor", "cautious, v2"};
  r.baseline = 0;
  r.metrics = {Metric::sold_units,  Metric::lost_units, Metric::waste_units,
               Metric::waste_share, Metric::fill_rate,  Metric::profit};

  struct Column {
    Metric metric;
    std::vector<std::vector<double>> per_policy;  // [policy][replication]
  };
  const std::vector<Column> columns = {
      {Metric::sold_units,
       {{900, 910, 905, 895, 920}, {905, 918, 906, 902, 930}, {890, 901, 899, 887, 909}}},
      {Metric::lost_units, {{60, 72, 55, 66, 80}, {70, 85, 63, 75, 95}, {58, 75, 54, 67, 79}}},
      {Metric::waste_units,
       {{120, 131, 118, 125, 140}, {100, 112, 97, 108, 118}, {121, 129, 120, 127, 139}}},
      {Metric::waste_share,
       {{0.118, 0.126, 0.115, 0.123, 0.132},
        {0.099, 0.109, 0.097, 0.107, 0.113},
        {0.119, 0.125, 0.118, 0.125, 0.133}}},
      {Metric::fill_rate,
       {{0.93, 0.91, 0.94, 0.92, 0.90},
        {0.91, 0.89, 0.93, 0.90, 0.88},
        {0.935, 0.905, 0.945, 0.915, 0.91}}},
      {Metric::profit,
       {{2500.5, 2610.25, 2480.75, 2555, 2701.5},
        {2650.5, 2770.25, 2600.75, 2720, 2850.5},
        {2490.5, 2620.25, 2470.75, 2560, 2690.5}}},
  };

  MetricVector blank;
  blank.fill(std::numeric_limits<double>::quiet_NaN());
  r.values.assign(3, std::vector<MetricVector>(5, blank));
  for (const Column& c : columns) {
    for (size_t p = 0; p < 3; ++p) {
      for (size_t j = 0; j < 5; ++j) at(r.values[p][j], c.metric) = c.per_policy[p][j];
    }
  }
  return r;
}

/// Parses CSV text (RFC 4180: quoted fields, doubled quotes, "\n" line ends) into rows of fields.
inline std::vector<std::vector<std::string>> parse_csv(std::string_view text) {
  std::vector<std::vector<std::string>> rows;
  std::vector<std::string> row;
  std::string field;
  bool quoted = false;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    if (quoted) {
      if (c == '"' && i + 1 < text.size() && text[i + 1] == '"') {
        field += '"';
        ++i;
      } else if (c == '"') {
        quoted = false;
      } else {
        field += c;
      }
    } else if (c == '"') {
      quoted = true;
    } else if (c == ',') {
      row.push_back(field);
      field.clear();
    } else if (c == '\n') {
      row.push_back(field);
      field.clear();
      rows.push_back(row);
      row.clear();
    } else {
      field += c;
    }
  }
  if (!field.empty() || !row.empty()) {
    row.push_back(field);
    rows.push_back(row);
  }
  return rows;
}

/// strtod of the whole field; NaN if the field is not entirely a number.
inline double parse_double(const std::string& s) {
  char* end = nullptr;
  const double v = std::strtod(s.c_str(), &end);
  return end == s.c_str() + s.size() && !s.empty() ? v : std::nan("");
}

/// The whole content of a file, as bytes.
inline std::string read_all(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

/// A fresh empty folder under the system temporary folder, removed with everything in it when
/// the object goes out of scope.
class ScratchDir {
 public:
  explicit ScratchDir(std::string_view name)
      : path_(std::filesystem::temp_directory_path() /
              fmt::format("larder-test-{}-{}", name, static_cast<long>(::getpid()))) {
    std::filesystem::remove_all(path_);
    std::filesystem::create_directories(path_);
  }
  ScratchDir(const ScratchDir&) = delete;
  ScratchDir& operator=(const ScratchDir&) = delete;
  ~ScratchDir() {
    std::error_code ignored;
    std::filesystem::permissions(path_, std::filesystem::perms::owner_all,
                                 std::filesystem::perm_options::add, ignored);
    std::filesystem::remove_all(path_, ignored);
  }
  const std::filesystem::path& path() const { return path_; }

 private:
  std::filesystem::path path_;
};

/// Names of the entries of a folder, sorted.
inline std::vector<std::string> folder_entries(const std::filesystem::path& dir) {
  std::vector<std::string> out;
  for (const auto& e : std::filesystem::directory_iterator(dir)) {
    out.push_back(e.path().filename().string());
  }
  std::sort(out.begin(), out.end());
  return out;
}

}  // namespace larder::test
