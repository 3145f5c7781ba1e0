/// \file capture.h
/// \brief The standard output of a shell command, for tests of the terayee program's
/// printed results (popen; the command's exit status is not checked here).
#pragma once
#include <cstdio>
#include <memory>
#include <string>

namespace ty::test {

inline std::string capture(const std::string& cmd) {
  std::string out;
  std::unique_ptr<FILE, int (*)(FILE*)> p(popen(cmd.c_str(), "r"), pclose);
  char buf[4096];
  for (size_t n; p && (n = fread(buf, 1, sizeof buf, p.get())) > 0;) out.append(buf, n);
  return out;
}

}  // namespace ty::test
