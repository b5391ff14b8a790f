// `ignore`: feeds the sales to the forecast as if they were demand. Biased low on sold-out days,
// since sales are demand cut off at the stock (checks.md 3(d): E[min(D, S)] < E[D]).

#include <cmath>
#include <limits>

#include "policies/registry.hpp"

namespace larder {

namespace {
class Ignore : public CensoringState, public CensoringMethod {
 public:
  void treat(int, std::span<const Observation> observed, std::span<const DemandForecast>,
             std::span<double> out) override {
    for (size_t i = 0; i < out.size(); ++i) {
      out[i] = observed[i].open ? static_cast<double>(observed[i].sold)
                                : std::numeric_limits<double>::quiet_NaN();
    }
  }
  std::unique_ptr<CensoringState> make(const StoreView&) const override {
    return std::make_unique<Ignore>();
  }
};
}  // namespace

void register_ignore(PolicyRegistry& r) {
  r.censorings.add({"ignore", "sales are taken as demand, sold-out days included (biased low)",
                    [](PartContext&) -> std::unique_ptr<CensoringMethod> {
                      return std::make_unique<Ignore>();
                    }});
}

}  // namespace larder
