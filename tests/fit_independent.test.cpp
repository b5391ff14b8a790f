// `larder fit` against histories written outside larder: tests/fit_history_gen.py (numpy and
// scipy through /usr/bin/python3, seeded) draws every customer of three stores and three items
// for a year, serves them in time order with substitution (a rye customer who finds rye out
// takes spelt with probability 0.4, a bun customer who finds bun out spelt with 0.3),
// stocks each day at 1.2 x the sales of the same weekday a week before (so the days that did
// not sell out are selected by last week's demand) and writes larder's history format. Truths:
// bases 18 (rye, negative binomial cv 0.35), 14 (spelt, Poisson) and 10 (bun, Poisson) at
// stores whose sizes average 1 and weekday multipliers that average 1; no persistence, or a
// latent lag-7 correlation of 0.4 (a Gaussian AR process on the normal scores of the day's
// demand). Every tolerance is a multiple of the fit's own standard error (or interval), and
// "over repeated histories" means the mean of the estimates lies within 2 standard errors of
// that mean of the truth.

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <cmath>
#include <filesystem>
#include <map>

#include "reports/markup_check.test.hpp"
#include "sim/fit/scenario_writer.hpp"
#include "sim/history/history_reader.hpp"
#include "sim/history/item_file.hpp"
#include "sim/runner/fit_check.hpp"
#include "sim/scenario/load_scenario.hpp"
#include "tests/cli_runner.test.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

struct Generated {
  fs::path history, items;
};

/// Writes the history of `seed` (lag-7 correlation `lag7`) with the independent generator.
Generated generate(int seed, double lag7) {
  const fs::path dir = test::scratch_dir("fit-independent");
  fs::create_directories(dir);
  Generated g{dir / fmt::format("h{}-{}.csv", seed, lag7), dir / fmt::format("i{}.csv", seed)};
  const test::ProcessResult p = test::run_command_line(fmt::format(
      "{} {}/tests/fit_history_gen.py --seed {} --lag7 {} --out {} --items-out {}", LARDER_PYTHON,
      LARDER_SOURCE_DIR, seed, lag7, g.history.string(), g.items.string()));
  INFO(p.output);
  REQUIRE(p.code == 0);
  return g;
}

FitResult fit_file(const fs::path& file, bool substitution) {
  SeriesBuilder b(file.string());
  const HistoryColumns columns =
      read_history_file(file.string(), [&](const HistoryRow& row) { b.add(row); });
  FitOptions o;
  o.substitution = substitution;
  return fit_history(b.finish(columns), o);
}

int item_index(const FitResult& r, const std::string& id) {
  for (size_t i = 0; i < r.data.items.size(); ++i)
    if (r.data.items[i] == id) return static_cast<int>(i);
  FAIL("no item " << id);
  return -1;
}

const SubstituteShare* share_of(const FitResult& r, const std::string& out,
                                const std::string& substitute) {
  for (const SubstituteShare& x : r.substitution)
    if (r.data.items[x.out_item] == out && r.data.items[x.substitute] == substitute) return &x;
  return nullptr;
}

const std::map<std::string, double> kBase = {{"rye", 18.0}, {"spelt", 14.0}, {"bun", 10.0}};

/// Mean of estimates against the truth over repeated histories: within 2 standard errors of
/// the mean (the root of the summed variances over the count).
struct Pooled {
  double sum = 0.0, var = 0.0;
  int n = 0;
  void add(double estimate_minus_truth, double se) {
    sum += estimate_minus_truth, var += se * se, ++n;
  }
  double mean() const { return sum / n; }
  double se() const { return std::sqrt(var) / n; }
};

