#include "sim/scenario/generated_stores.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "sim/random/stream.hpp"
#include "sim/stats/normal.hpp"

namespace larder {

std::string generated_store_id(int index, int count) {
  const int width = std::max(3, static_cast<int>(std::to_string(count).size()));
  return fmt::format("s{:0{}}", index + 1, width);
}

std::vector<double> generated_store_sizes(std::uint64_t seed, int count, double cv) {
  std::vector<double> sizes(static_cast<size_t>(std::max(count, 0)), 1.0);
  if (cv <= 0.0) return sizes;
  // Lognormal exp(sigma * Z + mu) has mean exp(mu + sigma^2 / 2) and CV sqrt(exp(sigma^2) - 1):
  // mean 1 needs mu = -sigma^2 / 2, and the CV gives sigma^2 = log(1 + cv^2).
  const double sigma2 = std::log1p(cv * cv);
  const double sigma = std::sqrt(sigma2);
  for (size_t i = 0; i < sizes.size(); ++i) {
    pcg32 g = make_stream({seed, 0, static_cast<std::uint32_t>(i), kNoItem, Purpose::generation});
    const double z = normal_quantile(to_unit(g()));
    sizes[i] = std::exp(sigma * z - sigma2 / 2.0);
  }
  return sizes;
}

}  // namespace larder
