#include "sim/runner/memory_limit.hpp"

#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>

#include "sim/runner/run_estimate.hpp"

namespace larder {

std::optional<std::size_t> parse_memory_size(const std::string& text) {
  std::string number = text;
  while (!number.empty() && number.back() == ' ') number.pop_back();
  const auto ends_with = [&](std::string_view suffix) {
    if (number.size() < suffix.size()) return false;
    for (size_t k = 0; k < suffix.size(); ++k) {
      const char c = number[number.size() - suffix.size() + k];
      if (std::toupper(static_cast<unsigned char>(c)) != suffix[k]) return false;
    }
    return true;
  };
  // "4G", "4GB" and "4GiB" are all 4 * 1024^3 bytes; a plain number is bytes.
  if (ends_with("IB")) {
    number.resize(number.size() - 2);
  } else if (ends_with("B") && number.size() >= 2 &&
             std::string("KMGT").find(static_cast<char>(std::toupper(
                 static_cast<unsigned char>(number[number.size() - 2])))) != std::string::npos) {
    number.pop_back();
  }
  double scale = 1.0;
  if (!number.empty()) {
    const char unit = static_cast<char>(std::toupper(static_cast<unsigned char>(number.back())));
    if (const auto k = std::string("KMGT").find(unit); k != std::string::npos) {
      scale = std::pow(1024.0, static_cast<double>(k + 1));
      number.pop_back();
    }
  }
  while (!number.empty() && number.back() == ' ') number.pop_back();
  if (number.empty() || number.find_first_not_of("0123456789.") != std::string::npos ||
      number.find('.') != number.rfind('.')) {
    return std::nullopt;  // digits and one point only: no sign, exponent, hex, inf or nan
  }
  try {
    size_t used = 0;
    const double v = std::stod(number, &used);
    const double bytes = v * scale;
    // Up to 2^60 bytes (an exbibyte): beyond any machine, and far inside size_t.
    if (used != number.size() || !(bytes >= 1.0) || bytes > std::ldexp(1.0, 60)) {
      return std::nullopt;
    }
    return static_cast<std::size_t>(bytes);
  } catch (const std::exception&) {
    return std::nullopt;
  }
}

std::string format_bytes(std::size_t bytes) {
  const double b = static_cast<double>(bytes);
  if (bytes < 1024) return fmt::format("{} bytes", bytes);
  if (bytes < (std::size_t{1} << 20)) return fmt::format("{:.0f} KiB", b / 1024.0);
  const double mib = b / (1024.0 * 1024.0);
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
              fmt::format("--max-memory {}: expected a size of at least 1 byte such as 512M, 4G, "
                          "1.5GiB or 800000 (bytes); K, M, G and T are powers of 1024",
                          limit_text));
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
