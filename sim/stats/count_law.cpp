#include "sim/stats/count_law.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <stdexcept>

#include "sim/stats/log_gamma.hpp"
#include "sim/stats/normal.hpp"

namespace larder {

namespace {

constexpr double kLn2Pi = 1.8378770664093454835606594728112352797227949472755668;

/// Stirling's error log(n!) - [(n + 1/2) log n - n + log sqrt(2 pi)] for real n > 0: the
/// asymptotic series for n > 15 (error below 3e-16), lgamma below.
double stirling_error(double n) {
  if (n > 15.0) {
    const double nn = n * n;
    constexpr double s0 = 1.0 / 12.0, s1 = 1.0 / 360.0, s2 = 1.0 / 1260.0, s3 = 1.0 / 1680.0,
                     s4 = 1.0 / 1188.0;
    return (s0 - (s1 - (s2 - (s3 - s4 / nn) / nn) / nn) / nn) / n;
  }
  return log_gamma(n + 1.0) - (n + 0.5) * std::log(n) + n - 0.5 * kLn2Pi;
}

/// Deviance term x log(x / np) + np - x (x, np > 0), by its series in v = (x - np) / (x + np)
/// when |v| < 1/2 (terms shrink by v^2 <= 1/4), so that the cancellation costs no precision
/// (Loader 2000, "Fast and accurate computation of binomial probabilities").
double deviance(double x, double np) {
  if (std::fabs(x - np) < 0.5 * (x + np)) {
    double v = (x - np) / (x + np);
    double s = (x - np) * v;
    double ej = 2.0 * x * v;
    v *= v;
    for (int j = 1; j < 1000; ++j) {
      ej *= v;
      const double next = s + ej / (2 * j + 1);
      if (next == s) return next;
      s = next;
    }
    return s;
  }
  return x * std::log(x / np) + np - x;
}

/// Poisson(mean) pmf at integer k >= 0 by Loader's saddle-point form: accurate to a few ulp
/// even for large k and mean, where exp(k log mean - mean - lgamma(k + 1)) would lose digits.
double poisson_pmf(double k, double mean) {
  if (k < 0.0) return 0.0;
  if (mean <= 0.0) return k == 0.0 ? 1.0 : 0.0;
  if (k == 0.0) return std::exp(-mean);
  return std::exp(-stirling_error(k) - deviance(k, mean) - 0.5 * (kLn2Pi + std::log(k)));
}

/// Negative binomial pmf (size r, given mean) at integer k >= 0: the same saddle-point form
/// applied to Gamma(k + r) / (Gamma(r) k!) P^r Q^k = r / (k + r) * Binomial(k + r, P) at r,
/// with P = r / (r + mean), Q = mean / (r + mean).
double nb_pmf(double k, double r, double mean) {
  if (k < 0.0) return 0.0;
  if (k == 0.0) return std::exp(-r * std::log1p(mean / r));
  const double n = k + r;
  const double big_p = r / (r + mean);
  const double big_q = mean / (r + mean);
  const double lc = stirling_error(n) - stirling_error(r) - stirling_error(k) -
                    deviance(r, n * big_p) - deviance(k, n * big_q);
  const double lf = kLn2Pi + std::log(r) + std::log(k) - std::log(n);
  return r / n * std::exp(lc - 0.5 * lf);
}

// pmf recurrences: p(k+1) from p(k) and p(k-1) from p(k). The ratio depends on k only, so its
// division stays off the p -> p dependency chain and successive steps overlap in the CPU.

/// Poisson: p(k+1) / p(k) = mean / (k + 1).
struct PoissonStep {
  double mean;
  double up(double p, double k) const { return p * (mean / (k + 1.0)); }
  double down(double p, double k) const { return p * (k / mean); }
};

/// Negative binomial of size r, q = mean / (r + mean): p(k+1) / p(k) = (k + r) q / (k + 1).
struct NbStep {
  double r;
  double q;
  double up(double p, double k) const { return p * ((k + r) * q / (k + 1.0)); }
  double down(double p, double k) const { return p * (k / ((k - 1.0 + r) * q)); }
};

/// The upper guard of every search: mean + 40 sd + 50, at most 2^30.
int count_cap(double mean, double sd) {
  const double c = std::floor(mean + 40.0 * sd + 50.0);
  return c < 0x1p30 ? static_cast<int>(c) : 1 << 30;
}

/// P(D <= mode) summed downward from the mode until the terms no longer matter.
template <class Step>
double cdf_at_mode(double mode, double p_mode, Step step) {
  double f = p_mode;
  double p = p_mode;
  for (double k = mode; k > 0.0; k -= 1.0) {
    p = step.down(p, k);
    f += p;
    if (p <= f * 0x1p-60) break;
  }
  return f;
}

/// sum_{k=0}^{q-1} P(D <= k) = E[(q - D)+] for q >= 1: the cdf accumulated upward from the
/// point below the mode where the pmf is negligible (so lower-tail values keep their relative
/// precision), with the plateau near 1 counted in one step.
template <class Step>
double sum_cdf_below(int q, double mode, double p_mode, Step step) {
  const double last = static_cast<double>(q) - 1.0;
  double k = mode;
  double p = p_mode;
  const double tiny = p_mode * 0x1p-70;
  while (k > 0.0 && p > tiny) {
    p = step.down(p, k);
    k -= 1.0;
  }
  if (k > last) return 0.0;  // every F(k) with k < q is below ~1e-21 p(mode)
  double f = p;
  double s = f;
  while (k < last) {
    p = step.up(p, k);
    k += 1.0;
    const double next = f + p;
    if (next == f && k > mode) return s + f * (last - k + 1.0);
    f = next;
    s += f;
  }
  return s;
}

/// The normal-count pieces: z of the cdf at count k is (k + 0.5 - mean) / sd.
/// With sd 0 the count is the constant max(0, ceil(mean - 0.5)) (the rounding of the sampler).
double constant_count(double mean) {
  return std::max(0.0, std::ceil(mean - 0.5));
}

double normal_count_leftover(int q, double mean, double sd) {
  if (q <= 0) return 0.0;
  if (sd == 0.0) return std::max(0.0, q - constant_count(mean));
  // Terms with z < -10 are below 8e-24 each; from where Phi rounds to 1 every term is 1.
  double k = std::max(0.0, std::ceil(mean - 0.5 - 10.0 * sd));
  const double end = q;
  double s = 0.0;
  for (; k < end; k += 1.0) {
    const double f = normal_cdf((k + 0.5 - mean) / sd);
    if (f == 1.0) return s + (end - k);
    s += f;
  }
  return s;
}

double normal_count_shortage(int q, double mean, double sd) {
  // sum over k >= q of P(D > k) = 1 - Phi((k + 0.5 - mean) / sd); P(D > k) = 1 for k < 0.
  if (sd == 0.0) return std::max(0.0, constant_count(mean) - q);
  double k = q;
  double s = 0.0;
  if (k < 0.0) {
    s = -k;
    k = 0.0;
  }
  const double k_one = std::ceil(mean - 0.5 - 10.0 * sd);  // below: terms within 8e-24 of 1
  if (k < k_one) {
    s += k_one - k;
    k = k_one;
  }
  for (;; k += 1.0) {
    const double t = normal_sf((k + 0.5 - mean) / sd);
    s += t;
    if (t <= s * 0x1p-60) break;
  }
  return s;
}

void check_mean(double mean) {
  if (!std::isfinite(mean) || mean < 0.0) {
    throw std::invalid_argument("demand count law: the mean must be finite and >= 0");
  }
}

}  // namespace

CountLaw CountLaw::make(DemandFamily f, double mean, std::optional<double> cv,
                        std::optional<double> dispersion) {
  check_mean(mean);
  if (f == DemandFamily::poisson) return CountLaw{DemandFamily::poisson, mean, mean};
  if (cv.has_value() == dispersion.has_value()) {
    throw std::invalid_argument(
        "demand count law: negative_binomial and normal need exactly one of cv or dispersion");
  }
  double variance = 0.0;
  if (cv) {
    if (!std::isfinite(*cv) || *cv < 0.0) {
      throw std::invalid_argument("demand count law: cv must be finite and >= 0");
    }
    variance = (*cv * mean) * (*cv * mean);
  } else {
    if (!(*dispersion > 0.0)) {
      throw std::invalid_argument("demand count law: dispersion k must be > 0");
    }
    variance = mean + mean * mean / *dispersion;
  }
  return from_moments(f, mean, variance);
}

CountLaw CountLaw::from_moments(DemandFamily f, double mean, double variance) {
  check_mean(mean);
  if (!std::isfinite(variance)) {
    throw std::invalid_argument("demand count law: the variance must be finite");
  }
  variance = std::max(variance, 0.0);
  if (f == DemandFamily::poisson || (f == DemandFamily::negative_binomial && variance <= mean)) {
    return CountLaw{DemandFamily::poisson, mean, mean};
  }
  return CountLaw{f, mean, variance};
}

double CountLaw::pmf(int k) const {
  if (k < 0) return 0.0;
  if (mean <= 0.0) return k == 0 ? 1.0 : 0.0;
  const double x = k;
  if (family == DemandFamily::normal) {
    const double sd = std::sqrt(std::max(variance, 0.0));
    if (sd == 0.0) return k == std::max(0, quantile(0.5)) ? 1.0 : 0.0;
    const double hi = (x + 0.5 - mean) / sd;
    if (k == 0) return normal_cdf(hi);
    const double lo = (x - 0.5 - mean) / sd;
    // Difference of the smaller tail areas, so neither cancels to 0 in the tails.
    return lo > 0.0 ? normal_sf(lo) - normal_sf(hi) : normal_cdf(hi) - normal_cdf(lo);
  }
  if (family == DemandFamily::negative_binomial && variance > mean) {
    return nb_pmf(x, mean * mean / (variance - mean), mean);
  }
  return poisson_pmf(x, mean);
}

double CountLaw::cdf(int k) const {
  return CountSampler(*this).cdf(k);
}

int CountLaw::quantile(double p) const {
  return CountSampler(*this)(p);
}

double CountLaw::expected_leftover(int q) const {
  if (q <= 0) return 0.0;
  if (mean <= 0.0) return q;
  if (family == DemandFamily::normal) {
    const double sd = std::sqrt(std::max(variance, 0.0));
    if (sd == 0.0) return std::max(0, q - quantile(0.5));
    return normal_count_leftover(q, mean, sd);
  }
  if (family == DemandFamily::negative_binomial && variance > mean) {
    const double r = mean * mean / (variance - mean);
    const double mode = r > 1.0 ? std::floor((r - 1.0) * mean / r) : 0.0;
    return sum_cdf_below(q, mode, nb_pmf(mode, r, mean), NbStep{r, mean / (r + mean)});
  }
  const double mode = std::floor(mean);
  return sum_cdf_below(q, mode, poisson_pmf(mode, mean), PoissonStep{mean});
}

double CountLaw::expected_sales(int q) const {
  return static_cast<double>(q) - expected_leftover(q);
}

double CountLaw::expected_shortage(int q) const {
  if (mean <= 0.0) return std::max(0.0, -static_cast<double>(q));
  if (family == DemandFamily::normal) {
    const double sd = std::sqrt(std::max(variance, 0.0));
    if (sd == 0.0) return std::max(0, quantile(0.5) - q);
    return normal_count_shortage(q, mean, sd);
  }
  // E[(D - q)+] = E[D] - E[min(D, q)], and E[D] = mean for the poisson and negative binomial.
  return std::max(0.0, mean - expected_sales(q));
}

CountSampler::CountSampler(const CountLaw& law) : mean_(law.mean) {
  if (!(law.mean > 0.0)) return;  // kind zero: always 0
  if (law.family == DemandFamily::normal) {
    kind_ = Kind::normal;
    sd_ = std::sqrt(std::max(law.variance, 0.0));
    cap_ = count_cap(mean_, sd_);
    return;
  }
  if (law.family == DemandFamily::negative_binomial && law.variance > law.mean) {
    kind_ = Kind::negative_binomial;
    r_ = mean_ * mean_ / (law.variance - mean_);
    q_ = mean_ / (r_ + mean_);
    mode_ = r_ > 1.0 ? std::floor((r_ - 1.0) * mean_ / r_) : 0.0;
    p_mode_ = nb_pmf(mode_, r_, mean_);
    f_mode_ = cdf_at_mode(mode_, p_mode_, NbStep{r_, q_});
    cap_ = count_cap(mean_, std::sqrt(law.variance));
    return;
  }
  kind_ = Kind::poisson;
  mode_ = std::floor(mean_);
  p_mode_ = poisson_pmf(mode_, mean_);
  f_mode_ = cdf_at_mode(mode_, p_mode_, PoissonStep{mean_});
  cap_ = count_cap(mean_, std::sqrt(mean_));
}

template <class Step>
int CountSampler::walk(double u, Step step) const {
  double k = mode_;
  double p = p_mode_;
  double f = f_mode_;
  if (u <= f) {  // the answer is at or below the mode: drop p(k) while F(k-1) >= u
    while (k > 0.0) {
      const double below = f - p;
      if (u > below) break;
      p = step.down(p, k);
      f = below;
      k -= 1.0;
    }
    return static_cast<int>(k);
  }
  const double cap = cap_;
  while (k < cap) {  // above the mode: add p(k+1) until F(k+1) >= u
    p = step.up(p, k);
    k += 1.0;
    const double next = f + p;
    if (next >= u) return static_cast<int>(k);
    if (next == f) break;  // the cdf has stopped growing below u: the far-tail guard
    f = next;
  }
  return cap_;
}

template <class Step>
double CountSampler::walk_cdf(int k, Step step) const {
  const double target = k;
  double j = mode_;
  double p = p_mode_;
  double f = f_mode_;
  if (target <= j) {
    while (j > target) {  // the same operations as walk(), in the same order
      const double below = f - p;
      p = step.down(p, j);
      f = below;
      j -= 1.0;
    }
    return std::max(f, 0.0);
  }
  while (j < target) {
    p = step.up(p, j);
    j += 1.0;
    const double next = f + p;
    if (next == f) break;
    f = next;
  }
  return std::min(f, 1.0);
}

template <class Step>
void CountSampler::walk_cdf_run(int first, std::span<double> out, Step step) const {
  // The same operations as walk_cdf, shared by consecutive k: down from the mode for k below
  // it, up from the mode for k above it.
  const double last = static_cast<double>(first) + static_cast<double>(out.size()) - 1.0;
  double j = mode_;
  double p = p_mode_;
  double f = f_mode_;
  const auto put = [&](double k, double value) {
    if (k >= first && k <= last) out[static_cast<size_t>(k - first)] = value;
  };
  put(j, std::max(f, 0.0));
  while (j > first) {
    const double below = f - p;
    p = step.down(p, j);
    f = below;
    j -= 1.0;
    put(j, std::max(f, 0.0));
  }
  j = mode_;
  p = p_mode_;
  f = f_mode_;
  bool flat = false;
  while (j < last) {
    if (!flat) {
      p = step.up(p, j);
      const double next = f + p;
      if (next == f) {
        flat = true;
      } else {
        f = next;
      }
    }
    j += 1.0;
    put(j, j >= cap_ ? 1.0 : std::min(f, 1.0));
  }
}

void CountSampler::cdf_run(int first, std::span<double> out) const {
  switch (kind_) {
    case Kind::poisson:
      walk_cdf_run(first, out, PoissonStep{mean_});
      return;
    case Kind::negative_binomial:
      walk_cdf_run(first, out, NbStep{r_, q_});
      return;
    default:
      for (size_t n = 0; n < out.size(); ++n) out[n] = cdf(first + static_cast<int>(n));
  }
}

int CountSampler::operator()(double u) const {
  switch (kind_) {
    case Kind::zero:
      return 0;
    case Kind::poisson:
      return walk(u, PoissonStep{mean_});
    case Kind::negative_binomial:
      return walk(u, NbStep{r_, q_});
    case Kind::normal:
      break;
  }
  const double x =
      sd_ == 0.0 ? std::ceil(mean_ - 0.5) : std::ceil(mean_ + sd_ * normal_quantile(u) - 0.5);
  if (x <= 0.0) return 0;
  if (!(x < cap_)) return cap_;
  return static_cast<int>(x);
}

double CountSampler::cdf(int k) const {
  if (k < 0) return 0.0;
  switch (kind_) {
    case Kind::zero:
      return 1.0;
    case Kind::poisson:
      return k >= cap_ ? 1.0 : walk_cdf(k, PoissonStep{mean_});
    case Kind::negative_binomial:
      return k >= cap_ ? 1.0 : walk_cdf(k, NbStep{r_, q_});
    case Kind::normal:
      break;
  }
  const double x = static_cast<double>(k) + 0.5 - mean_;
  if (sd_ == 0.0) return x >= 0.0 ? 1.0 : 0.0;
  return normal_cdf(x / sd_);
}

}  // namespace larder
