/// \file wait_policy.cpp
/// \brief Bounded spinning of waiting OpenMP threads (see wait_policy.h).
#include "solver/threads/wait_policy.h"

#include <unistd.h>

#include <cstdlib>

namespace ty {

void bound_thread_waits(char** argv) {
  if (std::getenv("OMP_WAIT_POLICY") || std::getenv("GOMP_SPINCOUNT")) return;
  if (setenv("GOMP_SPINCOUNT", kSpinCount, 1) != 0) return;
  execv("/proc/self/exe", argv);  // only returns on failure: then run on with the default
  unsetenv("GOMP_SPINCOUNT");
}

}  // namespace ty
