/// \file thread_count.cpp
/// \brief The default thread count (see thread_count.h).
#include "solver/threads/thread_count.h"

#include <omp.h>
#include <sched.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <string>

namespace ty {
namespace {

/// Cores granted by a CPU quota, rounded up; 0 when there is none or it cannot be read.
int cgroup_quota_cores() {
  {  // cgroup v2: "max 100000" (no quota) or "QUOTA PERIOD" in microseconds
    std::ifstream in("/sys/fs/cgroup/cpu.max");
    std::string quota;
    double period = 0;
    if (in >> quota >> period && quota != "max" && period > 0) {
      const double q = std::atof(quota.c_str());
      if (q > 0) return std::max(1, static_cast<int>(std::ceil(q / period)));
    }
  }
  std::ifstream q1("/sys/fs/cgroup/cpu/cpu.cfs_quota_us"), p1("/sys/fs/cgroup/cpu/cpu.cfs_period_us");
  double q = 0, p = 0;
  if (q1 >> q && p1 >> p && q > 0 && p > 0) return std::max(1, static_cast<int>(std::ceil(q / p)));
  return 0;
}

}  // namespace

int usable_cores() {
  int cores = 0;
  cpu_set_t set;
  CPU_ZERO(&set);
  if (sched_getaffinity(0, sizeof(set), &set) == 0) cores = CPU_COUNT(&set);
  if (cores <= 0) cores = omp_get_num_procs();
  if (const int q = cgroup_quota_cores(); q > 0) cores = std::min(cores, q);
  if (std::getenv("OMP_NUM_THREADS")) cores = std::min(cores, omp_get_max_threads());
  return std::max(1, cores);
}

int threads_for_work(double work, int cores) {
  const double fit = std::floor(work / kCellsPerThread);
  return std::clamp(static_cast<int>(std::min<double>(fit, cores)), 1, std::max(1, cores));
}

}  // namespace ty
