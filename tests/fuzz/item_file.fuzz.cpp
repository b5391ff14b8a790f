// Fuzz target: an item file (`larder fit --items`, the format `larder history --items-out`
// writes; sim/history/item_file.hpp). Contract checked on every input: no crash, hang or
// sanitizer report; items or InputError, never anything else; problems name the file and a line
// of the text (or none), at most Diagnostics::kMaxKept of them and the reason the reader
// stopped; accepted items have distinct, non-empty ids, prices and costs that are finite
// numbers >= 0, shelf lives from 1 to 3650 and the same attribute columns in the same order.
// Crashes found become tests in tests/fuzz_regressions.test.cpp.

#include "sim/history/item_file.hpp"

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <set>
#include <sstream>
#include <string>

#include "sim/scenario/diagnostics.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  long long lines = 1;
  for (const char c : text) lines += c == '\n' ? 1 : 0;
  std::istringstream in(text);
  std::vector<larder::ItemRecord> items;
  try {
    items = larder::read_item_file(in, "items.csv");
  } catch (const larder::InputError& e) {
    const larder::Diagnostics& diag = e.diagnostics();
    if (diag.ok() || diag.items().size() > larder::Diagnostics::kMaxKept + 1) __builtin_trap();
    for (const larder::Diagnostic& d : diag.items()) {
      if (d.where.file != "items.csv" || d.where.line < 0 || d.where.line > lines + 1 ||
          d.message.empty())
        __builtin_trap();
    }
    (void)diag.format();
    return 0;
  }
  if (items.empty()) __builtin_trap();
  std::set<std::string> ids;
  for (const larder::ItemRecord& r : items) {
    if (r.id.empty() || !ids.insert(r.id).second) __builtin_trap();
    if (!std::isfinite(r.price) || r.price < 0 || !std::isfinite(r.unit_cost) || r.unit_cost < 0)
      __builtin_trap();
    if (r.shelf_life_days < 1 || r.shelf_life_days > 3650) __builtin_trap();
    if (r.attributes.size() != items.front().attributes.size()) __builtin_trap();
    for (size_t k = 0; k < r.attributes.size(); ++k)
      if (r.attributes[k].first != items.front().attributes[k].first) __builtin_trap();
  }
  return 0;
}
