#include "cli/history_bench.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <chrono>
#include <cstdint>
#include <iterator>
#include <sstream>

#include "sim/history/history_reader.hpp"

namespace larder {

void bench_history_reader(int stores, int items, int days) {
  std::string text = "date,store,item,delivered,sold,leftover,sold_out,sold_out_time\n";
  const CivilDate start{2027, 1, 4};
  std::uint64_t state = 0x9e3779b97f4a7c15ULL;  // a fixed LCG: the text is the same every time
  for (int t = 0; t < days; ++t) {
    const std::string date = to_iso(add_days(start, t));
    for (int s = 0; s < stores; ++s) {
      for (int i = 0; i < items; ++i) {
        state = state * 6364136223846793005ULL + 1442695040888963407ULL;
        const int sold = static_cast<int>((state >> 33) % 13);  // 0..12 of 12 delivered
        const int left = std::max(12 - sold, 0);
        const int got = 12 - left;
        fmt::format_to(std::back_inserter(text), "{},store-{},item-{},12,{},{},{},{}\n", date, s, i,
                       got, left, left == 0 ? 1 : 0, left == 0 ? "18:30" : "");
      }
    }
  }
  const long long rows = static_cast<long long>(stores) * items * days;
  const double megabytes = static_cast<double>(text.size()) / 1e6;
  std::istringstream in(std::move(text));
  long long seen = 0;
  long long sold = 0;
  const auto t0 = std::chrono::steady_clock::now();
  read_history(in, "bench.csv", [&](const HistoryRow& r) {
    ++seen;
    sold += r.sold;
  });
  const double sec = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  fmt::print(
      "\nhistory reader (strict, streaming; one thread): {} rows ({} store-items x {} days, "
      "{:.0f} MB) in {:.2f} s: {:.2f} M rows/s{}\n",
      rows, static_cast<long long>(stores) * items, days, megabytes, sec,
      static_cast<double>(seen) / sec / 1e6, seen == rows && sold > 0 ? "" : " (rows lost!)");
}

}  // namespace larder
