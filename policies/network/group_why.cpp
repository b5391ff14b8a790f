// Why a network plan gave a group its level: margins, variability, expectations at the level
// and the shadow price of one more point of in-stock (group_why.hpp).

#include "policies/network/group_why.hpp"

#include <cmath>
#include <limits>
#include <stdexcept>

namespace larder {

namespace {
constexpr double kPoint = 0.01;  // one point of in-stock
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
}  // namespace

void GroupMargins::add(double mean, double variance, const Economics& e) {
  const double m = std::max(mean, 0.0);
  demand += m;
  demand_sd += std::sqrt(std::max(variance, 0.0));
  underage += m * std::max(e.price - e.unit_cost + e.penalty, 0.0);
  overage += m * std::max(e.unit_cost - e.recovery, 0.0);
}

double GroupMargins::critical_ratio() const {
  return underage + overage > 0 ? underage / (underage + overage) : 0.0;
}

double GroupMargins::cv() const {
  return demand > 0 ? demand_sd / demand : 0.0;
}

void add_curves(std::vector<GroupCurve>& sum, std::span<const GroupCurve> plan) {
  if (sum.empty()) {
    sum.assign(plan.begin(), plan.end());
    return;
  }
  if (sum.size() != plan.size()) throw std::invalid_argument("add_curves: group counts differ");
  for (size_t g = 0; g < sum.size(); ++g) {
    GroupCurve& s = sum[g];
    const GroupCurve& p = plan[g];
    if (s.in_stock.size() != p.in_stock.size()) {
      throw std::invalid_argument("add_curves: level grids differ");
    }
    for (size_t l = 0; l < s.in_stock.size(); ++l) {
      s.in_stock[l] += p.in_stock[l];
      s.profit[l] += p.profit[l];
    }
    if (s.leftover.size() == p.leftover.size()) {
      for (size_t l = 0; l < s.leftover.size(); ++l) s.leftover[l] += p.leftover[l];
    } else {
      s.leftover.clear();
    }
    s.days += p.days;
  }
}

Allocation allocate_summed(std::span<const GroupCurve> curves, double target) {
  return improve(curves, allocate(curves, target));
}

std::vector<GroupWhy> group_why(std::span<const GroupCurve> curves, const Allocation& a,
                                std::span<const double> levels,
                                std::span<const GroupMargins> margins, double plans) {
  std::vector<GroupWhy> out;
  const double per = plans > 0 ? 1.0 / plans : 0.0;
  for (size_t g = 0; g < curves.size(); ++g) {
    const GroupCurve& c = curves[g];
    const auto l = static_cast<size_t>(a.level[g]);
    GroupWhy w;
    w.level = levels[l];
    w.days = c.days * per;
    w.in_stock = c.days > 0 ? c.in_stock[l] / c.days : 0.0;
    w.leftover = c.leftover.empty() ? kNaN : c.leftover[l] * per;
    w.profit = c.profit[l] * per;
    w.point_cost = kNaN;
    for (size_t up = l + 1; up < c.in_stock.size(); ++up) {
      const double gained = c.in_stock[up] - c.in_stock[l];
      if (gained <= 0) continue;
      w.point_cost = (c.profit[l] - c.profit[up]) / gained * kPoint * c.days * per;
      break;
    }
    if (g < margins.size()) {
      w.critical_ratio = margins[g].critical_ratio();
      w.cv = margins[g].cv();
    }
    out.push_back(w);
  }
  return out;
}

PointPrice network_point_price(std::span<const GroupCurve> curves, const Allocation& a,
                               double target, double plans) {
  double days = 0;
  for (const GroupCurve& c : curves) days += c.days;
  const double per = plans > 0 ? 1.0 / plans : 0.0;
  PointPrice p;
  p.multiplier = a.lambda * kPoint * days * per;
  p.finite_difference = kNaN;
  if (target + kPoint <= 1.0) {
    const Allocation up = allocate_summed(curves, target + kPoint);
    if (up.feasible && a.feasible) p.finite_difference = (a.profit - up.profit) * per;
  }
  return p;
}

}  // namespace larder
