// Round trip of the multiplicative censored-likelihood fit on a history simulated here with
// known demand and a fixed stock per store-item-weekday, so the censoring is known and the
// naive estimate (sales taken as demand) has a closed form: E[min(D, S)] = mu - sigma L(z),
// z = (S - mu) / sigma, L the standard normal loss function (Nahmias, Production and
// Operations Analysis; checks.md 1.2 and 3(d)). For the count max(0, round(X)) the shortfall is
// sum_{k > S} P(X >= k - 0.5), the midpoint rule for the integral sigma L(z), off by about
// phi(z) / (24 sigma) (well below the standard errors used here).

#include "sim/fit/decomposition.hpp"

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <cmath>

#include "sim/random/stream.hpp"
#include "sim/stats/count_law.hpp"
#include "sim/stats/normal.hpp"

namespace larder {
namespace {

struct TrueItem {
  std::string id;
  double base;
  std::array<double, 7> weekday;  // average 1, the fit's normalisation
  DemandFamily family;
  double cv;
};

const std::array<double, 4> kSizes = {0.6, 0.9, 1.1, 1.4};  // average 1
const std::vector<TrueItem> kItems = {
    {"loaf", 40, {0.8, 0.9, 0.9, 1.0, 1.1, 1.3, 1.0}, DemandFamily::normal, 0.25},
    {"tart", 15, {1.2, 1.0, 0.9, 0.9, 1.0, 1.0, 1.0}, DemandFamily::negative_binomial, 0.4},
};
constexpr int kDays = 364;
constexpr double kZ = 0.3;  // stock = mean + 0.3 sd, rounded: about 38% of days sell out

struct Simulated {
  FitData data;
  double loaf_sales = 0, loaf_residual_sq = 0, loaf_expected_sales = 0, loaf_expected_demand = 0;
  int loaf_days = 0;
};

Simulated simulate() {
  SeriesBuilder b("simulated.csv");
  Simulated out;
  const CivilDate monday{2027, 1, 4};
  for (size_t i = 0; i < kItems.size(); ++i) {
    const TrueItem& it = kItems[i];
    for (size_t s = 0; s < kSizes.size(); ++s) {
      pcg32 g = make_stream({20261202, 0, static_cast<std::uint32_t>(s),
                             static_cast<std::uint32_t>(i), Purpose::demand});
      for (int d = 0; d < kDays; ++d) {
        const double mu = it.base * kSizes[s] * it.weekday[d % 7];
        const double sd = it.cv * mu;
        const int stock = static_cast<int>(std::lround(mu + kZ * sd));
        const int demand =
            CountLaw::make(it.family, mu, it.cv, std::nullopt).quantile(to_unit(g()));
        HistoryRow row;
        row.date = add_days(monday, d);
        row.store = fmt::format("s{}", s);
        row.item = it.id;
        row.delivered = stock;
        row.sold = std::min(demand, stock);
        row.leftover = stock - row.sold;
        row.sold_out = row.leftover == 0;
        b.add(row);
        if (i == 0) {
          out.loaf_sales += row.sold;
          const double expected = mu - sd * normal_loss((stock - mu) / sd);
          out.loaf_residual_sq += (row.sold - expected) * (row.sold - expected);
          out.loaf_expected_demand += mu;
          out.loaf_expected_sales += expected;
          out.loaf_days++;
        }
      }
    }
  }
  out.data = b.finish(HistoryColumns{});
  return out;
}

TEST_CASE("censored fit recovers base, weekday multipliers, cv and sizes", "[fit]") {
  const Simulated sim = simulate();
  const Decomposition f = fit_decomposition(sim.data, FitOptions{});
  REQUIRE(f.items.size() == 2);
  REQUIRE(f.stores.size() == 4);
  for (size_t i = 0; i < kItems.size(); ++i) {
    const TrueItem& t = kItems[i];
    const ItemEstimate& e = f.items[i];
    INFO(t.id);
    REQUIRE(e.fitted);
    CHECK(e.converged);
    CHECK(e.family == t.family);          // AIC picks the law the days were drawn from
    CHECK(e.censored_days > e.days / 4);  // the test is about censoring
    // 4 standard errors from the observed information; the errors must be small enough to tell
    // the censored fit from the naive one.
    CHECK(std::abs(e.base - t.base) < 4 * e.base_se);
    CHECK(e.base_se < 0.02 * t.base);
    CHECK(t.base - e.naive_base > 4 * e.base_se);  // sales as demand is biased low
    for (int w = 0; w < 7; ++w) {
      INFO("weekday " << w);
      CHECK(std::abs(e.weekday[w] - t.weekday[w]) < 4 * e.weekday_se[w]);
      CHECK(e.weekday_se[w] < 0.05);
    }
    CHECK(std::abs(e.cv - t.cv) < 4 * e.cv_se);
    CHECK(e.cv_se < 0.1 * t.cv);
  }
  for (size_t s = 0; s < kSizes.size(); ++s) {
    CHECK(std::abs(f.stores[s].size - kSizes[s]) < 4 * f.stores[s].size_se);
    CHECK(f.stores[s].size_se < 0.02);
  }
}

TEST_CASE("naive mean of sales is biased low by sigma L(z)", "[fit]") {
  // checks.md 3(d): E[sales] = mu - sigma L(z) < mu. The sample mean of the loaf's sales must
  // be within 4 standard errors of the closed form and far below the true mean.
  const Simulated sim = simulate();
  const double n = sim.loaf_days;
  const double mean = sim.loaf_sales / n;
  // Days are independent with different means (store, weekday): the standard error of the
  // mean from each day's deviation from its own expectation.
  const double se = std::sqrt(sim.loaf_residual_sq) / n;
  const double expected = sim.loaf_expected_sales / n;
  const double true_mean = sim.loaf_expected_demand / n;
  CHECK(std::abs(mean - expected) < 4 * se);
  CHECK(true_mean - expected > 8 * se);  // the bias is large against the noise
}

TEST_CASE("items and stores with too little data are flagged, not fitted", "[fit]") {
  SeriesBuilder b("short.csv");
  const CivilDate monday{2027, 1, 4};
  for (int d = 0; d < 60; ++d) {
    for (const char* item : {"plenty", "scarce"}) {
      HistoryRow row;
      row.date = add_days(monday, d);
      row.store = "corner";
      row.item = item;
      const bool scarce = std::string(item) == "scarce";
      row.delivered = 10;
      row.sold = scarce && d % 7 != 2 ? 10 : 5 + d % 4;  // scarce sells out except on wednesdays
      row.leftover = 10 - row.sold;
      row.sold_out = row.leftover == 0;
      b.add(row);
    }
  }
  const Decomposition f = fit_decomposition(b.finish(HistoryColumns{}), FitOptions{});
  CHECK(f.items[0].fitted);
  CHECK_FALSE(f.items[1].fitted);
  CHECK_THAT(f.items[1].problem, Catch::Contains("not enough data"));
}

}  // namespace
}  // namespace larder
