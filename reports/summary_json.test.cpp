#include "reports/summary_json.hpp"

#include <catch2/catch.hpp>
#include <limits>

#include "reports/sample_run.test.hpp"

using nlohmann::json;

namespace {

/// Checks one {mean, stderr, ci_low, ci_high} object against expected values.
void check_estimate(const json& e, double mean, double sem, double low, double high) {
  REQUIRE(e.is_object());
  CHECK(e.at("mean").get<double>() == Approx(mean).epsilon(1e-12).margin(1e-12));
  CHECK(e.at("stderr").get<double>() == Approx(sem).epsilon(1e-12));
  CHECK(e.at("ci_low").get<double>() == Approx(low).epsilon(1e-12));
  CHECK(e.at("ci_high").get<double>() == Approx(high).epsilon(1e-12));
}

const json& policy_entry(const json& j, const std::string& name) {
  for (const json& p : j.at("policies")) {
    if (p.at("name") == name) return p;
  }
  FAIL("no policy " << name);
  throw;  // not reached
}

const json& difference_entry(const json& j, const std::string& name) {
  for (const json& d : j.at("differences")) {
    if (d.at("policy") == name) return d;
  }
  FAIL("no difference for " << name);
  throw;  // not reached
}

}  // namespace

TEST_CASE("summary.json parses back with every run fact", "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const std::string text = larder::summary_json_text(r);
  REQUIRE(text.back() == '\n');
  const json j = json::parse(text);

  CHECK(j.at("scenario") == "two-shops");
  CHECK(j.at("scenario_file") == "scenarios/two-shops.yaml");
  CHECK(j.at("seed").get<std::uint64_t>() == 20270104u);
  CHECK(j.at("replications") == 5);
  CHECK(j.at("horizon_days") == 91);
  CHECK(j.at("warmup_days") == 14);
  CHECK(j.at("stores") == 2);
  CHECK(j.at("items") == 3);
  CHECK(j.at("currency") == "EUR");
  CHECK(j.at("command") == "larder run scenarios/two-shops.yaml --replications 5 --seed 20270104");
  CHECK(j.at("larder_version") == "0.1.0");
  CHECK(j.at("threads") == 2);
  CHECK(j.at("seconds").get<double>() == 0.25);
  CHECK(j.at("confidence_level").get<double>() == 0.95);
  CHECK(j.at("baseline") == "fixed_order");

  // The reported metrics in order, with what they mean.
  const json& metrics = j.at("metrics");
  REQUIRE(metrics.size() == 6);
  const std::vector<std::string> names = {"sold_units",  "lost_units", "waste_units",
                                          "waste_share", "fill_rate",  "profit"};
  for (size_t i = 0; i < names.size(); ++i) CHECK(metrics[i].at("name") == names[i]);
  CHECK(metrics[2].at("unit") == "units");
  CHECK(metrics[2].at("better") == -1);
  CHECK(metrics[5].at("unit") == "money");
  CHECK(metrics[5].at("better") == 1);
  CHECK(metrics[5].at("description").is_string());
}

