/// \file resume_pair.h
/// \brief A scene run straight for `total` steps beside the same scene stopped at `at`,
/// checkpointed (io/run/checkpoint.h), loaded into a fresh simulation and run on: the resume
/// tests compare the two bit for bit (test only).
#pragma once
#include <cstring>
#include <filesystem>
#include <memory>
#include <string>

#include "io/run/checkpoint.h"
#include "solver/simulation.h"

namespace ty::test {

struct ResumePair {
  std::unique_ptr<Simulation<double>> straight, resumed;
  /// Every wave-field component of the two runs is the same, bit for bit.
  bool same_fields() const {
    for (int q = 0; q < 6; ++q)
      if (std::memcmp(straight->field(static_cast<Component>(q)), resumed->field(static_cast<Component>(q)),
                      straight->grid().size() * sizeof(double)) != 0)
        return false;
    return true;
  }
};

inline ResumePair run_straight_and_resumed(const Scene& s, const std::string& name, long at, long total) {
  const std::string yaml = "title: t";
  const std::filesystem::path path = std::filesystem::temp_directory_path() / ("ty-checkpoint-" + name + ".h5");
  ResumePair r{std::make_unique<Simulation<double>>(s, 2), std::make_unique<Simulation<double>>(s, 2)};
  for (long n = 0; n < total; ++n) r.straight->step();
  {
    Simulation<double> first(s, 2);
    for (long n = 0; n < at; ++n) first.step();
    save_checkpoint(path.string(), first, yaml);
  }
  load_checkpoint(path.string(), *r.resumed, yaml);
  for (long n = at; n < total; ++n) r.resumed->step();
  std::filesystem::remove(path);
  return r;
}

}  // namespace ty::test
