/// \file ranks.cpp
/// \brief ranks.h over MPI (TERAYEE_MPI) or, without it, the one-rank identity.
#include "solver/parallel/ranks.h"

#include <cstdlib>
#include <cstring>
#include <numeric>
#include <stdexcept>

#include "solver/grid/aligned.h"

#ifdef TERAYEE_MPI
#include <mpi.h>
#endif

namespace ty::parallel {

#ifdef TERAYEE_MPI
static_assert(sizeof(MPI_Request) <= 16, "Request's storage holds an MPI_Request");
namespace {
MPI_Request* req(Request& r) { return static_cast<MPI_Request*>(r.handle()); }
int g_rank = 0, g_size = 1;
}  // namespace

Session::Session(int& argc, char**& argv) {
  int provided = 0;
  MPI_Init_thread(&argc, &argv, MPI_THREAD_FUNNELED, &provided);
  if (provided < MPI_THREAD_FUNNELED) throw std::runtime_error("MPI does not offer the funneled thread level");
  MPI_Comm_rank(MPI_COMM_WORLD, &g_rank);
  MPI_Comm_size(MPI_COMM_WORLD, &g_size);
  if (g_size > 1) aligned::huge_pages = false;  // a rank's memory is its rows' pages (aligned.h)
}
Session::~Session() { MPI_Finalize(); }
int rank() { return g_rank; }
int size() { return g_size; }
bool built_with_mpi() { return true; }

Request::~Request() {
  if (pending_) wait();
}
void Request::wait() {
  if (!pending_) return;
  MPI_Wait(req(*this), MPI_STATUS_IGNORE);
  pending_ = false;
}
void send_bytes(const void* data, std::size_t n, int peer, int tag, Request& r) {
  MPI_Isend(data, static_cast<int>(n), MPI_BYTE, peer, tag, MPI_COMM_WORLD, req(r));
  r.set_pending();
}
void receive_bytes(void* data, std::size_t n, int peer, int tag, Request& r) {
  MPI_Irecv(data, static_cast<int>(n), MPI_BYTE, peer, tag, MPI_COMM_WORLD, req(r));
  r.set_pending();
}
long g_gathered = 0;
long gathered_bytes() { return g_gathered; }
void allgather_bytes(void* all, const std::vector<int>& counts) {
  g_gathered += std::accumulate(counts.begin(), counts.end(), 0L) - counts[g_rank];
  std::vector<int> displs(counts.size(), 0);
  std::partial_sum(counts.begin(), counts.end() - 1, displs.begin() + 1);
  MPI_Allgatherv(MPI_IN_PLACE, 0, MPI_DATATYPE_NULL, all, counts.data(), displs.data(), MPI_BYTE, MPI_COMM_WORLD);
}
void gather_bytes_to_root(void* all, const std::vector<int>& counts) {
  std::vector<int> displs(counts.size(), 0);
  std::partial_sum(counts.begin(), counts.end() - 1, displs.begin() + 1);
  if (g_rank == 0) {
    g_gathered += std::accumulate(counts.begin(), counts.end(), 0L) - counts[0];
    MPI_Gatherv(MPI_IN_PLACE, 0, MPI_BYTE, all, counts.data(), displs.data(), MPI_BYTE, 0, MPI_COMM_WORLD);
  } else {
    MPI_Gatherv(static_cast<char*>(all) + displs[g_rank], counts[g_rank], MPI_BYTE, nullptr, nullptr, nullptr, MPI_BYTE,
                0, MPI_COMM_WORLD);
  }
}
long max_over_ranks(long v) {
  long m = v;
  MPI_Allreduce(&v, &m, 1, MPI_LONG, MPI_MAX, MPI_COMM_WORLD);
  return m;
}
void sum_over_ranks(double* v, long n) {
  g_gathered += static_cast<long>((g_size - 1) * n * sizeof(double));
  MPI_Allreduce(MPI_IN_PLACE, v, static_cast<int>(n), MPI_DOUBLE, MPI_SUM, MPI_COMM_WORLD);
}
std::vector<Pick> picks_over_ranks(Pick mine) {
  std::vector<Pick> all(g_size);
  g_gathered += static_cast<long>((g_size - 1) * sizeof(Pick));
  MPI_Allgather(&mine, sizeof(Pick), MPI_BYTE, all.data(), sizeof(Pick), MPI_BYTE, MPI_COMM_WORLD);
  return all;
}
void broadcast_bytes(void* data, std::size_t n, int root) {
  MPI_Bcast(data, static_cast<int>(n), MPI_BYTE, root, MPI_COMM_WORLD);
}
void barrier() { MPI_Barrier(MPI_COMM_WORLD); }
void abort(int code) {
  MPI_Abort(MPI_COMM_WORLD, code);
  std::exit(code);
}

#else  // one rank

Session::Session(int&, char**&) {}
Session::~Session() = default;
int rank() { return 0; }
int size() { return 1; }
bool built_with_mpi() { return false; }
Request::~Request() = default;
void Request::wait() { pending_ = false; }
void send_bytes(const void*, std::size_t, int, int, Request&) {
  throw std::logic_error("send_bytes: one rank has no peer");
}
void receive_bytes(void*, std::size_t, int, int, Request&) {
  throw std::logic_error("receive_bytes: one rank has no peer");
}
void allgather_bytes(void*, const std::vector<int>&) {}
void gather_bytes_to_root(void*, const std::vector<int>&) {}
long gathered_bytes() { return 0; }
long max_over_ranks(long v) { return v; }
void sum_over_ranks(double*, long) {}
std::vector<Pick> picks_over_ranks(Pick mine) { return {mine}; }
void broadcast_bytes(void*, std::size_t, int) {}
void barrier() {}
void abort(int code) { std::exit(code); }
#endif

}  // namespace ty::parallel