TEST_CASE("summary.json has every policy and metric, in order, with scipy's statistics",
          "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const json j = json::parse(larder::summary_json_text(r));

  const json& policies = j.at("policies");
  REQUIRE(policies.size() == 3);
  CHECK(policies[0].at("name") == "fixed_order");
  CHECK(policies[1].at("name") == "newsvendor");
  CHECK(policies[2].at("name") == "cautious, v2");
  for (const json& p : policies) {
    const json& m = p.at("metrics");
    CHECK(m.size() == 6);
    for (const char* name :
         {"sold_units", "lost_units", "waste_units", "waste_share", "fill_rate", "profit"}) {
      INFO(p.at("name") << " " << name);
      REQUIRE(m.contains(name));
      CHECK(m.at(name).size() == 4);
      for (const char* field : {"mean", "stderr", "ci_low", "ci_high"}) {
        CHECK(m.at(name).at(field).is_number_float());
      }
    }
    CHECK_FALSE(m.contains("waste_kg"));  // not reported
  }

  // /usr/bin/python3, scipy 1.10.1: for each series x, x.mean(), scipy.stats.sem(x),
  // scipy.stats.t.interval(0.95, len(x) - 1, loc=x.mean(), scale=scipy.stats.sem(x)).
  const json& base = policy_entry(j, "fixed_order").at("metrics");
  check_estimate(base.at("waste_units"), 126.8, 3.992492955535426, 115.71506247606698,
                 137.88493752393302);
  check_estimate(base.at("waste_share"), 0.12279999999999999, 0.0029899832775452115,
                 0.11449847556443632, 0.13110152443556367);
  check_estimate(base.at("fill_rate"), 0.9200000000000002, 0.007071067811865465, 0.9003675683852246,
                 0.9396324316147757);
  check_estimate(base.at("profit"), 2569.6, 39.957680738501324, 2458.6596928985314,
                 2680.5403071014684);
  const json& news = policy_entry(j, "newsvendor").at("metrics");
  check_estimate(news.at("sold_units"), 912.2, 5.219195340279955, 897.7091906444086,
                 926.6908093555915);
  check_estimate(news.at("lost_units"), 77.6, 5.635601121442148, 61.95306285152472,
                 93.24693714847527);
  const json& cautious = policy_entry(j, "cautious, v2").at("metrics");
  check_estimate(cautious.at("waste_units"), 127.2, 3.411744421846396, 117.72747889977869,
                 136.67252110022133);
  check_estimate(cautious.at("profit"), 2566.4, 40.77457847728165, 2453.191621170248,
                 2679.6083788297524);
}

TEST_CASE("summary.json has paired differences against the baseline with verdicts", "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const json j = json::parse(larder::summary_json_text(r));

  const json& differences = j.at("differences");
  REQUIRE(differences.size() == 2);  // the baseline is not compared with itself
  CHECK(differences[0].at("policy") == "newsvendor");
  CHECK(differences[1].at("policy") == "cautious, v2");
  for (const json& d : differences) {
    CHECK(d.at("baseline") == "fixed_order");
    CHECK(d.at("metrics").size() == 6);
    for (const auto& [name, e] : d.at("metrics").items()) {
      INFO(name);
      CHECK(e.size() == 5);
      CHECK(e.at("verdict").is_string());
    }
  }

  // /usr/bin/python3, scipy 1.10.1, on d = policy - fixed_order per replication:
  // d.mean(), scipy.stats.sem(d), scipy.stats.t.interval(0.95, 4, loc=d.mean(), scale=sem).
  const json& news = difference_entry(j, "newsvendor").at("metrics");
  check_estimate(news.at("waste_units"), -19.8, 0.8602325267042626, -22.188388388099984,
                 -17.411611611900017);
  CHECK(news.at("waste_units").at("verdict") == "better: lower waste_units (significant)");
  check_estimate(news.at("waste_share"), -0.0178, 0.000583095189484529, -0.019418931784708705,
                 -0.016181068215291295);
  CHECK(news.at("waste_share").at("verdict") == "better: lower waste_share (significant)");
  check_estimate(news.at("fill_rate"), -0.017999999999999995, 0.002000000000000024,
                 -0.02355289021039566, -0.012447109789604331);
  CHECK(news.at("fill_rate").at("verdict") == "worse: lower fill_rate (significant)");
  check_estimate(news.at("lost_units"), 11.0, 1.3038404810405297, 7.3799584784562775,
                 14.620041521543722);
  CHECK(news.at("lost_units").at("verdict") == "worse: higher lost_units (significant)");
  check_estimate(news.at("sold_units"), 6.2, 1.5297058540778354, 1.952855669053176,
                 10.447144330946823);
  CHECK(news.at("sold_units").at("verdict") == "higher sold_units (significant)");
  check_estimate(news.at("profit"), 148.8, 7.806407624509496, 127.12593776175184,
                 170.47406223824817);
  CHECK(news.at("profit").at("verdict") == "better: higher profit (significant)");

  const json& cautious = difference_entry(j, "cautious, v2").at("metrics");
  check_estimate(cautious.at("waste_units"), 0.4, 0.8124038404635959, -1.8555946662990443,
                 2.655594666299044);
  CHECK(cautious.at("waste_units").at("verdict") == "no significant difference");
  check_estimate(cautious.at("lost_units"), 0.0, 0.8944271909999159, -2.483327996407533,
                 2.483327996407533);
  CHECK(cautious.at("lost_units").at("verdict") == "no significant difference");
  check_estimate(cautious.at("profit"), -3.2, 4.4429719783046115, -15.53566780169482,
                 9.135667801694819);
  CHECK(cautious.at("profit").at("verdict") == "no significant difference");
  check_estimate(cautious.at("sold_units"), -8.8, 0.8602325267042626, -11.188388388099986,
                 -6.411611611900016);
  CHECK(cautious.at("sold_units").at("verdict") == "lower sold_units (significant)");
}

