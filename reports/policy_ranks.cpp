#include "reports/policy_ranks.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "reports/comparison.hpp"
#include "reports/csv.hpp"

namespace larder {

namespace {

bool beats(double a, double b, int better) {
  return better > 0 ? a > b : a < b;
}

std::vector<int> ranked_first(const std::vector<int>& ranks, const std::vector<double>& means) {
  std::vector<int> out;
  for (std::size_t p = 0; p < ranks.size(); ++p) {
    if (ranks[p] == 1 && std::isfinite(means[p])) out.push_back(static_cast<int>(p));
  }
  return out;
}

std::string names(const std::vector<int>& best, const std::vector<std::string>& policies) {
  std::string out;
  for (const int b : best) {
    out += (out.empty() ? "" : " = ") + policies[static_cast<std::size_t>(b)];
  }
  return out.empty() ? "n/a" : out;
}

}  // namespace

std::vector<int> rank_policies(const std::vector<double>& means, int better) {
  std::vector<int> ranks(means.size());
  int finite = 0;
  for (const double m : means) finite += std::isfinite(m) ? 1 : 0;
  for (std::size_t p = 0; p < means.size(); ++p) {
    if (!std::isfinite(means[p])) {
      ranks[p] = finite + 1;
      continue;
    }
    int ahead = 0;
    for (const double o : means) ahead += std::isfinite(o) && beats(o, means[p], better) ? 1 : 0;
    ranks[p] = 1 + ahead;
  }
  return ranks;
}

bool RankTable::best_changes() const {
  return std::any_of(points.begin(), points.end(),
                     [](const RankPoint& p) { return p.best_changes; });
}

RankTable rank_table(const std::string& metric, int better,
                     const std::vector<std::string>& policies, std::vector<RankPoint> points) {
  RankTable t{metric, better, policies, std::move(points)};
  for (RankPoint& p : t.points) {
    p.ranks = rank_policies(p.means, better);
    p.best = ranked_first(p.ranks, p.means);
  }
  if (!t.points.empty()) {
    const std::vector<int>& base = t.points.front().best;
    for (RankPoint& p : t.points) p.best_changes = p.best != base;
  }
  return t;
}

RankTable rank_table(const std::vector<SweepPoint>& points, Metric m) {
  std::vector<RankPoint> in;
  std::vector<std::string> policies;
  if (!points.empty()) policies = points.front().result.policies;
  for (const SweepPoint& pt : points) {
    RankPoint p;
    p.input = pt.values.empty() ? "base" : pt.values[0];
    p.value = pt.values.size() > 1 ? pt.values[1] : "";
    for (std::size_t k = 0; k < pt.result.policies.size(); ++k) {
      p.means.push_back(policy_estimate(pt.result, static_cast<int>(k), m).mean);
    }
    in.push_back(std::move(p));
  }
  RankTable t = rank_table(std::string(metric_name(m)), metric_info(m).better, policies, in);
  if (t.points.empty() || t.points.front().best.empty()) return t;
  const int base_best = t.points.front().best.front();
  for (std::size_t k = 0; k < t.points.size(); ++k) {
    RankPoint& p = t.points[k];
    if (!p.best_changes || p.best.empty()) continue;
    // The new best against the base's best, at this value, paired.
    const Estimate d = paired_difference(points[k].result, p.best.front(), base_best, m);
    p.change_clear = is_significant(d) && beats(d.mean, 0.0, t.better);
  }
  return t;
}

std::string rank_text(const RankTable& t) {
  std::size_t input_w = 5;
  std::size_t value_w = 5;
  for (const RankPoint& p : t.points) {
    input_w = std::max(input_w, p.input.size());
    value_w = std::max(value_w, p.value.size());
  }
  std::string out = fmt::format("ranks on {} ({} is better; 1 = best) at each input value\n",
                                t.metric, t.better > 0 ? "higher" : "lower");
  std::string head = fmt::format("{:<{}}  {:<{}}", "input", input_w, "value", value_w);
  for (const std::string& name : t.policies) head += fmt::format("  {:>{}}", name, name.size());
  out += head + "  best\n";
  for (const RankPoint& p : t.points) {
    std::string line = fmt::format("{:<{}}  {:<{}}", p.input, input_w, p.value, value_w);
    for (std::size_t k = 0; k < t.policies.size(); ++k) {
      line += fmt::format("  {:>{}}", k < p.ranks.size() ? p.ranks[k] : 0, t.policies[k].size());
    }
    line += "  " + names(p.best, t.policies);
    if (p.best_changes) {
      line += p.change_clear.value_or(true) ? "  BEST CHANGES" : "  best changes, within noise";
    }
    out += line + "\n";
  }
  out += t.best_changes()
             ? fmt::format("the best policy on {} changes with the inputs above\n", t.metric)
             : fmt::format("the best policy on {} holds at every value\n", t.metric);
  return out;
}

std::string rank_csv_rows(const RankTable& t) {
  std::string out;
  for (const RankPoint& p : t.points) {
    for (std::size_t k = 0; k < t.policies.size() && k < p.means.size(); ++k) {
      const bool best =
          std::find(p.best.begin(), p.best.end(), static_cast<int>(k)) != p.best.end();
      out += fmt::format("{},{},{},{},{},{},{},{}\n", csv_field(p.input), csv_field(p.value),
                         t.metric, csv_field(t.policies[k]), csv_number(p.means[k]), p.ranks[k],
                         best ? "true" : "false", p.best_changes ? "true" : "false");
    }
  }
  return out;
}

}  // namespace larder
