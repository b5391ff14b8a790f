// The rollout table of `larder allocate --rollout` (rollout_csv.hpp) and the averaging of plans
// (averaged_plan.hpp), on a small instance built by hand: the columns as documented, the group
// keys and attributes of each store-item, and the order basis per weekday against the Poisson
// quantile of Boost.Math (the in_stock_target rule orders the smallest Q with P(D <= Q - 1) >=
// L, policies.md).

#include "reports/rollout_csv.hpp"

#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "tests/fixture.hpp"

namespace larder {
namespace {

constexpr const char* kRollout = R"(format: 1
name: rollout
seed: 3
horizon: { days: 28, warmup_days: 0, start_weekday: mon }
stores:
  - { id: n, size: 1.0, attributes: { format: big, region: north } }
  - { id: s, size: 0.5, open_weekdays: [mon, tue, wed, thu, fri, sat], attributes: { format: small } }
items:
  - { id: loaf, price: 4, unit_cost: 1, attributes: { type: bread, sourcing: make }, demand: { base: 10, weekday: { sat: 2 } } }
  - { id: tart, price: 5, unit_cost: 3, attributes: { type: cake }, demand: { base: 4 } }
policies:
  - name: p
    forecast: { method: oracle }
    quantity: { rule: network_in_stock, target: 0.8, groups: [attribute:type, store_attribute:format] }
)";

/// The smallest Q with P(D <= Q - 1) >= level for Poisson(mean).
int order_basis(double mean, double level) {
  const boost::math::poisson_distribution<double> law(mean);
  int q = 1;  // Q = 0 is never in stock: P(D <= -1) = 0
  while (boost::math::cdf(law, q - 1) < level) ++q;
  return q;
}

std::vector<std::string> split(const std::string& line) {
  std::vector<std::string> out;
  std::stringstream ss(line);
  std::string f;
  while (std::getline(ss, f, ',')) out.push_back(f);
  if (!line.empty() && line.back() == ',') out.emplace_back();
  return out;
}

/// One plan of the week from day 0, forecasts by hand (the true Poisson means), curves summed
/// per group.
PlanSample hand_sample(const Scenario& s, const GroupMap& groups) {
  PlanSample p;
  const std::vector<double> levels = default_levels();
  p.curves.assign(static_cast<size_t>(groups.count()), GroupCurve{});
  for (GroupCurve& c : p.curves) {
    c.in_stock.assign(levels.size(), 0.0);
    c.profit.assign(levels.size(), 0.0);
    c.leftover.assign(levels.size(), 0.0);
  }
  std::vector<LevelPoint> points(levels.size());
  p.stores.resize(s.stores.size());
  for (size_t st = 0; st < s.stores.size(); ++st) {
    for (int d = 0; d < 7; ++d) {
      if (!s.is_open(static_cast<int>(st), d)) continue;
      p.stores[st].days.push_back(d);
      for (size_t i = 0; i < s.items.size(); ++i) {
        const Item& it = s.items[i];
        const double mean = it.demand.base * s.stores[st].size *
                            it.demand.weekday[static_cast<size_t>(s.weekday_of(d))];
        p.stores[st].forecasts.push_back({mean, mean});
        level_curve(CountLaw::from_moments(DemandFamily::poisson, mean, mean),
                    {it.price, it.unit_cost, 0.0, 0.0}, levels, points);
        GroupCurve& c =
            p.curves[static_cast<size_t>(groups.of_store_item[st * s.items.size() + i])];
        for (size_t l = 0; l < levels.size(); ++l) {
          c.in_stock[l] += points[l].in_stock;
          c.profit[l] += points[l].profit;
          c.leftover[l] += points[l].leftover;
        }
        c.days += 1;
      }
    }
  }
  return p;
}

TEST_CASE("rollout_csv: columns, group keys, attributes and order basis per weekday",
          "[allocate][rollout]") {
  const Scenario s = test::scenario_from(kRollout);
  const std::vector<Policy> policies = test::policies_for(s);
  const NetworkTarget& target = *policies[0].quantity->network();
  const GroupMap groups = make_groups(target.grouping, s);
  const std::vector<PlanSample> samples = {hand_sample(s, groups)};
  const AveragedPlan plan = average_plans(s, target, samples, default_levels());
  const std::string csv = rollout_csv(s, target.grouping, plan);
  std::vector<std::string> rows;
  std::stringstream ss(csv);
  for (std::string line; std::getline(ss, line);) rows.push_back(line);
  REQUIRE(rows.size() == 1 + 2 * 2);
  CHECK(rows[0] ==
        "store,item,group,attribute:type,store_attribute:format,attribute:sourcing,"
        "store_attribute:region,level,expected_in_stock,order_mon,order_tue,order_wed,order_thu,"
        "order_fri,order_sat,order_sun");
  // Store-major: n/loaf, n/tart, s/loaf, s/tart.
  const auto nl = split(rows[1]);
  REQUIRE(nl.size() == 16);
  CHECK(nl[0] == "n");
  CHECK(nl[1] == "loaf");
  CHECK(nl[2] == "bread / big");
  CHECK(nl[3] == "bread");
  CHECK(nl[4] == "big");
  CHECK(nl[5] == "make");
  CHECK(nl[6] == "north");
  const auto st = split(rows[4]);
  REQUIRE(st.size() == 16);
  CHECK(st[2] == "cake / small");
  CHECK(st[5].empty());   // tart has no sourcing
  CHECK(st[6].empty());   // s has no region
  CHECK(st[15].empty());  // s is closed on Sundays
  // Order basis per weekday against the Poisson quantile at the row's level.
  for (size_t r = 1; r < rows.size(); ++r) {
    const auto f = split(rows[r]);
    const size_t store = (r - 1) / 2;
    const size_t item = (r - 1) % 2;
    const double level = std::stod(f[7]);
    CHECK(level ==
          plan.group_level[static_cast<size_t>(plan.groups.of_store_item[store * 2 + item])]);
    for (size_t wd = 0; wd < 7; ++wd) {
      if (store == 1 && wd == 6) continue;
      const Item& it = s.items[item];
      const double mean = it.demand.base * s.stores[store].size * it.demand.weekday[wd];
      CAPTURE(r, wd, mean, level);
      CHECK(std::stod(f[9 + wd]) == order_basis(mean, level));
    }
  }
  // The plan meets its target in expectation (one-day newsvendor, the oracle's laws).
  double in_stock = 0, days = 0;
  for (size_t k = 0; k < plan.days.size(); ++k) {
    in_stock += plan.in_stock[k];
    days += plan.days[k];
  }
  CHECK(in_stock / days >= 0.8 - 1e-12);
}

TEST_CASE("average_plans: copies of one plan give that plan, per plan", "[allocate][rollout]") {
  const Scenario s = test::scenario_from(kRollout);
  const std::vector<Policy> policies = test::policies_for(s);
  const NetworkTarget& target = *policies[0].quantity->network();
  const GroupMap groups = make_groups(target.grouping, s);
  const PlanSample one = hand_sample(s, groups);
  const AveragedPlan a = average_plans(s, target, std::vector<PlanSample>{one}, default_levels());
  const AveragedPlan b =
      average_plans(s, target, std::vector<PlanSample>{one, one, one}, default_levels());
  CHECK(b.plans == 3);
  CHECK(a.group_level == b.group_level);
  for (size_t k = 0; k < a.days.size(); ++k) {
    CHECK(b.days[k] == Approx(a.days[k]));
    CHECK(b.profit[k] == Approx(a.profit[k]));
    CHECK(b.leftover[k] == Approx(a.leftover[k]));
  }
  // Store s is open 6 of the 7 days.
  CHECK(a.days[2] == 6.0);
  CHECK(a.days[0] == 7.0);
}

}  // namespace
}  // namespace larder
