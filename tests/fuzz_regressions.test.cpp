// Inputs the fuzz targets of tests/fuzz/ found crashing, hanging or breaking a reader's contract,
// kept as tests so the fix stays (DEVELOPERS.md, "Fuzzing"). Each case names the target that
// found it and inlines the input; the expected messages are worked out by hand.

#include <catch2/catch.hpp>
#include <stdexcept>
#include <string>

#include "reports/shard_file.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder {
namespace {

/// The problems parse_scenario reports for `text` (empty when it is a valid scenario).
std::string scenario_problems(const std::string& text) {
  Diagnostics diag;
  const auto s = parse_scenario(text, "fuzz.yaml", diag);
  CHECK(s.has_value() == diag.ok());
  return diag.format();
}

// scenario_loader: yaml-cpp 0.7's LoadAll looped forever, adding empty documents, when a
// document starts with a token that cannot start a node (yaml-cpp issue #1040). Found as the
// first input below (a mutated example); the others are reduced by hand. Without the guard
// (sim/scenario/yaml_stall.hpp) these cases never return and CTest's timeout fails them.
TEST_CASE("a ',' where a YAML document starts is an error, not a hang", "[fuzz][scenario]") {
  const std::string found =
      ",ormat: 1\nname: small\nseed: 3\nhorizon: { days: 60, warmup_days: 7 }\n"
      "seedperlications: 5\nstores: [ { id: corner } ]\nitems:\n"
      "  - { id: roll, price: 1.5, item:unit_cost: 0.4, demand: { base: 30 } }\n"
      "  - { id: pie, price: 4, unit_co:ts 1.5, shelf_life_days: 2, demand: { base: 8 } }\n"
      "policies:\n  - name: fixed\n"
      "    forecast: { metd: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 } }\n"
      "  - { id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, dem2and: { base: 8 } }\n"
      "policies:\n  - name: fixed\n    forecast:le }";
  CHECK(scenario_problems(found) == "fuzz.yaml:1:1: error: invalid YAML: unexpected ','\n");
  CHECK(scenario_problems(",") == "fuzz.yaml:1:1: error: invalid YAML: unexpected ','\n");
  CHECK(scenario_problems("# a comment\n  ,") ==
        "fuzz.yaml:2:3: error: invalid YAML: unexpected ','\n");
  CHECK(scenario_problems("[a],") == "fuzz.yaml:1:4: error: invalid YAML: unexpected ','\n");
  CHECK(scenario_problems("!tag ,") == "fuzz.yaml:1:6: error: invalid YAML: unexpected ','\n");
  CHECK(scenario_problems("&anchor ,") == "fuzz.yaml:1:9: error: invalid YAML: unexpected ','\n");
  CHECK(scenario_problems("format: 1\n---\n,") ==
        "fuzz.yaml:3:1: error: invalid YAML: unexpected ','\n");
}

// shard_file: a JSON object whose "format" is a number made parse_shard_file throw nlohmann's
// type_error ("[json.exception.type_error.302] type must be string, but is number") instead of
// its own std::runtime_error, so the message reached `larder merge` raw (and an MPI run's
// shard reading could end in std::terminate). Found after about 870,000 inputs; reduced by hand
// (the input found is a mutated shard whose other keys are never read).
TEST_CASE("a shard file whose format is not a string is not a shard file", "[fuzz][shard]") {
  for (const char* text : {R"({"complete":true,"format":1})", R"({"format":null})",
                           R"({"format":["larder-shard"]})", R"({"format":{}})"}) {
    INFO(text);
    try {
      (void)parse_shard_file(text);
      FAIL("accepted");
    } catch (const std::runtime_error& e) {
      CHECK(std::string(e.what()) == "not a larder shard file");
    }
  }
  CHECK_THROWS_WITH(parse_shard_file("[1, 2]"), "not a larder shard file");
}

}  // namespace
}  // namespace larder
