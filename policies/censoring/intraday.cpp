// `intraday`: on a sold-out day, scales the sales up by the share of the day's customers expected
// to have arrived by the sell-out time: estimate = sales / F(t), with F the item's intraday
// profile accumulated to t hours after opening (intraday_profile.hpp). Needs `observe: intraday`
// on the policy, which records the sell-out time. Other open days feed their sales.
//
// The idea is common practice in retail demand estimation: the sales rate before the stock-out,
// read against the usual shape of the day, tells what the whole day would have sold ("lost
// sales from the time of stock-out"). Jain, Rudi and Wang (2015, Operations Research, "Demand
// estimation and ordering under censoring: stock-out timing is (almost) all you need"; cited
// from memory) show how much the stock-out time adds over the sold-out flag alone; they fit the
// demand distribution by maximum likelihood over many days, while this treatment works one day
// at a time. The ratio is that day's own maximum-likelihood estimate when customers arrive as a
// Poisson process with rate lambda f(t) (f the profile, integrating to 1 over the day): seeing n
// arrivals up to the n-th at time t has likelihood prod lambda f(t_k) * exp(-lambda F(t)), which
// is largest at lambda = n / F(t); with no sell-out the day is seen whole, F = 1, lambda = n.
//
// Edge cases: a sold-out day with no sales (an empty shelf), or sold out before any customer was
// expected (F(t) = 0), says nothing about the day's rate and is skipped (NaN), as in
// `normal_tail`.
// A sold-out day without a recorded time (not expected when observing intraday) feeds its sales,
// as `ignore` would. Closed days are skipped.

#include <cmath>
#include <limits>
#include <memory>
#include <span>
#include <vector>

#include "policies/registry.hpp"
#include "sim/scenario/intraday_profile.hpp"

namespace larder {

namespace {

/// The intraday shares of every item, [item * hours + h] (the same for every store: opening
/// hours are the scenario's).
struct ItemShares {
  std::vector<double> shares;
  size_t hours = 0;

  std::span<const double> of(size_t item) const {
    return std::span<const double>(shares).subspan(item * hours, hours);
  }
};

class IntradayState : public CensoringState {
 public:
  explicit IntradayState(std::shared_ptr<const ItemShares> shares) : shares_(std::move(shares)) {}

  void treat(int, std::span<const Observation> observed, std::span<const DemandForecast>,
             std::span<double> out) override {
    constexpr double kSkip = std::numeric_limits<double>::quiet_NaN();
    for (size_t i = 0; i < out.size(); ++i) {
      const Observation& o = observed[i];
      const double s = static_cast<double>(o.sold);
      if (!o.open) {
        out[i] = kSkip;
      } else if (!o.sold_out || std::isnan(o.sellout_hour)) {
        out[i] = s;
      } else if (o.sold == 0) {
        out[i] = kSkip;  // an empty shelf says nothing about demand
      } else {
        const double f = elapsed_share(shares_->of(i), static_cast<double>(o.sellout_hour));
        out[i] = f > 0.0 ? s / f : kSkip;
      }
    }
  }

 private:
  std::shared_ptr<const ItemShares> shares_;
};

class Intraday : public CensoringMethod {
 public:
  explicit Intraday(const Scenario& scenario) {
    auto s = std::make_shared<ItemShares>();
    s->hours = static_cast<size_t>(scenario.hours());
    s->shares.reserve(scenario.items.size() * s->hours);
    for (const Item& item : scenario.items) {
      const std::vector<double> one = intraday_shares(item, scenario.calendar);
      s->shares.insert(s->shares.end(), one.begin(), one.end());
    }
    shares_ = std::move(s);
  }
  std::unique_ptr<CensoringState> make(const StoreView&) const override {
    return std::make_unique<IntradayState>(shares_);
  }

 private:
  std::shared_ptr<const ItemShares> shares_;
};

}  // namespace

void register_intraday(PolicyRegistry& r) {
  r.censorings.add({"intraday",
                    "a sold-out day feeds sales / the share of the intraday profile elapsed at "
                    "the sell-out time (needs observe: intraday)",
                    [](PartContext& ctx) -> std::unique_ptr<CensoringMethod> {
                      if (!ctx.observe_intraday) {
                        ctx.params.error(
                            "method",
                            ctx.params.path() + ": intraday needs observe: intraday on the policy",
                            "add observe: intraday to the policy");
                        return nullptr;
                      }
                      return std::make_unique<Intraday>(ctx.scenario);
                    }});
}

}  // namespace larder