TEST_CASE("summary.json doubles read back bit for bit", "[reports]") {
  larder::RunResult r = larder::test::sample_run();
  // Values with long decimal expansions.
  at(r.values[1][0], larder::Metric::profit) = 0.1 + 0.2;
  at(r.values[1][1], larder::Metric::profit) = 1.0 / 3.0;
  at(r.values[1][2], larder::Metric::profit) = 123456789.123456789;
  r.info.seconds = 2.0 / 3.0;
  const json direct = larder::summary_json(r);
  const json parsed = json::parse(larder::summary_json_text(r));
  CHECK(parsed.at("seconds").get<double>() == 2.0 / 3.0);
  for (size_t p = 0; p < 3; ++p) {
    for (const auto& [name, e] : direct.at("policies")[p].at("metrics").items()) {
      for (const char* field : {"mean", "stderr", "ci_low", "ci_high"}) {
        INFO(p << " " << name << " " << field);
        CHECK(parsed.at("policies")[p].at("metrics").at(name).at(field).get<double>() ==
              e.at(field).get<double>());
      }
    }
  }
}

TEST_CASE("summary.json writes values that are not numbers as null", "[reports]") {
  larder::RunResult r = larder::test::sample_run();
  // A share of nothing in one replication of the newsvendor policy.
  at(r.values[1][3], larder::Metric::waste_share) = std::numeric_limits<double>::quiet_NaN();
  const json j = json::parse(larder::summary_json_text(r));
  CHECK(j.at("policies")[1].at("metrics").at("waste_share").at("mean").is_null());
  CHECK(j.at("policies")[0].at("metrics").at("waste_share").at("mean").is_number());
  const json& d = j.at("differences")[0].at("metrics").at("waste_share");
  CHECK(d.at("mean").is_null());
  CHECK(d.at("verdict") == "not available");
}

TEST_CASE("summary.json with another baseline compares against it", "[reports]") {
  larder::RunResult r = larder::test::sample_run();
  r.baseline = 1;
  const json j = json::parse(larder::summary_json_text(r));
  CHECK(j.at("baseline") == "newsvendor");
  REQUIRE(j.at("differences").size() == 2);
  CHECK(j.at("differences")[0].at("policy") == "fixed_order");
  CHECK(j.at("differences")[1].at("policy") == "cautious, v2");
  CHECK(j.at("differences")[0].at("baseline") == "newsvendor");
  // Worked by hand: fixed_order - newsvendor is minus the newsvendor - fixed_order difference.
  const json& profit = j.at("differences")[0].at("metrics").at("profit");
  CHECK(profit.at("mean").get<double>() == Approx(-148.8).epsilon(1e-12));
  CHECK(profit.at("verdict") == "worse: lower profit (significant)");
}
