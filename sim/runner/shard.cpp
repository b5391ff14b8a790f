#include "sim/runner/shard.hpp"

#include <fmt/format.h>

#include <charconv>
#include <cstdint>

namespace larder {

namespace {

std::optional<int> whole_number(std::string_view s) {
  int v = 0;
  const auto [end, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (s.empty() || ec != std::errc{} || end != s.data() + s.size()) return std::nullopt;
  return v;
}

}  // namespace

std::optional<ShardSpec> parse_shard(std::string_view text) {
  const size_t slash = text.find('/');
  if (slash == std::string_view::npos) return std::nullopt;
  const auto k = whole_number(text.substr(0, slash));
  const auto n = whole_number(text.substr(slash + 1));
  if (!k || !n || *k < 1 || *k > *n) return std::nullopt;
  return ShardSpec{*k, *n};
}

ReplicationRange shard_range(ShardSpec s, int replications) {
  const auto edge = [&](int k) {
    return static_cast<int>(static_cast<std::int64_t>(k) * replications / s.count);
  };
  const int first = edge(s.index - 1);
  return {first, edge(s.index) - first};
}

std::string scenario_digest(std::string_view text) {
  std::uint64_t h = 14695981039346656037ull;  // FNV-1a offset basis and prime (64 bits)
  for (unsigned char c : text) {
    h ^= c;
    h *= 1099511628211ull;
  }
  return fmt::format("{:016x}", h);
}

std::string without_shard_option(std::string_view command) {
  for (const std::string_view option : {" --shard=", " --shard "}) {
    const size_t at = command.find(option);
    if (at == std::string_view::npos) continue;
    size_t end = command.find(' ', at + option.size());
    if (end == std::string_view::npos) end = command.size();
    return std::string(command.substr(0, at)) + std::string(command.substr(end));
  }
  return std::string(command);
}

}  // namespace larder
