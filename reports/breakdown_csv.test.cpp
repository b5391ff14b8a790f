// breakdown.csv on a breakdown built by hand: one policy, two keys (a store and a plan group),
// three replications. Means and standard errors of {1, 2, 6}: mean 3, sample sd
// sqrt(((1-3)^2 + (2-3)^2 + (6-3)^2) / 2) = sqrt(7), stderr sqrt(7 / 3) (by hand).

#include "reports/breakdown_csv.hpp"

#include <catch2/catch.hpp>
#include <cmath>

#include "reports/csv.hpp"

namespace larder {
namespace {

TEST_CASE("breakdown.csv rows per key and metric, plan rows for plan groups", "[reports]") {
  RunResult r;
  r.policies = {"net, weekly"};
  r.metrics = {Metric::waste_units};
  PolicyBreakdown b;
  b.keys = {{"store", "quay"}, {"plan_group", "A"}};
  b.first_group = 1;
  for (double x : {1.0, 2.0, 6.0}) {
    MetricVector v{};
    at(v, Metric::waste_units) = x;
    b.values.push_back({v, v});
    b.planned_level.push_back({x / 10});
    b.planned_in_stock.push_back({0.5});
  }
  r.breakdown = {b};
  const std::string se = csv_number(std::sqrt(7.0 / 3.0));
  const std::string expected =
      "policy,dimension,key,metric,mean,stderr\n"
      "\"net, weekly\",store,quay,waste_units,3," +
      se + "\n" + "\"net, weekly\",plan_group,A,waste_units,3," + se + "\n" +
      "\"net, weekly\",plan_group,A,planned_level,0.3," + csv_number(std::sqrt(7.0 / 3.0) / 10) +
      "\n" + "\"net, weekly\",plan_group,A,planned_in_stock,0.5,0\n";
  CHECK(breakdown_csv(r) == expected);
}

}  // namespace
}  // namespace larder
