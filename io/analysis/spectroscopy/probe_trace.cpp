/// \file probe_trace.cpp
/// \brief Reading a probe's series back from a run folder (see probe_trace.h).
#include "io/analysis/spectroscopy/probe_trace.h"

#include <fmt/format.h>

#include "io/run/hdf5_file.h"
#include "io/scene/diagnostics.h"

namespace ty {

namespace {
constexpr hsize_t kMaxSamples = hsize_t{1} << 28;
}

bool has_probe_field(const std::string& run, const std::string& probe, const std::string& field) {
  const h5::File h = h5::File::open(run + "/fields.h5");
  return h.exists("/probes/" + probe + "/" + field);
}

ProbeTrace read_probe_trace(const std::string& run, const std::string& probe, const std::string& field) {
  ProbeTrace p;
  p.file = run + "/fields.h5", p.name = probe, p.field = field;
  const h5::File h = h5::File::open(p.file);
  const std::string base = "/probes/" + probe;
  if (!h.exists(base + "/time"))
    throw BadInput(fmt::format("{}: error: the run has no probe named '{}'", p.file, probe));
  if (!h.exists(base + "/" + field))
    throw BadInput(
        fmt::format("{}: error: probe '{}' did not record '{}' (add it to the probe's fields)", p.file, probe, field));
  const auto shape = h.checked_shape(base + "/time", 1, kMaxSamples);
  p.time = h.read_checked(base + "/time", shape);
  p.value = h.read_checked(base + "/" + field, shape);
  const auto at = h.read_checked(base + "/at", {2});
  p.x = at[0], p.y = at[1];
  if (p.time.size() < 2)
    throw BadInput(fmt::format("{}: error: probe '{}' holds fewer than two samples", p.file, probe));
  return p;
}

}  // namespace ty
