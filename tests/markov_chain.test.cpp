// The engine against an exact Markov chain of the stock by remaining life, computed here, for
// one store-item with Poisson(lambda) demand, lost sales, a fixed shelf life m, `base_stock`
// order-up-to S and a mixed issuing rule (`customers.fifo_share` f).
//
// Sources:
// - The fixed-lifetime formulation of Nahmias, S. (1982), "Perishable inventory theory: a
//   review", Operations Research 30(4): 680-708: periodic review; a unit received in period t
//   can be sold in periods t..t+m-1 and outdates after that; the state is the vector of
//   on-hand units by remaining life; FIFO sells the oldest first, LIFO the freshest.
// - checks.md 5.2 [C]: exact stationary values for FIFO and LIFO at lambda = 5 (used here to
//   show that the chain below is right), and its structural invariants: sales and lost sales
//   do not depend on m or the issuing rule, E[order] = E[sales] + E[outdated], outdating under
//   FIFO <= under LIFO, and it falls as m rises.
// - model.md, "One day of one store": delivery, service with fifo_share (Binomial(s, f) of the
//   s units sold come from the oldest end, the rest from the freshest end), close (in stock at
//   close = a sellable unit left, counting units that expire that night), end of life, order.
//
// The chain. An order placed after close with lead time 1 arrives the next morning before
// opening, and `base_stock` orders S - (units still sellable tomorrow) - (units on order) =
// S - carried. So every day opens with S units: the carried ones plus a delivery of
// S - carried at full life m. That is checks.md 5.2's zero-lead-time chain (order at the start
// of a period, delivered at once) with the period running from one delivery to the next. The
// state is the vector of carried units by remaining life 1..m-1 at the start of a day (their
// sum is at most S). One day: sales s = min(D, S); of them j ~ Binomial(s, f) come from the
// oldest end and s - j from the freshest end (exact, the two ends meet only when stock runs
// out); the units with one day left that remain at close are outdated; the others age by a day.
// Demand enters only through min(D, S), so its support needs no truncation: P(D >= S) goes
// exactly to s = S, and lost sales are lambda - E[sales]. From any state, D >= S empties the
// shelf, so the chain has a single recurrent class and is aperiodic; its stationary
// distribution is solved exactly with Eigen (pi (P - I) = 0, sum pi = 1) and the residual is
// checked below 1e-13.

#include <fmt/format.h>

#include <Eigen/Dense>
#include <algorithm>
#include <catch2/catch.hpp>
#include <cmath>
#include <map>
#include <numeric>
#include <vector>

#include "tests/fixture.hpp"

