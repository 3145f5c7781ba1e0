/// \file thread_count.h
/// \brief How many threads a run takes when the scene and the command line leave it open:
/// no more than the cores this process may use (its affinity mask and its cgroup's CPU
/// quota), and no more than its work can keep busy between two synchronisations.
///
/// A thread that waits at a barrier either spins (and steals the core from a thread of
/// another process on a shared machine) or sleeps (and pays a wake-up every step). Both
/// costs are per step, so a small grid gains nothing from a second thread and loses a
/// great deal when the machine is shared: it gets one thread. Measured figures are in
/// docs/performance.md.
#pragma once

namespace ty {

/// Cores this process may run on: the affinity mask, capped by a cgroup v2 `cpu.max` or v1
/// `cpu.cfs_quota_us` quota (rounded up), capped by OMP_NUM_THREADS where it is set.
int usable_cores();

/// Vacuum-cell updates per step below which one more thread does not pay for its waits.
inline constexpr double kCellsPerThread = 16384;

/// Threads for `work` vacuum-equivalent cell updates per step on at most `cores` cores.
int threads_for_work(double work, int cores);

}  // namespace ty
