#pragma once
// Policy parts are created by name. Each part's file has a `register_*` function adding its
// factory to a catalogue; `policy_registry()` builds the catalogue once (immutable after), so a
// new part is an addition (its file plus one line in registry.cpp), not an edit of the engine.

#include <functional>
#include <memory>
#include <string>
#include <vector>

#include "policies/adjustment.hpp"
#include "policies/censoring.hpp"
#include "policies/forecast.hpp"
#include "policies/quantity_rule.hpp"

namespace larder {

/// One named part: its one-line summary (for --help) and how to create it from parameters.
template <class Method>
struct PartFactory {
  std::string name;
  std::string summary;
  std::function<std::unique_ptr<Method>(PartContext&)> create;
};

/// The named parts of one kind.
template <class Method>
class Catalogue {
 public:
  void add(PartFactory<Method> f) { parts_.push_back(std::move(f)); }
  const PartFactory<Method>* find(std::string_view name) const {
    for (const auto& p : parts_) {
      if (p.name == name) return &p;
    }
    return nullptr;
  }
  const std::vector<PartFactory<Method>>& all() const { return parts_; }
  /// "a, b, c" for messages.
  std::string names() const;

 private:
  std::vector<PartFactory<Method>> parts_;
};

/// Every policy part larder knows, by kind.
struct PolicyRegistry {
  Catalogue<ForecastMethod> forecasts;
  Catalogue<CensoringMethod> censorings;
  Catalogue<QuantityMethod> quantities;
  Catalogue<AdjustmentMethod> adjustments;
};

/// The registry of all built-in parts (built on first use, immutable afterwards).
const PolicyRegistry& policy_registry();

template <class Method>
std::string Catalogue<Method>::names() const {
  std::string out;
  for (const auto& p : parts_) out += (out.empty() ? "" : ", ") + p.name;
  return out;
}

// Registration functions, one per part file.
void register_oracle(PolicyRegistry& r);
void register_ses_weekday(PolicyRegistry& r);
void register_moving_average(PolicyRegistry& r);
void register_same_day_last_week(PolicyRegistry& r);
void register_holt_winters(PolicyRegistry& r);
void register_demand_chasing(PolicyRegistry& r);
void register_ignore(PolicyRegistry& r);
void register_drop(PolicyRegistry& r);
void register_normal_tail(PolicyRegistry& r);
void register_intraday(PolicyRegistry& r);
void register_product_limit(PolicyRegistry& r);
void register_fixed(PolicyRegistry& r);
void register_base_stock(PolicyRegistry& r);
void register_critical_fractile(PolicyRegistry& r);
void register_in_stock_target(PolicyRegistry& r);
void register_network_in_stock(PolicyRegistry& r);
void register_fill_rate_target(PolicyRegistry& r);
void register_order_up_to(PolicyRegistry& r);
void register_replay(PolicyRegistry& r);
void register_pull_to_center(PolicyRegistry& r);
void register_leftover_aversion(PolicyRegistry& r);
void register_pack_round(PolicyRegistry& r);
void register_shelf_cap(PolicyRegistry& r);
void register_min_display(PolicyRegistry& r);
void register_waste_feedback(PolicyRegistry& r);
void register_cap_growth(PolicyRegistry& r);

}  // namespace larder
