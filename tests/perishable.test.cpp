// The engine against exact Markov-chain values for perishables with a fixed lifetime
// (checks.md 5.2 [C]: Poisson(5) demand, lost sales, order up to S every period, stationary
// per-period expectations by power iteration). larder's order after close arrives before the
// next opening, so `base_stock` with level S starts every day with S units, as in that chain.
// FIFO is fifo_share 1 (every shopper takes the oldest unit), LIFO is fifo_share 0.
// Also the structural invariants listed there: sales and lost sales do not depend on the
// lifetime or the issuing rule, and E[order] = E[sales] + E[outdated] (flow balance).

#include <fmt/format.h>

#include <catch2/catch.hpp>

#include "tests/fixture.hpp"

namespace larder {
namespace {

struct ChainRow {
  int life;
  double fifo_share;
  int s;
  double sales, lost, outdated, order;
};

// checks.md 5.2, table of stationary expectations [C].
constexpr ChainRow kRows[] = {
    {1, 1.0, 5, 4.122663, 0.877337, 0.877337, 5.000000},
    {2, 1.0, 5, 4.122663, 0.877337, 0.036791, 4.159454},
    {2, 1.0, 8, 4.877891, 0.122109, 0.320519, 5.198410},
    {2, 0.0, 8, 4.877891, 0.122109, 1.252392, 6.130282},
    {3, 1.0, 10, 4.977812, 0.022188, 0.089922, 5.067734},
    {3, 0.0, 10, 4.977812, 0.022188, 1.347482, 6.325295},
};

void check_close(const Estimate& e, double exact, const char* what) {
  INFO(what << ": simulated " << e.mean << " +- " << e.stderr_ << ", exact " << exact);
  CHECK(std::abs(e.mean - exact) <= 4.0 * e.stderr_ + 1e-6);  // table values have 6 decimals
}

TEST_CASE("order-up-to with fixed lifetime matches the exact Markov chain (checks.md 5.2)",
          "[engine][perishable]") {
  constexpr int kDays = 2000;
  constexpr int kWarmup = 50;
  for (const ChainRow& row : kRows) {
    DYNAMIC_SECTION("m=" << row.life << " fifo_share=" << row.fifo_share << " S=" << row.s) {
      const Scenario s =
          test::scenario_from(fmt::format(R"(
format: 1
name: chain
seed: 5
horizon: {{ days: {}, warmup_days: {} }}
replications: 20
stores: [ {{ id: s }} ]
customers: {{ fifo_share: {} }}
items:
  - {{ id: milk, price: 2, unit_cost: 1, shelf_life_days: {}, demand: {{ base: 5 }} }}
policies:
  - name: up-to-S
    forecast: {{ method: oracle }}
    quantity: {{ rule: base_stock, level: {} }}
)",
                                          kDays, kWarmup, row.fifo_share, row.life, row.s));
      const RunResult r = test::run_scenario(s);
      const double days = kDays - kWarmup;
      check_close(test::metric_estimate(r, 0, Metric::sold_units, days), row.sales, "sales");
      check_close(test::metric_estimate(r, 0, Metric::lost_units, days), row.lost, "lost");
      check_close(test::metric_estimate(r, 0, Metric::waste_units, days), row.outdated, "outdated");
      const Estimate order = test::metric_estimate(r, 0, Metric::delivered_units, days);
      check_close(order, row.order, "order");
      // Flow balance holds per replication up to the stock carried across the horizon ends.
      const Estimate sold = test::metric_estimate(r, 0, Metric::sold_units, days);
      const Estimate waste = test::metric_estimate(r, 0, Metric::waste_units, days);
      CHECK(std::abs(order.mean - sold.mean - waste.mean) <= row.s / days + 1e-12);
    }
  }
}

}  // namespace
}  // namespace larder
