/// \file wait_policy.h
/// \brief How long an OpenMP thread spins at a barrier before it sleeps.
///
/// The OpenMP runtime's default (GNU libgomp: 300000 spin iterations, several milliseconds)
/// is tuned for a machine that runs nothing else: when two runs share two cores, a thread
/// spins out its time slice waiting for a partner that is not running, and both runs
/// collapse (20x slower each, measured). Always sleeping (OMP_WAIT_POLICY=passive) costs a
/// wake-up per barrier instead (10x slower alone on a small grid). A bounded spin of a few
/// tens of microseconds keeps the alone speed and lets a waiting thread give its core up.
/// libgomp reads its settings once, when it is loaded, so the setting is made by running
/// the program again with it in the environment (unless the user has set either variable).
#pragma once

namespace ty {

/// Spin iterations before a waiting thread sleeps (GOMP_SPINCOUNT).
inline constexpr const char* kSpinCount = "2000";

/// Called first in main: when neither OMP_WAIT_POLICY nor GOMP_SPINCOUNT is set, sets
/// GOMP_SPINCOUNT and replaces the process with a fresh copy of the same program and
/// arguments; returns only when nothing needed doing or the re-execution failed.
void bound_thread_waits(char** argv);

}  // namespace ty