TEST_CASE("independent histories without persistence: shares, bases, cv and lag-7 come back",
          "[fit][independent]") {
  std::map<std::string, Pooled> shares;
  int lag7_cover = 0, lag7_intervals = 0, poisson_limit = 0;
  const std::vector<int> seeds = {11, 12, 13, 14};
  for (const int seed : seeds) {
    const Generated g = generate(seed, 0.0);
    const FitResult r = fit_file(g.history, true);
    INFO("seed " << seed);
    REQUIRE(r.substitution_converged);
    for (const auto& [out, sub, truth] :
         {std::tuple{"rye", "spelt", 0.4}, std::tuple{"bun", "spelt", 0.3}}) {
      const SubstituteShare* x = share_of(r, out, sub);
      REQUIRE(x != nullptr);
      INFO(out << " -> " << sub << ": " << x->share << " se " << x->se);
      CHECK(std::abs(x->share - truth) < 4 * x->se);
      shares[std::string(out) + ">" + sub].add(x->share - truth, x->se);
    }
    // Every other pair has no substitution: its share is noise around 0.
    for (const SubstituteShare& x : r.substitution) {
      if (r.data.items[x.substitute] == "spelt") continue;
      INFO(r.data.items[x.out_item] << " -> " << r.data.items[x.substitute] << ": " << x.share);
      CHECK(std::abs(x.share) < 4 * x.se);
    }
    for (const auto& [id, base] : kBase) {
      const ItemEstimate& e = r.fit.items[static_cast<size_t>(item_index(r, id))];
      INFO(id << " base " << e.base << " se " << e.base_se);
      REQUIRE(e.fitted);
      // Own demand: the substitute sales are not counted in the base.
      CHECK(std::abs(e.base - base) < 4 * e.base_se);
      // The exposure MLE (gamma-mixed Poisson arrivals for rye) agrees with the truth too.
      const IntradayFit& in = r.intraday[static_cast<size_t>(item_index(r, id))];
      REQUIRE(in.exposure_base);
      CHECK(std::abs(*in.exposure_base - base) < 4 * in.exposure_se);
      // No persistence: the lag-7 interval covers 0 in about 95% of cases.
      const PersistenceFit& p = r.persistence[static_cast<size_t>(item_index(r, id))];
      INFO("lag-7 " << p.correlation << " [" << p.low << ", " << p.high << "] se " << p.se);
      CHECK(std::abs(p.correlation) < 4 * p.se);
      ++lag7_intervals;
      lag7_cover += p.low <= 0.0 && p.high >= 0.0 ? 1 : 0;
      const PersistenceFit& q = r.persistence_lag1[static_cast<size_t>(item_index(r, id))];
      CHECK(std::abs(q.correlation) < 4 * q.se);
    }
    // The spread: rye's cv near 0.35 on its profile interval's scale; bun is Poisson, and the
    // negative binomial's interval for it reaches the Poisson limit (the likelihood-ratio test
    // of the boundary rejects at 2.5%; Self and Liang 1987).
    const ItemEstimate& rye = r.fit.items[static_cast<size_t>(item_index(r, "rye"))];
    INFO("rye cv " << rye.cv << " [" << rye.cv_low << ", " << rye.cv_high << "]");
    CHECK(rye.family == DemandFamily::negative_binomial);
    CHECK(rye.cv_low < rye.cv);
    CHECK(rye.cv_high > rye.cv);
    // The interval's width is about 2 x 1.96 standard errors: within about 4 of them.
    CHECK(std::abs(rye.cv - 0.35) < rye.cv_high - rye.cv_low);
    const ItemEstimate& bun = r.fit.items[static_cast<size_t>(item_index(r, "bun"))];
    INFO("bun cv interval [" << bun.cv_low << ", " << bun.cv_high << "]");
    REQUIRE(!std::isnan(bun.cv_high));
    poisson_limit += bun.cv_low_at_poisson ? 1 : 0;
  }
  for (const auto& [pair, p] : shares) {
    INFO(pair << ": mean error " << p.mean() << " se " << p.se());
    CHECK(std::abs(p.mean()) < 2 * p.se());
  }
  // Binomial(12, 0.95): 9 or fewer intervals covering 0 has probability 0.02.
  CHECK(lag7_cover >= 10);
  CHECK(lag7_intervals == 12);
  // Binomial(4, 0.975): 2 or fewer at the Poisson limit has probability 0.004.
  CHECK(poisson_limit >= 3);
}

TEST_CASE("independent histories with a lag-7 correlation of 0.4: it comes back",
          "[fit][independent]") {
  Pooled rho;
  for (const int seed : {21, 22}) {
    const Generated g = generate(seed, 0.4);
    const FitResult r = fit_file(g.history, true);
    for (const std::string id : {"rye", "bun"}) {
      const PersistenceFit& p = r.persistence[static_cast<size_t>(item_index(r, id))];
      INFO(seed << " " << id << " lag-7 " << p.correlation << " [" << p.low << ", " << p.high
                << "] se " << p.se);
      CHECK(std::abs(p.correlation - 0.4) < 4 * p.se);
      CHECK(p.distinguishable());
      rho.add(p.correlation - 0.4, p.se);
    }
  }
  // Not checked against 2 standard errors of the mean: with persistence the stock of a day
  // also depends on the chain before the pair, which the pairwise likelihood does not see, and
  // the estimate reads low (README, "Fitting a history"). Printed for the record.
  WARN("lag-7 0.4: mean error over 4 estimates " << rho.mean() << " (se " << rho.se() << ")");
}

TEST_CASE("fit --check: the fitted scenario reproduces the history's sell-out shares",
          "[fit][independent]") {
  const Generated g = generate(11, 0.0);
  const FitResult r = fit_file(g.history, true);
  WriteOptions w;
  w.name = "fitted";
  w.history_file = g.history.string();
  w.items_file = g.items.string();
  w.items = read_item_file(g.items.string());
  const std::vector<ItemCheck> checks = check_fit(r, w, 100, 2);
  REQUIRE(checks.size() == 3);
  for (const ItemCheck& c : checks) {
    INFO(c.item << ": sold out " << c.sold_out.history << " fitted " << c.sold_out.low << "-"
                << c.sold_out.high << "; sales " << c.sales.history << " fitted " << c.sales.low
                << "-" << c.sales.high);
    CHECK(c.store_days == 3 * 364);
    CHECK(c.sold_out.inside());
    CHECK(std::abs(c.sales.history - c.sales.mean) < 4 * c.sales.sd);
  }
}

}  // namespace
}  // namespace larder
