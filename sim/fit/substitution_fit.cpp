#include "sim/fit/substitution_fit.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "sim/fit/dense_newton.hpp"

namespace larder {

namespace {

constexpr double kNever = std::numeric_limits<double>::infinity();
constexpr double kUnknown = -1.0;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr int kRounds = 10;
constexpr double kTolerance = 1e-3;  // in share: a small part of any share's standard error

/// One source of substitute demand on a row of the substitute: the row of the item that was
/// out and the share of its day's demand still to come at its sell-out, G(tau).
struct Source {
  int slot = 0;  ///< index into the target's list of sources
  size_t row_out = 0;
  double arrived = 0.0;  ///< G(tau)
  double mean = 0.0;     ///< E[L] at the current fit
  double spread = 0.0;   ///< the extra variance of L over Poisson, (1 - G)^2 Var(rate)
};

/// A row of a target item with its sources.
struct TargetRow {
  size_t row = 0;
  std::vector<Source> sources;
};

struct Target {
  int item = 0;
  std::vector<int> sources;     ///< source items (slot -> item), pairs with enough days
  std::vector<int> store_days;  ///< per slot
  std::vector<TargetRow> rows;  ///< rows with at least one source
  Eigen::VectorXd alpha;        ///< per slot
};

/// E[L] and the extra variance of L for a source row under the fitted law of its item.
void lost_demand(const FitData& data, const Decomposition& fit, Source& s) {
  const FitDay& d = data.rows[s.row_out];
  const ItemEstimate& e = fit.items[d.item];
  const double m = fit.mean(d.store, d.item, data.weekday(d.day));
  const double rest = 1.0 - s.arrived;
  s.mean = m * rest;
  s.spread = 0.0;
  const double excess = e.cv * e.cv * m - 1.0;
  if (e.family == DemandFamily::poisson || excess <= 0.0 || m <= 0.0) return;
  const double r = m / excess;
  const double rate = r / m + s.arrived;
  s.mean = rest * (r + d.sold) / rate;
  s.spread = rest * rest * (r + d.sold) / (rate * rate);
}

ExtraDemand extra_of(const TargetRow& tr, const Eigen::VectorXd& alpha) {
  ExtraDemand x;
  for (const Source& s : tr.sources) {
    const double a = alpha[s.slot];
    x.mean += a * s.mean;
    x.var += a * s.mean + a * a * s.spread;  // Binomial(L, a): a E[L] + a^2 (Var L - E[L])
  }
  return x;
}

double row_nll(const FitData& data, const ItemEstimate& e, double own, const ExtraDemand& x,
               size_t row) {
  const FitDay& d = data.rows[row];
  if (d.sold_out && d.sold == 0) return 0.0;
  if (!(own + x.mean > 0.0)) return std::numeric_limits<double>::infinity();
  return -total_log_likelihood(e.family, own, e.cv, x, d.sold, d.sold_out);
}

/// Builds the targets: every ordered pair (out, substitute) of fitted items with at least
/// `min_store_days` store-days on which `out` sold out at a known time (whether or not the
/// substitute was still in stock: its demand counts the customers who came, served or not).
/// Rows on a store-day with a sell-out of unknown time are marked in `excluded`.
std::vector<Target> build_targets(const FitData& data, const Decomposition& fit,
                                  const std::vector<IntradayFit>& intraday, int min_store_days,
                                  std::vector<char>& excluded) {
  const auto n = data.items.size();
  std::vector<size_t> order;
  for (size_t r = 0; r < data.rows.size(); ++r) {
    const FitDay& d = data.rows[r];
    if (fit.items[d.item].fitted && fit.stores[d.store].fitted) order.push_back(r);
  }
  std::sort(order.begin(), order.end(), [&](size_t a, size_t b) {
    const FitDay& x = data.rows[a];
    const FitDay& y = data.rows[b];
    return x.store != y.store ? x.store < y.store : x.day < y.day;
  });
  std::vector<std::vector<int>> count(n, std::vector<int>(n, 0));
  // Candidate (target row, out item, out row, G) of every store-day.
  struct Candidate {
    size_t row_in, row_out;
    int out;
    double arrived;
  };
  std::vector<Candidate> candidates;
  for (size_t b = 0; b < order.size();) {
    size_t e = b;
    while (e < order.size() && data.rows[order[e]].store == data.rows[order[b]].store &&
           data.rows[order[e]].day == data.rows[order[b]].day)
      ++e;
    std::vector<long> row(n, -1);
    std::vector<double> tau(n, kNever);
    bool unknown = false;
    for (size_t k = b; k < e; ++k) {
      const FitDay& d = data.rows[order[k]];
      row[d.item] = static_cast<long>(order[k]);
      if (d.sold_out && d.sold > 0) {
        tau[d.item] = d.sold_out_minute < 0 ? kUnknown : d.sold_out_minute;
        unknown = unknown || d.sold_out_minute < 0;
      }
    }
    for (size_t i = 0; i < n; ++i) {
      if (row[i] < 0) continue;
      if (unknown) {
        excluded[static_cast<size_t>(row[i])] = 1;
        continue;
      }
      for (size_t j = 0; j < n; ++j) {
        if (j == i || row[j] < 0 || tau[j] == kNever) continue;
        const auto& shares = intraday[j].shares;
        if (shares.empty()) continue;
        const double g = cumulative_share(shares, data.columns.first_hour, tau[j]);
        count[j][i]++;
        candidates.push_back(
            {static_cast<size_t>(row[i]), static_cast<size_t>(row[j]), static_cast<int>(j), g});
      }
    }
    b = e;
  }
  std::vector<Target> targets;
  std::vector<int> target_of(n, -1);
  std::vector<std::vector<int>> slot_of(n, std::vector<int>(n, -1));
  for (size_t i = 0; i < n; ++i) {
    Target t;
    t.item = static_cast<int>(i);
    for (size_t j = 0; j < n; ++j) {
      if (count[j][i] < min_store_days) continue;
      slot_of[i][j] = static_cast<int>(t.sources.size());
      t.sources.push_back(static_cast<int>(j));
      t.store_days.push_back(count[j][i]);
    }
    if (t.sources.empty()) continue;
    t.alpha = Eigen::VectorXd::Zero(static_cast<Eigen::Index>(t.sources.size()));
    target_of[i] = static_cast<int>(targets.size());
    targets.push_back(std::move(t));
  }
  // Candidates arrive grouped by store-day, so a target row's sources are consecutive.
  for (const Candidate& c : candidates) {
    const int item = data.rows[c.row_in].item;
    const int t = target_of[static_cast<size_t>(item)];
    if (t < 0) continue;
    const int slot = slot_of[static_cast<size_t>(item)][static_cast<size_t>(c.out)];
    if (slot < 0) continue;
    Target& tg = targets[static_cast<size_t>(t)];
    if (tg.rows.empty() || tg.rows.back().row != c.row_in) tg.rows.push_back({c.row_in, {}});
    tg.rows.back().sources.push_back({slot, c.row_out, c.arrived, 0.0, 0.0});
  }
  return targets;
}

/// Every row of the target in a fitted store and not excluded, with its sources if any.
std::vector<std::pair<size_t, const TargetRow*>> all_rows(const FitData& data,
                                                          const Decomposition& fit, const Target& t,
                                                          const std::vector<char>& excluded) {
  std::vector<std::pair<size_t, const TargetRow*>> rows;
  size_t next = 0;
  for (size_t r = 0; r < data.rows.size(); ++r) {
    const FitDay& d = data.rows[r];
    if (d.item != t.item || !fit.stores[d.store].fitted || excluded[r]) continue;
    while (next < t.rows.size() && t.rows[next].row < r) ++next;
    rows.emplace_back(r, next < t.rows.size() && t.rows[next].row == r ? &t.rows[next] : nullptr);
  }
  return rows;
}

/// The shares of one target with its weekday means held at the decomposition's up to one
/// common factor, fitted with them (the base and the shares are strongly correlated: without
/// it the alternation with the decomposition would crawl).
void fit_shares(const FitData& data, const Decomposition& fit, Target& t,
                const std::vector<char>& excluded) {
  const ItemEstimate& e = fit.items[static_cast<size_t>(t.item)];
  const auto rows = all_rows(data, fit, t, excluded);
  std::vector<double> own;
  for (const auto& [r, tr] : rows) {
    const FitDay& d = data.rows[r];
    own.push_back(fit.mean(d.store, t.item, data.weekday(d.day)));
  }
  const Eigen::Index S = t.alpha.size();
  const DenseValue f = [&](const Eigen::VectorXd& x) {
    const double scale = std::exp(x[S]);
    double v = 0.0;
    for (size_t k = 0; k < rows.size(); ++k) {
      const TargetRow* tr = rows[k].second;
      v += row_nll(data, e, own[k] * scale, tr ? extra_of(*tr, x.head(S)) : ExtraDemand{},
                   rows[k].first);
    }
    return v;
  };
  Eigen::VectorXd x0 = Eigen::VectorXd::Zero(S + 1);
  x0.head(S) = t.alpha;
  const DenseMinimum dm = minimize_dense(f, x0);
  t.alpha = dm.x.head(S);
}

/// Standard errors of the shares from the joint observed information of the target's log
/// weekday means, log cv (not for poisson) and shares, over all its rows.
Eigen::VectorXd share_se(const FitData& data, const Decomposition& fit, const Target& t,
                         const std::vector<char>& excluded) {
  const ItemEstimate& e = fit.items[static_cast<size_t>(t.item)];
  std::vector<int> block(7, -1);
  Eigen::Index K = 0;
  for (int w = 0; w < 7; ++w)
    if (e.weekday_seen[w]) block[static_cast<size_t>(w)] = static_cast<int>(K++);
  const bool spread = e.family != DemandFamily::poisson;
  const Eigen::Index S = t.alpha.size();
  const Eigen::Index n = K + (spread ? 1 : 0) + S;
  Eigen::VectorXd theta(n);
  for (int w = 0; w < 7; ++w)
    if (block[static_cast<size_t>(w)] >= 0)
      theta[block[static_cast<size_t>(w)]] = std::log(e.base * e.weekday[w]);
  if (spread) theta[K] = std::log(e.cv);
  theta.tail(S) = t.alpha;
  const auto rows = all_rows(data, fit, t, excluded);
  const DenseValue f = [&](const Eigen::VectorXd& x) {
    ItemEstimate at = e;
    if (spread) at.cv = std::exp(x[K]);
    const Eigen::VectorXd alpha = x.tail(S);
    double v = 0.0;
    for (const auto& [r, tr] : rows) {
      const FitDay& d = data.rows[r];
      const double own =
          fit.stores[d.store].size * std::exp(x[block[static_cast<size_t>(data.weekday(d.day))]]);
      v += row_nll(data, at, own, tr ? extra_of(*tr, alpha) : ExtraDemand{}, r);
    }
    return v;
  };
  Eigen::MatrixXd H = dense_hessian(f, theta, 1e-4);
  Eigen::VectorXd se = Eigen::VectorXd::Constant(S, std::numeric_limits<double>::infinity());
  if (spread && Eigen::LLT<Eigen::MatrixXd>(H).info() != Eigen::Success) {
    // A negative binomial at its Poisson limit: the cv is not determined (flat), so the
    // shares' errors are taken with the cv held.
    Eigen::MatrixXd without(n - 1, n - 1);
    std::vector<Eigen::Index> keep;
    for (Eigen::Index k = 0; k < n; ++k)
      if (k != K) keep.push_back(k);
    for (size_t a = 0; a < keep.size(); ++a)
      for (size_t b = 0; b < keep.size(); ++b)
        without(static_cast<Eigen::Index>(a), static_cast<Eigen::Index>(b)) = H(keep[a], keep[b]);
    H = without;
  }
  Eigen::LLT<Eigen::MatrixXd> llt(H);
  if (llt.info() != Eigen::Success) return se;
  const Eigen::Index m = H.rows();
  const Eigen::MatrixXd cov = llt.solve(Eigen::MatrixXd::Identity(m, m));
  for (Eigen::Index s = 0; s < S; ++s) se[s] = std::sqrt(cov(m - S + s, m - S + s));
  return se;
}

}  // namespace

SubstitutionFit fit_substitution(const FitData& data, const FitOptions& options, Decomposition& fit,
                                 const std::vector<IntradayFit>& intraday, int min_store_days) {
  SubstitutionFit out;
  if (data.columns.hours == 0 || !data.columns.has_sold_out_time) return out;
  std::vector<char> excluded(data.rows.size(), 0);
  std::vector<Target> targets = build_targets(data, fit, intraday, min_store_days, excluded);
  if (targets.empty()) return out;
  // Only a substitute's own rows need its sources' sell-out times.
  std::vector<char> is_target(data.items.size(), 0);
  for (const Target& t : targets) is_target[static_cast<size_t>(t.item)] = 1;
  for (size_t r = 0; r < data.rows.size(); ++r)
    if (!is_target[static_cast<size_t>(data.rows[r].item)]) excluded[r] = 0;
  out.extra.assign(data.rows.size(), ExtraDemand{});
  for (size_t r = 0; r < data.rows.size(); ++r)
    if (excluded[r]) out.extra[r].mean = kNaN;
  out.substitutes_from.assign(data.rows.size(), -1);
  for (const Target& t : targets) {
    for (const TargetRow& tr : t.rows) {
      // The first source sell-out before this item's own (its later sales hold substitutes).
      const FitDay& own = data.rows[tr.row];
      const int own_out = own.sold_out ? own.sold_out_minute : 24 * 60;
      std::int16_t first = -1;
      for (const Source& s : tr.sources) {
        const std::int16_t m = data.rows[s.row_out].sold_out_minute;
        if (m < own_out && (first < 0 || m < first)) first = m;
      }
      out.substitutes_from[tr.row] = first;
    }
  }
  for (out.rounds = 1; out.rounds <= kRounds; ++out.rounds) {
    double change = 0.0;
    for (Target& t : targets) {
      for (TargetRow& tr : t.rows)
        for (Source& s : tr.sources) lost_demand(data, fit, s);
      const Eigen::VectorXd before = t.alpha;
      fit_shares(data, fit, t, excluded);
      change = std::max(change, (t.alpha - before).cwiseAbs().maxCoeff());
      for (const TargetRow& tr : t.rows) out.extra[tr.row] = extra_of(tr, t.alpha);
    }
    // Between rounds each item keeps its family; the last round chooses again.
    const bool last = change < kTolerance || out.rounds == kRounds;
    FitOptions round = options;
    round.intervals = last;
    if (!last)
      for (const ItemEstimate& e : fit.items) round.item_family.emplace_back(e.family);
    fit = fit_decomposition(data, round, out.extra);
    if (change < kTolerance) {
      out.converged = true;
      break;
    }
  }
  out.rounds = std::min(out.rounds, kRounds);
  for (Target& t : targets) {
    for (TargetRow& tr : t.rows)
      for (Source& s : tr.sources) lost_demand(data, fit, s);
    if (!fit.items[static_cast<size_t>(t.item)].fitted) continue;
    const Eigen::VectorXd se = share_se(data, fit, t, excluded);
    for (size_t k = 0; k < t.sources.size(); ++k) {
      SubstituteShare x;
      x.out_item = t.sources[k];
      x.substitute = t.item;
      x.share = t.alpha[static_cast<Eigen::Index>(k)];
      x.se = se[static_cast<Eigen::Index>(k)];
      x.store_days = t.store_days[k];
      for (const TargetRow& tr : t.rows)
        for (const Source& s : tr.sources)
          if (s.slot == static_cast<int>(k)) x.lost_units += s.mean;
      out.shares.push_back(x);
    }
  }
  std::sort(out.shares.begin(), out.shares.end(), [](const auto& a, const auto& b) {
    return a.out_item != b.out_item ? a.out_item < b.out_item : a.substitute < b.substitute;
  });
  return out;
}

}  // namespace larder
