#include "reports/output_path.hpp"

#include <fmt/format.h>

#include <system_error>

#include "sim/scenario/diagnostics.hpp"

namespace larder {

namespace {

namespace fs = std::filesystem;

[[noreturn]] void refuse(const fs::path& where, std::string message, std::string hint) {
  Diagnostics d;
  d.error({where.string(), 0, 0}, std::move(message), std::move(hint));
  throw InputError(std::move(d));
}

/// What an existing path is, in words, for a refusal; "" for an ordinary file or nothing.
std::string not_a_file(const fs::path& p) {
  std::error_code ec;
  const fs::file_status s = fs::symlink_status(p, ec);
  if (ec || !fs::exists(s) || fs::is_regular_file(s)) return "";
  if (fs::is_symlink(s)) return "a symbolic link";
  if (fs::is_directory(s)) return "a folder";
  if (fs::is_fifo(s)) return "a named pipe (FIFO)";
  if (fs::is_character_file(s) || fs::is_block_file(s)) return "a device";
  if (fs::is_socket(s)) return "a socket";
  return "not an ordinary file";
}

void check_inputs(const fs::path& out, const std::string& option,
                  const std::vector<InputFile>& inputs) {
  for (const InputFile& in : inputs) {
    if (!in.path.empty() && same_file(out, in.path)) {
      refuse(out,
             fmt::format("{} {} is {} ({}): larder would overwrite its own input", option,
                         out.string(), in.what, in.path.string()),
             "write the output to another file");
    }
  }
}

}  // namespace

bool same_file(const fs::path& a, const fs::path& b) {
  std::error_code ea;
  std::error_code eb;
  if (fs::exists(a, ea) && fs::exists(b, eb)) {
    std::error_code ec;
    return fs::equivalent(a, b, ec);
  }
  std::error_code e1;
  std::error_code e2;
  const fs::path ca = fs::weakly_canonical(fs::absolute(a), e1);
  const fs::path cb = fs::weakly_canonical(fs::absolute(b), e2);
  return !e1 && !e2 && ca == cb;
}

void check_output_files(const std::vector<OutputFile>& outputs,
                        const std::vector<InputFile>& inputs) {
  for (size_t i = 0; i < outputs.size(); ++i) {
    const OutputFile& o = outputs[i];
    if (const std::string what = not_a_file(o.path); !what.empty()) {
      refuse(o.path,
             fmt::format("{} {} is {}; larder writes only ordinary files and never replaces "
                         "anything else",
                         o.option, o.path.string(), what),
             "give the path of an ordinary file (new, or one larder may overwrite)");
    }
    check_inputs(o.path, o.option, inputs);
    for (size_t j = 0; j < i; ++j) {
      if (same_file(o.path, outputs[j].path)) {
        refuse(o.path,
               fmt::format("{} and {} name the same file {}: one would overwrite the other",
                           outputs[j].option, o.option, o.path.string()),
               "give each output its own file");
      }
    }
  }
}

void check_output_folder(const fs::path& dir, const std::vector<std::string>& names,
                         const std::vector<InputFile>& inputs) {
  std::error_code ec;
  if (fs::is_symlink(fs::symlink_status(dir, ec))) {
    refuse(dir,
           "the output folder is a symbolic link; larder replaces the folder's results as a "
           "whole and would replace the link",
           "give the folder it points to as --out");
  }
  for (const std::string& name : names) {
    const fs::path p = dir / name;
    if (const std::string what = not_a_file(p); !what.empty()) {
      refuse(p, fmt::format("{} in the output folder is {}; larder would replace it", name, what),
             "remove it, or choose another --out");
    }
    check_inputs(p, "the output", inputs);
  }
}

}  // namespace larder
