/// \file stop_signals.cpp
/// \brief The stop-signal handlers (POSIX.1-2017 sigaction, pthread_sigmask).
#include "io/run/stop_signals.h"

#include <pthread.h>

namespace ty {
namespace {

volatile std::sig_atomic_t g_signal = 0;
constexpr int kSignals[3] = {SIGINT, SIGTERM, SIGHUP};

extern "C" void on_stop_signal(int sig) {
  if (g_signal == 0) g_signal = sig;
}

sigset_t stop_set() {
  sigset_t set;
  sigemptyset(&set);
  for (int s : kSignals) sigaddset(&set, s);
  return set;
}

}  // namespace

StopSignals::StopSignals() {
  g_signal = 0;
  struct sigaction sa {};
  sa.sa_handler = on_stop_signal;
  sa.sa_mask = stop_set();  // one handler at a time
  sa.sa_flags = SA_RESTART;
  for (int k = 0; k < 3; ++k) sigaction(kSignals[k], &sa, &old_[k]);
  // A file past the size limit (ulimit -f) is a write error with a message, not a death.
  struct sigaction ignore {};
  ignore.sa_handler = SIG_IGN;
  sigaction(SIGXFSZ, &ignore, &old_xfsz_);
}

StopSignals::~StopSignals() {
  for (int k = 0; k < 3; ++k) sigaction(kSignals[k], &old_[k], nullptr);
  sigaction(SIGXFSZ, &old_xfsz_, nullptr);
}

int StopSignals::received() { return g_signal; }

StopSignals::Hold::Hold() {
  const sigset_t set = stop_set();
  pthread_sigmask(SIG_BLOCK, &set, &old_);
}

StopSignals::Hold::~Hold() { pthread_sigmask(SIG_SETMASK, &old_, nullptr); }

}  // namespace ty
