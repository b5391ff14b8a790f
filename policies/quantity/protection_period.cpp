#include "policies/quantity/protection_period.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

#include "policies/quantity/fractile_rule.hpp"
#include "sim/stats/binomial.hpp"
#include "sim/stats/count_law.hpp"

namespace larder {

double expected_outdating(std::span<const std::int32_t> stock_by_age,
                          std::span<const std::int32_t> arrivals, int life,
                          std::span<const double> withdrawals, double fifo_share,
                          std::span<double> leaving) {
  const size_t m = static_cast<size_t>(std::max(life, 1));
  std::vector<double> s(m, 0.0);  // s[k]: units that leave at the close of today + k
  for (size_t k = 0; k < stock_by_age.size() && k < m; ++k) s[k] = stock_by_age[k];
  const size_t n = withdrawals.size();
  double outdated = 0.0;
  for (size_t d = 0; d < n; ++d) {
    if (d < arrivals.size()) s[m - 1] += arrivals[d];
    const double total = std::accumulate(s.begin(), s.end(), 0.0);
    const double sold = std::clamp(withdrawals[d], 0.0, total);
    // The oldest-first share from the oldest end, the rest from the freshest end (sold <=
    // stock, so both ends can always give what is asked).
    double need = fifo_share * sold;
    for (size_t k = 0; k < m && need > 0.0; ++k) {
      const double t = std::min(need, s[k]);
      s[k] -= t;
      need -= t;
    }
    need = (1.0 - fifo_share) * sold;
    for (size_t k = m; k-- > 0 && need > 0.0;) {
      const double t = std::min(need, s[k]);
      s[k] -= t;
      need -= t;
    }
    if (d < leaving.size()) leaving[d] = s[0];
    if (d + 1 < n) outdated += s[0];
    for (size_t k = 0; k + 1 < m; ++k) s[k] = s[k + 1];
    s[m - 1] = 0.0;
  }
  return outdated;
}

double discount_netting(const DemandForecast& day, DemandFamily family, double take_rate,
                        double x) {
  if (!(x > 0.0) || !(take_rate > 0.0) || !(day.mean > 0.0)) return 0.0;
  const double mean = take_rate * day.mean;
  const double var = family == DemandFamily::poisson
                         ? mean
                         : take_rate * take_rate * std::max(day.variance, 0.0) +
                               take_rate * (1.0 - take_rate) * day.mean;
  const CountLaw a = CountLaw::from_moments(family, mean, var);
  // E[min(x, A)] = sum over k < x of P(A > k); a fractional x counts its last unit in part.
  const int whole = static_cast<int>(std::floor(x));
  double e = 0.0;
  for (int k = 0; k < whole; ++k) e += 1.0 - a.cdf(k);
  return e + (x - whole) * (1.0 - a.cdf(whole));
}

ProtectionPeriod::ProtectionPeriod(const Scenario& scenario)
    : scenario_(scenario),
      fifo_share_(scenario.fifo_share),
      take_rate_(scenario.discount_take_rate) {}

void ProtectionPeriod::prepare(const OrderContext& ctx, std::span<const OrderInput> in,
                               int review_days) {
  const Scenario& sc = scenario_;
  in_ = in;
  items_ = static_cast<int>(in.size());
  lead_ = std::max(ctx.arrival_day - ctx.order_day, 1);
  const size_t items = in.size();
  // Days order_day + 1 ... order_day + days, cut at the end of the horizon.
  const int horizon_left = sc.horizon.days - 1 - ctx.order_day;
  days_.resize(items);
  int period = lead_;
  bool other_days = false;  // a day outside the engine's window is needed
  for (size_t i = 0; i < items; ++i) {
    const int life = sc.items[i].shelf_life_days;
    const int serves = std::min(std::max(review_days, in[i].cover_days), life);
    days_[i] = std::max(std::min(lead_ - 1 + serves, horizon_left), lead_);
    period = std::max(period, days_[i]);
    other_days = other_days || lead_ > 1 || serves > std::max(in[i].cover_days, 1);
  }
  // One day with lead time 1 (daily deliveries): the engine's window is the whole period.
  if (period == 1 && lead_ == 1) {
    forecasts_.clear();
    return;
  }
  // forecasts_[d * items + i]: item i's demand forecast for day order_day + 1 + d (0 on closed
  // days and outside the horizon). A one-day window on the arrival day is the engine's forecast
  // (after the censoring treatment's refinement); other days come from the forecaster, or,
  // without one, from the engine's window spread evenly over its days.
  forecasts_.assign(static_cast<size_t>(period) * items, DemandForecast{});
  day_.resize(items);
  for (int d = 0; d < period; ++d) {
    const int day = ctx.order_day + 1 + d;
    DemandForecast* row = &forecasts_[static_cast<size_t>(d) * items];
    if (day < 0 || day >= sc.horizon.days || !sc.is_open(ctx.store.store, day)) continue;
    if (ctx.forecaster != nullptr && other_days) {
      ctx.forecaster->predict(day, day_);
      std::copy(day_.begin(), day_.end(), row);
    } else {
      for (size_t i = 0; i < items; ++i) {
        const double w = 1.0 / std::max(in[i].cover_days, 1);
        row[i] = {in[i].forecast.mean * w, in[i].forecast.variance * w};
      }
    }
    if (day == ctx.arrival_day) {
      for (size_t i = 0; i < items; ++i) {
        if (in[i].cover_days <= 1) row[i] = in[i].forecast;
      }
    }
  }
}

const DemandForecast& ProtectionPeriod::day_forecast(size_t i, int d) const {
  // Without a filled table the period is the engine's one-day window.
  if (forecasts_.empty()) return in_[i].forecast;
  return forecasts_[static_cast<size_t>(d) * static_cast<size_t>(items_) + i];
}

bool ProtectionPeriod::plain(size_t i) const {
  return lead_ == 1 && days_[i] == 1 && (!scenario_.items[i].next_day || in_[i].discounted == 0);
}

DemandForecast ProtectionPeriod::demand(size_t i) const {
  const OrderInput& x = in_[i];
  if (plain(i)) return x.forecast;
  const int window = std::max(x.cover_days, 1);
  DemandForecast sum = x.forecast;
  for (int d = 0; d < days_[i]; ++d) {
    if (d >= lead_ - 1 && d < lead_ - 1 + window) continue;  // the engine's window
    const DemandForecast& f = day_forecast(i, d);
    sum.mean += std::max(f.mean, 0.0);
    sum.variance += std::max(f.variance, 0.0);
  }
  const Item& item = scenario_.items[i];
  if (item.next_day) {
    // Discounted units shown on the arrival day: tomorrow's tier with lead time 1, else the
    // units expected to reach the end of their life the day before the arrival.
    double shown = x.discounted;
    if (lead_ > 1) {
      std::vector<double> withdrawals(static_cast<size_t>(lead_ - 1));
      std::vector<double> leaving(withdrawals.size());
      for (size_t d = 0; d < withdrawals.size(); ++d) {
        withdrawals[d] = std::max(day_forecast(i, static_cast<int>(d)).mean, 0.0);
      }
      expected_outdating(x.stock_by_age, x.pipeline, item.shelf_life_days, withdrawals, fifo_share_,
                         leaving);
      shown = leaving.back();
    }
    const DemandForecast& arrival =
        lead_ == 1 && x.cover_days <= 1 ? x.forecast : day_forecast(i, lead_ - 1);
    sum.mean -= discount_netting(arrival, item.demand.family, take_rate_, shown);
  }
  sum.mean = std::max(sum.mean, 0.0);
  return sum;
}

int ProtectionPeriod::order_to(size_t i, long target) {
  const OrderInput& x = in_[i];
  if (plain(i))
    return static_cast<int>(std::clamp(target - x.usable_stock - x.on_order, 0L, 2000000000L));
  const int life = scenario_.items[i].shelf_life_days;
  const int days = days_[i];
  withdrawals_.assign(static_cast<size_t>(days), 0.0);
  for (int d = 0; d < days; ++d) {
    withdrawals_[static_cast<size_t>(d)] = std::max(day_forecast(i, d).mean, 0.0);
  }
  // Stock by age and arrivals; without an age profile, usable stock counts as fresh and units
  // on order as arriving tomorrow.
  stock_.assign(x.stock_by_age.begin(), x.stock_by_age.end());
  if (stock_.empty()) {
    stock_.assign(static_cast<size_t>(life), 0);
    stock_.back() = x.usable_stock;
  }
  arrivals_.assign(static_cast<size_t>(days), 0);
  if (x.pipeline.empty()) {
    arrivals_[0] = x.on_order;
  } else {
    for (size_t d = 0; d < x.pipeline.size() && d < arrivals_.size(); ++d) {
      arrivals_[d] = x.pipeline[d];
    }
  }
  const long position = std::accumulate(stock_.begin(), stock_.end(), 0L) +
                        std::accumulate(arrivals_.begin(), arrivals_.end(), 0L);
  const long base = target - position;
  const size_t arrival = static_cast<size_t>(lead_ - 1);
  const std::int32_t scheduled = arrivals_[arrival];
  long q = std::max(0L, base);
  for (int round = 0; round < 20; ++round) {
    arrivals_[arrival] = static_cast<std::int32_t>(std::min(scheduled + q, 2000000000L));
    const double o = expected_outdating(stock_, arrivals_, life, withdrawals_, fifo_share_);
    const long next = std::max(0L, base + static_cast<long>(std::ceil(o - 1e-9)));
    if (next == q) break;
    q = next;
  }
  return static_cast<int>(std::min(q, 2000000000L));
}

namespace {
/// F(x) of a count law at a real x: linear between the integers around it (0 below 0).
double cdf_at(const std::vector<double>& cdf, double x) {
  if (x < 0.0) return 0.0;
  const double f = std::floor(x);
  const size_t k = static_cast<size_t>(f);
  if (k + 1 >= cdf.size()) return 1.0;
  return cdf[k] + (x - f) * (cdf[k + 1] - cdf[k]);
}
}  // namespace

void ProtectionPeriod::carry(size_t i) {
  const OrderInput& x = in_[i];
  const Item& item = scenario_.items[i];
  carried_.clear();
  if (lead_ == 1) {
    carried_.push_back(
        {static_cast<double>(x.usable_stock + x.on_order), static_cast<double>(x.discounted), 1.0});
    return;
  }
  const int life = item.shelf_life_days;
  stock_.assign(x.stock_by_age.begin(), x.stock_by_age.end());
  if (stock_.empty()) {
    stock_.assign(static_cast<size_t>(life), 0);
    stock_.back() = x.usable_stock;
  }
  const int first_arrival = x.pipeline.empty() ? x.on_order : x.pipeline[0];
  if (lead_ == 2) {
    // The day before the arrival, exactly: its demand, the split of its sales between the
    // oldest and the freshest end, and the units on their last day that are left.
    long total = first_arrival;
    for (std::int32_t s : stock_) total += s;
    const long last = stock_.empty() ? 0 : (life == 1 ? first_arrival : stock_[0]);
    const DemandForecast& f = day_forecast(i, 0);
    const CountLaw law =
        CountLaw::from_moments(item.demand.family, std::max(f.mean, 0.0), f.variance);
    double cdf = 0.0;
    for (long d = 0;; ++d) {
      const double next = d >= total ? 1.0 : law.cdf(static_cast<int>(d));
      const double pd = next - cdf;
      cdf = next;
      const long sold = std::min(d, total);
      const std::vector<double> split = binomial_pmf(static_cast<int>(sold), fifo_share_);
      for (size_t k = 0; k < split.size(); ++k) {
        if (split[k] <= 0.0) continue;
        const long fresh = sold - static_cast<long>(k);
        const long from_last =
            std::min(last, static_cast<long>(k) + std::max(0L, fresh - (total - last)));
        const long left_last = last - from_last;
        carried_.push_back({static_cast<double>(total - sold - left_last),
                            item.next_day ? static_cast<double>(left_last) : 0.0, pd * split[k]});
      }
      if (d >= total || 1.0 - cdf < 1e-9) break;
    }
    return;
  }
  // Longer lead times: the expected carried stock (EWA over the days before the arrival).
  const size_t before = static_cast<size_t>(lead_ - 1);
  withdrawals_.assign(before, 0.0);
  leaving_.assign(before, 0.0);
  double in_total = 0.0;
  for (std::int32_t s : stock_) in_total += s;
  arrivals_.assign(before, 0);
  for (size_t d = 0; d < before; ++d) {
    withdrawals_[d] = std::max(day_forecast(i, static_cast<int>(d)).mean, 0.0);
    arrivals_[d] = x.pipeline.size() > d ? x.pipeline[d] : (d == 0 ? x.on_order : 0);
    in_total += arrivals_[d];
  }
  expected_outdating(stock_, arrivals_, life, withdrawals_, fifo_share_, leaving_);
  // What is left: everything in, less the expected sales (capped by the stock) and leavers.
  double left = in_total;
  for (size_t d = 0; d < before; ++d) left -= withdrawals_[d] + leaving_[d];
  carried_.push_back({std::max(left, 0.0), item.next_day ? leaving_.back() : 0.0, 1.0});
}

double ProtectionPeriod::window_outdating(size_t i, long q) {
  const int days = days_[i];
  const int life = scenario_.items[i].shelf_life_days;
  withdrawals_.assign(static_cast<size_t>(days), 0.0);
  leaving_.assign(static_cast<size_t>(days), 0.0);
  for (int d = 0; d < days; ++d) {
    withdrawals_[static_cast<size_t>(d)] = std::max(day_forecast(i, d).mean, 0.0);
  }
  const OrderInput& x = in_[i];
  stock_.assign(x.stock_by_age.begin(), x.stock_by_age.end());
  if (stock_.empty()) {
    stock_.assign(static_cast<size_t>(life), 0);
    stock_.back() = x.usable_stock;
  }
  arrivals_.assign(static_cast<size_t>(days), 0);
  for (size_t d = 0; d < x.pipeline.size() && d < arrivals_.size(); ++d)
    arrivals_[d] = x.pipeline[d];
  arrivals_[static_cast<size_t>(lead_ - 1)] += static_cast<std::int32_t>(std::min(q, 2000000000L));
  expected_outdating(stock_, arrivals_, life, withdrawals_, fifo_share_, leaving_);
  double o = 0.0;
  for (int d = lead_ - 1; d + 1 < days; ++d) o += leaving_[static_cast<size_t>(d)];
  return o;
}

int ProtectionPeriod::quantile_order(size_t i, DemandFamily family, double p, int extra) {
  const OrderInput& x = in_[i];
  if (plain(i)) {
    const int target = p > 0.0 ? forecast_quantile(x.forecast, family, p) + extra : 0;
    return std::max(0, target - x.usable_stock - x.on_order);
  }
  if (!(p > 0.0)) return 0;
  const Item& item = scenario_.items[i];
  const DemandForecast w = x.forecast;
  const CountLaw law = CountLaw::from_moments(family, std::max(w.mean, 0.0), w.variance);
  carry(i);
  // The window's cdf up to where every outcome is covered.
  double top = 0.0;
  for (const Carried& c : carried_) top = std::max(top, c.units + c.discounted);
  const int k_max = forecast_quantile(w, family, 1.0 - 1e-9) + 2;
  std::vector<double> cdf(static_cast<size_t>(k_max) + 1);
  for (int k = 0; k <= k_max; ++k) cdf[static_cast<size_t>(k)] = law.cdf(k);
  std::vector<double> netting(carried_.size(), 0.0);
  if (item.next_day) {
    for (size_t c = 0; c < carried_.size(); ++c) {
      netting[c] = discount_netting(w, family, take_rate_, carried_[c].discounted);
    }
  }
  const auto covered = [&](long q) {
    double g = 0.0;
    for (size_t c = 0; c < carried_.size(); ++c) {
      g += carried_[c].probability *
           cdf_at(cdf, carried_[c].units + static_cast<double>(q - extra) + netting[c]);
    }
    return g;
  };
  long q = 0;
  while (q < k_max + extra && covered(q) < p) ++q;
  // A window of several days: units expected to outdate within it do not serve it.
  if (days_[i] - (lead_ - 1) > 1 && item.shelf_life_days > 1) {
    const long base = q;
    for (int round = 0; round < 20; ++round) {
      const long next = base + static_cast<long>(std::ceil(window_outdating(i, q) - 1e-9));
      if (next == q) break;
      q = next;
    }
  }
  return static_cast<int>(std::min(q, 2000000000L));
}

}  // namespace larder
