/// \file atomic_file.cpp
/// \brief Write-to-temporary, fsync, rename, fsync-the-folder (see atomic_file.h).
#include "io/run/atomic_file.h"

#include <fcntl.h>
#include <fmt/format.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <stdexcept>

namespace ty {
namespace {

/// fsync of a file or a folder by name; returns errno (0 on success).
int sync_path(const std::string& path, bool folder) {
  const int fd = ::open(path.c_str(), (folder ? O_RDONLY | O_DIRECTORY : O_RDWR) | O_CLOEXEC);
  if (fd < 0) return errno;
  int err = 0;
  while (::fsync(fd) != 0) {
    if (errno == EINTR) continue;
    err = errno;
    break;
  }
  ::close(fd);
  return err;
}

std::string folder_of(const std::string& path) {
  const std::string parent = std::filesystem::path(path).parent_path().string();
  return parent.empty() ? "." : parent;
}

}  // namespace

std::string temporary_name(const std::string& path) { return path + ".tmp"; }

void discard_temporary(const std::string& tmp) {
  std::error_code ec;
  std::filesystem::remove(tmp, ec);
}

void commit_file(const std::string& tmp, const std::string& path) {
  if (const int err = sync_path(tmp, false)) {
    discard_temporary(tmp);
    throw std::runtime_error(fmt::format("cannot write '{}': {}", path, std::strerror(err)));
  }
  if (std::rename(tmp.c_str(), path.c_str()) != 0) {
    const int err = errno;
    discard_temporary(tmp);
    throw std::runtime_error(fmt::format("cannot put '{}' in place: {}", path, std::strerror(err)));
  }
  // EINVAL: a file system that cannot sync folders; the rename itself has happened.
  if (const int err = sync_path(folder_of(path), true); err != 0 && err != EINVAL)
    throw std::runtime_error(fmt::format("cannot flush the folder of '{}': {}", path, std::strerror(err)));
}

void write_atomically(const std::string& path, const std::function<void(const std::string& tmp)>& write) {
  const std::string tmp = temporary_name(path);
  try {
    write(tmp);
  } catch (...) {
    discard_temporary(tmp);
    throw;
  }
  commit_file(tmp, path);
}

void write_text_atomically(const std::string& path, const std::string& text) {
  write_atomically(path, [&](const std::string& tmp) {
    std::ofstream out(tmp);
    out << text;
    out.close();
    if (!out) throw std::runtime_error(fmt::format("cannot write '{}'", path));
  });
}

}  // namespace ty
