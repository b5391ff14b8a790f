#include "sim/fit/decomposition.hpp"

#include <fmt/format.h>

#include <cmath>
#include <functional>
#include <limits>

#include "sim/fit/block_newton.hpp"
#include "sim/fit/count_likelihood.hpp"
#include "sim/fit/total_demand.hpp"

namespace larder {

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr std::array<DemandFamily, 3> kFamilies = {
    DemandFamily::poisson, DemandFamily::negative_binomial, DemandFamily::normal};

struct Obs {
  std::int32_t store = 0;
  std::int32_t sold = 0;
  bool censored = false;
  ExtraDemand extra;  ///< substitute demand on top of the item's own
};

/// One family's fit of one item: log weekday means (over the item's weekdays) and log cv.
struct FamilyState {
  bool tried = false;
  Eigen::VectorXd a;
  double c = 0.0;
  BlockMinimum minimum;
};

struct ItemWork {
  int index = 0;
  std::vector<int> weekdays;                 ///< weekdays with days (block k -> weekday)
  std::vector<std::vector<Obs>> by_weekday;  ///< per block
  std::array<FamilyState, 3> fits;
  int chosen = 0;  ///< index into kFamilies
};

double block_nll(DemandFamily f, const std::vector<Obs>& obs, const std::vector<double>& size,
                 double a, double c) {
  const double m = std::exp(a);
  const double cv = std::exp(c);
  double nll = 0.0;
  for (const Obs& o : obs)
    nll -= total_log_likelihood(f, size[o.store] * m, cv, o.extra, o.sold, o.censored);
  return nll;
}

/// Fits family `f` of item `w` with sizes fixed, warm-started from its last fit.
void fit_family(ItemWork& w, int family_index, const std::vector<double>& size) {
  const DemandFamily f = kFamilies[family_index];
  FamilyState& st = w.fits[family_index];
  BlockProblem p;
  p.blocks = static_cast<int>(w.weekdays.size());
  p.shared = f != DemandFamily::poisson;
  p.value = [&](int k, double a, double c) { return block_nll(f, w.by_weekday[k], size, a, c); };
  st.minimum = minimize_blocks(p, st.a, st.c);
  st.a = st.minimum.a;
  st.c = st.minimum.c;
  st.tried = true;
}

/// Naive start: log of the mean of sales / size per weekday, and the cv of sales around it.
void start_values(ItemWork& w, const std::vector<double>& size) {
  const auto blocks = static_cast<Eigen::Index>(w.weekdays.size());
  Eigen::VectorXd a(blocks);
  double ss = 0.0, n = 0.0, mean_all = 0.0;
  for (Eigen::Index k = 0; k < blocks; ++k) {
    double s = 0.0;
    for (const Obs& o : w.by_weekday[k]) s += o.sold / size[o.store];
    const double m = std::max(s / static_cast<double>(w.by_weekday[k].size()), 0.5);
    a[k] = std::log(m);
    mean_all += m / static_cast<double>(blocks);
    for (const Obs& o : w.by_weekday[k]) {
      const double r = o.sold / (size[o.store] * m) - 1.0;
      ss += r * r;
      n += 1.0;
    }
  }
  const double cv = std::sqrt(ss / std::max(n - 1.0, 1.0));
  for (int fi = 0; fi < 3; ++fi) {
    w.fits[fi].a = a;
    w.fits[fi].c = std::log(std::max(cv, 0.05));
  }
  // The negative binomial starts above the Poisson boundary cv^2 mean = 1, where it is flat.
  w.fits[1].c = std::log(std::max(cv, 1.2 / std::sqrt(mean_all)));
}

/// Fits the item's families (`all`) or only the one chosen last time, and keeps the family
/// with the smallest AIC among those fitted at these sizes.
void fit_item(ItemWork& w, const std::vector<double>& size, const FitOptions& options, bool all) {
  double best = std::numeric_limits<double>::infinity();
  for (int fi = 0; fi < 3; ++fi) {
    if (options.family && *options.family != kFamilies[fi]) continue;
    const auto item = static_cast<size_t>(w.index);
    if (item < options.item_family.size() && options.item_family[item] &&
        *options.item_family[item] != kFamilies[fi])
      continue;
    if (!all && fi != w.chosen) continue;
    fit_family(w, fi, size);
    const double params = static_cast<double>(w.weekdays.size()) + (fi == 0 ? 0.0 : 1.0);
    const double aic = 2.0 * params + 2.0 * w.fits[fi].minimum.value;
    if (aic < best) best = aic, w.chosen = fi;
  }
}

/// Store sizes given the items: one 1-D Newton problem per store (the blocks).
void fit_sizes(const std::vector<ItemWork>& items, std::vector<double>& size,
               const std::vector<int>& store_active, Eigen::VectorXd& size_var) {
  const auto stores = static_cast<int>(size.size());
  // Per store, the observations with their item's fitted mean and cv.
  struct Term {
    int family = 0;
    double mean = 0.0;  ///< at size 1
    double cv = 0.0;
    std::int32_t sold = 0;
    bool censored = false;
    ExtraDemand extra;
  };
  std::vector<std::vector<Term>> terms(static_cast<size_t>(stores));
  for (const ItemWork& w : items) {
    const FamilyState& st = w.fits[w.chosen];
    for (size_t k = 0; k < w.weekdays.size(); ++k) {
      const double m = std::exp(st.a[static_cast<Eigen::Index>(k)]);
      for (const Obs& o : w.by_weekday[k])
        terms[o.store].push_back({w.chosen, m, std::exp(st.c), o.sold, o.censored, o.extra});
    }
  }
  BlockProblem p;
  p.blocks = stores;
  p.value = [&](int s, double a, double) {
    if (!store_active[s]) return 0.0;
    const double z = std::exp(a);
    double nll = 0.0;
    for (const Term& t : terms[s])
      nll -=
          total_log_likelihood(kFamilies[t.family], z * t.mean, t.cv, t.extra, t.sold, t.censored);
    return nll;
  };
  Eigen::VectorXd a0(stores);
  for (int s = 0; s < stores; ++s) a0[s] = std::log(size[s]);
  const BlockMinimum m = minimize_blocks(p, a0, 0.0);
  size_var = Eigen::VectorXd::Zero(stores);
  for (int s = 0; s < stores; ++s) {
    if (!store_active[s]) continue;
    size[s] = std::exp(m.a[s]);
    const double h = m.hessian(s, s);
    size_var[s] = h > 0 ? size[s] * size[s] / h : std::numeric_limits<double>::infinity();
  }
}

/// The profile negative log-likelihood of family `fi` at log cv `c`: the weekday means
/// refitted with the cv held there.
double profile_value(const ItemWork& w, int fi, const std::vector<double>& size, double c) {
  const DemandFamily f = kFamilies[fi];
  BlockProblem p;
  p.blocks = static_cast<int>(w.weekdays.size());
  p.value = [&](int k, double a, double) { return block_nll(f, w.by_weekday[k], size, a, c); };
  return minimize_blocks(p, w.fits[fi].a, 0.0).value;
}

/// The root of g in [lo, hi] (g(lo) and g(hi) of opposite signs) by the Illinois variant of
/// regula falsi (Dowell and Jarratt 1971), to 1e-4 in log cv or in g.
double profile_root(const std::function<double(double)>& g, double lo, double glo, double hi,
                    double ghi) {
  int side = 0;
  for (int it = 0; it < 40 && hi - lo > 1e-4; ++it) {
    const double x = (lo * ghi - hi * glo) / (ghi - glo);
    const double gx = g(x);
    if (std::abs(gx) < 1e-4) return x;  // the drop is met to 1e-4 in log-likelihood
    if ((gx > 0) == (ghi > 0)) {
      hi = x, ghi = gx;
      if (side == -1) glo /= 2;
      side = -1;
    } else {
      lo = x, glo = gx;
      if (side == 1) ghi /= 2;
      side = 1;
    }
  }
  return 0.5 * (lo + hi);
}

/// The 95% profile-likelihood interval of the cv (chi-square(1) 0.95 quantile 3.841459,
/// from memory; half of it is the drop in log-likelihood).
void cv_interval(const ItemWork& w, const std::vector<double>& size, ItemEstimate& e) {
  int fi = w.chosen == 0 ? 1 : w.chosen;
  if (!w.fits[fi].tried) return;
  const FamilyState& st = w.fits[fi];
  constexpr double kHalfChi2 = 3.841459 / 2.0;
  const double best = st.minimum.value;
  const auto g = [&](double c) {
    const double v = profile_value(w, fi, size, c);
    return (std::isfinite(v) ? v : std::numeric_limits<double>::max()) - best - kHalfChi2;
  };
  e.cv_interval_family = kFamilies[fi];
  // Lower end: at cv 1e-4 the negative binomial is Poisson on every day (cv^2 mean <= 1).
  const double c_min = kFamilies[fi] == DemandFamily::negative_binomial ? std::log(1e-4) : st.c - 8;
  const double g_min = g(c_min);
  const double g_hat = -kHalfChi2;
  if (g_min <= 0) {
    e.cv_low = 0.0;
    e.cv_low_at_poisson = kFamilies[fi] == DemandFamily::negative_binomial;
  } else {
    e.cv_low = std::exp(profile_root(g, c_min, g_min, st.c, g_hat));
  }
  double hi = st.c;
  double g_hi = g_hat;
  for (double step = 0.125; step < 10 && g_hi <= 0; step *= 2) {
    hi = st.c + step;
    g_hi = g(hi);
  }
  e.cv_high = g_hi > 0 ? std::exp(profile_root(g, st.c, g_hat, hi, g_hi))
                       : std::numeric_limits<double>::infinity();
}

}  // namespace

