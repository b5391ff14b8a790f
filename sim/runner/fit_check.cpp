#include "sim/runner/fit_check.hpp"

#include <fmt/format.h>
#include <tbb/task_arena.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <unordered_map>

#include "policies/policy.hpp"
#include "sim/runner/record_history.hpp"
#include "sim/scenario/iso_date.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder {

namespace {

/// The empirical quantile of sorted values (linear interpolation between order statistics,
/// numpy's default "linear" method).
double quantile(const std::vector<double>& sorted, double q) {
  if (sorted.empty()) return std::nan("");
  const double pos = q * static_cast<double>(sorted.size() - 1);
  const auto lo = static_cast<size_t>(std::floor(pos));
  const size_t hi = std::min(lo + 1, sorted.size() - 1);
  return sorted[lo] + (pos - static_cast<double>(lo)) * (sorted[hi] - sorted[lo]);
}

void summarise(CheckStatistic& s) {
  std::vector<double> v = s.replicated;
  std::sort(v.begin(), v.end());
  s.low = quantile(v, 0.025);
  s.high = quantile(v, 0.975);
  double sum = 0.0, sq = 0.0;
  for (const double x : v) sum += x;
  s.mean = sum / static_cast<double>(v.size());
  for (const double x : v) sq += (x - s.mean) * (x - s.mean);
  s.sd = v.size() > 1 ? std::sqrt(sq / static_cast<double>(v.size() - 1)) : 0.0;
}

/// A scratch folder for the check's scenario and order file, removed when it goes out of scope.
class ScratchFolder {
 public:
  ScratchFolder() {
    path_ =
        std::filesystem::temp_directory_path() /
        fmt::format("larder-fit-check-{}-{}", ::getpid(), reinterpret_cast<std::uintptr_t>(this));
    std::filesystem::create_directories(path_);
  }
  ~ScratchFolder() {
    std::error_code ec;
    std::filesystem::remove_all(path_, ec);
  }
  ScratchFolder(const ScratchFolder&) = delete;
  ScratchFolder& operator=(const ScratchFolder&) = delete;
  const std::filesystem::path& path() const { return path_; }

 private:
  std::filesystem::path path_;
};

}  // namespace

std::vector<ItemCheck> check_fit(const FitResult& r, const WriteOptions& base, int replications,
                                 int threads) {
  const FitData& d = r.data;
  ScratchFolder scratch;
  WriteOptions o = base;
  o.replay_orders = "history-deliveries.csv";
  o.replications = replications;
  std::ofstream(scratch.path() / o.replay_orders, std::ios::binary) << replay_orders_csv(r);
  const std::string text = fitted_scenario_yaml(r, o);
  Diagnostics diag;
  const std::string file = (scratch.path() / "check.yaml").string();
  auto scenario = parse_scenario(text, file, diag);
  std::vector<Policy> policies;
  if (scenario) policies = build_policies(*scenario, diag);
  if (!scenario || !diag.ok()) throw InputError(std::move(diag));

  // The history's store-item-days and statistics, by (store, item) index and day.
  const auto n_items = d.items.size();
  std::unordered_map<std::string, int> store_index, item_index;
  for (size_t s = 0; s < d.stores.size(); ++s) store_index[d.stores[s]] = static_cast<int>(s);
  for (size_t i = 0; i < n_items; ++i) item_index[d.items[i]] = static_cast<int>(i);
  const auto key = [&](int store, int item, int day) {
    return (static_cast<std::int64_t>(store) * static_cast<std::int64_t>(n_items) + item) *
               (d.days + 1) +
           day;
  };
  std::unordered_map<std::int64_t, char> kept;
  std::vector<ItemCheck> out(n_items);
  std::vector<double> sold(n_items, 0.0), out_days(n_items, 0.0);
  for (const FitDay& x : d.rows) {
    if (!r.fit.items[x.item].fitted || !r.fit.stores[x.store].fitted) continue;
    kept[key(x.store, x.item, x.day)] = 1;
    ItemCheck& c = out[x.item];
    c.store_days++;
    sold[x.item] += x.sold;
    out_days[x.item] += x.sold_out ? 1.0 : 0.0;
  }
  for (size_t i = 0; i < n_items; ++i) {
    out[i].item = d.items[i];
    if (out[i].store_days == 0) continue;
    out[i].sales.history = sold[i] / out[i].store_days;
    out[i].sold_out.history = out_days[i] / out[i].store_days;
  }
  tbb::task_arena arena(threads > 0 ? threads : tbb::task_arena::automatic);
  const std::int64_t first = day_number(d.first_date);
  for (int rep = 0; rep < replications; ++rep) {
    std::vector<double> s(n_items, 0.0), so(n_items, 0.0), n(n_items, 0.0);
    HistoryRecorder recorder(*scenario, policies, 0, rep, arena);
    recorder.run([&](const HistoryRow& row) {
      const auto st = store_index.find(row.store);
      const auto it = item_index.find(row.item);
      if (st == store_index.end() || it == item_index.end()) return;
      const auto day = static_cast<int>(day_number(row.date) - first);
      if (!kept.contains(key(st->second, it->second, day))) return;
      const auto i = static_cast<size_t>(it->second);
      s[i] += row.sold;
      so[i] += row.sold_out ? 1.0 : 0.0;
      n[i] += 1.0;
    });
    for (size_t i = 0; i < n_items; ++i) {
      if (n[i] <= 0) continue;
      out[i].sales.replicated.push_back(s[i] / n[i]);
      out[i].sold_out.replicated.push_back(so[i] / n[i]);
    }
  }
  std::erase_if(out, [](const ItemCheck& c) { return c.sales.replicated.empty(); });
  for (ItemCheck& c : out) {
    summarise(c.sales);
    summarise(c.sold_out);
  }
  return out;
}

}  // namespace larder
