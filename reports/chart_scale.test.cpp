// Axis ticks and the linear scale on cases worked by hand. The rule (chart_scale.hpp): the
// smallest step s = m x 10^k, m in {1, 2, 5}, for which ceil(hi / s) - floor(lo / s) is at most
// the allowed number of intervals; the axis runs from floor(lo / s) s to ceil(hi / s) s.

#include "reports/chart_scale.hpp"

#include <catch2/catch.hpp>

namespace larder {
namespace {

TEST_CASE("nice_axis on [0, 0.87]: step 0.2, ticks 0 to 1.0", "[html]") {
  // At most 5 intervals. s = 0.1: ceil(8.7) - 0 = 9 > 5; s = 0.2: ceil(4.35) = 5 <= 5.
  const Axis a = nice_axis(0.0, 0.87, 5);
  CHECK(a.step == 0.2);
  CHECK(a.ticks == std::vector<double>{0.0, 0.2, 0.4, 0.6, 0.8, 1.0});  // the doubles nearest
  CHECK(a.lo == 0.0);
  CHECK(a.hi == 1.0);
  CHECK(a.decimals == 1);
  CHECK(tick_label(a, a.ticks[3]) == "0.6");  // not 0.6000000000000001 (3 x 0.2)
}

TEST_CASE("nice_axis on money: thousands, separators in labels", "[html]") {
  // [0, 2701.5], 5 intervals: s = 500 gives ceil(5.403) = 6 > 5; s = 1000 gives 3.
  const Axis a = nice_axis(0.0, 2701.5, 5);
  CHECK(a.step == 1000.0);
  CHECK(a.ticks == std::vector<double>{0.0, 1000.0, 2000.0, 3000.0});
  CHECK(a.decimals == 0);
  CHECK(tick_label(a, 2000.0) == "2,000");
  // With 6 intervals allowed, s = 500 fits: 0, 500, ..., 3000.
  CHECK(nice_axis(0.0, 2701.5, 6).ticks.size() == 7);
}

TEST_CASE("nice_axis spans negative values and does not start at zero when not asked", "[html]") {
  // [-3.2, 7.9]: s = 2 gives ceil(3.95) - floor(-1.6) = 4 - (-2) = 6 > 5; s = 5 gives
  // ceil(1.58) - floor(-0.64) = 2 - (-1) = 3.
  const Axis a = nice_axis(-3.2, 7.9, 5);
  CHECK(a.ticks == std::vector<double>{-5.0, 0.0, 5.0, 10.0});
  // [12.3, 13.1], 4 intervals: s = 0.2 gives ceil(65.5) - floor(61.5) = 66 - 61 = 5 > 4;
  // s = 0.5 gives ceil(26.2) - floor(24.6) = 27 - 24 = 3.
  const Axis b = nice_axis(12.3, 13.1, 4);
  CHECK(b.ticks == std::vector<double>{12.0, 12.5, 13.0, 13.5});
  CHECK(tick_label(b, 12.5) == "12.5");
  CHECK(tick_label(b, 13.0) == "13.0");
}

TEST_CASE("nice_axis keeps data ends that sit on a tick", "[html]") {
  // 1 / 0.2 is 4.999... or 5.000...1 in doubles; either way the axis must end at 1, not 1.2.
  CHECK(nice_axis(0.0, 1.0, 5).ticks == std::vector<double>{0.0, 0.2, 0.4, 0.6, 0.8, 1.0});
  // 0.3 / 0.1 = 2.9999999999999996: the axis [0, 0.3] in steps of 0.1 has 3 intervals.
  CHECK(nice_axis(0.0, 0.3, 3).ticks == std::vector<double>{0.0, 0.1, 0.2, 0.3});
  // Small steps: [0, 0.0042], 5 intervals: s = 0.001 gives ceil(4.2) = 5.
  const Axis small = nice_axis(0.0, 0.0042, 5);
  CHECK(small.step == 0.001);
  CHECK(small.decimals == 3);
  CHECK(small.hi == 0.005);
}

TEST_CASE("nice_axis widens empty and unusable spans", "[html]") {
  CHECK(nice_axis(0.0, 0.0).ticks == std::vector<double>{0.0, 0.2, 0.4, 0.6, 0.8, 1.0});
  // [8, 8] widens to [4, 12]: s = 2 gives 6 - 2 = 4 intervals.
  CHECK(nice_axis(8.0, 8.0).ticks == std::vector<double>{4.0, 6.0, 8.0, 10.0, 12.0});
  CHECK(nice_axis(std::nan(""), 3.0).ticks.front() == 0.0);
  CHECK(nice_axis(std::nan(""), 3.0).ticks.back() == 1.0);
  // Reversed ends are swapped.
  CHECK(nice_axis(0.87, 0.0).hi == 1.0);
}

TEST_CASE("LinearScale maps the domain onto the range, also reversed", "[html]") {
  // A y axis drawn downwards: [0, 1] onto [300, 20]; 0.25 -> 300 - 0.25 x 280 = 230.
  const LinearScale y(0.0, 1.0, 300.0, 20.0);
  CHECK(y(0.0) == 300.0);
  CHECK(y(1.0) == 20.0);
  CHECK(y(0.25) == Approx(230.0));
  // [-5, 10] onto [0, 600]: 0 -> 5 / 15 x 600 = 200; 12.5 extrapolates to 17.5 / 15 x 600 = 700.
  const LinearScale x(-5.0, 10.0, 0.0, 600.0);
  CHECK(x(0.0) == Approx(200.0));
  CHECK(x(12.5) == Approx(700.0));
}

}  // namespace
}  // namespace larder
