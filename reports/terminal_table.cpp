#include "reports/terminal_table.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <string_view>

#include "reports/comparison.hpp"
#include "reports/number_format.hpp"
#include "sim/stats/summary.hpp"

namespace larder {

namespace {

// Shown when the run reports them (substitution and discount metrics only when the scenario
// has those features; see applicable_metrics; donated units only when some policy donates).
constexpr std::array kTableMetrics = {
    Metric::waste_units,
    Metric::waste_share,
    Metric::in_stock_at_close,
    Metric::no_stockout_share,
    Metric::fill_rate,
    Metric::served_share,
    Metric::lost_units,
    Metric::sold_units,
    Metric::discounted_units,
    Metric::donated_units,
    Metric::surplus_units,
    Metric::revenue,
    Metric::profit,
    Metric::waste_kg,
    Metric::co2e_kg,
};

constexpr std::string_view kGap = "  ";
constexpr std::string_view kReset = "\x1b[0m";
constexpr std::string_view kBold = "\x1b[1m";
constexpr std::string_view kDim = "\x1b[2m";
constexpr std::string_view kGreen = "\x1b[32m";
constexpr std::string_view kRed = "\x1b[31m";

/// Characters on screen: UTF-8 code points ("±" is one), not bytes.
std::size_t display_width(std::string_view s) {
  return static_cast<std::size_t>(std::count_if(
      s.begin(), s.end(), [](char c) { return (static_cast<unsigned char>(c) & 0xC0) != 0x80; }));
}

enum class Align { left, right };

struct Cell {
  std::string text;
  std::string_view style;  ///< ANSI escape applied when colour is on; empty for none
};

/// A block of rows under a header and a rule, every column padded to its widest cell so that
/// every line has the same width.
class TextBlock {
 public:
  explicit TextBlock(std::vector<Align> align) : align_(std::move(align)) {}

  void add_row(std::vector<Cell> row) { rows_.push_back(std::move(row)); }

  std::string render(bool color) const {
    std::vector<std::size_t> width(align_.size(), 0);
    for (const auto& row : rows_) {
      for (std::size_t c = 0; c < row.size(); ++c) {
        width[c] = std::max(width[c], display_width(row[c].text));
      }
    }
    std::string out;
    for (std::size_t r = 0; r < rows_.size(); ++r) {
      render_row(rows_[r], width, color, out);
      if (r == 0) {  // the rule under the header
        std::vector<Cell> rule;
        for (std::size_t w : width) rule.push_back({std::string(w, '-'), {}});
        render_row(rule, width, false, out);
      }
    }
    return out;
  }

 private:
  void render_row(const std::vector<Cell>& row, const std::vector<std::size_t>& width, bool color,
                  std::string& out) const {
    for (std::size_t c = 0; c < align_.size(); ++c) {
      if (c > 0) out += kGap;
      const Cell empty;
      const Cell& cell = c < row.size() ? row[c] : empty;
      const std::string pad(width[c] - display_width(cell.text), ' ');
      const bool styled = color && !cell.style.empty();
      if (align_[c] == Align::right) out += pad;
      if (styled) out += cell.style;
      out += cell.text;
      if (styled) out += kReset;
      if (align_[c] == Align::left) out += pad;
    }
    out += '\n';
  }

