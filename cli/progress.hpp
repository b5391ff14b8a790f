#pragma once
// Progress of a long run on stderr: a bar with rate and ETA when stderr is a terminal, a plain
// line every few seconds otherwise, nothing when quiet.

#include <chrono>
#include <string>

namespace larder {

class Progress {
 public:
  /// `what` names the work ("replications"); `quiet` silences everything.
  Progress(std::string what, bool quiet);
  /// Reports that `done` of `total` units are finished.
  void update(int done, int total);
  /// Ends the bar's line (if one was drawn).
  void finish();

 private:
  std::string what_;
  bool quiet_;
  bool terminal_;
  bool drawn_ = false;
  std::chrono::steady_clock::time_point start_;
  std::chrono::steady_clock::time_point last_;
};

/// "1m 05s", "42s", "3h 02m": a duration for humans.
std::string format_duration(double seconds);

}  // namespace larder
