#pragma once
// The item file that goes with a history (`larder history --items-out`, `larder fit --items`):
// a CSV with one row per item, columns `item,price,unit_cost,shelf_life_days` (any order) and
// every other column an attribute of the item (README, "History format").

#include <cstddef>
#include <istream>
#include <string>
#include <utility>
#include <vector>

namespace larder {

struct ItemRecord {
  std::string id;
  double price = 0;
  double unit_cost = 0;
  int shelf_life_days = 1;
  std::vector<std::pair<std::string, std::string>>
      attributes;  ///< every other column, in header order
};

/// The largest item file read (its rows are kept): a million items with attributes.
inline constexpr std::size_t kMaxItemFileBytes = std::size_t{256} << 20;
/// The most item rows an item file may hold (each kept costs about 200 bytes).
inline constexpr std::size_t kMaxItemFileItems = 1'000'000;

/// Reads and checks an item file (lines capped as the history's, the whole at
/// kMaxItemFileBytes and kMaxItemFileItems, so a pipe or device is never read without end);
/// every problem is reported at once as InputError
/// (`file:line:col: error: ...`): missing, unknown-empty or duplicate columns, duplicate or empty
/// item ids, prices and costs that are not numbers >= 0, shelf lives that are not whole numbers
/// >= 1.
std::vector<ItemRecord> read_item_file(const std::string& path);

/// The same, from a stream called `path` in messages (the fuzz target of tests/fuzz/ and tests).
std::vector<ItemRecord> read_item_file(std::istream& in, const std::string& path);

}  // namespace larder
