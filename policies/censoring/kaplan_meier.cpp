// The Kaplan-Meier product-limit estimator (Kaplan and Meier 1958; checks.md 3(b)): one pass
// over the sorted observations, censored ones kept in the risk set at their own time.

#include "policies/censoring/kaplan_meier.hpp"

#include <algorithm>

namespace larder {

void kaplan_meier(std::span<SurvivalObservation> data, KaplanMeier& out) {
  out.times.clear();
  out.at_risk.clear();
  out.events.clear();
  out.survival.clear();
  out.largest_censored = -std::numeric_limits<double>::infinity();
  std::sort(
      data.begin(), data.end(),
      [](const SurvivalObservation& a, const SurvivalObservation& b) { return a.time < b.time; });
  const size_t n = data.size();
  double s = 1.0;
  for (size_t i = 0; i < n;) {
    const double t = data[i].time;
    int events = 0;
    size_t j = i;
    for (; j < n && data[j].time == t; ++j) {
      if (data[j].censored) {
        out.largest_censored = t;
      } else {
        ++events;
      }
    }
    if (events > 0) {
      const int at_risk = static_cast<int>(n - i);  // all observations >= t, censored ones too
      s *= 1.0 - static_cast<double>(events) / at_risk;
      out.times.push_back(t);
      out.at_risk.push_back(at_risk);
      out.events.push_back(events);
      out.survival.push_back(s);
    }
    i = j;
  }
}

KaplanMeier kaplan_meier(std::vector<SurvivalObservation> data) {
  KaplanMeier km;
  kaplan_meier(std::span<SurvivalObservation>(data), km);
  return km;
}

double KaplanMeier::survival_at(double t) const {
  // The last event time <= t.
  const auto it = std::upper_bound(times.begin(), times.end(), t);
  return it == times.begin() ? 1.0 : survival[static_cast<size_t>(it - times.begin() - 1)];
}

double KaplanMeier::restricted_mean(double tau) const {
  double area = 0.0;
  double from = 0.0;
  double s = 1.0;
  for (size_t i = 0; i < times.size() && times[i] < tau; ++i) {
    if (times[i] > from) {
      area += s * (times[i] - from);
      from = times[i];
    }
    s = survival[i];
  }
  if (tau > from) area += s * (tau - from);
  return area;
}

}  // namespace larder
