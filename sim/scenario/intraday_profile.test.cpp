// Tests of the intraday profiles. Every expected value here is computed by hand from the
// definitions (shares are weights divided by their sum; arrivals are uniform within an hour), not
// taken from the code under test.

#include "sim/scenario/intraday_profile.hpp"

#include <algorithm>
#include <catch2/catch.hpp>
#include <numeric>
#include <string>
#include <vector>

namespace {

/// Index of the largest share (the first when tied).
size_t peak_index(const std::vector<double>& shares) {
  return static_cast<size_t>(std::max_element(shares.begin(), shares.end()) - shares.begin());
}

}  // namespace

TEST_CASE("every named profile gives one share per opening hour, summing to 1", "[scenario]") {
  for (const auto name : larder::kIntradayProfiles) {
    INFO(std::string(name));
    CHECK(larder::is_intraday_profile(name));
    const std::vector<double> shares = larder::intraday_shares(name, {}, 8, 20);
    REQUIRE(shares.size() == 12);  // 8:00 to 20:00
    CHECK(std::accumulate(shares.begin(), shares.end(), 0.0) == Approx(1.0).epsilon(1e-12));
    for (const double s : shares) CHECK(s > 0.0);
  }
  CHECK_FALSE(larder::is_intraday_profile("lunch"));
}

TEST_CASE("flat gives equal shares", "[scenario]") {
  // By hand: 12 opening hours, 1/12 each.
  for (const double s : larder::intraday_shares("flat", {}, 8, 20)) {
    CHECK(s == Approx(1.0 / 12.0).epsilon(1e-12));
  }
}

TEST_CASE("a list of weights is normalised as given", "[scenario]") {
  // By hand: weights 1, 2, 3, 2 sum to 8, so the shares are 1/8, 2/8, 3/8, 2/8.
  const std::vector<double> weights = {1, 2, 3, 2};
  const std::vector<double> shares = larder::intraday_shares("flat", weights, 8, 12);
  REQUIRE(shares.size() == 4);
  CHECK(shares[0] == Approx(0.125));
  CHECK(shares[1] == Approx(0.25));
  CHECK(shares[2] == Approx(0.375));
  CHECK(shares[3] == Approx(0.25));
  // The weights win over the profile name.
  CHECK(larder::intraday_shares("evening_peak", weights, 8, 12) == shares);
  // Zero weights are allowed (an hour without customers) as long as one is not zero.
  const std::vector<double> gap = {0, 3, 1};
  const std::vector<double> g = larder::intraday_shares("flat", gap, 8, 11);
  CHECK(g[0] == 0.0);
  CHECK(g[1] == Approx(0.75));
  CHECK(g[2] == Approx(0.25));
}

TEST_CASE("the peaks fall in the hours their names say", "[scenario]") {
  // intraday_profile.hpp: the bells are centred at 8:30, 12:30 and 17:30, so the largest share is
  // the hour starting at 8:00, 12:00 and 17:00. Index = clock hour - opening hour (8).
  CHECK(peak_index(larder::intraday_shares("morning_peak", {}, 8, 20)) == 0);  // 8:00
  CHECK(peak_index(larder::intraday_shares("midday_peak", {}, 8, 20)) == 4);   // 12:00
  CHECK(peak_index(larder::intraday_shares("evening_peak", {}, 8, 20)) == 9);  // 17:00
  // With other opening hours the peak stays at the same clock hour.
  CHECK(peak_index(larder::intraday_shares("evening_peak", {}, 6, 22)) == 11);  // 17:00
  // Shares fall away from the peak on both sides.
  const std::vector<double> e = larder::intraday_shares("evening_peak", {}, 8, 20);
  CHECK(e[8] < e[9]);
  CHECK(e[10] < e[9]);
  CHECK(e[0] < e[8]);
}

TEST_CASE("elapsed_share is linear within an hour", "[scenario]") {
  // By hand, flat over 4 hours (a quarter each): 1.5 hours after opening, one whole hour and half
  // of the next have passed, 0.25 + 0.5 * 0.25 = 0.375.
  const std::vector<double> flat = larder::intraday_shares("flat", {}, 8, 12);
  CHECK(larder::elapsed_share(flat, 0.0) == 0.0);
  CHECK(larder::elapsed_share(flat, 1.5) == Approx(0.375));
  CHECK(larder::elapsed_share(flat, 2.25) == Approx(0.5625));  // 0.5 + 0.25 * 0.25
  CHECK(larder::elapsed_share(flat, 4.0) == Approx(1.0));
  CHECK(larder::elapsed_share(flat, 6.0) == Approx(1.0));  // after closing: the whole day
  // By hand, weights 1, 2, 3, 2 (shares 1/8, 2/8, 3/8, 2/8): 2.5 hours after opening,
  // 1/8 + 2/8 + 0.5 * 3/8 = 0.5625.
  const std::vector<double> weights = {1, 2, 3, 2};
  const std::vector<double> w = larder::intraday_shares("flat", weights, 8, 12);
  CHECK(larder::elapsed_share(w, 2.5) == Approx(0.5625));
  CHECK(larder::elapsed_share(w, 3.0) == Approx(0.75));
}