  std::vector<Align> align_;
  std::vector<std::vector<Cell>> rows_;
};

std::string_view verdict_style(Metric m, const Estimate& d) {
  switch (verdict_tone(m, d)) {
    case VerdictTone::better:
      return kGreen;
    case VerdictTone::worse:
      return kRed;
    case VerdictTone::neutral:
      return {};
    default:
      return kDim;
  }
}

std::string heading(std::string_view text, bool color) {
  return color ? fmt::format("{}{}{}\n", kBold, text, kReset) : fmt::format("{}\n", text);
}

std::string run_header(const RunInfo& info, bool color) {
  std::string out =
      heading(info.scenario_file.empty()
                  ? fmt::format("scenario {}", info.scenario_name)
                  : fmt::format("scenario {} ({})", info.scenario_name, info.scenario_file),
              color);
  out += fmt::format(
      "{} replications, seed {}, horizon {} days, warm-up {} days, {} stores, {} items\n",
      info.replications, info.seed, info.horizon_days, info.warmup_days, info.stores, info.items);
  return out;
}

std::string policy_block(const RunResult& result, const std::vector<Metric>& metrics, bool color) {
  const std::size_t n_policies = result.policies.size();
  std::vector<Align> align = {Align::left, Align::left};
  align.resize(2 + n_policies, Align::right);
  TextBlock block(std::move(align));

  std::vector<Cell> header = {{"metric", {}}, {"unit", {}}};
  for (const auto& name : result.policies) header.push_back({name, {}});
  block.add_row(std::move(header));

  for (Metric m : metrics) {
    const std::string_view unit = metric_info(m).unit;
    std::vector<Estimate> est;
    int decimals = 0;
    for (std::size_t p = 0; p < n_policies; ++p) {
      est.push_back(policy_estimate(result, static_cast<int>(p), m));
      const double half = (est.back().ci_high - est.back().ci_low) / 2.0;
      decimals = std::max(decimals, estimate_decimals(half, unit));
    }
    std::vector<Cell> row = {{std::string(metric_name(m)), {}},
                             {unit_label(unit, result.info.currency), {}}};
    for (const Estimate& e : est) {
      row.push_back({format_estimate(e.mean, (e.ci_high - e.ci_low) / 2.0, unit, decimals), {}});
    }
    block.add_row(std::move(row));
  }
  return heading(kEstimateCaption, color) + block.render(color);
}

std::string difference_block(const RunResult& result, int policy,
                             const std::vector<Metric>& metrics, bool color) {
  TextBlock block({Align::left, Align::left, Align::right, Align::right, Align::left});
  block.add_row(
      {{"metric", {}}, {"unit", {}}, {"difference", {}}, {"95% CI", {}}, {"verdict", {}}});
  for (Metric m : metrics) {
    const std::string_view unit = metric_info(m).unit;
    const Estimate d = baseline_difference(result, policy, m);
    const int decimals = estimate_decimals((d.ci_high - d.ci_low) / 2.0, unit);
    block.add_row({{std::string(metric_name(m)), {}},
                   {unit_label(unit, result.info.currency, true), {}},
                   {format_number(display_value(d.mean, unit), decimals), {}},
                   {format_interval(d.ci_low, d.ci_high, unit, decimals), {}},
                   {verdict(m, d), verdict_style(m, d)}});
  }
  return heading(difference_title(result, policy), color) + block.render(color);
}

/// A network_in_stock policy's promise (target against achieved) and its plan groups (up to
/// 12): planned level, the in-stock the plans expected, and the in-stock achieved. Empty for
/// other policies.
std::string plan_group_block(const RunResult& result, size_t policy, bool color) {
  const std::optional<TargetCheck> check = target_check(result, policy);
  if (!check) return {};
  std::string out = heading(
      fmt::format("{}: network plan, mean over replications", result.policies[policy]), color);
  out += fmt::format("{}{}\n", target_text(*check),
                     check->missed() ? " - missed beyond its 95% interval" : "");
  const std::vector<PlanGroupRow> rows = plan_group_rows(result, policy);
  if (rows.empty() || rows.size() > 12) return out;
  TextBlock block({Align::left, Align::right, Align::right, Align::right});
  block.add_row(
      {{"group", {}}, {"planned level", {}}, {"expected in stock", {}}, {"in stock at close", {}}});
  const auto pct = [](const Estimate& e) { return fmt::format("{:.1f}%", 100.0 * e.mean); };
  for (const PlanGroupRow& row : rows) {
    block.add_row({{row.group, {}},
                   {pct(row.planned_level), {}},
                   {pct(row.planned_in_stock), {}},
                   {pct(row.in_stock_at_close), {}}});
  }
  return out + block.render(color);
}

}  // namespace

std::vector<Metric> table_metrics(const RunResult& result) {
  std::vector<Metric> out;
  for (Metric m : kTableMetrics) {
    if (std::find(result.metrics.begin(), result.metrics.end(), m) == result.metrics.end()) {
      continue;
    }
    // Donated units only when some policy donates (else a column of zeros).
    if (m == Metric::donated_units) {
      bool any = false;
      for (const auto& rows : result.values) {
        for (const MetricVector& v : rows) any = any || at(v, m) > 0.0;
      }
      if (!any) continue;
    }
    out.push_back(m);
  }
  return out;
}

std::string comparison_table(const RunResult& result, bool color) {
  const std::vector<Metric> metrics = table_metrics(result);
  std::string out = run_header(result.info, color);
  out += '\n';
  out += policy_block(result, metrics, color);
  const int n_policies = static_cast<int>(result.policies.size());
  for (int p = 0; p < n_policies; ++p) {
    if (p == result.baseline) continue;
    out += '\n';
    out += difference_block(result, p, metrics, color);
  }
  for (size_t p = 0; p < result.breakdown.size(); ++p) {
    const std::string groups = plan_group_block(result, p, color);
    if (!groups.empty()) out += '\n' + groups;
  }
  return out;
}

}  // namespace larder
