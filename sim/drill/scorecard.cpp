#include "sim/drill/scorecard.hpp"

#include <cmath>
#include <limits>

#include "policies/quantity/critical_fractile.hpp"

namespace larder {

namespace {

/// The series of one item (or several, appended) that the readings need.
struct Series {
  std::vector<double> q_prev, s_prev, q, mu_prev, mu_now;  // chasing, per unit of the item's mean
  std::vector<double> mu, q_star, q_pull;  // pull to centre, scaled by the day's mean
  double service_sum = 0.0;
  double justified_sum = 0.0;
  int orders = 0;
  void append(const Series& o) {
    q_prev.insert(q_prev.end(), o.q_prev.begin(), o.q_prev.end());
    s_prev.insert(s_prev.end(), o.s_prev.begin(), o.s_prev.end());
    q.insert(q.end(), o.q.begin(), o.q.end());
    mu_prev.insert(mu_prev.end(), o.mu_prev.begin(), o.mu_prev.end());
    mu_now.insert(mu_now.end(), o.mu_now.begin(), o.mu_now.end());
    mu.insert(mu.end(), o.mu.begin(), o.mu.end());
    q_star.insert(q_star.end(), o.q_star.begin(), o.q_star.end());
    q_pull.insert(q_pull.end(), o.q_pull.begin(), o.q_pull.end());
    service_sum += o.service_sum;
    justified_sum += o.justified_sum;
    orders += o.orders;
  }
};

HabitReading reading(std::string item, const Series& s) {
  HabitReading h;
  h.item = std::move(item);
  h.chasing = chasing_weight(s.q_prev, s.s_prev, s.q, s.mu_prev, s.mu_now);
  // Mean and Q* must differ enough for w to mean something: on average 5% of the mean.
  h.pull_to_center = slope_through_origin(
      [&] {
        std::vector<double> x(s.mu.size());
        for (size_t k = 0; k < x.size(); ++k) x[k] = s.mu[k] - s.q_star[k];
        return x;
      }(),
      [&] {
        std::vector<double> y(s.mu.size());
        for (size_t k = 0; k < y.size(); ++k) y[k] = s.q_pull[k] - s.q_star[k];
        return y;
      }(),
      0.0025 * static_cast<double>(s.mu.size()));
  const double nan = std::numeric_limits<double>::quiet_NaN();
  h.orders = s.orders;
  h.implied_service = s.orders > 0 ? s.service_sum / s.orders : nan;
  h.justified_service = s.orders > 0 ? s.justified_sum / s.orders : nan;
  return h;
}

}  // namespace

std::vector<Metric> scorecard_metrics() {
  return {Metric::waste_units, Metric::in_stock_at_close, Metric::fill_rate, Metric::profit};
}

Scorecard score_drill(DrillGame& game, const DrillDecisions& decided, std::string trainee) {
  const DrillOutcome out = game.play(decided);
  const Scenario& s = game.scenario();
  const DrillSpec& sp = game.spec();
  Scorecard c;
  c.scenario = s.name;
  c.trainee = std::move(trainee);
  c.seed = s.seed;
  c.store = s.stores[static_cast<size_t>(sp.store)].id;
  for (const int i : sp.items) c.items.push_back(s.items[static_cast<size_t>(i)].id);
  c.currency = s.currency;
  c.first_day = game.first_day();
  c.days = sp.days;
  c.events = sp.events;
  const size_t trainee_lane = out.policies.size() - 1;
  c.policies.push_back(c.trainee);
  c.totals.push_back(out.totals[trainee_lane]);
  c.daily.push_back(out.daily[trainee_lane]);
  for (size_t p = 0; p < trainee_lane; ++p) {
    c.policies.push_back(out.policies[p]);
    c.totals.push_back(out.totals[p]);
    c.daily.push_back(out.daily[p]);
  }
  for (int d = 0; d < c.days; ++d) {
    c.weekday.push_back(kWeekdayNames[static_cast<size_t>(s.weekday_of(c.first_day + d))]);
  }
  c.item_days = out.items;

  // Habits: Q is the stock at opening of a delivery day (what the order set), S the sales the
  // trainee last saw when ordering it (the order day's), mu and Q* the true law's (pull to
  // centre per unit of the day's mean).
  const int lead = s.logistics.lead_time_days;
  Series all;
  std::vector<HabitReading> per_item;
  for (size_t k = 0; k < sp.items.size(); ++k) {
    const int item = sp.items[k];
    const Item& it = s.items[static_cast<size_t>(item)];
    const double cr = critical_ratio(s, it, it.stockout_penalty);
    const auto& days = out.items[k];
    Series one;
    // Chasing is read in units of the item's mean demand over the drill, so items pool.
    double scale = 0.0;
    for (int d = 0; d < c.days; ++d) scale += game.demand().mean(sp.store, item, c.first_day + d);
    scale = scale > 0.0 ? scale / c.days : 1.0;
    for (const DrillTurn& t : game.turns()) {
      const ItemDay& a = days[static_cast<size_t>(t.arrival_day - c.first_day)];
      const CountLaw law = game.demand().law(sp.store, item, t.arrival_day);
      if (!a.open || law.mean <= 0.0) continue;
      const double mu = law.mean;
      const double q = a.open_stock;
      const double q_star = cr <= 0.0 ? 0.0 : cr >= 1.0 ? q : law.quantile(cr);
      one.mu.push_back(1.0);
      one.q_star.push_back(q_star / mu);
      one.q_pull.push_back(q / mu);
      one.service_sum += law.cdf(a.open_stock);
      one.justified_sum += cr;
      ++one.orders;
      const int d = t.order_day;
      if (d < c.first_day) continue;
      const ItemDay& seen = days[static_cast<size_t>(d - c.first_day)];
      const double mu_d = game.demand().law(sp.store, item, d).mean;
      if (!seen.open || mu_d <= 0.0 || d + lead != t.arrival_day) continue;
      one.q_prev.push_back(seen.open_stock / scale);
      one.s_prev.push_back(seen.sold / scale);
      one.q.push_back(q / scale);
      one.mu_prev.push_back(mu_d / scale);
      one.mu_now.push_back(mu / scale);
    }
    per_item.push_back(reading(it.id, one));
    all.append(one);
  }
  c.habits.push_back(reading("all", all));
  c.habits.insert(c.habits.end(), per_item.begin(), per_item.end());
  return c;
}

}  // namespace larder
