#pragma once
// Checks on the paths a command is about to write, made before any work (README, "Output
// safety"): an output never replaces something that is not an ordinary file (a device, a FIFO,
// a folder) nor a symbolic link, never overwrites one of the command's own inputs, and two
// outputs of one command never name the same file. A refusal is bad input (InputError, exit 2).

#include <filesystem>
#include <string>
#include <vector>

namespace larder {

/// An output file and the option that named it (for the message).
struct OutputFile {
  std::filesystem::path path;
  std::string option;  ///< e.g. "--out", "--items-out"
};

/// An input of the command and what it is (for the message), e.g. {"h.csv", "the history"}.
struct InputFile {
  std::filesystem::path path;
  std::string what;
};

/// Throws InputError unless every output is missing or an ordinary file (not a symbolic link),
/// none is the same file as an input (by device and inode when both exist, else by path), and no
/// two outputs name the same file.
void check_output_files(const std::vector<OutputFile>& outputs,
                        const std::vector<InputFile>& inputs);

/// For a folder of results: throws InputError when `dir` is a symbolic link (the folder is
/// replaced as a whole, which would replace the link), or when one of the files larder writes
/// there (`names`) exists as anything but an ordinary file or is one of the inputs.
void check_output_folder(const std::filesystem::path& dir, const std::vector<std::string>& names,
                         const std::vector<InputFile>& inputs);

/// Whether `a` and `b` name the same file: the same device and inode when both exist, else the
/// same absolute path with `.`, `..` and symbolic links of existing parents resolved.
bool same_file(const std::filesystem::path& a, const std::filesystem::path& b);

}  // namespace larder
