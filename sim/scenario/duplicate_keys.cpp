#include "sim/scenario/duplicate_keys.hpp"

#include <fmt/format.h>

#include <map>
#include <set>

#include "sim/scenario/params.hpp"

namespace larder {

namespace {

class DuplicateFinder {
 public:
  DuplicateFinder(const std::string& file, Diagnostics& diag) : file_(file), diag_(diag) {}

  void visit(const YAML::Node& node, const std::string& path) {
    if (!node.IsMap() && !node.IsSequence()) return;
    // An alias shares its anchor's node and mark: visiting each position once keeps the walk
    // linear even for aliases of aliases.
    if (!visited_.insert(node.Mark().pos).second) return;
    if (node.IsSequence()) {
      for (size_t i = 0; i < node.size(); ++i) visit(node[i], fmt::format("{}[{}]", path, i));
      return;
    }
    std::map<std::string, int> first_line;
    for (const auto& kv : node) {
      if (!kv.first.IsScalar()) continue;
      const std::string& key = kv.first.Scalar();
      const Location where = location_of(kv.first, file_);
      const auto [it, inserted] = first_line.emplace(key, where.line);
      if (!inserted) {
        diag_.error(
            where,
            fmt::format("duplicate key '{}' in {}", key, path.empty() ? "the scenario" : path),
            fmt::format("'{}' is first given at line {}", key, it->second));
        continue;
      }
      visit(kv.second, path.empty() ? key : fmt::format("{}.{}", path, key));
    }
  }

 private:
  const std::string& file_;
  Diagnostics& diag_;
  std::set<int> visited_;
};

}  // namespace

void report_duplicate_keys(const YAML::Node& root, const std::string& file, Diagnostics& diag) {
  DuplicateFinder(file, diag).visit(root, "");
}

}  // namespace larder
