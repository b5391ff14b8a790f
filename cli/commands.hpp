#pragma once
// The subcommands of `larder` (cli.md). Each returns the process exit code.

#include <optional>
#include <string>
#include <vector>

#include "cli/mpi_world.hpp"
#include "cli/scenario_input.hpp"

namespace larder {

/// Options shared by commands that simulate.
struct CommonOptions {
  std::string scenario;           ///< "" = built-in demo
  Overrides overrides;            ///< from the texts below (read_overrides)
  std::string seed_text;          ///< --seed as typed ("" = not given)
  std::string replications_text;  ///< -r as typed ("" = not given)
  int threads = 0;
  bool quiet = false;
  std::string format = "table";  ///< table | json
  std::string command_line;      ///< as typed, for "how to rerun"
};

struct RunArgs {
  CommonOptions common;
  std::string out;               ///< "" = larder-out/<scenario name>
  std::string shard;             ///< "K/N": run shard K of N and write shard-K-of-N.json; "" = all
  std::string max_memory;        ///< refuse a run estimated above this ("4G"); "" = half the RAM
  std::string precision;         ///< METRIC=HALF_WIDTH: add replications until met ("" = off)
  int max_replications = 10000;  ///< the most --precision may run
  bool force = false;            ///< write into a non-empty folder that holds no larder result
  MpiWorld mpi;                  ///< this rank under mpirun (rank 0 of 1 otherwise)
};
/// Exit 130 when interrupted (Ctrl-C), with the finished replications in <out>/partial/.
int run_command(const RunArgs& args);

/// `larder merge DIR...`: shard files of one run into the outputs of a single run.
struct MergeArgs {
  std::vector<std::string> inputs;  ///< folders (their shard-K-of-N.json files) or files
  std::string out;                  ///< "" = larder-out/<scenario name>
  bool quiet = false;
  std::string format = "table";  ///< what goes to stdout: table | json
  bool force = false;            ///< write into a non-empty folder that holds no larder result
};
int merge_command(const MergeArgs& args);

int check_command(const CommonOptions& args);

struct SweepArgs {
  CommonOptions common;
  std::vector<std::string> set;              ///< PATH=V1,V2,... (several make a grid)
  std::vector<std::string> vary;             ///< PATH=-10%,+10%,...: one input at a time
  std::string waste_metric = "waste_units";  ///< --vary ranks on profit and on this metric
  std::string out;                           ///< folder for sweep.csv [larder-out/<scenario name>]
  bool force = false;  ///< write into a non-empty folder that holds no larder result
};
int sweep_command(const SweepArgs& args);

struct AllocateArgs {
  CommonOptions common;
  std::string policy;      ///< a network_in_stock policy of the scenario
  std::optional<int> day;  ///< plan on this day [the end of the warm-up]
  std::string out;         ///< CSV file [larder-out/<scenario>/allocation-<policy>.csv]
  int days = 1;            ///< plan on this many days from `day` and average [1]
  std::string rollout;     ///< rollout table CSV ("" = none)
};
int allocate_command(const AllocateArgs& args);

/// `larder history SCENARIO --policy NAME --out FILE.csv`: what the stores would have recorded.
struct HistoryArgs {
  CommonOptions common;
  std::string policy;     ///< a policy of the scenario
  std::string out;        ///< the history CSV
  int replication = 0;    ///< which replication's days
  std::string items_out;  ///< item file to write beside it ("" = none)
};
int history_command(const HistoryArgs& args);

/// `larder fit HISTORY.csv --out SCENARIO.yaml`: demand estimated from a censored history.
struct FitArgs {
  std::string history;           ///< the history CSV
  std::string items;             ///< item file with prices and costs ("" = placeholders)
  std::string out;               ///< scenario file to write
  std::string family = "auto";   ///< auto | poisson | negative_binomial | normal
  int min_days = 28;             ///< fewer days that did not sell out: the item is left out
  std::string name;              ///< scenario name ["fitted-<history file stem>"]
  bool substitution = false;     ///< also estimate substitute shares (needs hourly sales)
  bool check = false;            ///< replay the history's deliveries on the fitted scenario
  int check_replications = 200;  ///< replications of the check
  int threads = 0;               ///< for the check (0 = all)
  bool quiet = false;
};
int fit_command(const FitArgs& args);

/// `larder drill SCENARIO`: a training drill at the prompt or from `--decisions FILE`;
/// `larder drill --summary DIR...`: several trainees' scorecards in one table.
struct DrillArgs {
  CommonOptions common;
  std::string decisions;             ///< score these decisions instead of prompting
  std::string out;                   ///< [larder-out/<scenario>/drill-<trainee>]
  std::string trainee = "trainee";   ///< the trainee's name in the scorecard
  std::vector<std::string> summary;  ///< scorecard folders or files: the class view
  bool force = false;                ///< write into a non-empty folder that holds no larder result
};
int drill_command(const DrillArgs& args);

struct BenchArgs {
  int stores = 100;
  int items = 50;
  int days = 364;
  int max_threads = 0;  ///< 0 = all cores
  bool quiet = false;
};
int bench_command(const BenchArgs& args);

}  // namespace larder
