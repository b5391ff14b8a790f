// `normal_tail`: on a sold-out day with sales s, feeds the forecast the conditional mean
// E[D | D >= s] under the normal with the mean and variance that the forecast predicted for
// that day: mean + sd * lambda(a), lambda the inverse Mills ratio, a = (s - 0.5 - mean) / sd.
// This is the normal-tail (Tobit-type) correction: Tobin's (1958) censored-normal model, and
// the censored-normal demand estimation of Nahmias (1994), applied one day at a time to the
// current estimate instead of by maximum likelihood over a sample (checks.md 3(a)). Other open
// days feed their sales.
//
// Integer demand: "sold out" means D >= s (the last unit went), so with the continuity
// correction the normal event is X >= s - 0.5, the same convention as the quantity rules'
// P(D <= x) = Phi((x + 0.5 - mean) / sd) (policies.md). The result is at least s. A sold-out day
// with no sales (nothing was on the shelf) says only D >= 0 and is skipped (NaN). A forecast
// with no spread (sd = 0) gives max(mean, s).

#include <limits>

#include "policies/censoring/normal_tail_moments.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {
class NormalTail : public CensoringState, public CensoringMethod {
 public:
  bool needs_forecast() const override { return true; }
  void treat(int, std::span<const Observation> observed, std::span<const DemandForecast> predicted,
             std::span<double> out) override {
    constexpr double kSkip = std::numeric_limits<double>::quiet_NaN();
    for (size_t i = 0; i < out.size(); ++i) {
      const Observation& o = observed[i];
      const double s = static_cast<double>(o.sold);
      if (!o.open) {
        out[i] = kSkip;
      } else if (!o.sold_out) {
        out[i] = s;
      } else if (o.sold == 0) {
        out[i] = kSkip;  // an empty shelf says nothing about demand
      } else {
        out[i] = count_upper_tail(predicted[i].mean, predicted[i].variance, s).mean;
      }
    }
  }
  std::unique_ptr<CensoringState> make(const StoreView&) const override {
    return std::make_unique<NormalTail>();
  }
};
}  // namespace

void register_normal_tail(PolicyRegistry& r) {
  r.censorings.add({"normal_tail",
                    "a sold-out day feeds E[D | D >= sales] under the day's normal forecast "
                    "(Tobit-type correction)",
                    [](PartContext&) -> std::unique_ptr<CensoringMethod> {
                      return std::make_unique<NormalTail>();
                    }});
}

}  // namespace larder
