#include "reports/shard_file.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <fstream>
#include <regex>
#include <sstream>
#include <stdexcept>

#include "reports/run_result_json.hpp"
#include "sim/scenario/diagnostics.hpp"

namespace larder {

namespace {

namespace fs = std::filesystem;
using nlohmann::json;

constexpr std::string_view kFormat = "larder-shard";
constexpr int kFormatVersion = 1;

bool is_shard_file_name(const fs::path& p) {
  static const std::regex pattern(R"(shard-[0-9]+-of-[0-9]+\.json)");
  return std::regex_match(p.filename().string(), pattern);
}

ShardSource read_one(const fs::path& file) {
  std::ifstream in(file, std::ios::binary);
  if (!in) throw std::runtime_error("cannot be read");
  std::stringstream text;
  text << in.rdbuf();
  return {file.string(), parse_shard_file(text.str())};
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

std::string shard_file_text(const ShardResult& shard) {
  const json j = {{"format", kFormat},
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
  return j.dump(-1, ' ', false, json::error_handler_t::replace) + "\n";
}

ShardResult parse_shard_file(std::string_view text) {
  json j;
  try {
    j = json::parse(text);
  } catch (const json::exception&) {
    throw std::runtime_error("not a larder shard file (not JSON, or cut short)");
  }
  if (!j.is_object() || j.value("format", "") != kFormat) {
    throw std::runtime_error("not a larder shard file");
  }
  try {
    if (j.at("format_version").get<int>() != kFormatVersion) {
      throw std::runtime_error(fmt::format("shard file format {} is not supported by larder {}",
                                           j.at("format_version").dump(), LARDER_VERSION));
    }
    ShardResult s;
    s.shard = {j.at("shard").get<int>(), j.at("shards").get<int>()};
    if (s.shard.index < 1 || s.shard.index > s.shard.count) {
      throw std::runtime_error(
          fmt::format("shard {} of {} is not a shard", s.shard.index, s.shard.count));
    }
    s.complete = j.at("complete").get<bool>();
    s.total_replications = j.at("replications_total").get<int>();
    s.replication_ids = j.at("replication_ids").get<std::vector<int>>();
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
