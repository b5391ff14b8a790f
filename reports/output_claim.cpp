#include "reports/output_claim.hpp"

#include <fmt/format.h>

#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "reports/atomic_file.hpp"
#include "sim/scenario/diagnostics.hpp"

namespace larder {

namespace {

namespace fs = std::filesystem;

[[noreturn]] void refuse(const fs::path& dir, std::string message, std::string hint) {
  Diagnostics d;
  d.error({dir.string(), 0, 0}, std::move(message), std::move(hint));
  throw InputError(std::move(d));
}

bool larder_summary(const fs::path& file) {
  std::ifstream in(file);
  if (!in) return false;
  std::stringstream text;
  text << in.rdbuf();
  const auto j = nlohmann::json::parse(text.str(), nullptr, false);
  return j.is_object() && j.contains("larder_version");
}

/// Whether `dir` holds anything but the marker (or a marker being written by another process
/// of the same run: MPI ranks claim the folder at the same time).
bool holds_other_files(const fs::path& dir) {
  std::error_code ec;
  for (const auto& entry : fs::directory_iterator(dir, ec)) {
    const std::string name = entry.path().filename().string();
    std::string_view base = name;
    if (base.starts_with(".")) base.remove_prefix(1);  // a temporary file: .<name>.tmp-...
    if (!base.starts_with(kOutputMarker)) return true;
  }
  return false;
}

}  // namespace

bool holds_larder_result(const fs::path& dir) {
  std::error_code ec;
  return fs::is_regular_file(dir / kOutputMarker, ec) || larder_summary(dir / "summary.json");
}

void claim_output_folder(const fs::path& dir, bool force) {
  std::error_code ec;
  const fs::file_status status = fs::status(dir, ec);
  if (fs::exists(status) && !fs::is_directory(status)) {
    refuse(dir, "the output folder is a file", "choose another --out");
  }
  if (fs::is_directory(status) && !force && holds_other_files(dir) && !holds_larder_result(dir)) {
    refuse(dir,
           fmt::format("the output folder exists, is not empty and holds no larder result; "
                       "larder would replace files in it"),
           "choose another --out, or pass --force to write into it anyway");
  }
  ensure_directory(dir);
  if (!fs::is_regular_file(dir / kOutputMarker, ec)) {
    write_file_atomically(dir / kOutputMarker,
                          "This folder holds results written by larder; larder may replace the "
                          "files it wrote here.\n");
  }
}

}  // namespace larder
