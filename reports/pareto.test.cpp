// pareto_front on a hand-made set (waste share to lower, in-stock to raise), worked by hand:
//   a (0.10, 0.60)  b (0.12, 0.70)  c (0.15, 0.70)  d (0.20, 0.90)  e (0.11, 0.55)  f (0.10, 0.60)
// c is dominated by b (more waste, same in-stock); e by a (more waste, less in-stock); a and f
// are identical and undominated; b and d trade waste for in-stock.

#include "reports/pareto.hpp"

#include <catch2/catch.hpp>

namespace larder {
namespace {

TEST_CASE("pareto_front marks the undominated points", "[reports][sweep]") {
  const std::vector<double> waste = {0.10, 0.12, 0.15, 0.20, 0.11, 0.10};
  const std::vector<double> in_stock = {0.60, 0.70, 0.70, 0.90, 0.55, 0.60};
  CHECK(pareto_front(waste, in_stock) == std::vector<bool>{true, true, false, true, false, true});
  CHECK(pareto_front(std::vector<double>{}, std::vector<double>{}).empty());
  CHECK(pareto_front(std::vector<double>{1.0}, std::vector<double>{0.0}) ==
        std::vector<bool>{true});
}

}  // namespace
}  // namespace larder
