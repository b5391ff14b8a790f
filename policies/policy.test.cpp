// Every validation rule of the policy parts built so far reports file:line:col, the path and
// what was wrong (scenario.md: unknown keys are errors; ranges are checked).

#include "policies/policy.hpp"

#include <fmt/format.h>

#include <catch2/catch.hpp>

#include "sim/scenario/load_scenario.hpp"

namespace larder {
namespace {

/// The diagnostics of building the policies of a one-item scenario with `policy` (YAML lines
/// that follow `policies:`; the first policy line is line 8 of the file).
std::string problems(const std::string& policy) {
  const std::string text = fmt::format(R"(format: 1
name: checks
seed: 1
stores: [ {{ id: s }} ]
items:
  - {{ id: loaf, price: 3, unit_cost: 1, demand: {{ base: 20 }} }}
policies:
{}
)",
                                       policy);
  Diagnostics diag;
  auto scenario = parse_scenario(text, "p.yaml", diag);
  REQUIRE(scenario.has_value());
  build_policies(*scenario, diag);
  return diag.format();
}

TEST_CASE("policy parts: unknown names list the known ones", "[policies][validation]") {
  CHECK(problems("  - { name: a, forecast: { method: crystal_ball }, quantity: { rule: fixed, "
                 "quantity: 3 } }") ==
        "p.yaml:8:26: error: policies[0].forecast: unknown forecast method 'crystal_ball'\n"
        "  hint: known: " +
            policy_registry().forecasts.names() + "\n");
  CHECK(problems("  - { name: a, forecast: { method: oracle }, quantity: { rule: guess } }") ==
        "p.yaml:8:56: error: policies[0].quantity: unknown quantity rule 'guess'\n"
        "  hint: known: " +
            policy_registry().quantities.names() + "\n");
  CHECK(problems("  - { name: a, forecast: { method: oracle }, censoring: psychic, quantity: { "
                 "rule: fixed, quantity: 3 } }")
            .find("p.yaml:8:57: error: policies[0].censoring: unknown censoring treatment "
                  "'psychic'") == 0);
}

TEST_CASE("policy parts: unknown keys and out-of-range values", "[policies][validation]") {
  CHECK(problems("  - { name: a, forecast: { method: oracle }, quantity: { rule: in_stock_target, "
                 "levle: 0.7 } }") ==
        "p.yaml:8:56: error: policies[0].quantity needs 'level'\n"
        "  hint: give one number for every item, or a map from item id to number\n"
        "p.yaml:8:81: error: unknown key 'levle' in policies[0].quantity\n"
        "  hint: did you mean 'level'?\n");
  CHECK(problems("  - { name: a, forecast: { method: oracle }, quantity: { rule: in_stock_target, "
                 "level: 1 } }") ==
        "p.yaml:8:88: error: policies[0].quantity.level must be in (0, 1) (got 1)\n");
  CHECK(problems("  - { name: a, forecast: { method: ses_weekday, alpha: 1.5 }, quantity: { rule: "
                 "fixed, quantity: 3 } }") ==
        "p.yaml:8:56: error: policies[0].forecast.alpha must be in (0, 1] (got 1.5)\n");
  CHECK(problems("  - { name: a, forecast: { method: ses_weekday, initial: last_year }, quantity: "
                 "{ rule: fixed, quantity: 3 } }") ==
        "p.yaml:8:58: error: policies[0].forecast.initial must be one of prior, first_week "
        "(got last_year)\n");
  CHECK(problems("  - { name: a, forecast: { method: oracle }, quantity: { rule: in_stock_target, "
                 "level: 0.7, assume: gamma } }") ==
        "p.yaml:8:101: error: policies[0].quantity.assume must be one of poisson, "
        "negative_binomial, normal (got gamma)\n");
  CHECK(
      problems("  - { name: a, forecast: { method: oracle }, quantity: { rule: critical_fractile, "
               "penalty: -1 } }") ==
      "p.yaml:8:92: error: policies[0].quantity.penalty must be >= 0 (got -1)\n");
}

TEST_CASE("policy parts: item maps name existing items, all of them", "[policies][validation]") {
  CHECK(problems("  - { name: a, forecast: { method: oracle }, quantity: { rule: fixed, quantity: "
                 "{ loaf: 3, bun: 4 } } }") ==
        "p.yaml:8:92: error: policies[0].quantity.quantity: unknown item 'bun'\n");
  CHECK(problems("  - { name: a, forecast: { method: oracle }, quantity: { rule: base_stock, "
                 "level: {} } }") ==
        "p.yaml:8:83: error: policies[0].quantity.level has no value for item(s) loaf\n"
        "  hint: list every item, or give one number for all\n");
  CHECK(problems("  - { name: a, forecast: { method: oracle }, quantity: { rule: fixed, quantity: "
                 "[1, 2] } }") ==
        "p.yaml:8:81: error: policies[0].quantity.quantity must be a number or a map from item "
        "id to number\n");
}

}  // namespace
}  // namespace larder
