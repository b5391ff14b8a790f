// `drop`: a sold-out day feeds nothing to the forecast (NaN: the day is skipped); other open
// days feed their sales, which are then the demand. Still biased low: a sold-out day is a high
// demand day, so what remains is demand given D < S, E[D | D < S] = mu - sigma phi(z) / Phi(z),
// lower even than the naive sales mean (checks.md 3(d); Nahmias 1994 compares this estimator
// with the censored-normal MLE).

#include <limits>

#include "policies/registry.hpp"

namespace larder {

namespace {
class Drop : public CensoringState, public CensoringMethod {
 public:
  void treat(int, std::span<const Observation> observed, std::span<const DemandForecast>,
             std::span<double> out) override {
    for (size_t i = 0; i < out.size(); ++i) {
      const Observation& o = observed[i];
      out[i] = o.open && !o.sold_out ? static_cast<double>(o.sold)
                                     : std::numeric_limits<double>::quiet_NaN();
    }
  }
  std::unique_ptr<CensoringState> make(const StoreView&) const override {
    return std::make_unique<Drop>();
  }
};
}  // namespace

void register_drop(PolicyRegistry& r) {
  r.censorings.add(
      {"drop", "sold-out days are skipped, other days' sales taken as demand (biased low)",
       [](PartContext&) -> std::unique_ptr<CensoringMethod> { return std::make_unique<Drop>(); }});
}

}  // namespace larder
