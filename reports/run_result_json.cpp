#include "reports/run_result_json.hpp"

#include <fmt/format.h>

#include <cmath>
#include <stdexcept>

#include "reports/exact_json_number.hpp"
#include "reports/json_integer.hpp"

namespace larder {

namespace {

using nlohmann::json;

/// The largest count (replications, days, stores, items, threads) a run file may hold.
constexpr int kMaxCount = 1'000'000'000;

// ---- writing ----

json info_json(const RunInfo& info) {
  return {{"scenario", info.scenario_name},
          {"scenario_file", info.scenario_file},
          {"seed", info.seed},
          {"replications", info.replications},
          {"horizon_days", info.horizon_days},
          {"warmup_days", info.warmup_days},
          {"stores", info.stores},
          {"items", info.items},
          {"currency", info.currency},
          {"command", info.command},
          {"larder_version", info.version},
          {"threads", info.threads},
          {"seconds", exact_json_number(info.seconds)}};
}

json numbers_json(const std::vector<double>& v) {
  json out = json::array();
  for (double x : v) out.push_back(exact_json_number(x));
  return out;
}

json row_json(const MetricVector& row) {
  json out = json::array();
  for (double x : row) out.push_back(exact_json_number(x));
  return out;
}

json rows_json(const std::vector<MetricVector>& rows) {
  json out = json::array();
  for (const MetricVector& r : rows) out.push_back(row_json(r));
  return out;
}

template <typename T, typename F>
json each_json(const std::vector<T>& v, F&& f) {
  json out = json::array();
  for (const T& x : v) out.push_back(f(x));
  return out;
}

json breakdown_json(const PolicyBreakdown& b) {
  json keys = json::array();
  for (const BreakdownKey& k : b.keys) keys.push_back({k.dimension, k.key});
  return {{"keys", std::move(keys)},
          {"first_group", b.first_group},
          {"values", each_json(b.values, rows_json)},
          {"planned_level", each_json(b.planned_level, numbers_json)},
          {"planned_in_stock", each_json(b.planned_in_stock, numbers_json)},
          {"network_target",
           std::isfinite(b.network_target) ? exact_json_number(b.network_target) : json()}};
}

json metric_names(const std::vector<Metric>& metrics) {
  json out = json::array();
  for (Metric m : metrics) out.push_back(metric_name(m));
  return out;
}

std::vector<Metric> all_metrics() {
  std::vector<Metric> out;
  for (size_t k = 0; k < kMetricCount; ++k) out.push_back(static_cast<Metric>(k));
  return out;
}

// ---- reading ----

const json& field(const json& j, const char* key) {
  if (!j.is_object()) throw std::runtime_error(fmt::format("expected an object holding '{}'", key));
  const auto it = j.find(key);
  if (it == j.end()) throw std::runtime_error(fmt::format("missing field '{}'", key));
  return *it;
}

const json& array_of(const json& j, size_t n, std::string_view what) {
  if (!j.is_array()) throw std::runtime_error(fmt::format("{}: expected a list", what));
  if (n != SIZE_MAX && j.size() != n) {
    throw std::runtime_error(fmt::format("{}: expected {} entries, found {}", what, n, j.size()));
  }
  return j;
}

RunInfo info_from(const json& j) {
  RunInfo info;
  info.scenario_name = field(j, "scenario").get<std::string>();
  info.scenario_file = field(j, "scenario_file").get<std::string>();
  info.seed = json_uint64(field(j, "seed"), "seed");
  info.replications = json_int(field(j, "replications"), "replications", 0, kMaxCount);
  info.horizon_days = json_int(field(j, "horizon_days"), "horizon_days", 0, kMaxCount);
  info.warmup_days = json_int(field(j, "warmup_days"), "warmup_days", 0, kMaxCount);
  info.stores = json_int(field(j, "stores"), "stores", 0, kMaxCount);
  info.items = json_int(field(j, "items"), "items", 0, kMaxCount);
  info.currency = field(j, "currency").get<std::string>();
  info.command = field(j, "command").get<std::string>();
  info.version = field(j, "larder_version").get<std::string>();
  info.threads = json_int(field(j, "threads"), "threads", 0, kMaxCount);
  info.seconds = exact_json_number_value(field(j, "seconds"));
  return info;
}

Metric metric_from_name(const std::string& name) {
  for (size_t k = 0; k < kMetricCount; ++k) {
    if (metric_name(static_cast<Metric>(k)) == name) return static_cast<Metric>(k);
  }
  throw std::runtime_error(
      fmt::format("unknown metric '{}' (written by another larder version?)", name));
}

std::vector<double> numbers_from(const json& j, size_t n, std::string_view what) {
  std::vector<double> out;
  for (const json& x : array_of(j, n, what)) out.push_back(exact_json_number_value(x));
  return out;
}

/// A row in `order` (the file's row_metrics) as a MetricVector.
MetricVector row_from(const json& j, const std::vector<Metric>& order, std::string_view what) {
  MetricVector row{};
  const std::vector<double> v = numbers_from(j, order.size(), what);
  for (size_t k = 0; k < order.size(); ++k) at(row, order[k]) = v[k];
  return row;
}

std::vector<MetricVector> rows_from(const json& j, size_t n, const std::vector<Metric>& order,
                                    std::string_view what) {
  std::vector<MetricVector> out;
  for (const json& r : array_of(j, n, what)) out.push_back(row_from(r, order, what));
  return out;
}

PolicyBreakdown breakdown_from(const json& j, size_t reps, const std::vector<Metric>& order,
                               const std::string& policy) {
  PolicyBreakdown b;
  for (const json& k : array_of(field(j, "keys"), SIZE_MAX, "breakdown keys")) {
    const json& pair = array_of(k, 2, "breakdown key");
    b.keys.push_back({pair[0].get<std::string>(), pair[1].get<std::string>()});
  }
  b.first_group = static_cast<std::size_t>(json_integer(field(j, "first_group"), "first_group", 0,
                                                        static_cast<std::int64_t>(b.keys.size())));
  const std::string what = fmt::format("breakdown of {}", policy);
  for (const json& r : array_of(field(j, "values"), reps, what)) {
    b.values.push_back(rows_from(r, b.keys.size(), order, what));
  }
  const json& level = field(j, "planned_level");
  const json& in_stock = field(j, "planned_in_stock");
  const size_t planned_reps = level.empty() ? 0 : reps;
  const size_t groups = b.keys.size() - std::min(b.first_group, b.keys.size());
  for (const json& r : array_of(level, planned_reps, what + " planned levels")) {
    b.planned_level.push_back(numbers_from(r, groups, what + " planned levels"));
  }
  for (const json& r : array_of(in_stock, planned_reps, what + " planned in-stock")) {
    b.planned_in_stock.push_back(numbers_from(r, groups, what + " planned in-stock"));
  }
  const auto target = j.find("network_target");
  if (target != j.end() && !target->is_null()) {
    const double t = exact_json_number_value(*target);
    if (!(t > 0.0) || !(t < 1.0)) {
      throw std::runtime_error(what + ": network_target must be a share between 0 and 1");
    }
    b.network_target = t;
  }
  return b;
}

}  // namespace

json run_result_json(const RunResult& result) {
  json pairs = json::array();
  for (const SubstitutionPair& p : result.substitution_pairs) {
    pairs.push_back({{"from", p.from}, {"to", p.to}});
  }
  json substituted = json::array();
  for (const auto& per_policy : result.substituted) {
    substituted.push_back(each_json(per_policy, numbers_json));
  }
  return {{"info", info_json(result.info)},
          {"policies", result.policies},
          {"baseline", result.baseline},
          {"metrics", metric_names(result.metrics)},
          {"row_metrics", metric_names(all_metrics())},
          {"values", each_json(result.values, rows_json)},
          {"substitution_pairs", std::move(pairs)},
          {"substituted", std::move(substituted)},
          {"breakdown", each_json(result.breakdown, breakdown_json)}};
}

RunResult run_result_from_json(const json& j) {
  RunResult r;
  r.info = info_from(field(j, "info"));
  r.policies = field(j, "policies").get<std::vector<std::string>>();
  if (r.policies.empty()) throw std::runtime_error("the run has no policies");
  r.baseline = json_int(field(j, "baseline"), "baseline (a policy index)", 0,
                        static_cast<int>(r.policies.size()) - 1);
  for (const json& m : array_of(field(j, "metrics"), SIZE_MAX, "metrics")) {
    r.metrics.push_back(metric_from_name(m.get<std::string>()));
  }
  std::vector<Metric> order;
  for (const json& m : array_of(field(j, "row_metrics"), kMetricCount, "row_metrics")) {
    order.push_back(metric_from_name(m.get<std::string>()));
  }
  const size_t n_policies = r.policies.size();
  const size_t reps = static_cast<size_t>(std::max(r.info.replications, 0));
  const json& values = array_of(field(j, "values"), n_policies, "values");
  for (size_t p = 0; p < n_policies; ++p) {
    r.values.push_back(rows_from(values[p], reps, order, "values of " + r.policies[p]));
  }
  for (const json& p : array_of(field(j, "substitution_pairs"), SIZE_MAX, "substitution_pairs")) {
    r.substitution_pairs.push_back(
        {field(p, "from").get<std::string>(), field(p, "to").get<std::string>()});
  }
  const size_t n_pairs = r.substitution_pairs.size();
  const json& substituted = array_of(field(j, "substituted"), n_policies, "substituted");
  for (size_t p = 0; p < n_policies; ++p) {
    std::vector<std::vector<double>> per_rep;
    const std::string what = "substituted of " + r.policies[p];
    for (const json& row : array_of(substituted[p], n_pairs > 0 ? reps : 0, what)) {
      per_rep.push_back(numbers_from(row, n_pairs, what));
    }
    r.substituted.push_back(std::move(per_rep));
  }
  const json& breakdown = array_of(field(j, "breakdown"), n_policies, "breakdown");
  for (size_t p = 0; p < n_policies; ++p) {
    r.breakdown.push_back(breakdown_from(breakdown[p], reps, order, r.policies[p]));
  }
  return r;
}

}  // namespace larder
