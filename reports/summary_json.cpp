#include "reports/summary_json.hpp"

#include "reports/comparison.hpp"

namespace larder {

namespace {

nlohmann::json estimate_json(const Estimate& e) {
  return {{"mean", e.mean}, {"stderr", e.stderr_}, {"ci_low", e.ci_low}, {"ci_high", e.ci_high}};
}

std::string metric_key(Metric m) {
  return std::string(metric_name(m));
}

}  // namespace

nlohmann::json summary_json(const RunResult& result) {
  const RunInfo& info = result.info;
  nlohmann::json j;
  j["scenario"] = info.scenario_name;
  j["scenario_file"] = info.scenario_file;
  j["seed"] = info.seed;
  j["replications"] = info.replications;
  j["horizon_days"] = info.horizon_days;
  j["warmup_days"] = info.warmup_days;
  j["stores"] = info.stores;
  j["items"] = info.items;
  j["currency"] = info.currency;
  j["command"] = info.command;
  j["larder_version"] = info.version;
  j["threads"] = info.threads;
  j["seconds"] = info.seconds;
  j["confidence_level"] = kReportLevel;

  nlohmann::json metrics = nlohmann::json::array();
  for (Metric m : result.metrics) {
    const MetricInfo& mi = metric_info(m);
    metrics.push_back({{"name", mi.name},
                       {"unit", mi.unit},
                       {"better", mi.better},
                       {"description", mi.description}});
  }
  j["metrics"] = std::move(metrics);

  const int n_policies = static_cast<int>(result.policies.size());
  nlohmann::json policies = nlohmann::json::array();
  for (int p = 0; p < n_policies; ++p) {
    nlohmann::json per_metric = nlohmann::json::object();
    for (Metric m : result.metrics) {
      per_metric[metric_key(m)] = estimate_json(policy_estimate(result, p, m));
    }
    nlohmann::json entry = {{"name", result.policies[static_cast<size_t>(p)]},
                            {"metrics", std::move(per_metric)}};
    if (const auto check = target_check(result, static_cast<size_t>(p))) {
      entry["network_target"] = {{"target", check->target},
                                 {"achieved_in_stock", estimate_json(check->achieved)},
                                 {"points", check->points()},
                                 {"missed", check->missed()},
                                 {"text", target_text(*check)}};
    }
    policies.push_back(std::move(entry));
  }
  j["policies"] = std::move(policies);

  const std::string& baseline = result.policies.at(static_cast<size_t>(result.baseline));
  j["baseline"] = baseline;

  nlohmann::json differences = nlohmann::json::array();
  for (int p = 0; p < n_policies; ++p) {
    if (p == result.baseline) continue;
    nlohmann::json per_metric = nlohmann::json::object();
    for (Metric m : result.metrics) {
      const Estimate d = baseline_difference(result, p, m);
      nlohmann::json entry = estimate_json(d);
      entry["verdict"] = verdict(m, d);
      per_metric[metric_key(m)] = std::move(entry);
    }
    differences.push_back({{"policy", result.policies[static_cast<size_t>(p)]},
                           {"baseline", baseline},
                           {"metrics", std::move(per_metric)}});
  }
  j["differences"] = std::move(differences);
  return j;
}

std::string summary_json_text(const RunResult& result) {
  // Replace rather than throw on text that is not valid UTF-8 (a command line, a file name).
  return summary_json(result).dump(2, ' ', false, nlohmann::json::error_handler_t::replace) + "\n";
}

}  // namespace larder
