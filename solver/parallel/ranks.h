/// \file ranks.h
/// \brief The only door to MPI (the Message Passing Interface standard, mpi-forum.org):
/// the run's processes ("ranks") and the few collective and point-to-point operations the
/// decomposition needs. Built with -DTERAYEE_MPI=ON every call is an MPI call; without it
/// the same code compiles to one rank, where every exchange is empty and every collective
/// is the identity. Only rank-ordered operations are used (allgather of per-rank blocks, a
/// max reduction of integers), so nothing summed across ranks depends on the rank count.
#pragma once
#include <cstddef>
#include <vector>

namespace ty::parallel {

/// Starts MPI (thread level "funneled": only the main thread calls MPI) when built with it
/// and ends it at destruction; one per program, in main().
class Session {
 public:
  Session(int& argc, char**& argv);
  ~Session();
  Session(const Session&) = delete;
  Session& operator=(const Session&) = delete;
};

/// This process's rank and the number of ranks (0 and 1 without MPI or outside mpirun).
int rank();
int size();
/// Whether the program was built with MPI.
bool built_with_mpi();

/// A pending non-blocking transfer; wait() completes it (nothing to do without MPI).
class Request {
 public:
  Request() = default;
  ~Request();
  Request(const Request&) = delete;
  Request& operator=(const Request&) = delete;
  void wait();
  bool pending() const { return pending_; }
  void* handle() { return &storage_; }
  void set_pending() { pending_ = true; }

 private:
  alignas(8) unsigned char storage_[16] = {};  // holds an MPI_Request
  bool pending_ = false;
};

/// Non-blocking send / receive of n bytes to / from rank peer with a tag.
void send_bytes(const void* data, std::size_t n, int peer, int tag, Request& r);
void receive_bytes(void* data, std::size_t n, int peer, int tag, Request& r);

/// Every rank's block of `counts[r]` bytes, laid end to end in rank order (in place: the
/// caller's block already sits at its offset in `all`).
void allgather_bytes(void* all, const std::vector<int>& counts);
/// The same onto rank 0 alone (the others' `all` is left as it was).
void gather_bytes_to_root(void* all, const std::vector<int>& counts);
/// Bytes this rank has received from the others through allgather_bytes so far (the
/// recorders' rows and the whole-grid gathers: what the run log reports over ranks).
long gathered_bytes();
/// The largest of every rank's value.
long max_over_ranks(long v);
/// Each of v[0 .. n) summed over the ranks, on every rank, in place (exact where one rank
/// alone holds a non-zero value, as the stop rule's map samples: each on its row's rank).
void sum_over_ranks(double* v, long n);
/// A value and where it was found (a cell, a node; -1: nowhere), one per rank.
struct Pick {
  double value = 0;
  long where = -1;
};
/// Every rank's pick, in rank order, on every rank (the caller picks among them by the rule
/// it applies within its rows, so the choice is the one a single process makes).
std::vector<Pick> picks_over_ranks(Pick mine);
/// Rank `root`'s bytes, to every rank.
void broadcast_bytes(void* data, std::size_t n, int root);
/// Waits for every rank.
void barrier();
/// Ends every rank now with exit status `code` (a failure on one rank that the others cannot see).
[[noreturn]] void abort(int code);

}  // namespace ty::parallel
