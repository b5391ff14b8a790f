// Ranks of policies at each value of a sensitivity sweep, worked by hand: competition ranks with
// ties, missing means last, the best that changes even when every policy keeps its sign against
// the baseline, and lower-is-better metrics.

#include "reports/policy_ranks.hpp"

#include <catch2/catch.hpp>
#include <cmath>

namespace larder {
namespace {

TEST_CASE("competition ranks, ties and missing means", "[sweep]") {
  CHECK(rank_policies({10, 30, 20}, +1) == std::vector<int>{3, 1, 2});
  CHECK(rank_policies({10, 30, 20}, -1) == std::vector<int>{1, 3, 2});
  CHECK(rank_policies({5, 7, 7, 1}, +1) == std::vector<int>{3, 1, 1, 4});  // "1134"
  CHECK(rank_policies({5, std::nan(""), 7}, +1) == std::vector<int>{2, 3, 1});
  CHECK(rank_policies({}, +1).empty());
}

RankPoint point(std::string input, std::string value, std::vector<double> means) {
  RankPoint p;
  p.input = std::move(input);
  p.value = std::move(value);
  p.means = std::move(means);
  return p;
}

TEST_CASE("the best policy changes although every policy keeps its sign", "[sweep]") {
  // Profit of a baseline and three rules. Every rule beats the baseline at every value (the old
  // test of signs would say the ranking holds), but at price -10% the best rule drops to third.
  const std::vector<std::string> policies = {"habit", "discount", "markdown", "donate"};
  const RankTable t = rank_table(
      "profit", +1, policies,
      {point("base", "", {100, 130, 120, 110}), point("price", "-10%", {90, 95, 110, 100}),
       point("price", "+10%", {110, 150, 125, 120}), point("unit_cost", "+20%", {80, 99, 99, 90})});
  REQUIRE(t.points.size() == 4);
  CHECK(t.points[0].ranks == std::vector<int>{4, 1, 2, 3});
  CHECK(t.points[0].best == std::vector<int>{1});
  CHECK_FALSE(t.points[0].best_changes);
  CHECK(t.points[1].ranks == std::vector<int>{4, 3, 1, 2});
  CHECK(t.points[1].best == std::vector<int>{2});
  CHECK(t.points[1].best_changes);
  CHECK_FALSE(t.points[2].best_changes);
  // A tie for first is a change of the best: the base's best is no longer alone.
  CHECK(t.points[3].best == std::vector<int>{1, 2});
  CHECK(t.points[3].best_changes);
  CHECK(t.best_changes());
  const std::string text = rank_text(t);
  INFO(text);
  CHECK_THAT(text, Catch::Contains("ranks on profit (higher is better; 1 = best)"));
  CHECK_THAT(text, Catch::Contains("markdown  BEST CHANGES"));
  CHECK_THAT(text, Catch::Contains("discount = markdown  BEST CHANGES"));
  CHECK_THAT(text, Catch::Contains("the best policy on profit changes"));
  const std::string csv = rank_csv_rows(t);
  CHECK_THAT(csv, Catch::Contains("price,-10%,profit,markdown,110,1,true,true\n"));
  CHECK_THAT(csv, Catch::Contains("base,,profit,habit,100,4,false,false\n"));
}

TEST_CASE("a waste metric ranks lower first and may hold where profit does not", "[sweep]") {
  const std::vector<std::string> policies = {"habit", "discount", "donate"};
  const RankTable t =
      rank_table("co2e_kg", -1, policies,
                 {point("base", "", {900, 400, 300}), point("price", "-10%", {950, 420, 310})});
  CHECK(t.points[0].ranks == std::vector<int>{3, 2, 1});
  CHECK(t.points[1].ranks == std::vector<int>{3, 2, 1});
  CHECK_FALSE(t.best_changes());
  const std::string text = rank_text(t);
  CHECK_THAT(text, Catch::Contains("ranks on co2e_kg (lower is better; 1 = best)"));
  CHECK_THAT(text, Catch::Contains("the best policy on co2e_kg holds at every value"));
}

TEST_CASE("a change of the best within the noise says so", "[sweep]") {
  RankTable t = rank_table("profit", +1, {"a", "b"},
                           {point("base", "", {10, 11}), point("price", "-10%", {12, 11})});
  REQUIRE(t.points[1].best_changes);
  t.points[1].change_clear = false;
  CHECK_THAT(rank_text(t), Catch::Contains("best changes, within noise"));
  t.points[1].change_clear = true;
  CHECK_THAT(rank_text(t), Catch::Contains("BEST CHANGES"));
}

}  // namespace
}  // namespace larder
