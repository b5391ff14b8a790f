// `oracle`: the true mean and variance of the day's demand (not the draw). It exists to
// benchmark the forecasts that must learn from sales.

#include "policies/registry.hpp"
#include "sim/engine/demand_model.hpp"

namespace larder {

namespace {
class Oracle : public Forecaster, public ForecastMethod {
 public:
  Oracle() = default;
  explicit Oracle(const StoreView& v) : view_(&v) {}
  void observe(int, std::span<const double>) override {}
  void predict(int day, std::span<DemandForecast> out) const override {
    for (size_t i = 0; i < out.size(); ++i) {
      const CountLaw law = view_->truth.law(view_->store, static_cast<int>(i), day);
      out[i] = {law.mean, law.variance};
    }
  }
  std::size_t bytes_per_item() const override { return 0; }
  std::unique_ptr<Forecaster> make(const StoreView& v) const override {
    return std::make_unique<Oracle>(v);
  }

 private:
  const StoreView* view_ = nullptr;
};
}  // namespace

void register_oracle(PolicyRegistry& r) {
  r.forecasts.add(
      {"oracle", "the true demand distribution of each day (a benchmark)",
       [](PartContext&) -> std::unique_ptr<ForecastMethod> { return std::make_unique<Oracle>(); }});
}

}  // namespace larder
