/// \file stop_signals.h
/// \brief Ctrl-C, SIGTERM and SIGHUP during a run: the handler only records the signal
/// (sigaction with SA_RESTART, so no system call fails half-way); the run loop sees it,
/// writes its checkpoint with these signals blocked (a second Ctrl-C cannot cut the
/// save short), and exits with 128 + the signal number, as a shell reports it. SIGXFSZ
/// (a file over `ulimit -f`) is ignored meanwhile, so it shows as a write error.
#pragma once
#include <csignal>

namespace ty {

class StopSignals {
 public:
  StopSignals();   ///< installs the handlers (first thing in a run)
  ~StopSignals();  ///< puts the previous handlers back
  StopSignals(const StopSignals&) = delete;
  StopSignals& operator=(const StopSignals&) = delete;

  /// The signal that asked to stop, or 0.
  static int received();

  /// Blocks the stop signals in this thread for its lifetime (around a checkpoint write).
  class Hold {
   public:
    Hold();
    ~Hold();

   private:
    sigset_t old_;
  };

 private:
  struct sigaction old_[3], old_xfsz_;
};

}  // namespace ty
