#include "sim/runner/shard_merge.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <map>

#include "sim/scenario/diagnostics.hpp"

namespace larder {

namespace {

/// A fact that every shard of one run shares: what it is called in messages, and its value.
struct Fact {
  std::string label;
  std::string value;
};

std::string joined_keys(const RunResult& r) {
  std::string out;
  for (const auto& b : r.breakdown) {
    for (const BreakdownKey& k : b.keys) out += fmt::format("{}={};", k.dimension, k.key);
    out += fmt::format("|{}|{}|", b.first_group, b.network_target);
  }
  return out;
}

std::vector<Fact> run_facts(const ShardResult& s) {
  const RunResult& r = s.result;
  std::string metrics;
  for (Metric m : r.metrics) metrics += fmt::format("{} ", metric_name(m));
  std::string pairs;
  for (const SubstitutionPair& p : r.substitution_pairs) pairs += p.from + ">" + p.to + " ";
  return {
      {"scenario", r.info.scenario_name},
      {"scenario text (digest)", s.scenario_digest},
      {"seed", std::to_string(r.info.seed)},
      {"replications", std::to_string(s.total_replications)},
      {"shard count", std::to_string(s.shard.count)},
      {"larder version", r.info.version},
      {"horizon (days, warm-up)", fmt::format("{}, {}", r.info.horizon_days, r.info.warmup_days)},
      {"stores and items", fmt::format("{}, {}", r.info.stores, r.info.items)},
      {"policies", fmt::format("{} (baseline {})", fmt::join(r.policies, ", "), r.baseline)},
      {"metrics", metrics},
      {"substitution pairs", pairs},
      {"breakdown keys", joined_keys(r)}};
}

/// Problems that make `s` unfit to merge with `reference` (a shard of the run).
void check_same_run(const ShardSource& s, const ShardSource& reference, Diagnostics& diag) {
  const std::vector<Fact> mine = run_facts(s.shard);
  const std::vector<Fact> theirs = run_facts(reference.shard);
  for (size_t k = 0; k < mine.size(); ++k) {
    if (mine[k].value == theirs[k].value) continue;
    const bool short_values = mine[k].value.size() + theirs[k].value.size() < 80;
    diag.error({s.name},
               short_values ? fmt::format("{} is {} but {} has {}", mine[k].label, mine[k].value,
                                          reference.name, theirs[k].value)
                            : fmt::format("{} differ from {}", mine[k].label, reference.name),
               "shards of one run share the scenario, seed, replications and shard count");
  }
}

std::string range_text(ReplicationRange r) {
  if (r.count == 1) return fmt::format("replication {}", r.first);
  return fmt::format("replications {} to {}", r.first, r.first + r.count - 1);
}

constexpr size_t kNone = SIZE_MAX;

/// Marks source `i` as the owner of its replications in `owner`; a problem when one is out of
/// range or already owned (reported once per source, with the first such replication).
void claim(const std::vector<ShardSource>& sources, size_t i, std::vector<size_t>& owner,
           Diagnostics& diag) {
  const int total = static_cast<int>(owner.size());
  int clashes = 0;
  for (int id : sources[i].shard.replication_ids) {
    if (id < 0 || id >= total) {
      diag.error({sources[i].name},
                 fmt::format("replication {} is outside 0 to {}", id, total - 1));
      return;
    }
    size_t& o = owner[static_cast<size_t>(id)];
    if (o != kNone && clashes++ == 0) {
      diag.error({sources[i].name},
                 fmt::format("replication {} is also in {}", id, sources[o].name));
    }
    if (o == kNone) o = i;
  }
}

/// Which source holds each replication, or problems when one is held twice or by none.
std::vector<size_t> owners(const std::vector<ShardSource>& sources, std::string_view inputs,
                           Diagnostics& diag) {
  const ShardResult& first = sources.front().shard;
  const int total = first.total_replications;
  const int count = first.shard.count;
  std::map<int, size_t> by_index;
  std::vector<bool> repeated(sources.size(), false);
  for (size_t i = 0; i < sources.size(); ++i) {
    const ShardResult& s = sources[i].shard;
    const auto [it, fresh] = by_index.emplace(s.shard.index, i);
    if (!fresh) {
      repeated[i] = true;
      diag.error({sources[i].name}, fmt::format("shard {} of {} is also in {}", s.shard.index,
                                                count, sources[it->second].name));
    }
    if (!s.complete) {
      diag.error(
          {sources[i].name},
          fmt::format("shard {} of {} was interrupted after {} of {} replications", s.shard.index,
                      count, s.replication_ids.size(), shard_range(s.shard, total).count),
          fmt::format("run `--shard {}/{}` again", s.shard.index, count));
    }
  }
  for (int k = 1; k <= count; ++k) {
    if (by_index.count(k) > 0) continue;
    diag.error({std::string(inputs)},
               fmt::format("shard {} of {} ({}) is missing", k, count,
                           range_text(shard_range({k, count}, total))),
               fmt::format("run `--shard {}/{}` and pass its file or folder too", k, count));
  }
  std::vector<size_t> owner(static_cast<size_t>(std::max(total, 0)), kNone);
  for (size_t i = 0; i < sources.size(); ++i) {
    if (!repeated[i]) claim(sources, i, owner, diag);
  }
  if (diag.ok() && std::count(owner.begin(), owner.end(), kNone) > 0) {
    const auto gap = std::find(owner.begin(), owner.end(), kNone) - owner.begin();
    diag.error({std::string(inputs)}, fmt::format("replication {} is in no shard", gap));
  }
  return owner;
}

/// Where each row of a shard lives: (source, row) for replication id.
struct RowRef {
  size_t source;
  size_t row;
};

std::vector<RowRef> rows_in_order(const std::vector<ShardSource>& sources,
                                  const std::vector<size_t>& owner) {
  std::vector<std::map<int, size_t>> row_of(sources.size());
  for (size_t i = 0; i < sources.size(); ++i) {
    const auto& ids = sources[i].shard.replication_ids;
    for (size_t r = 0; r < ids.size(); ++r) row_of[i][ids[r]] = r;
  }
  std::vector<RowRef> out;
  for (size_t id = 0; id < owner.size(); ++id) {
    out.push_back({owner[id], row_of[owner[id]].at(static_cast<int>(id))});
  }
  return out;
}

/// Appends row `row` of every per-replication table of `from` to `to`.
void append_row(RunResult& to, const RunResult& from, size_t row) {
  for (size_t p = 0; p < to.policies.size(); ++p) {
    to.values[p].push_back(from.values[p][row]);
    if (!from.substituted[p].empty()) to.substituted[p].push_back(from.substituted[p][row]);
    PolicyBreakdown& b = to.breakdown[p];
    const PolicyBreakdown& fb = from.breakdown[p];
    b.values.push_back(fb.values[row]);
    if (!fb.planned_level.empty()) {
      b.planned_level.push_back(fb.planned_level[row]);
      b.planned_in_stock.push_back(fb.planned_in_stock[row]);
    }
  }
}

/// `reference` without its rows: the run facts, names and keys.
RunResult empty_like(const RunResult& reference) {
  RunResult out = reference;
  const size_t n = out.policies.size();
  out.values.assign(n, {});
  out.substituted.assign(n, {});
  for (PolicyBreakdown& b : out.breakdown) {
    b.values.clear();
    b.planned_level.clear();
    b.planned_in_stock.clear();
  }
  return out;
}

}  // namespace

RunResult merge_shards(const std::vector<ShardSource>& sources, std::string_view inputs) {
  Diagnostics diag;
  if (sources.empty()) {
    diag.error({std::string(inputs)}, "no shard files (shard-K-of-N.json) found");
    throw InputError(diag);
  }
  for (size_t i = 1; i < sources.size(); ++i) check_same_run(sources[i], sources[0], diag);
  if (!diag.ok()) throw InputError(diag);
  const std::vector<size_t> owner = owners(sources, inputs, diag);
  if (!diag.ok()) throw InputError(diag);

  const auto lowest = std::min_element(
      sources.begin(), sources.end(),
      [](const auto& a, const auto& b) { return a.shard.shard.index < b.shard.shard.index; });
  RunResult merged = empty_like(lowest->shard.result);
  for (const RowRef& ref : rows_in_order(sources, owner)) {
    append_row(merged, sources[ref.source].shard.result, ref.row);
  }
  merged.info.replications = static_cast<int>(owner.size());
  merged.info.seconds = 0.0;
  merged.info.threads = 0;
  for (const ShardSource& s : sources) {
    merged.info.seconds += s.shard.result.info.seconds;
    merged.info.threads = std::max(merged.info.threads, s.shard.result.info.threads);
  }
  return merged;
}

}  // namespace larder
