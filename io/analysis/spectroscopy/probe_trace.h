/// \file probe_trace.h
/// \brief One field of one probe of a finished run (/probes/NAME/FIELD of RUN/fields.h5,
/// written by io/run/run_folder): its times (the E times (k+1) dt), values (SI) and the
/// probe's position.
#pragma once
#include <string>
#include <vector>

namespace ty {

struct ProbeTrace {
  std::string file, name, field;
  std::vector<double> time, value;  ///< s; SI units of the field
  double x = 0, y = 0;              ///< the probe's position, m (the scene's coordinates)
};

/// BadInput naming the file when the run has no such probe or field, or the series do not
/// match the time axis.
ProbeTrace read_probe_trace(const std::string& run, const std::string& probe, const std::string& field);
bool has_probe_field(const std::string& run, const std::string& probe, const std::string& field);

}  // namespace ty
