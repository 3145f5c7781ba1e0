/// \file shift.cpp
/// \brief The lateral shift of a reflected beam against its exact specular image (see shift.h).
#include "io/analysis/shift.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <unsupported/Eigen/FFT>

#include "solver/sources/incident.h"

namespace ty {

using cd = std::complex<double>;

BeamMoments beam_moments(const std::vector<double>& s, const std::vector<double>& I) {
  double m0 = 0, m1 = 0, m2 = 0;
  for (size_t q = 0; q < s.size(); ++q) m0 += I[q], m1 += I[q] * s[q], m2 += I[q] * s[q] * s[q];
  BeamMoments b;
  b.centroid = m1 / m0;
  b.width = 2 * std::sqrt(std::max(0.0, m2 / m0 - b.centroid * b.centroid));
  return b;
}

namespace {

/// The beams on the line as sums of the grid's plane waves: each recorded E component's
/// spectrum along the line (zero-padded to twice its length and more, so no image wraps
/// round), and each plane wave's normal wavenumber.
struct PlaneWaves {
  size_t n = 0;                           // samples on the line
  std::vector<std::vector<cd>> inc, ref;  // spectra of the incident and reflected components
  std::vector<cd> kn;                     // normal wavenumber per bin (NaN beyond the grid's band)
  mutable Eigen::FFT<double> fft;

  PlaneWaves(const LineCut& a, const LineCut& r, const ShiftGeometry& g) : n(a.s.size()) {
    size_t N = 1;
    while (N < 2 * n) N *= 2;
    const double ds = n > 1 ? std::abs(a.s[1] - a.s[0]) : 1.0;
    kn.resize(N);
    for (size_t m = 0; m < N; ++m) {
      const double kt = 2 * M_PI * (m < N / 2 ? double(m) : double(m) - double(N)) / (N * ds);
      kn[m] = yee_normal_wavenumber(g.omega, kt, g.index, g.d_t, g.d_n, g.dt);
    }
    for (int c = 0; c < 3; ++c) {
      if (r.E[c].empty()) continue;
      std::vector<cd> xi(N, 0.0), xr(N, 0.0);
      for (size_t q = 0; q < n; ++q) xi[q] = r.E[c][q], xr[q] = a.E[c][q] - r.E[c][q];
      inc.emplace_back(), ref.emplace_back();
      fft.fwd(inc.back(), xi);
      fft.fwd(ref.back(), xr);
    }
  }

  /// |E|^2 on the line of the beams `spectra`, each plane wave times factor(kn) (0 where
  /// the grid carries no wave).
  template <class F>
  std::vector<double> intensity(const std::vector<std::vector<cd>>& spectra, F factor) const {
    std::vector<double> I(n, 0.0);
    std::vector<cd> x, y;
    for (const auto& sp : spectra) {
      x = sp;
      for (size_t m = 0; m < x.size(); ++m) x[m] *= std::isnan(kn[m].real()) ? cd(0.0) : factor(kn[m]);
      fft.inv(y, x);
      for (size_t q = 0; q < n; ++q) I[q] += std::norm(y[q]);
    }
    return I;
  }
};

}  // namespace

LateralShift lateral_shift(const LineCut& a, const LineCut& r, bool line_is_y, const ShiftGeometry& g) {
  const PlaneWaves w(a, r, g);
  const cd i(0, 1);
  LateralShift out;
  out.s = a.s;
  out.line_distance = std::abs(g.face - a.at);
  out.incident_profile = w.intensity(w.inc, [](cd) { return cd(1.0); });
  out.reflected_profile = w.intensity(w.ref, [](cd) { return cd(1.0); });
  out.incident = beam_moments(a.s, out.incident_profile);
  out.reflected = beam_moments(a.s, out.reflected_profile);
  // t = z x n: for a line y = const (normal y) t = -x; for x = const (normal x) t = +y
  const double t_sign = line_is_y ? -1.0 : 1.0;
  auto specular = [&](double h) {  // the incident beam's image in a perfect mirror h beyond the line
    return w.intensity(w.inc, [&](cd k) { return std::exp(2.0 * i * k * h); });
  };
  auto face_shift = [&](double h) {  // both beams carried to the face h beyond the line
    const auto fi = w.intensity(w.inc, [&](cd k) { return std::exp(i * k * h); });
    const auto fr = w.intensity(w.ref, [&](cd k) { return k.imag() > 0 ? cd(0.0) : std::exp(-i * k * h); });
    return t_sign * (beam_moments(a.s, fr).centroid - beam_moments(a.s, fi).centroid);
  };
  const double h = out.line_distance, dh = g.half_cell;
  const double ds = a.s.size() > 1 ? std::abs(a.s[1] - a.s[0]) : 0.0;
  out.specular_profile = specular(h);
  out.specular = beam_moments(a.s, out.specular_profile);
  out.shift = t_sign * (out.reflected.centroid - out.specular.centroid);
  const double c_far = beam_moments(a.s, specular(h + dh)).centroid;
  const double c_near = beam_moments(a.s, specular(std::max(0.0, h - dh))).centroid;
  out.uncertainty = 0.5 * std::abs(c_far - c_near) + 0.1 * ds;
  out.face_shift = face_shift(h);
  out.face_uncertainty = 0.5 * std::abs(face_shift(h + dh) - face_shift(std::max(0.0, h - dh))) + 0.1 * ds;
  return out;
}

}  // namespace ty
