/// \file sweep_jobs.h
/// \brief Child processes of a sweep: `terayee` itself started with given arguments
/// (posix_spawn of /proc/self/exe), at most N at a time, each waited for.
#pragma once
#include <functional>
#include <string>
#include <vector>

namespace ty {

struct Job {
  std::vector<std::string> args;  ///< arguments after the program name
  std::string log;                ///< file that takes the child's stdout and stderr
  std::function<void(int status)> done;  ///< called with the exit status (128+signal when killed)
};

/// Runs `jobs` with at most `parallel` children alive at once, in order; `progress` is
/// called after each one ends with the numbers finished and running.
void run_jobs(std::vector<Job> jobs, int parallel, const std::function<void(int finished, int running)>& progress);

/// Runs one terayee child and returns its exit status.
int run_one(const std::vector<std::string>& args, const std::string& log);

/// Runs another program found on the PATH (e.g. sbatch) and returns its exit status
/// (127 when it cannot be started).
int run_program(const std::string& program, const std::vector<std::string>& args, const std::string& log);

}  // namespace ty
