#include "reports/shard_file.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <regex>
#include <stdexcept>

#include "reports/json_integer.hpp"
#include "reports/run_result_json.hpp"
#include "sim/scenario/bounded_read.hpp"
#include "sim/scenario/diagnostics.hpp"

namespace larder {

namespace {

namespace fs = std::filesystem;
using nlohmann::json;

constexpr std::string_view kFormat = "larder-shard";
constexpr int kFormatVersion = 2;  // 2: the content digest (issue 23)
constexpr const char* kDigestKey = "content_digest";

bool is_shard_file_name(const fs::path& p) {
  static const std::regex pattern(R"(shard-[0-9]+-of-[0-9]+\.json)");
  return std::regex_match(p.filename().string(), pattern);
}

ShardSource read_one(const fs::path& file) {
  std::error_code ec;
  if (!fs::is_regular_file(file, ec)) {
    throw std::runtime_error("not an ordinary file (a pipe or a device is not a shard file)");
  }
  const BoundedText in = read_bounded(file.string(), kMaxShardFileBytes);
  if (in.too_large) {
    throw std::runtime_error(fmt::format(
        "larger than the limit of {} for a shard file (larder read no further); split the run "
        "into more shards",
        size_in_words(kMaxShardFileBytes)));
  }
  if (!in.ok()) throw std::runtime_error(fmt::format("cannot be read: {}", in.problem));
  return {file.string(), parse_shard_file(in.text)};
}

/// The shard files directly in `dir`, by name.
std::vector<fs::path> shard_files_in(const fs::path& dir) {
  std::vector<fs::path> out;
  for (const auto& entry : fs::directory_iterator(dir)) {
    if (entry.is_regular_file() && is_shard_file_name(entry.path())) out.push_back(entry.path());
  }
  std::sort(out.begin(), out.end());
  return out;
}

}  // namespace

std::string shard_file_name(ShardSpec s) {
  return fmt::format("shard-{}-of-{}.json", s.index, s.count);
}

namespace {

/// The canonical text of a shard file's fields but the digest (nlohmann's compact dump, keys
/// sorted), which the digest covers: every number, the run facts, the ids and the scenario.
std::string canonical_text(const json& fields) {
  return fields.dump(-1, ' ', false, json::error_handler_t::replace);
}

/// The largest count (shards, replications) a shard file may hold.
constexpr int kMaxShardCount = 1'000'000'000;

}  // namespace

std::string shard_file_text(const ShardResult& shard) {
  json j = {{"format", kFormat},
            {"format_version", kFormatVersion},
            {"shard", shard.shard.index},
            {"shards", shard.shard.count},
            {"complete", shard.complete},
            {"replications_total", shard.total_replications},
            {"replication_ids", shard.replication_ids},
            {"scenario_digest", shard.scenario_digest},
            {"scenario_text", shard.scenario_text},
            {"shard_command", shard.shard_command},
            {"run", run_result_json(shard.result)}};
  const std::string digest = scenario_digest(canonical_text(j));
  j[kDigestKey] = digest;
  return j.dump(-1, ' ', false, json::error_handler_t::replace) + "\n";
}

ShardResult parse_shard_file(std::string_view text) {
  json j;
  try {
    j = json::parse(text);
  } catch (const json::exception&) {
    throw std::runtime_error("not a larder shard file (not JSON, or cut short)");
  }
  // Not j.value("format", ""): it throws a json type_error when "format" is not a string.
  const auto format = j.is_object() ? j.find("format") : j.end();
  if (format == j.end() || !format->is_string() || format->get<std::string>() != kFormat) {
    throw std::runtime_error("not a larder shard file");
  }
  try {
    const json& version = j.at("format_version");
    if (!version.is_number_integer() || version.get<std::int64_t>() != kFormatVersion) {
      throw std::runtime_error(fmt::format("shard file format {} is not supported by larder {}",
                                           version.dump(), LARDER_VERSION));
    }
    // The digest first: a changed digit, an injected number or a cut file is refused before
    // anything is read from it.
    const auto digest = j.find(kDigestKey);
    if (digest == j.end() || !digest->is_string()) {
      throw std::runtime_error("damaged shard file: it carries no digest of its content");
    }
    const std::string expected = digest->get<std::string>();
    j.erase(kDigestKey);
    if (scenario_digest(canonical_text(j)) != expected) {
      throw std::runtime_error(
          "damaged shard file: its content does not match its digest (edited, or written by a "
          "faulty disk); run the shard again");
    }
    ShardResult s;
    const int count = json_int(j.at("shards"), "shards", 1, kMaxShardCount);
    s.shard = {json_int(j.at("shard"), "shard", 1, count), count};
    s.complete = j.at("complete").get<bool>();
    s.total_replications =
        json_int(j.at("replications_total"), "replications_total", 1, kMaxShardCount);
    const json& ids = j.at("replication_ids");
    if (!ids.is_array()) throw std::runtime_error("replication_ids: expected a list");
    for (const json& id : ids) {
      s.replication_ids.push_back(json_int(id, "a replication id", 0, s.total_replications - 1));
    }
    s.scenario_digest = j.at("scenario_digest").get<std::string>();
    s.scenario_text = j.at("scenario_text").get<std::string>();
    if (scenario_digest(s.scenario_text) != s.scenario_digest) {
      throw std::runtime_error("damaged shard file: the scenario text does not match its digest");
    }
    s.shard_command = j.at("shard_command").get<std::string>();
    s.result = run_result_from_json(j.at("run"));
    if (s.replication_ids.size() != static_cast<size_t>(s.result.info.replications)) {
      throw std::runtime_error(fmt::format("{} replication ids for {} replications",
                                           s.replication_ids.size(), s.result.info.replications));
    }
    return s;
  } catch (const json::exception& e) {
    throw std::runtime_error(fmt::format("damaged shard file: {}", e.what()));
  }
}

std::vector<ShardSource> read_shard_files(const std::vector<std::string>& paths) {
  Diagnostics diag;
  std::vector<ShardSource> out;
  std::vector<fs::path> seen;  // a file named twice (a folder and the file in it) counts once
  for (const std::string& p : paths) {
    std::error_code ec;
    std::vector<fs::path> files;
    if (fs::is_directory(p, ec)) {
      files = shard_files_in(p);
      if (files.empty()) diag.error({p}, "no shard files (shard-K-of-N.json) in this folder");
    } else if (fs::exists(p, ec)) {
      files.push_back(p);
    } else {
      diag.error({p}, "no such file or folder");
    }
    for (const fs::path& f : files) {
      const fs::path canonical = fs::weakly_canonical(f, ec);
      if (std::find(seen.begin(), seen.end(), canonical) != seen.end()) continue;
      seen.push_back(canonical);
      try {
        out.push_back(read_one(f));
      } catch (const std::exception& e) {
        diag.error({f.string()}, e.what());
      }
    }
  }
  if (!diag.ok()) throw InputError(diag);
  return out;
}

}  // namespace larder
