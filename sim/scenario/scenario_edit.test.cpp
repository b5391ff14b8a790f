// Editing a scenario document by path, on hand-written documents.

#include "sim/scenario/scenario_edit.hpp"

#include <catch2/catch.hpp>

namespace larder {
namespace {

const char* kDoc = R"(
customers: { fifo_share: 0.5 }
items:
  - { id: bun, price: 1.5 }
  - { id: pie, price: 4 }
policies:
  - { name: a, quantity: { rule: fixed, quantity: 3 } }
)";

TEST_CASE("parse_setting splits path and values, keeping brackets whole", "[scenario][edit]") {
  const auto s = parse_setting("logistics.delivery_weekdays=[mon, thu],[tue]");
  REQUIRE(s);
  CHECK(s->path == "logistics.delivery_weekdays");
  CHECK(s->values == std::vector<std::string>{"[mon, thu]", "[tue]"});
  CHECK_FALSE(parse_setting("no-equals"));
  CHECK_FALSE(parse_setting("=1"));
  CHECK_FALSE(parse_setting("a.b=1,,2"));
}

TEST_CASE("set_path walks keys, names, ids, positions and *", "[scenario][edit]") {
  YAML::Node root = YAML::Load(kDoc);
  CHECK(set_path(root, "customers.fifo_share", "0.2").empty());
  CHECK(root["customers"]["fifo_share"].as<double>() == 0.2);
  CHECK(set_path(root, "items.pie.price", "5").empty());
  CHECK(root["items"][1]["price"].as<double>() == 5);
  CHECK(set_path(root, "items.*.unit_cost", "0.9").empty());  // a new key on every item
  CHECK(root["items"][0]["unit_cost"].as<double>() == 0.9);
  CHECK(root["items"][1]["unit_cost"].as<double>() == 0.9);
  CHECK(set_path(root, "policies.0.quantity.quantity", "{ bun: 2, pie: 1 }").empty());
  CHECK(root["policies"][0]["quantity"]["quantity"]["pie"].as<int>() == 1);
  CHECK(set_path(root, "items.cake.price", "1") == "items has no element named 'cake'");
  CHECK(set_path(root, "nothing.here", "1") == "the file has no key 'nothing'");
  CHECK(set_path(root, "customers.fifo_share.x", "1") ==
        "customers.fifo_share is a single value; it has no 'x'");
}

TEST_CASE("scale_path multiplies every number it reaches", "[scenario][edit]") {
  YAML::Node root = YAML::Load(kDoc);
  CHECK(scale_path(root, "items.*.price", 1.1).empty());
  std::string error;
  const std::vector<double> v = numbers_at(root, "items.*.price", error);
  CHECK(error.empty());
  REQUIRE(v.size() == 2);
  CHECK(v[0] == Approx(1.65).epsilon(1e-12));
  CHECK(v[1] == Approx(4.4).epsilon(1e-12));
  CHECK(scale_path(root, "items.*.id", 2.0) == "items.*.id is not a number here");
}

}  // namespace
}  // namespace larder
