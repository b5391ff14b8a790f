#include "sim/engine/demand_model.hpp"

namespace larder {

namespace {
/// Memory the draw tables of a network may take (shared by all threads).
constexpr std::size_t kTableBudgetBytes = std::size_t{1} << 30;
}  // namespace

DemandModel::DemandModel(const Scenario& scenario) : scenario_(&scenario) {
  const int stores = static_cast<int>(scenario.stores.size());
  const int items = static_cast<int>(scenario.items.size());
  const int days = scenario.horizon.days;
  for (int s = 0; s < stores; ++s) {
    for (int w = 0; w < kDaysPerWeek; ++w) {
      for (int i = 0; i < items; ++i) {
        const Item& it = scenario.items[static_cast<size_t>(i)];
        weekday_mean_.push_back(it.demand.base * scenario.stores[static_cast<size_t>(s)].size *
                                it.demand.weekday[static_cast<size_t>(w)]);
      }
    }
  }
  // Draw tables make sampling about twice as fast; a network too large for them within the
  // memory budget draws with the samplers' walk instead (same counts, bit for bit).
  std::size_t table_bytes = 0;
  for (size_t k = 0; k < weekday_mean_.size(); ++k) {
    const CountSampler sampler(
        law_with_mean(static_cast<int>(k % static_cast<size_t>(items)), weekday_mean_[k]));
    const int n = InversionTable::entries_needed(sampler);
    if (n <= InversionTable::kMaxEntries &&
        scenario.items[k % static_cast<size_t>(items)].demand.family != DemandFamily::normal)
      table_bytes += InversionTable::bytes_for(n);
  }
  const int max_entries = table_bytes <= kTableBudgetBytes ? InversionTable::kMaxEntries : 0;
  tables_.reserve(weekday_mean_.size());
  for (size_t k = 0; k < weekday_mean_.size(); ++k) {
    tables_.emplace_back(
        law_with_mean(static_cast<int>(k % static_cast<size_t>(items)), weekday_mean_[k]),
        max_entries);
  }
  plain_day_.resize(static_cast<size_t>(stores) * static_cast<size_t>(days));
  open_day_.resize(plain_day_.size());
  event_factor_.resize(plain_day_.size());
  for (int s = 0; s < stores; ++s) {
    for (int t = 0; t < days; ++t) {
      const size_t k = static_cast<size_t>(s) * static_cast<size_t>(days) + static_cast<size_t>(t);
      open_day_[k] = scenario.is_open(s, t) ? 1 : 0;
      event_factor_[k] = scenario.event_multiplier(s, t);
      plain_day_[k] = (open_day_[k] != 0 && event_factor_[k] == 1.0) ? 1 : 0;
    }
  }
}

std::size_t DemandModel::index(int store, int item, int weekday) const {
  const size_t items = scenario_->items.size();
  return (static_cast<size_t>(store) * kDaysPerWeek + static_cast<size_t>(weekday)) * items +
         static_cast<size_t>(item);
}

const InversionTable* DemandModel::plain_tables(int store, int day) const {
  const size_t k = static_cast<size_t>(store) * static_cast<size_t>(scenario_->horizon.days) +
                   static_cast<size_t>(day);
  if (plain_day_[k] == 0) return nullptr;
  return &tables_[index(store, 0, scenario_->weekday_of(day))];
}

CountLaw DemandModel::law_with_mean(int item, double mean) const {
  const DemandSpec& d = scenario_->items[static_cast<size_t>(item)].demand;
  return CountLaw::make(d.family, mean, d.cv, d.dispersion);
}

double DemandModel::mean(int store, int item, int day) const {
  const size_t k = static_cast<size_t>(store) * static_cast<size_t>(scenario_->horizon.days) +
                   static_cast<size_t>(day);
  if (open_day_[k] == 0) return 0.0;
  return weekday_mean_[index(store, item, scenario_->weekday_of(day))] * event_factor_[k];
}

CountLaw DemandModel::law(int store, int item, int day) const {
  return law_with_mean(item, mean(store, item, day));
}

CountLaw DemandModel::weekday_law(int store, int item, int weekday) const {
  return law_with_mean(item, weekday_mean_[index(store, item, weekday)]);
}

int DemandModel::sample(int store, int item, int day, double u) const {
  const size_t k = static_cast<size_t>(store) * static_cast<size_t>(scenario_->horizon.days) +
                   static_cast<size_t>(day);
  if (plain_day_[k] != 0) return tables_[index(store, item, scenario_->weekday_of(day))](u);
  if (open_day_[k] == 0) return 0;
  return law(store, item, day).quantile(u);
}

std::size_t DemandModel::bytes_per_store_item() const {
  std::size_t b = 0;
  for (const auto& t : tables_) b += t.bytes() + sizeof(double);
  const std::size_t n = tables_.size() / kDaysPerWeek;
  return n == 0 ? 0 : b / n;
}

}  // namespace larder
