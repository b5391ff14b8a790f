#include "sim/runner/memory_limit.hpp"

#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>

#include "sim/runner/run_estimate.hpp"

namespace larder {

std::optional<std::size_t> parse_memory_size(const std::string& text) {
  if (text.empty()) return std::nullopt;
  double scale = 1.0;
  std::string number = text;
  const char unit = static_cast<char>(std::toupper(static_cast<unsigned char>(text.back())));
  const std::string units = "KMGT";
  if (const auto k = units.find(unit); k != std::string::npos) {
    scale = std::pow(1024.0, static_cast<double>(k + 1));
    number.pop_back();
  }
  try {
    size_t used = 0;
    const double v = std::stod(number, &used);
    if (used != number.size() || !(v > 0.0) || !std::isfinite(v)) return std::nullopt;
    return static_cast<std::size_t>(v * scale);
  } catch (const std::exception&) {
    return std::nullopt;
  }
}

std::string format_bytes(std::size_t bytes) {
  const double mib = static_cast<double>(bytes) / (1024.0 * 1024.0);
  return mib >= 1024.0 ? fmt::format("{:.1f} GiB", mib / 1024.0) : fmt::format("{:.0f} MiB", mib);
}

std::size_t default_memory_limit() {
  const long pages = ::sysconf(_SC_PHYS_PAGES);
  const long page = ::sysconf(_SC_PAGE_SIZE);
  if (pages <= 0 || page <= 0) return std::size_t{8} << 30;
  return static_cast<std::size_t>(pages) * static_cast<std::size_t>(page) / 2;
}

std::size_t minimum_memory(const Scenario& scenario, std::size_t policies) {
  const double stores = static_cast<double>(scenario.stores.size());
  const double items = static_cast<double>(scenario.items.size());
  const double bytes =
      stores * scenario.horizon.days * 10.0 + stores * items * kDaysPerWeek * 100.0 +
      static_cast<double>(scenario.replications) * static_cast<double>(policies) * 24.0 * 8.0;
  constexpr double kMost = 1e18;  // stays within size_t
  return static_cast<std::size_t>(std::min(bytes, kMost));
}

std::size_t check_memory(const Scenario& scenario, const std::vector<Policy>& policies, int threads,
                         const std::string& limit_text) {
  std::size_t limit = default_memory_limit();
  if (!limit_text.empty()) {
    const auto parsed = parse_memory_size(limit_text);
    if (!parsed) {
      Diagnostics d;
      d.error({scenario.file, 0, 0},
              fmt::format("--max-memory {}: expected a size such as 512M, 4G or 1.5G", limit_text));
      throw InputError(d);
    }
    limit = *parsed;
  }
  // The floor first: building the estimate's demand model could itself exhaust the memory.
  const std::size_t floor = minimum_memory(scenario, policies.size());
  const std::size_t need =
      floor > limit ? floor : estimate_run(scenario, policies, threads).memory_bytes;
  if (need > limit) {
    Diagnostics d;
    d.error(
        {scenario.file, 0, 0},
        fmt::format("this run would need {} {} of memory, more than the limit of {}",
                    need == floor ? "at least" : "about", format_bytes(need), format_bytes(limit)),
        "use fewer replications, stores or items, or raise --max-memory (the default is "
        "half of this machine's memory)");
    throw InputError(d);
  }
  return need;
}

}  // namespace larder
