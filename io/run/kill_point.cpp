/// \file kill_point.cpp
/// \brief TERAYEE_KILL_AT, read once (see kill_point.h).
#include "io/run/kill_point.h"

#include <csignal>
#include <cstdlib>
#include <cstring>

namespace ty {
namespace {

struct Target {
  bool armed = false;
  KillPoint where = KillPoint::step;
  long n = 0;
  int sig = SIGKILL;
};

Target parse() {
  Target t;
  const char* v = std::getenv("TERAYEE_KILL_AT");
  if (!v || !*v) return t;
  const struct {
    const char* name;
    KillPoint where;
    int sig;
  } names[] = {{"step:", KillPoint::step, SIGKILL},
               {"term:", KillPoint::step, SIGTERM},
               {"checkpoint:", KillPoint::checkpoint, SIGKILL},
               {"result", KillPoint::result, SIGKILL},
               {"renamed", KillPoint::renamed, SIGKILL}};
  for (const auto& p : names)
    if (std::strncmp(v, p.name, std::strlen(p.name)) == 0) {
      t.armed = true;
      t.where = p.where;
      t.sig = p.sig;
      t.n = std::atol(v + std::strlen(p.name));
    }
  return t;
}

}  // namespace

void kill_point(KillPoint where, long n) {
  static const Target target = parse();
  if (target.armed && target.where == where && target.n == n) std::raise(target.sig);
}

}  // namespace ty
