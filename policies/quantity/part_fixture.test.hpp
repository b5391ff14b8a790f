#pragma once
// Test helpers for policy parts: a scenario from YAML, one policy's rule and adjusters built
// through the registry (so parameters are read as in a run), and the diagnostics of a build.

#include <boost/math/distributions/poisson.hpp>
#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

#include "policies/policy.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder::qty_test {

/// Smallest k with F(k) >= p for Poisson(mean), from Boost.Math with integer_round_up
/// (checks.md 1.6: Boost's default discrete quantile rounds outwards).
inline int poisson_quantile(double mean, double p) {
  using namespace boost::math::policies;
  const boost::math::poisson_distribution<double, policy<discrete_quantile<integer_round_up>>> d(
      mean);
  return static_cast<int>(boost::math::quantile(d, p));
}

/// The diagnostics of parsing `yaml` (labelled `file`) and building its policies.
inline std::string build_problems(const std::string& yaml, const std::string& file = "p.yaml") {
  Diagnostics diag;
  auto scenario = parse_scenario(yaml, file, diag);
  if (!scenario) return diag.format();
  build_policies(*scenario, diag);
  return diag.format();
}

/// Policy 0 of a scenario at store 0: its quantity rule and adjusters, ready to decide.
class PartHarness {
 public:
  explicit PartHarness(const std::string& yaml, const std::string& file = "p.yaml") {
    Diagnostics diag;
    auto s = parse_scenario(yaml, file, diag);
    if (!s) throw std::runtime_error(diag.format());
    scenario_ = std::make_unique<Scenario>(std::move(*s));
    policies_ = build_policies(*scenario_, diag);
    if (!diag.ok()) throw std::runtime_error(diag.format());
    truth_ = std::make_unique<DemandModel>(*scenario_);
    view_ = std::make_unique<StoreView>(StoreView{*scenario_, *truth_, 0});
    rule_ = policies_[0].quantity->make(*view_);
    for (const auto& a : policies_[0].adjustments) adjusters_.push_back(a->make(*view_));
  }

  const Scenario& scenario() const { return *scenario_; }
  const StoreView& view() const { return *view_; }
  OrderRule& rule() { return *rule_; }

  /// Every day's observations to the rule and the adjusters (as the engine does after close).
  void observe(int day, std::span<const Observation> observed) {
    rule_->observe(day, observed);
    for (auto& a : adjusters_) a->observe(day, observed);
  }
  /// The rule's quantities for an order placed on `order_day` (arrival after the scenario's
  /// lead time), then every adjuster in order; `observed` is the order day's observations.
  std::vector<int> order(int order_day, std::span<const OrderInput> in,
                         const Forecaster* forecaster = nullptr,
                         std::span<const Observation> observed = {}) {
    const OrderContext ctx{*view_, order_day, order_day + scenario_->logistics.lead_time_days,
                           forecaster};
    std::vector<int> out(in.size(), -1);
    rule_->decide(ctx, in, out);
    std::vector<Observation> none(in.size());
    if (observed.empty()) observed = none;
    for (auto& a : adjusters_) a->adjust(ctx, in, observed, out);
    return out;
  }

 private:
  std::unique_ptr<Scenario> scenario_;
  std::vector<Policy> policies_;
  std::unique_ptr<DemandModel> truth_;
  std::unique_ptr<StoreView> view_;
  std::unique_ptr<OrderRule> rule_;
  std::vector<std::unique_ptr<Adjuster>> adjusters_;
};

/// A forecaster with the same mean and variance for every item and day.
class ConstantForecaster : public Forecaster {
 public:
  ConstantForecaster(double mean, double variance) : f_{mean, variance} {}
  void observe(int, std::span<const double>) override {}
  void predict(int, std::span<DemandForecast> out) const override {
    for (auto& f : out) f = f_;
  }
  std::size_t bytes_per_item() const override { return 0; }

 private:
  DemandForecast f_;
};

}  // namespace larder::qty_test
