/// \file kill_point.h
/// \brief Places where the kill tests (tools/kill-test.sh, tests/tools/test_run_safety.cpp)
/// make a run die by SIGKILL, chosen with the environment variable TERAYEE_KILL_AT:
///   step:N         after step N
///   term:N         after step N, SIGTERM instead (the run stops as when sent one: a
///                  checkpoint; over MPI ranks give it to one rank, tools/mpi-check.sh)
///   checkpoint:N   inside the N-th checkpoint write (the temporary file written, not renamed)
///   result         with fields.h5.tmp complete, before it is renamed
///   renamed        with fields.h5 in place, before the checkpoint is removed
/// Unset (every real run), each point is one comparison of a cached value.
#pragma once

namespace ty {

enum class KillPoint { step, checkpoint, result, renamed };

/// Dies by SIGKILL (or is sent SIGTERM) when TERAYEE_KILL_AT names this point (and count).
void kill_point(KillPoint where, long n = 0);

}  // namespace ty
