#pragma once
// `mpirun -np N larder run ...` (built with -DLARDER_MPI=ON, Debian's OpenMPI): every rank runs
// one slice of the replications, exactly as `--shard rank+1/N` would, and rank 0 gathers the
// slices and merges them (shard_merge.hpp), so the results are those of a single run, bit for
// bit. Without MPI, or without mpirun, there is one rank and nothing changes.

#include <string>
#include <vector>

namespace larder {

/// This process's place among the ranks (rank 0 of 1 without MPI).
struct MpiWorld {
  int rank = 0;
  int size = 1;
};

/// Initialises MPI for the life of `main` when larder was built with it (no-op otherwise).
class MpiSession {
 public:
  MpiSession(int& argc, char**& argv);
  ~MpiSession();
  MpiSession(const MpiSession&) = delete;
  MpiSession& operator=(const MpiSession&) = delete;
  MpiWorld world() const { return world_; }

 private:
  MpiWorld world_;
  [[maybe_unused]] bool active_ = false;  // used only in the MPI build
};

/// Gathers every rank's text on rank 0, in rank order; the other ranks get an empty list.
std::vector<std::string> gather_on_root(const std::string& mine);

}  // namespace larder
