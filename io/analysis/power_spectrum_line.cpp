/// \file power_spectrum_line.cpp
/// \brief Reading a run's power-spectrum lines and the power through them (see
/// power_spectrum_line.h).
#include "io/analysis/power_spectrum_line.h"

#include <fmt/format.h>

#include <cmath>

#include "io/run/hdf5_file.h"
#include "io/scene/diagnostics.h"

namespace ty {

/// The most values a dataset of a line may hold (a line of 10^4 points at 10^4 frequencies
/// and its six components are 6e8): a damaged file cannot make a reader allocate more.
constexpr hsize_t kMaxValues = hsize_t(1) << 31;

PowerSpectrumLine read_power_spectrum_line(const std::string& run, const std::string& name) {
  const std::string file = run + "/fields.h5";
  const h5::File h = h5::File::open(file);
  const std::string base = "/power-spectra/" + name;
  if (!h.exists(base + "/frequency"))
    throw BadInput(fmt::format("{}: error: the run has no power-spectrum line named '{}'", file, name));
  PowerSpectrumLine d;
  d.file = file, d.name = name;
  // read back from disk: every shape checked before it is read, the fields against the
  // frequencies and points (the power sums index them by both), every value finite
  const hsize_t nf = h.checked_shape(base + "/frequency", 1, kMaxValues)[0];
  const hsize_t np = h.checked_shape(base + "/weights", 1, kMaxValues)[0];
  if (nf == 0 || np == 0 || nf * np > kMaxValues / 6)
    throw BadInput(fmt::format("{}: error: {}: {} frequencies x {} points is no power-spectrum line", file, base, nf, np));
  d.freq = h.read_checked(base + "/frequency", {nf});
  d.weight = h.read_checked(base + "/weights", {np});
  d.normal = h.read_checked(base + "/normal", {2});
  d.re = h.read_checked(base + "/fields/real", {nf, np, 6});
  d.im = h.read_checked(base + "/fields/imag", {nf, np, 6});
  for (const auto* v : {&d.freq, &d.weight, &d.normal, &d.re, &d.im})
    for (double x : *v)
      if (!std::isfinite(x)) throw BadInput(fmt::format("{}: error: {}: a value is not finite", file, base));
  d.points = np;
  return d;
}

bool has_power_spectrum_line(const std::string& run, const std::string& name) {
  const h5::File h = h5::File::open(run + "/fields.h5");
  return h.exists("/power-spectra/" + name + "/frequency");
}

int power_spectrum_normal_axis(const std::string& run) {
  const h5::File h = h5::File::open(run + "/fields.h5");
  int axis = 0;
  if (h.exists("/power-spectra"))
    for (const auto& name : h.members("/power-spectra")) {
      const auto n = h.read_checked("/power-spectra/" + name + "/normal", {2});
      if (n.size() == 2 && std::abs(n[1]) > std::abs(n[0])) axis = 1;
    }
  return axis;
}

std::vector<double> line_power(const PowerSpectrumLine& a, const PowerSpectrumLine* minus) {
  std::vector<double> P(a.freq.size(), 0.0);
  for (size_t f = 0; f < a.freq.size(); ++f)
    for (size_t p = 0; p < a.points; ++p) {
      std::complex<double> E[3], H[3];
      for (int c = 0; c < 3; ++c) {
        E[c] = a.at(f, p, c) - (minus ? minus->at(f, p, c) : 0.0);
        H[c] = a.at(f, p, c + 3) - (minus ? minus->at(f, p, c + 3) : 0.0);
      }
      const double sx = (E[1] * std::conj(H[2]) - E[2] * std::conj(H[1])).real();
      const double sy = (E[2] * std::conj(H[0]) - E[0] * std::conj(H[2])).real();
      P[f] += a.weight[p] * 0.5 * (sx * a.normal[0] + sy * a.normal[1]);
    }
  return P;
}

}  // namespace ty