namespace larder {
namespace {

/// Stationary expectations per day.
struct ChainValues {
  double sales = 0.0;
  double lost = 0.0;
  double outdated = 0.0;
  double order = 0.0;        ///< = deliveries
  double in_stock = 0.0;     ///< P(a unit left at close), model.md's definition
  double carried_any = 0.0;  ///< P(a unit survives the night): a wrong reading of in stock
  double residual = 0.0;     ///< max |pi P - pi|
  int states = 0;
};

/// P(min(D, S) = s), s = 0..S, for D ~ Poisson(lambda). Exact: the tail P(D >= S) is s = S.
std::vector<double> sales_pmf(double lambda, int level) {
  std::vector<double> p(static_cast<size_t>(level) + 1, 0.0);
  double term = std::exp(-lambda);
  double below = 0.0;
  for (int k = 0; k < level; ++k) {
    p[static_cast<size_t>(k)] = term;
    below += term;
    term *= lambda / (k + 1);
  }
  p[static_cast<size_t>(level)] = std::max(0.0, 1.0 - below);
  return p;
}

/// Binomial(n, f) probabilities.
std::vector<double> binomial_pmf(int n, double f) {
  std::vector<double> b(static_cast<size_t>(n) + 1, 0.0);
  if (f <= 0.0) {
    b.front() = 1.0;
  } else if (f >= 1.0) {
    b.back() = 1.0;
  } else {
    double choose = 1.0;  // C(n, j)
    for (int j = 0; j <= n; ++j) {
      b[static_cast<size_t>(j)] = choose * std::pow(f, j) * std::pow(1.0 - f, n - j);
      choose = choose * (n - j) / (j + 1);
    }
  }
  return b;
}

/// Every vector of `len` non-negative counts with sum <= `left`.
void enumerate(int len, int left, std::vector<int>& cur, std::vector<std::vector<int>>& out) {
  if (static_cast<int>(cur.size()) == len) {
    out.push_back(cur);
    return;
  }
  for (int x = 0; x <= left; ++x) {
    cur.push_back(x);
    enumerate(len, left - x, cur, out);
    cur.pop_back();
  }
}

/// The exact stationary chain for shelf life `life` >= 1, order-up-to `level`, fifo share f.
ChainValues solve_chain(double lambda, int life, int level, double f) {
  // State: carried units by remaining life, index 0 = one day left (the oldest).
  std::vector<std::vector<int>> states;
  std::vector<int> cur;
  enumerate(life - 1, level, cur, states);
  std::map<std::vector<int>, Eigen::Index> index;
  for (size_t i = 0; i < states.size(); ++i) index[states[i]] = static_cast<Eigen::Index>(i);
  const Eigen::Index n = static_cast<Eigen::Index>(states.size());

  Eigen::MatrixXd p = Eigen::MatrixXd::Zero(n, n);
  Eigen::VectorXd sales = Eigen::VectorXd::Zero(n), outdated = Eigen::VectorXd::Zero(n),
                  order = Eigen::VectorXd::Zero(n), in_stock = Eigen::VectorXd::Zero(n),
                  carried_any = Eigen::VectorXd::Zero(n);
  const std::vector<double> ps = sales_pmf(lambda, level);
  for (Eigen::Index i = 0; i < n; ++i) {
    // Morning stock by remaining life 1..m: the carried units, then the delivery.
    std::vector<int> stock = states[static_cast<size_t>(i)];
    const int carried = std::accumulate(stock.begin(), stock.end(), 0);
    stock.push_back(level - carried);
    order[i] = level - carried;
    for (int s = 0; s <= level; ++s) {
      const std::vector<double> b = binomial_pmf(s, f);
      for (int j = 0; j <= s; ++j) {
        const double w = ps[static_cast<size_t>(s)] * b[static_cast<size_t>(j)];
        if (w == 0.0) continue;
        std::vector<int> left = stock;
        int need = j;  // from the oldest end
        for (size_t a = 0; need > 0; ++a) {
          const int t = std::min(need, left[a]);
          left[a] -= t;
          need -= t;
        }
        need = s - j;  // from the freshest end
        for (size_t a = left.size(); need > 0; --a) {
          const int t = std::min(need, left[a - 1]);
          left[a - 1] -= t;
          need -= t;
        }
        // Units with one day left leave at close; the others age by one day.
        const std::vector<int> next(left.begin() + 1, left.end());
        p(i, index.at(next)) += w;
        sales[i] += w * s;
        outdated[i] += w * left.front();
        in_stock[i] += s < level ? w : 0.0;
        carried_any[i] += std::accumulate(next.begin(), next.end(), 0) > 0 ? w : 0.0;
      }
    }
  }
  // pi (P - I) = 0 with the last equation replaced by sum(pi) = 1.
  Eigen::MatrixXd a = p.transpose() - Eigen::MatrixXd::Identity(n, n);
  a.row(n - 1).setOnes();
  Eigen::VectorXd rhs = Eigen::VectorXd::Zero(n);
  rhs[n - 1] = 1.0;
  const Eigen::VectorXd pi = a.fullPivLu().solve(rhs);

  ChainValues v;
  v.states = static_cast<int>(n);
  v.residual = (p.transpose() * pi - pi).cwiseAbs().maxCoeff();
  v.sales = pi.dot(sales);
  v.lost = lambda - v.sales;
  v.outdated = pi.dot(outdated);
  v.order = pi.dot(order);
  v.in_stock = pi.dot(in_stock);
  v.carried_any = pi.dot(carried_any);
  return v;
}

/// E[min(D, S)] and P(D < S) for D ~ Poisson(lambda), straight from the pmf.
double expected_sales(double lambda, int level) {
  const std::vector<double> p = sales_pmf(lambda, level);
  double e = 0.0;
  for (size_t s = 0; s < p.size(); ++s) e += static_cast<double>(s) * p[s];
  return e;
}
double prob_below(double lambda, int level) {
  return 1.0 - sales_pmf(lambda, level).back();
}

struct TableRow {
  int life;
  double f;
  int level;
  double sales, lost, outdated, order;
};

// checks.md 5.2 [C], lambda = 5, every row (FIFO: f = 1, LIFO: f = 0; m = 1 has no choice).
constexpr TableRow kTable[] = {
    {1, 1.0, 5, 4.122663, 0.877337, 0.877337, 5.000000},
    {1, 1.0, 8, 4.877891, 0.122109, 3.122109, 8.000000},
    {2, 1.0, 5, 4.122663, 0.877337, 0.036791, 4.159454},
    {2, 1.0, 6, 4.506702, 0.493298, 0.088299, 4.595001},
    {2, 1.0, 7, 4.744519, 0.255481, 0.179554, 4.924073},
    {2, 1.0, 8, 4.877891, 0.122109, 0.320519, 5.198410},
    {2, 1.0, 10, 4.977812, 0.022188, 0.766709, 5.744521},
    {2, 0.0, 5, 4.122663, 0.877337, 0.215928, 4.338591},
    {2, 0.0, 8, 4.877891, 0.122109, 1.252392, 6.130282},
    {2, 0.0, 10, 4.977812, 0.022188, 2.237069, 7.214881},
    {3, 1.0, 5, 4.122663, 0.877337, 0.001005, 4.123668},
    {3, 1.0, 8, 4.877891, 0.122109, 0.022587, 4.900477},
    {3, 1.0, 10, 4.977812, 0.022188, 0.089922, 5.067734},
    {3, 0.0, 5, 4.122663, 0.877337, 0.071640, 4.194303},
    {3, 0.0, 8, 4.877891, 0.122109, 0.684301, 5.562192},
    {3, 0.0, 10, 4.977812, 0.022188, 1.347482, 6.325295},
};

TEST_CASE("the exact perishable chain reproduces checks.md 5.2", "[engine][markov]") {
  for (const TableRow& row : kTable) {
    INFO("m=" << row.life << " f=" << row.f << " S=" << row.level);
    const ChainValues v = solve_chain(5.0, row.life, row.level, row.f);
    CHECK(v.residual < 1e-13);
    // The table has six decimals.
    CHECK(std::abs(v.sales - row.sales) <= 1e-6);
    CHECK(std::abs(v.lost - row.lost) <= 1e-6);
    CHECK(std::abs(v.outdated - row.outdated) <= 1e-6);
    CHECK(std::abs(v.order - row.order) <= 1e-6);
  }
  // checks.md 5.2 invariant 3: m = 1 is the newsvendor, outdated = E[(S - D)+].
  for (int level : {5, 8}) {
    const ChainValues v = solve_chain(5.0, 1, level, 0.5);
    CHECK(std::abs(v.outdated - (level - expected_sales(5.0, level))) <= 1e-12);
  }
}

TEST_CASE("the exact perishable chain satisfies the invariants of checks.md 5.2",
          "[engine][markov]") {
  for (double lambda : {4.0, 5.0, 6.0}) {
    for (int level : {5, 7, 9}) {
      const double sales = expected_sales(lambda, level);
      double previous_m = 0.0;
      for (int life : {1, 2, 3}) {
        double previous_f = 1e9;
        double fifo = 0.0;
        for (double f : {0.0, 0.5, 1.0}) {
          INFO("lambda=" << lambda << " m=" << life << " f=" << f << " S=" << level);
          const ChainValues v = solve_chain(lambda, life, level, f);
          CHECK(v.residual < 1e-13);
          // 1. Every day opens with S: sales and lost sales depend on neither m nor f.
          CHECK(std::abs(v.sales - sales) <= 1e-12);
          CHECK(std::abs(v.lost - (lambda - sales)) <= 1e-12);
          CHECK(std::abs(v.in_stock - prob_below(lambda, level)) <= 1e-12);
          // 2. Flow balance.
          CHECK(std::abs(v.order - (v.sales + v.outdated)) <= 1e-12);
          // 4. Outdating: FIFO <= f = 0.5 <= LIFO (strictly when units can carry over).
          //    With m = 1 nothing carries over and the issuing rule does not matter.
          if (life == 1 && f > 0.0) {
            CHECK(std::abs(v.outdated - previous_f) <= 1e-12);
          } else if (life > 1) {
            CHECK(v.outdated < previous_f);
          }
          previous_f = v.outdated;
          fifo = v.outdated;
        }
        // ... and it falls as m rises (FIFO shown; the loop above orders the others).
        if (life > 1) CHECK(fifo < previous_m);
        previous_m = fifo;
      }
    }
  }
}

// ---------------------------------------------------------------------------------------------
// The engine against the chain.

constexpr int kDays = 4050;
constexpr int kWarmup = 50;
constexpr int kReplications = 20;
constexpr double kScored = kDays - kWarmup;

struct Config {
  double lambda;
  int level;
  int life;
  double f;
};

struct Simulated {
  Estimate sales, lost, outdated, order, in_stock;
  std::vector<double> sales_series, lost_series, outdated_series, order_series;
};

Simulated simulate(const Config& c) {
  // One seed for all configurations: by model.md's common random numbers, demand draws are the
  // same whatever the shelf life or fifo_share (so the errors of the configurations are
  // correlated: with this seed, sales run about 1.2 standard errors low in every one of them).
  const Scenario s = test::scenario_from(fmt::format(R"(
format: 1
name: markov
seed: 1982
horizon: {{ days: {}, warmup_days: {} }}
replications: {}
stores: [ {{ id: s }} ]
customers: {{ fifo_share: {} }}
items:
  - {{ id: milk, price: 2, unit_cost: 1, shelf_life_days: {}, demand: {{ base: {} }} }}
policies:
  - name: up-to-S
    forecast: {{ method: oracle }}
    quantity: {{ rule: base_stock, level: {} }}
)",
                                                     kDays, kWarmup, kReplications, c.f, c.life,
                                                     c.lambda, c.level));
  const RunResult r = test::run_scenario(s);
  Simulated out;
  out.sales = test::metric_estimate(r, 0, Metric::sold_units, kScored);
  out.lost = test::metric_estimate(r, 0, Metric::lost_units, kScored);
  out.outdated = test::metric_estimate(r, 0, Metric::waste_units, kScored);
  out.order = test::metric_estimate(r, 0, Metric::delivered_units, kScored);
  out.in_stock = test::metric_estimate(r, 0, Metric::in_stock_at_close);
  out.sales_series = r.series(0, Metric::sold_units);
  out.lost_series = r.series(0, Metric::lost_units);
  out.outdated_series = r.series(0, Metric::waste_units);
  out.order_series = r.series(0, Metric::delivered_units);
  return out;
}

void check_within(const Estimate& e, double exact, double max_stderr, const char* what) {
  INFO(what << ": simulated " << e.mean << " +- " << e.stderr_ << " (n=" << e.n << "), exact "
            << exact);
  CHECK(e.n == kReplications);
  // The replications must be precise enough for the comparison to be able to fail.
  CHECK(e.stderr_ > 0.0);
  CHECK(e.stderr_ < max_stderr);
  CHECK(std::abs(e.mean - exact) <= 4.0 * e.stderr_);
}

TEST_CASE("the engine matches the exact perishable chain for mixed issuing", "[engine][markov]") {
  std::vector<Config> configs;
  for (double lambda : {4.0, 5.0, 6.0})
    for (int level : {5, 7, 9})
      for (int life : {2, 3})
        for (double f : {0.0, 0.5, 1.0}) configs.push_back({lambda, level, life, f});

  std::vector<ChainValues> exact;
  std::vector<Simulated> sim;
  for (const Config& c : configs) {
    exact.push_back(solve_chain(c.lambda, c.life, c.level, c.f));
    sim.push_back(simulate(c));
  }

  // Largest standard errors allowed (units per day, and a share for in stock), so that the
  // comparisons can fail: a 4-standard-error band is then at most 0.04 units a day (about 1% of
  // sales) and 0.016 of in stock. With 20 x 4000 scored days the largest are about 0.0066
  // units and 0.002. The differences in outdating and in stock that the comparisons must
  // resolve are checked against the actual standard errors further down.
  constexpr double kMaxUnitsSe = 0.01;
  constexpr double kMaxShareSe = 0.004;
  double best_in_stock_gap = 0.0;  // in stock at close versus "a unit survives the night"
  for (size_t k = 0; k < configs.size(); ++k) {
    const Config& c = configs[k];
    const ChainValues& v = exact[k];
    const Simulated& e = sim[k];
    INFO("lambda=" << c.lambda << " m=" << c.life << " f=" << c.f << " S=" << c.level);
    CHECK(v.residual < 1e-13);
    check_within(e.outdated, v.outdated, kMaxUnitsSe, "outdated (waste)");
    check_within(e.sales, v.sales, kMaxUnitsSe, "sales");
    check_within(e.order, v.order, kMaxUnitsSe, "deliveries");
    check_within(e.lost, v.lost, kMaxUnitsSe, "lost sales");
    check_within(e.in_stock, v.in_stock, kMaxShareSe, "in stock at close");
    best_in_stock_gap =
        std::max(best_in_stock_gap, std::abs(v.in_stock - v.carried_any) / e.in_stock.stderr_);
    // Flow balance per replication: delivered - sold - wasted is the change in carried stock
    // over the scored days, between -S and S.
    for (size_t r = 0; r < e.order_series.size(); ++r) {
      const double gap = e.order_series[r] - e.sales_series[r] - e.outdated_series[r];
      CHECK(std::abs(gap) <= c.level);
    }
  }
  // The in-stock comparison can tell model.md's definition from one that leaves out the units
  // expiring that night.
  CHECK(best_in_stock_gap > 8.0);

  // Invariants across configurations of the same lambda and S.
  const auto find = [&](double lambda, int level, int life, double f) {
    for (size_t k = 0; k < configs.size(); ++k) {
      const Config& c = configs[k];
      if (c.lambda == lambda && c.level == level && c.life == life && c.f == f) return k;
    }
    FAIL("configuration not simulated");
    return size_t{0};
  };
  for (size_t k = 0; k < configs.size(); ++k) {
    const Config& c = configs[k];
    if (c.life != 2 || c.f != 0.0) continue;  // one base per (lambda, S)
    INFO("lambda=" << c.lambda << " S=" << c.level);
    for (int life : {2, 3}) {
      const size_t fifo = find(c.lambda, c.level, life, 1.0);
      const size_t half = find(c.lambda, c.level, life, 0.5);
      const size_t lifo = find(c.lambda, c.level, life, 0.0);
      INFO("m=" << life);
      // Sales and lost sales do not depend on m or f: with every day opening at S and the same
      // demand draws, they are the same in every replication.
      for (size_t other : {fifo, half, lifo}) {
        CHECK(sim[other].sales_series == sim[k].sales_series);
        CHECK(sim[other].lost_series == sim[k].lost_series);
      }
      // Outdating: FIFO <= f = 0.5 <= LIFO, and f = 0.5 is resolved from both ends, so an
      // engine that ignored a mixed fifo_share would fail the comparison above.
      CHECK(sim[fifo].outdated.mean <= sim[half].outdated.mean);
      CHECK(sim[half].outdated.mean <= sim[lifo].outdated.mean);
      const double se = sim[half].outdated.stderr_;
      CHECK(exact[half].outdated - exact[fifo].outdated > 8.0 * se);
      CHECK(exact[lifo].outdated - exact[half].outdated > 8.0 * se);
    }
    // Outdating falls as m rises.
    for (double f : {0.0, 0.5, 1.0}) {
      INFO("f=" << f);
      CHECK(sim[find(c.lambda, c.level, 3, f)].outdated.mean <
            sim[find(c.lambda, c.level, 2, f)].outdated.mean);
    }
  }
}

}  // namespace
}  // namespace larder
