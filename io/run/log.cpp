/// \file log.cpp
/// \brief Log lines to stderr and log.txt.
#include "io/run/log.h"

#include <iostream>

namespace ty {

void Log::info(const std::string& line) {
  if (silent_) return;
  if (!quiet_) std::cerr << line << "\n";
  if (file_) file_ << line << "\n" << std::flush;
}

void Log::error(const std::string& line) {
  if (silent_) return;
  std::cerr << "error: " << line << "\n";
  if (file_) file_ << "error: " << line << "\n" << std::flush;
}

}  // namespace ty
