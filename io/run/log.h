/// \file log.h
/// \brief The run's messages: printed on the terminal (stderr) and kept in log.txt.
#pragma once
#include <fstream>
#include <string>

namespace ty {

class Log {
 public:
  void open(const std::string& path, bool append = false) {
    file_.open(path, append ? std::ios::app : std::ios::trunc);
  }
  void quiet(bool q) { quiet_ = q; }
  /// Nothing at all, errors included (the ranks after rank 0 of a run over MPI ranks).
  void silent() { silent_ = true; }
  void info(const std::string& line);
  void warn(const std::string& line) { info("warning: " + line); }
  /// An error: on the terminal even when quiet, and in the file.
  void error(const std::string& line);

 private:
  std::ofstream file_;
  bool quiet_ = false;
  bool silent_ = false;
};

}  // namespace ty
