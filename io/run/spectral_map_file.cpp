/// \file spectral_map_file.cpp
/// \brief Reading a run's spectral maps (layout: /spectral-maps/NAME/{x, y, frequency} and
/// /spectral-maps/NAME/FIELD/{real, imag} [frequency][y][x], scene-format.md).
#include "io/run/spectral_map_file.h"

#include <fmt/format.h>

#include <cmath>

#include "io/scene/diagnostics.h"

namespace ty {
namespace {
constexpr hsize_t kMaxAxis = hsize_t(1) << 24;    // points along one axis
constexpr hsize_t kMaxValues = hsize_t(1) << 34;  // values in one dataset (128 GiB of doubles)
}  // namespace

SpectralMapFile::SpectralMapFile(const std::string& run, const std::string& name)
    : h_(h5::File::open(run + "/fields.h5")), file_(run + "/fields.h5"), name_(name), base_("/spectral-maps/" + name) {
  if (!h_.exists(base_ + "/frequency"))
    throw BadInput(fmt::format("{}: error: the run has no spectral map named '{}'", file_, name));
  // A run folder from disk is input: every shape is checked before it is read.
  const auto len = [&](const std::string& d) { return h_.checked_shape(base_ + d, 1, kMaxAxis)[0]; };
  x_ = h_.read_checked(base_ + "/x", {len("/x")});
  y_ = h_.read_checked(base_ + "/y", {len("/y")});
  f_ = h_.read_checked(base_ + "/frequency", {len("/frequency")});
}

size_t SpectralMapFile::frequency_index(double f) const {
  if (f <= 0 || f_.empty()) return 0;
  size_t k = 0;
  for (size_t q = 0; q < f_.size(); ++q)
    if (std::abs(f_[q] - f) < std::abs(f_[k] - f)) k = q;
  if (std::abs(f_[k] / f - 1) > 1e-6)
    throw BadInput(fmt::format("{}: error: the map '{}' has no frequency {:.9g} GHz (it has {:.9g} GHz{})", file_,
                               name_, f / 1e9, f_[0] / 1e9, f_.size() > 1 ? " and others" : ""));
  return k;
}

bool SpectralMapFile::has(const std::string& field) const { return h_.exists(base_ + "/" + field + "/real"); }

std::vector<std::complex<double>> SpectralMapFile::field(const std::string& field, size_t k) const {
  if (!has(field)) throw BadInput(fmt::format("{}: error: the map '{}' holds no '{}'", file_, name_, field));
  // real and imag must both be [frequency][y][x] of this map's axes
  const std::vector<hsize_t> shape{f_.size(), y_.size(), x_.size()};
  for (const char* part : {"/real", "/imag"}) {
    const std::string d = base_ + "/" + field + part;
    if (h_.checked_shape(d, 3, kMaxValues) != shape)
      throw BadInput(fmt::format("{}: error: {}: its shape is not [{}][{}][{}] (frequency, y, x of the map)", file_, d,
                                 f_.size(), y_.size(), x_.size()));
  }
  if (k >= f_.size()) throw BadInput(fmt::format("{}: error: the map '{}' has no frequency {}", file_, name_, k));
  std::vector<double> re, im;
  h_.read_frame(base_ + "/" + field + "/real", k, re);
  h_.read_frame(base_ + "/" + field + "/imag", k, im);
  std::vector<std::complex<double>> out(re.size());
  for (size_t p = 0; p < re.size(); ++p) out[p] = {re[p], im[p]};
  return out;
}

std::string SpectralMapFile::units(const std::string& field) const {
  return h_.read_attribute(base_ + "/" + field + "/real", "units");
}

std::vector<std::string> SpectralMapFile::electric() const {
  std::vector<std::string> out;
  for (const char* c : {"Ex", "Ey", "Ez"})
    if (has(c)) out.push_back(c);
  return out;
}

std::vector<double> SpectralMapFile::intensity(size_t k) const {
  const auto parts = electric();
  if (parts.empty()) throw BadInput(fmt::format("{}: error: the map '{}' holds no E component", file_, name_));
  std::vector<double> I(x_.size() * y_.size(), 0.0);
  for (const auto& c : parts) {
    const auto E = field(c, k);
    for (size_t p = 0; p < I.size(); ++p) I[p] += std::norm(E[p]);
  }
  return I;
}

}  // namespace ty
