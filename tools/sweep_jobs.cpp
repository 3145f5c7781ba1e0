/// \file sweep_jobs.cpp
/// \brief Starting and waiting for the child processes of a sweep (see sweep_jobs.h).
#include "tools/sweep_jobs.h"

#include <fcntl.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <map>
#include <stdexcept>

extern char** environ;

namespace ty {
namespace {

/// Starts `program` (empty: this program) with `args`, its output appended to `log`;
/// -1 when it cannot be started.
pid_t spawn(const std::vector<std::string>& args, const std::string& log, const std::string& program = "") {
  std::vector<std::string> argv_s{program.empty() ? "terayee" : program};
  argv_s.insert(argv_s.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (auto& a : argv_s) argv.push_back(a.data());
  argv.push_back(nullptr);
  posix_spawn_file_actions_t fa;
  posix_spawn_file_actions_init(&fa);
  posix_spawn_file_actions_addopen(&fa, 0, "/dev/null", O_RDONLY, 0);
  posix_spawn_file_actions_addopen(&fa, 1, log.c_str(), O_WRONLY | O_CREAT | O_APPEND, 0644);
  posix_spawn_file_actions_adddup2(&fa, 1, 2);
  pid_t pid = -1;
  const int rc = program.empty() ? posix_spawn(&pid, "/proc/self/exe", &fa, nullptr, argv.data(), environ)
                                 : posix_spawnp(&pid, program.c_str(), &fa, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&fa);
  return rc == 0 ? pid : -1;
}

int status_of(int st) { return WIFEXITED(st) ? WEXITSTATUS(st) : WIFSIGNALED(st) ? 128 + WTERMSIG(st) : 1; }

}  // namespace

int run_program(const std::string& program, const std::vector<std::string>& args, const std::string& log) {
  const pid_t pid = spawn(args, log, program);
  if (pid < 0) return 127;
  int st = 0;
  while (waitpid(pid, &st, 0) < 0 && errno == EINTR) {
  }
  return status_of(st);
}

int run_one(const std::vector<std::string>& args, const std::string& log) { return run_program("", args, log); }

void run_jobs(std::vector<Job> jobs, int parallel, const std::function<void(int, int)>& progress) {
  std::map<pid_t, size_t> alive;
  size_t next = 0;
  int finished = 0;
  while (next < jobs.size() || !alive.empty()) {
    while (next < jobs.size() && static_cast<int>(alive.size()) < std::max(1, parallel)) {
      const pid_t pid = spawn(jobs[next].args, jobs[next].log);
      if (pid < 0) throw std::runtime_error("cannot start terayee for a sweep point");
      alive[pid] = next++;
    }
    int st = 0;
    const pid_t pid = waitpid(-1, &st, 0);
    if (pid < 0) {
      if (errno == EINTR) continue;
      break;
    }
    const auto it = alive.find(pid);
    if (it == alive.end()) continue;
    const size_t k = it->second;
    alive.erase(it);
    ++finished;
    if (jobs[k].done) jobs[k].done(status_of(st));
    if (progress) progress(finished, static_cast<int>(alive.size()));
  }
}

}  // namespace ty
