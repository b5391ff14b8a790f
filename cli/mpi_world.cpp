#include "cli/mpi_world.hpp"

#ifdef LARDER_WITH_MPI
#include <mpi.h>
#endif

namespace larder {

#ifdef LARDER_WITH_MPI

MpiSession::MpiSession(int& argc, char**& argv) {
  int initialised = 0;
  MPI_Initialized(&initialised);
  if (initialised == 0) {
    MPI_Init(&argc, &argv);
    active_ = true;
  }
  MPI_Comm_rank(MPI_COMM_WORLD, &world_.rank);
  MPI_Comm_size(MPI_COMM_WORLD, &world_.size);
}

MpiSession::~MpiSession() {
  if (active_) MPI_Finalize();
}

std::vector<std::string> gather_on_root(const std::string& mine) {
  int rank = 0;
  int size = 1;
  MPI_Comm_rank(MPI_COMM_WORLD, &rank);
  MPI_Comm_size(MPI_COMM_WORLD, &size);
  const int length = static_cast<int>(mine.size());
  std::vector<int> lengths(static_cast<size_t>(size), 0);
  MPI_Gather(&length, 1, MPI_INT, lengths.data(), 1, MPI_INT, 0, MPI_COMM_WORLD);
  std::vector<int> offsets(static_cast<size_t>(size), 0);
  int total = 0;
  for (int r = 0; r < size; ++r) {
    offsets[static_cast<size_t>(r)] = total;
    total += lengths[static_cast<size_t>(r)];
  }
  std::string all(rank == 0 ? static_cast<size_t>(total) : 0, '\0');
  MPI_Gatherv(mine.data(), length, MPI_CHAR, all.data(), lengths.data(), offsets.data(), MPI_CHAR,
              0, MPI_COMM_WORLD);
  if (rank != 0) return {};
  std::vector<std::string> out;
  for (int r = 0; r < size; ++r) {
    out.push_back(all.substr(static_cast<size_t>(offsets[static_cast<size_t>(r)]),
                             static_cast<size_t>(lengths[static_cast<size_t>(r)])));
  }
  return out;
}

#else

MpiSession::MpiSession(int& /*argc*/, char**& /*argv*/) {}
MpiSession::~MpiSession() = default;
std::vector<std::string> gather_on_root(const std::string& mine) {
  return {mine};
}

#endif

}  // namespace larder
