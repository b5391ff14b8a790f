#include "reports/scorecard_json.hpp"

#include <cmath>
#include <nlohmann/json.hpp>

namespace larder {

namespace {

using nlohmann::json;

json number(double v) {
  return std::isfinite(v) ? json(v) : json(nullptr);
}

json fit(const SlopeFit& f) {
  return {{"value", number(f.value)}, {"stderr", number(f.std_error)}, {"n", f.n}};
}

json daily(const std::vector<MetricVector>& days, const std::vector<MetricVector>* minus) {
  json out = json::object();
  for (const Metric m : scorecard_metrics()) {
    json series = json::array();
    for (size_t d = 0; d < days.size(); ++d) {
      series.push_back(number(at(days[d], m) - (minus ? at((*minus)[d], m) : 0.0)));
    }
    out[std::string(metric_name(m))] = std::move(series);
  }
  return out;
}

json metrics(const MetricVector& v, const MetricVector* minus) {
  json out = json::object();
  for (size_t k = 0; k < kMetricCount; ++k) {
    const Metric m = static_cast<Metric>(k);
    out[std::string(metric_name(m))] = number(at(v, m) - (minus ? at(*minus, m) : 0.0));
  }
  return out;
}

}  // namespace

std::string scorecard_json_text(const Scorecard& c) {
  json j;
  j["format"] = "larder-drill-scorecard";
  j["format_version"] = 1;
  j["scenario"] = c.scenario;
  j["trainee"] = c.trainee;
  j["seed"] = c.seed;
  j["store"] = c.store;
  j["items"] = c.items;
  j["currency"] = c.currency;
  j["first_day"] = c.first_day;
  j["days"] = c.days;
  j["larder_version"] = LARDER_VERSION;
  j["events"] = json::array();
  for (const DrillEvent& e : c.events) {
    j["events"].push_back({{"day", e.day}, {"demand", e.demand}, {"announced", e.announced}});
  }
  j["weekdays"] = c.weekday;
  j["policies"] = json::array();
  for (size_t p = 0; p < c.policies.size(); ++p) {
    j["policies"].push_back({{"name", c.policies[p]},
                             {"role", p == 0   ? "trainee"
                                      : p == 1 ? "house"
                                               : "comparison"},
                             {"metrics", metrics(c.totals[p], nullptr)},
                             {"daily", daily(c.daily[p], nullptr)}});
  }
  j["differences"] = json::array();
  for (size_t p = 1; p < c.policies.size(); ++p) {
    j["differences"].push_back({{"policy", c.policies[p]},
                                {"metrics", metrics(c.totals[0], &c.totals[p])},
                                {"daily", daily(c.daily[0], &c.daily[p])}});
  }
  j["habits"] = json::array();
  for (const HabitReading& h : c.habits) {
    j["habits"].push_back({{"item", h.item},
                           {"chasing_weight", fit(h.chasing)},
                           {"pull_to_center", fit(h.pull_to_center)},
                           {"implied_service", number(h.implied_service)},
                           {"justified_service", number(h.justified_service)},
                           {"orders", h.orders}});
  }
  j["trainee_days"] = json::array();
  for (size_t k = 0; k < c.item_days.size(); ++k) {
    json days = json::array();
    for (const ItemDay& d : c.item_days[k]) {
      days.push_back({{"day", d.day},
                      {"open", d.open},
                      {"ordered", d.ordered < 0 ? json(nullptr) : json(d.ordered)},
                      {"open_stock", d.open_stock},
                      {"sold", d.sold},
                      {"sold_out", d.sold_out},
                      {"demand", d.demand},
                      {"thrown_out", d.unsold_out}});
    }
    j["trainee_days"].push_back({{"item", c.items[k]}, {"days", std::move(days)}});
  }
  return j.dump(2) + "\n";
}

}  // namespace larder
