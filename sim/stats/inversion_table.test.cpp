// The draw table must return exactly what the sampler's walk returns (it is only a faster way to
// the same inversion), and cdf_run must equal cdf(k) bit for bit.

#include "sim/stats/inversion_table.hpp"

#include <catch2/catch.hpp>
#include <cmath>

#include "sim/random/stream.hpp"

namespace larder {
namespace {

std::vector<CountLaw> laws() {
  return {
      CountLaw::make(DemandFamily::poisson, 0.0, {}, {}),
      CountLaw::make(DemandFamily::poisson, 0.4, {}, {}),
      CountLaw::make(DemandFamily::poisson, 20.0, {}, {}),
      CountLaw::make(DemandFamily::poisson, 350.0, {}, {}),
      CountLaw::make(DemandFamily::negative_binomial, 12.0, 0.5, {}),
      CountLaw::make(DemandFamily::negative_binomial, 3.0, {}, 0.7),
      CountLaw::make(DemandFamily::normal, 40.0, 0.3, {}),
  };
}

TEST_CASE("cdf_run equals cdf(k) bit for bit", "[stats][inversion]") {
  for (const CountLaw& law : laws()) {
    const CountSampler s(law);
    for (int first : {0, 3, 17}) {
      std::vector<double> run(200);
      s.cdf_run(first, run);
      for (size_t n = 0; n < run.size(); ++n) {
        INFO("family " << to_string(law.family) << " mean " << law.mean << " k " << first + n);
        CHECK(run[n] == s.cdf(first + static_cast<int>(n)));
      }
    }
  }
}

TEST_CASE("InversionTable returns exactly the sampler's count for every uniform",
          "[stats][inversion]") {
  for (const CountLaw& law : laws()) {
    const CountSampler s(law);
    const InversionTable t(law);
    INFO("family " << to_string(law.family) << " mean " << law.mean);
    pcg32 g(2026, 12);
    for (int n = 0; n < 200000; ++n) {
      const double u = to_unit(g());
      REQUIRE(t(u) == s(u));
    }
    // The extremes of to_unit, and uniforms exactly at and just above cdf values, where an
    // off-by-one would show.
    for (double u : {to_unit(0), to_unit(1), to_unit(0xfffffffeu), to_unit(0xffffffffu)}) {
      CHECK(t(u) == s(u));
    }
    for (int k = 0; k < 60; ++k) {
      const double f = s.cdf(k);
      if (f <= 0.0 || f >= 1.0) continue;
      CHECK(t(f) == s(f));
      CHECK(t(std::nextafter(f, 2.0)) == s(std::nextafter(f, 2.0)));
      CHECK(t(std::nextafter(f, 0.0)) == s(std::nextafter(f, 0.0)));
    }
  }
}

TEST_CASE("A law too wide for a table falls back to the walk", "[stats][inversion]") {
  const CountLaw law = CountLaw::make(DemandFamily::poisson, 20.0, {}, {});
  const InversionTable none(law, 0);
  const CountSampler s(law);
  CHECK(none.bytes() < InversionTable(law).bytes());
  pcg32 g(1, 2);
  for (int n = 0; n < 1000; ++n) {
    const double u = to_unit(g());
    CHECK(none(u) == s(u));
  }
}

}  // namespace
}  // namespace larder
