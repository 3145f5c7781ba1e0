/// \file angular_spectrum.cpp
/// \brief Sums over angular spectra through a layer stack (equations in angular_spectrum.h).
#include "materials/layered/angular_spectrum.h"

#include <cmath>

#include "io/scene/units.h"
#include "materials/layered/refraction.h"

namespace ty {

using cd = std::complex<double>;

double artmann_shift(const LayerStack& s, double omega, double theta, int p) {
  const double h = 1e-5;
  const double k = omega / constants::c0 * s.n_in;
  const cd a = stack_response(s, omega, theta + h).r[p][p], b = stack_response(s, omega, theta - h).r[p][p];
  double d = std::arg(a) - std::arg(b);
  while (d > constants::pi) d -= 2 * constants::pi;
  while (d < -constants::pi) d += 2 * constants::pi;
  return -d / (2 * h) / (k * std::cos(theta));
}

double beam_shift(const LayerStack& s, double omega, double theta, int p, double w, double h) {
  const double k = omega / constants::c0 * s.n_in;
  const double qmax = std::min(0.999 * k, 5.0 / w);
  const int nq = 401;
  double num = 0, den = 0, tan_r = 0, tan_i = 0, den_i = 0;
  for (int m = 0; m < nq; ++m) {
    const double q = -qmax + 2 * qmax * m / (nq - 1);  // transverse wavenumber in the beam's frame
    const double delta = std::asin(q / k), th = theta + delta;
    if (std::abs(th) >= 0.5 * constants::pi) continue;
    // |A|^2 per unit q becomes |F|^2 per unit k_t: |A|^2 dq/dk_t = |A|^2 cos(delta) / cos(th)
    const double A2 = std::exp(-q * q * w * w / 2) * std::cos(delta) / std::cos(th);
    const double r2 = std::norm(stack_response(s, omega, th).r[p][p]);
    num += A2 * r2 * artmann_shift(s, omega, th, p);
    den += A2 * r2;
    tan_r += A2 * r2 * std::tan(th);
    tan_i += A2 * std::tan(th);
    den_i += A2;
  }
  if (den <= 0) return 0.0;
  // on a line h before the face, against the specular image (the incident spectrum carried to a
  // perfect mirror and back): the reflected beam drifts by h <tan>_r, the image by h <tan>_i
  return num / den + h * (tan_r / den - tan_i / den_i);
}

namespace {

// full width at half maximum of samples v(x) around index k (NaN if it reaches an end)
double width(const std::vector<double>& x, const std::vector<double>& v, size_t k) {
  const double half = 0.5 * v[k];
  size_t a = k, b = k;
  while (a > 0 && v[a - 1] > half) --a;
  while (b + 1 < v.size() && v[b + 1] > half) ++b;
  if (a == 0 || b + 1 == v.size()) return std::nan("");
  const double l = x[a - 1] + (half - v[a - 1]) / (v[a] - v[a - 1]) * (x[a] - x[a - 1]);
  const double r = x[b] + (half - v[b]) / (v[b + 1] - v[b]) * (x[b + 1] - x[b]);
  return r - l;
}

}  // namespace

LineImage line_source_image(const LayerStack& s, double omega, double a, double from, double to) {
  const double k0 = omega / constants::c0;
  // the plane waves on the path kx = xi - i delta sin(pi xi / K), xi in [-K, K] (units of k0):
  // weight dkx / ky times the quadrature weight, kx, ky, t(kx)
  struct Wave {
    cd weight, kx, ky, t;
  };
  const double K = 1.0 + std::log(1e12) / (k0 * a);  // beyond, exp(-k0 a |kx|) < 1e-12
  const double delta = 0.1;
  const int n = 20000;
  std::vector<Wave> waves;
  waves.reserve(n);
  for (int q = 0; q < n; ++q) {
    const double xi = -K + 2 * K * (q + 0.5) / n;
    const cd kx(xi, -delta * std::sin(constants::pi * xi / K));
    const cd dkx(1.0, -delta * constants::pi / K * std::cos(constants::pi * xi / K));
    cd ky = std::sqrt(1.0 - kx * kx);
    if (ky.imag() < 0) ky = -ky;
    waves.push_back({dkx / ky * (2 * K / n), kx, ky, stack_response_kt(s, omega, -kx).t[0][0]});
  }
  auto field = [&](double x, double dist) {  // Ez at lateral offset x, distance dist behind the face
    cd e = 0;
    for (const Wave& w : waves) e += w.weight * w.t * std::exp(cd(0, 1) * k0 * (w.ky * (a + dist) + w.kx * x));
    return e;
  };
  LineImage img;
  const int ns = 400;
  for (int q = 0; q <= ns; ++q) {
    img.s.push_back(from + (to - from) * q / ns);
    img.intensity.push_back(std::norm(field(0, img.s.back())));
  }
  size_t best = 0;
  for (size_t q = 1; q < img.s.size(); ++q)
    if (img.intensity[q] > img.intensity[best]) best = q;
  img.peak = img.s[best];
  if (best > 0 && best + 1 < img.s.size()) {  // parabola through the neighbours
    const double l = img.intensity[best - 1], c = img.intensity[best], r = img.intensity[best + 1];
    const double d = l - 2 * c + r;
    if (d < 0) img.peak += 0.5 * (l - r) / d * (img.s[1] - img.s[0]);
  }
  img.fwhm_along = width(img.s, img.intensity, best);
  std::vector<double> xs, across;
  const double span = 4 * constants::c0 / (omega / (2 * constants::pi));  // four wavelengths either side
  for (int q = -300; q <= 300; ++q) {
    xs.push_back(span * q / 300);
    across.push_back(std::norm(field(xs.back(), img.peak)));
  }
  img.fwhm_across = width(xs, across, 300);
  if (s.layers.size() == 1) {  // paraxial: b = d Re(kn''(0)) - a, kn in units of k0
    const Layer& L = s.layers[0];
    const double h = 1e-3;
    auto kn = [&](double kt) { return ez_refraction(L.eps(2, 2), L.mu, s.normal, kt).kn; };
    const cd curv = (kn(h) - 2.0 * kn(0) + kn(-h)) / (h * h);
    img.paraxial = L.thickness * curv.real() - a;
  }
  return img;
}

}  // namespace ty
