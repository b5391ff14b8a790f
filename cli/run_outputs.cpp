#include "cli/run_outputs.hpp"

#include <fmt/format.h>

#include <numeric>
#include <vector>

#include "cli/progress.hpp"
#include "reports/atomic_file.hpp"
#include "reports/output_folder.hpp"
#include "reports/shard_file.hpp"

namespace larder {

namespace {

namespace fs = std::filesystem;

constexpr int kInterrupted = 130;  // cli.md: 128 + SIGINT, as shells report it

fs::path partial_dir(const fs::path& dir) {
  return dir / "partial";
}

/// Removes what an interrupted run of the same kind left in `partial/`: the shard's own file,
/// or (whole run) every file there but shard files; then the folder if it is empty.
void clear_partial(const fs::path& dir, const RunSlice& slice) {
  const fs::path partial = partial_dir(dir);
  std::error_code ec;
  if (!fs::is_directory(partial, ec)) return;
  std::vector<fs::path> stale;
  if (slice.shard) {
    stale.push_back(partial / shard_file_name(*slice.shard));
  } else {
    for (const auto& entry : fs::directory_iterator(partial, ec)) {
      const std::string name = entry.path().filename().string();
      if (entry.is_regular_file() && !name.starts_with("shard-")) stale.push_back(entry.path());
    }
  }
  for (const fs::path& p : stale) fs::remove(p, ec);
  fs::remove(partial, ec);  // only if empty
}

}  // namespace

ShardResult as_shard(const RunResult& result, const RunTarget& target, bool complete) {
  ShardResult s;
  s.shard = *target.slice.shard;
  s.total_replications = target.total_replications;
  s.scenario_text = scenario_text(target.scenario_path);
  s.scenario_digest = scenario_digest(s.scenario_text);
  s.shard_command = target.command_line;
  s.replication_ids.resize(static_cast<size_t>(result.info.replications));
  std::iota(s.replication_ids.begin(), s.replication_ids.end(), target.slice.range.first);
  s.complete = complete;
  s.result = result;
  return s;
}

namespace {

std::string range_text(int first, int count) {
  return count == 1 ? fmt::format("replication {}", first)
                    : fmt::format("replications {} to {}", first, first + count - 1);
}

}  // namespace

RunOutcome write_run_results(const RunResult& result, const RunTarget& target) {
  const int done = result.info.replications;
  const int wanted = target.slice.range.count;
  const bool complete = !target.stopped;
  if (done == 0) {
    return {kInterrupted, false, "interrupted before any replication finished; nothing written"};
  }
  const fs::path dir = complete ? target.dir : partial_dir(target.dir);
  ensure_directory(dir);
  RunOutcome out{complete ? 0 : kInterrupted, !target.slice.shard, ""};
  if (target.slice.shard) {
    const ShardSpec k = *target.slice.shard;
    const fs::path file = dir / shard_file_name(k);
    write_file_atomically(file, shard_file_text(as_shard(result, target, complete)));
    out.note = fmt::format("shard {}/{} ({}) written to {}", k.index, k.count,
                           range_text(target.slice.range.first, done), file.string());
  } else {
    std::vector<ResultFile> extra;
    if (complete && !target.report_html.empty())
      extra.push_back({"report.html", target.report_html});
    write_run_outputs(result, dir, std::move(extra));
    out.note = fmt::format("results written to {} ({} replications in {})", dir.string(), done,
                           format_duration(result.info.seconds));
  }
  if (complete) {
    clear_partial(target.dir, target.slice);
  } else {
    const std::string of = done < wanted ? fmt::format(" of {}", wanted) : "";
    out.note = fmt::format("interrupted after {}{} replications; partial {}", done, of, out.note);
  }
  return out;
}

}  // namespace larder
