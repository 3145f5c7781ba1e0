/// \file movie_writer.cpp
/// \brief ffmpeg as a child process reading raw frames on its standard input:
///   ffmpeg -f rawvideo -pix_fmt bgra -s WxH -r FPS -i - -c:v libx264 -pix_fmt yuv420p
///          -crf 18 -preset medium -movflags +faststart -f mp4 file:/ABSOLUTE/OUT.tmp
/// started with posix_spawnp (no shell). The output is an absolute path behind ffmpeg's
/// `file:` protocol, so a name starting with '-' is not read as an option and one like
/// `rtmp://x` is not a network address. The child gets only the pipe and the standard
/// streams (every other inherited descriptor is closed). SIGPIPE is blocked around each
/// write (not ignored process-wide): a failed ffmpeg shows as EPIPE.
#include "io/pictures/movie_writer.h"

#include "io/run/atomic_file.h"

#include <fcntl.h>
#include <fmt/format.h>
#include <signal.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <pthread.h>
#include <ctime>
#include <stdexcept>
#include <vector>

extern char** environ;

namespace ty {
namespace {

/// write(2) with SIGPIPE blocked in this thread; a SIGPIPE it raised is consumed
/// (sigtimedwait with a zero timeout), so a closed pipe gives EPIPE and nothing else,
/// and the process's signal dispositions are left alone.
ssize_t write_no_sigpipe(int fd, const void* p, size_t n) {
  sigset_t pipe_set, old;
  sigemptyset(&pipe_set);
  sigaddset(&pipe_set, SIGPIPE);
  sigset_t pending;
  sigpending(&pending);
  const bool was_pending = sigismember(&pending, SIGPIPE);
  pthread_sigmask(SIG_BLOCK, &pipe_set, &old);
  const ssize_t r = write(fd, p, n);
  const int err = errno;
  if (r < 0 && err == EPIPE && !was_pending) {
    const timespec zero{0, 0};
    while (sigtimedwait(&pipe_set, nullptr, &zero) < 0 && errno == EINTR) {
    }
  }
  pthread_sigmask(SIG_SETMASK, &old, nullptr);
  errno = err;
  return r;
}

}  // namespace

MovieWriter::MovieWriter(const std::string& path, int width, int height, double fps)
    : path_(path), tmp_(temporary_name(path)), width_(width), height_(height) {
  if (width % 2 || height % 2) throw std::runtime_error("a yuv420p movie needs even width and height");
  if (!(fps > 0)) throw std::runtime_error("the frame rate must be positive");
  int fd[2];
  if (pipe(fd) != 0) throw std::runtime_error(fmt::format("cannot make a pipe: {}", std::strerror(errno)));
  fcntl(fd[1], F_SETFD, FD_CLOEXEC);
  const std::string size = fmt::format("{}x{}", width, height), rate = fmt::format("{:g}", fps);
  std::vector<std::string> args = {"ffmpeg", "-nostdin", "-hide_banner", "-loglevel", "error", "-y",
                                   "-f", "rawvideo", "-pix_fmt", "bgra", "-s", size, "-r", rate, "-i", "pipe:0",
                                   "-c:v", "libx264", "-pix_fmt", "yuv420p", "-crf", "18", "-preset", "medium",
                                   "-movflags", "+faststart", "-f", "mp4",
                                   "file:" + std::filesystem::absolute(tmp_).string()};
  std::vector<char*> argv;
  for (auto& a : args) argv.push_back(a.data());
  argv.push_back(nullptr);
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_adddup2(&actions, fd[0], 0);
  posix_spawn_file_actions_addclose(&actions, fd[0]);
  posix_spawn_file_actions_addclosefrom_np(&actions, 3);  // nothing else of ours leaks into ffmpeg
  const int rc = posix_spawnp(&pid_, "ffmpeg", &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  close(fd[0]);
  if (rc != 0) {
    close(fd[1]);
    pid_ = -1;
    throw std::runtime_error(fmt::format("cannot start ffmpeg ({}); tools/setup.sh installs it", std::strerror(rc)));
  }
  pipe_ = fd[1];
}

MovieWriter::~MovieWriter() {
  if (pid_ > 0) abandon();
}

void MovieWriter::add(const uint8_t* bgra, int stride) {
  if (pipe_ < 0) throw std::runtime_error("the movie is closed");
  for (int r = 0; r < height_; ++r) {
    const uint8_t* p = bgra + static_cast<size_t>(r) * stride;
    size_t left = static_cast<size_t>(width_) * 4;
    while (left > 0) {
      const ssize_t n = write_no_sigpipe(pipe_, p, left);
      if (n < 0 && errno == EINTR) continue;
      if (n <= 0) {
        abandon();
        throw std::runtime_error(fmt::format("ffmpeg stopped taking frames for '{}'", path_));
      }
      p += n, left -= static_cast<size_t>(n);
    }
  }
  ++frames_;
}

void MovieWriter::finish() {
  close(pipe_);
  pipe_ = -1;
  int status = 0;
  waitpid(pid_, &status, 0);
  pid_ = -1;
  if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) {
    discard_temporary(tmp_);
    throw std::runtime_error(fmt::format("ffmpeg failed making '{}'", path_));
  }
  commit_file(tmp_, path_);
}

void MovieWriter::abandon() {
  if (pipe_ >= 0) close(pipe_), pipe_ = -1;
  if (pid_ > 0) {
    kill(pid_, SIGTERM);
    int status = 0;
    waitpid(pid_, &status, 0);
    pid_ = -1;
  }
  discard_temporary(tmp_);
}

}  // namespace ty