double Decomposition::mean(int store, int item, int weekday) const {
  const StoreEstimate& s = stores[store];
  const ItemEstimate& i = items[item];
  if (!s.fitted || !i.fitted) return 0.0;
  return i.base * s.size * i.weekday[weekday];
}

Decomposition fit_decomposition(const FitData& data, const FitOptions& options,
                                std::span<const ExtraDemand> extra) {
  Decomposition out;
  const auto n_stores = data.stores.size();
  const auto n_items = data.items.size();
  out.stores.resize(n_stores);
  out.items.resize(n_items);
  // Counts per store and per item-weekday.
  std::vector<int> store_uncensored(n_stores, 0);
  for (size_t s = 0; s < n_stores; ++s) out.stores[s].id = data.stores[s];
  for (size_t i = 0; i < n_items; ++i) out.items[i].id = data.items[i];
  for (const FitDay& d : data.rows) {
    StoreEstimate& s = out.stores[d.store];
    s.days++;
    s.open_weekdays[data.weekday(d.day)] = true;
    if (!d.sold_out) store_uncensored[d.store]++;
  }
  std::vector<int> store_active(n_stores, 0);
  for (size_t s = 0; s < n_stores; ++s) {
    if (store_uncensored[s] >= options.min_uncensored_days) {
      store_active[s] = 1;
      out.stores[s].fitted = true;
    } else {
      out.stores[s].problem =
          fmt::format("not enough data: {} days that did not sell out (needs {})",
                      store_uncensored[s], options.min_uncensored_days);
    }
  }
  // Items: observations of active stores by weekday; flag items with too little data.
  std::vector<ItemWork> work;
  {
    std::vector<std::array<std::vector<Obs>, 7>> obs(n_items);
    std::vector<std::array<int, 7>> uncensored(n_items, std::array<int, 7>{});
    for (size_t r = 0; r < data.rows.size(); ++r) {
      const FitDay& d = data.rows[r];
      if (!store_active[d.store]) continue;
      if (d.sold_out && d.sold == 0) continue;  // D >= 0 says nothing
      const ExtraDemand e = extra.empty() ? ExtraDemand{} : extra[r];
      if (std::isnan(e.mean)) continue;
      const int wd = data.weekday(d.day);
      obs[d.item][wd].push_back({d.store, d.sold, d.sold_out, e});
      if (!d.sold_out) uncensored[d.item][wd]++;
    }
    for (size_t i = 0; i < n_items; ++i) {
      ItemEstimate& e = out.items[i];
      ItemWork w;
      w.index = static_cast<int>(i);
      int total = 0;
      std::string weak;
      for (int wd = 0; wd < 7; ++wd) {
        if (obs[i][wd].empty()) continue;
        e.weekday_seen[wd] = true;
        total += uncensored[i][wd];
        e.days += static_cast<int>(obs[i][wd].size());
        for (const Obs& o : obs[i][wd]) e.censored_days += o.censored ? 1 : 0;
        if (uncensored[i][wd] < options.min_uncensored_per_weekday && weak.empty())
          weak = fmt::format("only {} {} that did not sell out (needs {})", uncensored[i][wd],
                             kWeekdayNames[wd], options.min_uncensored_per_weekday);
        w.weekdays.push_back(wd);
        w.by_weekday.push_back(std::move(obs[i][wd]));
      }
      if (total < options.min_uncensored_days) {
        e.problem = fmt::format("not enough data: {} days that did not sell out (needs {})", total,
                                options.min_uncensored_days);
      } else if (!weak.empty()) {
        e.problem = "not enough data: " + weak;
      } else {
        work.push_back(std::move(w));
      }
    }
  }
  std::vector<double> size(n_stores, 1.0);
  // Naive start for the sizes: each store's sales relative to the item's average, averaged.
  {
    std::vector<double> num(n_stores, 0.0), den(n_stores, 0.0);
    for (const ItemWork& w : work) {
      std::vector<double> s_sum(n_stores, 0.0), s_n(n_stores, 0.0);
      double all = 0.0, all_n = 0.0;
      for (const auto& v : w.by_weekday)
        for (const Obs& o : v)
          s_sum[o.store] += o.sold, s_n[o.store] += 1, all += o.sold, all_n += 1;
      const double avg = all / all_n;
      for (size_t s = 0; s < n_stores; ++s)
        if (s_n[s] > 0 && avg > 0) num[s] += s_sum[s] / s_n[s] / avg, den[s] += 1;
    }
    double total = 0.0, active = 0.0;
    for (size_t s = 0; s < n_stores; ++s) {
      if (den[s] > 0 && num[s] > 0) size[s] = num[s] / den[s];
      if (store_active[s]) total += size[s], active += 1;
    }
    for (double& z : size) z /= (active > 0 ? total / active : 1.0);
  }
  for (ItemWork& w : work) start_values(w, size);
  for (ItemWork& w : work) fit_item(w, size, options, true);
  int active_stores = 0;
  for (const int a : store_active) active_stores += a;
  Eigen::VectorXd size_var = Eigen::VectorXd::Zero(static_cast<Eigen::Index>(n_stores));
  for (out.rounds = 1; active_stores > 1 && !work.empty() && out.rounds < 100; ++out.rounds) {
    const std::vector<double> before = size;
    fit_sizes(work, size, store_active, size_var);
    double total = 0.0;
    for (size_t s = 0; s < n_stores; ++s)
      if (store_active[s]) total += size[s];
    const double g = total / active_stores;
    for (size_t s = 0; s < n_stores; ++s) size[s] /= g;
    for (ItemWork& w : work)
      for (FamilyState& st : w.fits) st.a.array() += std::log(g);
    double change = 0.0;
    for (size_t s = 0; s < n_stores; ++s)
      change = std::max(change, std::abs(std::log(size[s] / before[s])));
    // Between rounds only the chosen family moves; once the sizes settle, every family is
    // refitted at them and the choice made again (another round if it changed).
    const bool settled = change < 1e-7;
    std::vector<int> chosen;
    for (ItemWork& w : work) {
      chosen.push_back(w.chosen);
      fit_item(w, size, options, settled);
    }
    bool same = true;
    for (size_t k = 0; k < work.size(); ++k) same = same && chosen[k] == work[k].chosen;
    if (settled && same) break;
  }
  for (size_t s = 0; s < n_stores; ++s) {
    if (!store_active[s]) continue;
    out.stores[s].size = size[s];
    out.stores[s].size_se = std::sqrt(size_var[static_cast<Eigen::Index>(s)]);
  }
  // Estimates with delta-method standard errors from the item's observed information.
  for (ItemWork& w : work) {
    ItemEstimate& e = out.items[w.index];
    const FamilyState& st = w.fits[w.chosen];
    e.fitted = true;
    e.family = kFamilies[w.chosen];
    e.converged = st.minimum.converged;
    e.neg_log_likelihood = st.minimum.value;
    for (int fi = 0; fi < 3; ++fi) {
      const double params = static_cast<double>(w.weekdays.size()) + (fi == 0 ? 0.0 : 1.0);
      e.aic[fi] = w.fits[fi].tried ? 2.0 * params + 2.0 * w.fits[fi].minimum.value : kNaN;
    }
    const auto K = static_cast<Eigen::Index>(w.weekdays.size());
    const Eigen::MatrixXd cov = covariance_from(st.minimum.hessian);
    const Eigen::VectorXd m = st.a.array().exp();
    const double base = m.mean();
    e.base = base;
    // d base / d a_k = m_k / K.
    const Eigen::VectorXd gb = m / static_cast<double>(K);
    e.base_se = std::sqrt(gb.dot(cov.topLeftCorner(K, K) * gb));
    for (Eigen::Index k = 0; k < K; ++k) {
      const int wd = w.weekdays[static_cast<size_t>(k)];
      e.weekday[wd] = m[k] / base;
      // d (m_k / base) / d a_j = delta_jk m_k / base - m_k m_j / (K base^2).
      Eigen::VectorXd g = -m * m[k] / (static_cast<double>(K) * base * base);
      g[k] += m[k] / base;
      e.weekday_se[wd] = std::sqrt(g.dot(cov.topLeftCorner(K, K) * g));
    }
    if (e.family != DemandFamily::poisson) {
      e.cv = std::exp(st.c);
      e.cv_se = e.cv * std::sqrt(cov(K, K));
    }
    double naive = 0.0;
    for (size_t k = 0; k < w.weekdays.size(); ++k) {
      double s = 0.0;
      for (const Obs& o : w.by_weekday[k]) s += o.sold / size[o.store];
      naive += s / static_cast<double>(w.by_weekday[k].size());
    }
    e.naive_base = naive / static_cast<double>(K);
    if (options.intervals) cv_interval(w, size, e);
  }
  return out;
}

}  // namespace larder
