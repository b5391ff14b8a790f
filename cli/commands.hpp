#pragma once
// The subcommands of `larder` (cli.md). Each returns the process exit code.

#include <optional>
#include <string>

#include "cli/scenario_input.hpp"

namespace larder {

/// Options shared by commands that simulate.
struct CommonOptions {
  std::string scenario;  ///< "" = built-in demo
  Overrides overrides;
  int threads = 0;
  bool quiet = false;
  std::string format = "table";  ///< table | json
  std::string command_line;      ///< as typed, for "how to rerun"
};

struct RunArgs {
  CommonOptions common;
  std::string out;  ///< "" = larder-out/<scenario name>
};
int run_command(const RunArgs& args);

int check_command(const CommonOptions& args);

struct AllocateArgs {
  CommonOptions common;
  std::string policy;      ///< a network_in_stock policy of the scenario
  std::optional<int> day;  ///< plan on this day [the end of the warm-up]
  std::string out;         ///< CSV file [larder-out/<scenario>/allocation-<policy>.csv]
};
int allocate_command(const AllocateArgs& args);

struct BenchArgs {
  int stores = 100;
  int items = 50;
  int days = 364;
  int max_threads = 0;  ///< 0 = all cores
  bool quiet = false;
};
int bench_command(const BenchArgs& args);

}  // namespace larder
