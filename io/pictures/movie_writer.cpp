/// \file movie_writer.cpp
/// \brief ffmpeg as a child process reading raw frames on its standard input:
///   ffmpeg -f rawvideo -pix_fmt bgra -s WxH -r FPS -i - -c:v libx264 -pix_fmt yuv420p
///          -crf 18 -preset medium -movflags +faststart -f mp4 OUT
/// started with posix_spawnp (no shell, so any file name is safe).
#include "io/pictures/movie_writer.h"

#include <fcntl.h>
#include <fmt/format.h>
#include <signal.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <stdexcept>
#include <vector>

extern char** environ;

namespace ty {

MovieWriter::MovieWriter(const std::string& path, int width, int height, double fps)
    : path_(path), tmp_(path + ".partial"), width_(width), height_(height) {
  if (width % 2 || height % 2) throw std::runtime_error("a yuv420p movie needs even width and height");
  if (!(fps > 0)) throw std::runtime_error("the frame rate must be positive");
  int fd[2];
  if (pipe(fd) != 0) throw std::runtime_error(fmt::format("cannot make a pipe: {}", std::strerror(errno)));
  fcntl(fd[1], F_SETFD, FD_CLOEXEC);
  const std::string size = fmt::format("{}x{}", width, height), rate = fmt::format("{:g}", fps);
  std::vector<std::string> args = {"ffmpeg", "-nostdin", "-hide_banner", "-loglevel", "error", "-y",
                                   "-f", "rawvideo", "-pix_fmt", "bgra", "-s", size, "-r", rate, "-i", "pipe:0",
                                   "-c:v", "libx264", "-pix_fmt", "yuv420p", "-crf", "18", "-preset", "medium",
                                   "-movflags", "+faststart", "-f", "mp4", tmp_};
  std::vector<char*> argv;
  for (auto& a : args) argv.push_back(a.data());
  argv.push_back(nullptr);
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_adddup2(&actions, fd[0], 0);
  posix_spawn_file_actions_addclose(&actions, fd[0]);
  const int rc = posix_spawnp(&pid_, "ffmpeg", &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  close(fd[0]);
  if (rc != 0) {
    close(fd[1]);
    pid_ = -1;
    throw std::runtime_error(fmt::format("cannot start ffmpeg ({}); tools/setup.sh installs it", std::strerror(rc)));
  }
  pipe_ = fd[1];
  signal(SIGPIPE, SIG_IGN);  // a failed ffmpeg shows as a write error, not a silent exit
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
      const ssize_t n = write(pipe_, p, left);
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
    std::error_code ec;
    std::filesystem::remove(tmp_, ec);
    throw std::runtime_error(fmt::format("ffmpeg failed making '{}'", path_));
  }
  std::filesystem::rename(tmp_, path_);
}

void MovieWriter::abandon() {
  if (pipe_ >= 0) close(pipe_), pipe_ = -1;
  if (pid_ > 0) {
    kill(pid_, SIGTERM);
    int status = 0;
    waitpid(pid_, &status, 0);
    pid_ = -1;
  }
  std::error_code ec;
  std::filesystem::remove(tmp_, ec);
}

}  // namespace ty
