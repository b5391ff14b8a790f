#include "policies/network/allocation.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <stdexcept>

namespace larder {

namespace {

/// The upper concave hulls of all groups' (in_stock, profit) points from the most profitable
/// point to the most in-stock one, in one flat array: group g owns vertices
/// [begin[g], begin[g + 1]), in increasing in_stock, and slope[v] is the profit given up per
/// in-stock day gained on the edge into vertex v (strictly increasing along a hull; unused for
/// a group's first vertex). Along the hull, profit + lambda * in_stock is maximal at the vertex
/// after the last edge whose slope is below lambda (ties: the lower vertex); every point off the
/// hull is beaten or tied by a hull vertex for every lambda >= 0.
struct Hulls {
  std::vector<std::size_t> begin;
  std::vector<int> level;
  std::vector<double> slope;

  /// Group g's vertex for a lambda just above b: after every edge of slope <= b.
  std::size_t vertex_after(std::size_t g, double b) const {
    const auto first = slope.begin() + static_cast<std::ptrdiff_t>(begin[g]);
    const auto last = slope.begin() + static_cast<std::ptrdiff_t>(begin[g + 1]);
    return begin[g] + static_cast<std::size_t>(std::upper_bound(first + 1, last, b) - (first + 1));
  }
};

Hulls make_hulls(std::span<const GroupCurve> groups, std::size_t n_levels) {
  Hulls h;
  h.begin.reserve(groups.size() + 1);
  std::vector<int> order(n_levels);
  for (const GroupCurve& c : groups) {
    h.begin.push_back(h.level.size());
    const auto& in = c.in_stock;
    const auto& pr = c.profit;
    // In-stock ascending, then profit descending, then level ascending: a total order.
    const auto before = [&](int a, int b) {
      if (in[a] != in[b]) return in[a] < in[b];
      if (pr[a] != pr[b]) return pr[a] > pr[b];
      return a < b;
    };
    std::iota(order.begin(), order.end(), 0);
    if (!std::is_sorted(order.begin(), order.end(), before)) {  // level curves are sorted
      std::sort(order.begin(), order.end(), before);
    }
    // The hull starts at the most profitable point (first in this order among equals): points
    // with less in stock are beaten by it for every lambda >= 0.
    std::size_t start = 0;
    for (std::size_t k = 1; k < n_levels; ++k) {
      if (pr[order[k]] > pr[order[start]]) start = k;
    }
    const std::size_t base = h.level.size();
    h.level.push_back(order[start]);
    h.slope.push_back(0.0);
    for (std::size_t k = start + 1; k < n_levels; ++k) {
      const int i = order[k];
      if (in[i] == in[h.level.back()]) continue;  // no more in stock, no more profit
      const auto slope_to = [&](int from) { return (pr[from] - pr[i]) / (in[i] - in[from]); };
      double s = slope_to(h.level.back());
      // Drop vertices that are no longer strictly concave (collinear ones too: at the shared
      // slope the lower end wins the tie anyway).
      while (h.level.size() - base >= 2 && s <= h.slope.back()) {
        h.level.pop_back();
        h.slope.pop_back();
        s = slope_to(h.level.back());
      }
      h.level.push_back(i);
      h.slope.push_back(s);
    }
  }
  h.begin.push_back(h.level.size());
  return h;
}

}  // namespace

Allocation allocate(std::span<const GroupCurve> groups, double target) {
  if (!std::isfinite(target)) throw std::invalid_argument("allocate: the target must be finite");
  const std::size_t n_levels = groups.empty() ? 0 : groups.front().in_stock.size();
  for (const GroupCurve& c : groups) {
    if (n_levels == 0 || c.in_stock.size() != n_levels || c.profit.size() != n_levels) {
      throw std::invalid_argument("allocate: every group needs one value per level of the grid");
    }
    const auto finite = [](double x) { return std::isfinite(x); };
    if (!std::isfinite(c.days) || !std::all_of(c.in_stock.begin(), c.in_stock.end(), finite) ||
        !std::all_of(c.profit.begin(), c.profit.end(), finite)) {
      throw std::invalid_argument("allocate: curves and days must be finite");
    }
  }

  Allocation a;
  a.level.assign(groups.size(), 0);
  double days = 0.0;
  for (const GroupCurve& c : groups) days += c.days;
  a.required = target * days;
  // Every sum runs over the groups in their order, so equal inputs give equal results.
  const auto in_stock_of = [&](const auto& level_of) {
    double s = 0.0;
    for (std::size_t g = 0; g < groups.size(); ++g) s += groups[g].in_stock[level_of(g)];
    return s;
  };
  const auto take = [&](const auto& level_of) {
    a.in_stock = 0.0;
    a.profit = 0.0;
    for (std::size_t g = 0; g < groups.size(); ++g) {
      const int l = level_of(g);
      a.level[g] = l;
      a.in_stock += groups[g].in_stock[static_cast<std::size_t>(l)];
      a.profit += groups[g].profit[static_cast<std::size_t>(l)];
    }
  };

  const Hulls h = make_hulls(groups, n_levels);
  const auto first_vertex = [&](std::size_t g) { return h.level[h.begin[g]]; };
  const auto last_vertex = [&](std::size_t g) { return h.level[h.begin[g + 1] - 1]; };

  // lambda = 0: the unconstrained optimum (ties: the lower level).
  take(first_vertex);
  if (a.in_stock >= a.required) return a;

  // Even the most in stock everywhere misses the target.
  if (in_stock_of(last_vertex) < a.required) {
    take([&](std::size_t) { return static_cast<int>(n_levels) - 1; });
    a.feasible = false;
    return a;
  }

  // The choices change only at hull slopes: bisection over the sorted distinct slopes for the
  // smallest b such that the choices for lambda just above b meet the target. The largest slope
  // qualifies (every group at its most in-stock vertex); lambda = 0 does not.
  std::vector<double> breaks;
  breaks.reserve(h.level.size() - groups.size());
  for (std::size_t g = 0; g < groups.size(); ++g) {
    for (std::size_t v = h.begin[g] + 1; v < h.begin[g + 1]; ++v) breaks.push_back(h.slope[v]);
  }
  std::sort(breaks.begin(), breaks.end());
  breaks.erase(std::unique(breaks.begin(), breaks.end()), breaks.end());
  const auto after = [&](double b) {
    return [&h, b](std::size_t g) { return h.level[h.vertex_after(g, b)]; };
  };
  std::ptrdiff_t lo = -1;  // lambda = 0: misses
  auto hi = static_cast<std::ptrdiff_t>(breaks.size()) - 1;
  while (hi - lo > 1) {
    const std::ptrdiff_t mid = lo + (hi - lo) / 2;
    if (in_stock_of(after(breaks[static_cast<std::size_t>(mid)])) >= a.required) {
      hi = mid;
    } else {
      lo = mid;
    }
  }
  const double b = breaks[static_cast<std::size_t>(hi)];
  take(after(b));
  // The smallest double above b: there the choices above are each group's own optimum.
  a.lambda = std::nextafter(b, std::numeric_limits<double>::infinity());
  a.gap_bound = a.in_stock > a.required ? a.lambda * (a.in_stock - a.required) : 0.0;
  return a;
}

Allocation improve(std::span<const GroupCurve> groups, Allocation a, std::size_t max_work) {
  if (!a.feasible || groups.empty()) return a;
  const std::size_t n_levels = groups.front().profit.size();
  if (groups.size() * n_levels > max_work) return a;
  // Each move strictly raises the profit, so the search ends; the cap only bounds the work.
  for (std::size_t round = 0; round < 4 * groups.size() * n_levels; ++round) {
    const double slack = a.in_stock - a.required;
    double best_gain = 0.0;
    std::size_t best_group = 0;
    std::size_t best_level = 0;
    for (std::size_t g = 0; g < groups.size(); ++g) {
      const auto cur = static_cast<std::size_t>(a.level[g]);
      for (std::size_t l = 0; l < n_levels; ++l) {
        const double gain = groups[g].profit[l] - groups[g].profit[cur];
        if (gain <= best_gain || groups[g].in_stock[l] - groups[g].in_stock[cur] < -slack) continue;
        best_gain = gain;
        best_group = g;
        best_level = l;
      }
    }
    // A gain below the rounding noise of the sums is no gain.
    if (best_gain <= 1e-12 * (1.0 + std::fabs(a.profit))) break;
    const auto cur = static_cast<std::size_t>(a.level[best_group]);
    a.in_stock += groups[best_group].in_stock[best_level] - groups[best_group].in_stock[cur];
    a.profit += best_gain;
    a.gap_bound = std::max(0.0, a.gap_bound - best_gain);
    a.level[best_group] = static_cast<int>(best_level);
  }
  return a;
}

}  // namespace larder
