/// \file medium_command.cpp
/// \brief `terayee medium SCENE --medium NAME`: the linear-response properties of one
/// medium of a scene under the scene's bias, over a frequency band, at an angle of
/// incidence from vacuum (or the scene's chosen incidence index): the permeability tensor,
/// the Ez wave's effective permeability mu_V and its propagation character (the iso-frequency
/// curve k_t^2/mu_nn' + k_n^2/mu_tt' = eps k0^2 is an ellipse, a hyperbola, or has no real
/// branch), the power-flow refraction angle, reflection (co- and cross-polarized) and
/// transmission from the 4x4 transfer matrix for both signs of the angle (half-space, or a
/// slab with --thickness), the stationary-phase lateral shift D = -d(phi)/dk_t (Artmann,
/// Ann. Phys. 437, 87 (1948)) and, with --waist, the shift of that Gaussian beam from its
/// angular spectrum, D = -sum A^2 |r|^2 dphi/dk_t / sum A^2 |r|^2 (the centroid of the
/// reflected beam), which stays finite where the stationary phase fails.
#include <fmt/format.h>

#include <fstream>
#include <iostream>

#include "io/scene_reader.h"
#include "io/units.h"
#include "materials/transfer_matrix.h"
#include "tools/commands.h"

namespace ty {
namespace {

using cd = std::complex<double>;

struct Setup {
  Mat3c eps = Mat3c::Identity();
  MagnetModel model;
  MagneticState state;
  bool magnetic = false;
  double thickness = 0;
  int normal = 1;
  double n_in = 1;
};

Mat3c mu_at(const Setup& s, double f) {
  if (!s.magnetic) return Mat3c::Identity();
  return Mat3c::Identity() + susceptibility(s.model, s.state, 2 * constants::pi * f);
}

StackResponse respond(const Setup& s, double f, double theta) {
  LayerStack st;
  st.n_in = s.n_in;
  st.normal = s.normal;
  if (s.thickness > 0) st.layers = {{s.eps, mu_at(s, f), s.thickness}};
  else st.eps_out = s.eps, st.mu_out = mu_at(s, f);
  return stack_response(st, 2 * constants::pi * f, theta);
}

double phase(cd z) { return std::arg(z); }

/// -dphi/dk_t of the co-polarized reflection of polarization p at theta (m).
double artmann(const Setup& s, double f, double theta, int p) {
  const double h = 1e-5;
  const double k = 2 * constants::pi * f / constants::c0 * s.n_in;
  const cd a = respond(s, f, theta + h).r[p][p], b = respond(s, f, theta - h).r[p][p];
  double d = phase(a) - phase(b);
  while (d > constants::pi) d -= 2 * constants::pi;
  while (d < -constants::pi) d += 2 * constants::pi;
  return -d / (2 * h) / (k * std::cos(theta));
}

/// Lateral shift of a Gaussian beam of waist w: the centroid of its reflected angular spectrum.
double beam_shift(const Setup& s, double f, double theta, int p, double w) {
  const double k = 2 * constants::pi * f / constants::c0 * s.n_in;
  const double qmax = 4.0 / w;
  const int nq = 201;
  double num = 0, den = 0;
  for (int m = 0; m < nq; ++m) {
    const double q = -qmax + 2 * qmax * m / (nq - 1);  // tangential wavenumber offset
    const double st = std::sin(theta) + q / k;
    if (std::abs(st) >= 1) continue;
    const double th = std::asin(st);
    const double A2 = std::exp(-q * q * w * w / 2);
    const cd r = respond(s, f, th).r[p][p];
    const double dphi = artmann(s, f, th, p);  // -dphi/dk_t at this component
    num += A2 * std::norm(r) * dphi;
    den += A2 * std::norm(r);
  }
  return den > 0 ? num / den : 0.0;
}

}  // namespace

int medium_command(const MediumOptions& o) {
  const Scene scene = read_scene(o.scene, o.sets);
  int k = -1;
  for (size_t q = 0; q < scene.media.size(); ++q)
    if (scene.media[q].name == o.medium) k = static_cast<int>(q);
  if (k < 0) throw BadInput(fmt::format("{}: error: the scene has no medium named '{}'", o.scene, o.medium));
  const Medium& med = scene.media[k];
  if (med.perfect_conductor) throw BadInput(fmt::format("{}: error: '{}' is a perfect conductor", o.scene, o.medium));
  Setup s;
  for (int c = 0; c < 3; ++c) s.eps(c, c) = cd(med.permittivity[c], 0);
  if (med.conductivity > 0)
    for (int c = 0; c < 3; ++c) s.eps(c, c) += cd(0, 1) * med.conductivity / (constants::eps0 * 2 * constants::pi * o.from);
  if (med.magnet) {
    s.magnetic = true;
    s.model = MagnetModel(*med.magnet, scene.bias);
    s.state = find_ground_states(s.model).ground;
  }
  s.thickness = o.thickness;
  s.normal = o.normal == "x" ? 0 : 1;
  s.n_in = o.incidence_index;
  const int nn = s.normal, nt = 1 - s.normal;  // normal and in-plane tangential axes
  const double th = o.angle;
  std::ofstream csv;
  if (!o.csv.empty()) {
    csv.open(o.csv);
    csv << "frequency_Hz,mu_xx_re,mu_xx_im,mu_yy_re,mu_yy_im,mu_zz_re,mu_zz_im,mu_xy_re,mu_xy_im,muV_re,muV_im,"
           "character,refraction_deg,r_plus_abs,r_plus_phase,r_minus_abs,r_minus_phase,cross_plus,T_plus,T_minus,"
           "artmann_plus_m,artmann_minus_m,beam_plus_m,beam_minus_m\n";
  }
  std::cout << fmt::format("medium '{}' under the bias [{}, {}, {}] T, interface normal {}, angle {:+.3f} deg{}\n",
                           med.name, scene.bias[0], scene.bias[1], scene.bias[2], o.normal, th * 180 / constants::pi,
                           o.thickness > 0 ? fmt::format(", slab {:.4g} um", o.thickness * 1e6) : ", half-space");
  std::cout << fmt::format("{:>11s} {:>9s} {:>9s} {:>9s} {:>10s} {:>10s} {:>11s} {:>8s} {:>7s} {:>7s} {:>7s} {:>10s} {:>10s}\n",
                           "f/GHz", "mu_xx", "mu_yy", "mu_zz", "Im mu_xy", "Re mu_V", "character", "refr/deg",
                           "|r+|", "|r-|", "T+", "D+/um", "D-/um");
  for (int q = 0; q < o.count; ++q) {
    const double f = o.count == 1 ? o.from : o.from + (o.to - o.from) * q / (o.count - 1);
    const Mat3c mu = mu_at(s, f);
    const cd muv = voigt_permeability(mu, nn);
    // the Ez wave's iso-frequency curve: k_t^2 / mu_nn + k_n^2 / mu_tt = eps_zz k0^2 (diagonal part)
    const double a = mu(nn, nn).real(), b = mu(nt, nt).real();
    const std::string character = (a > 0 && b > 0) ? "ellipse" : (a < 0 && b < 0) ? "evanescent" : "hyperbola";
    // power-flow direction inside for the incidence's k_t: S ~ (k_t / mu_nn, k_n / mu_tt)
    const double k0 = 1.0, kt = s.n_in * std::sin(th) * k0;
    const double kn2 = (s.eps(2, 2).real() * k0 * k0 - kt * kt / a) * b;
    double refr = std::nan("");
    if (kn2 > 0) {
      double kn = std::sqrt(kn2);
      if (kn / b < 0) kn = -kn;  // power leaves the interface into the medium
      refr = std::atan2(kt / a, kn / b) * 180 / constants::pi;
    }
    const auto rp = respond(s, f, th), rm = respond(s, f, -th);
    const double dp = artmann(s, f, th, 0), dm = artmann(s, f, -th, 0);
    const double bp = o.waist > 0 ? beam_shift(s, f, th, 0, o.waist) : std::nan("");
    const double bm = o.waist > 0 ? beam_shift(s, f, -th, 0, o.waist) : std::nan("");
    std::cout << fmt::format("{:11.4f} {:9.4f} {:9.4f} {:9.4f} {:10.4f} {:10.4f} {:>11s} {:8.2f} {:7.4f} {:7.4f} {:7.4f} "
                             "{:10.3f} {:10.3f}\n",
                             f / 1e9, mu(0, 0).real(), mu(1, 1).real(), mu(2, 2).real(), mu(0, 1).imag(), muv.real(),
                             character, refr, std::abs(rp.r[0][0]), std::abs(rm.r[0][0]), rp.T[0], dp * 1e6, dm * 1e6);
    if (csv)
      csv << fmt::format("{:.10g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{},{:.8g},{:.8g},"
                         "{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g}\n",
                         f, mu(0, 0).real(), mu(0, 0).imag(), mu(1, 1).real(), mu(1, 1).imag(), mu(2, 2).real(),
                         mu(2, 2).imag(), mu(0, 1).real(), mu(0, 1).imag(), muv.real(), muv.imag(), character, refr,
                         std::abs(rp.r[0][0]), phase(rp.r[0][0]), std::abs(rm.r[0][0]), phase(rm.r[0][0]),
                         std::abs(rp.r[0][1]), rp.T[0], rm.T[0], dp, dm, bp, bm);
  }
  return 0;
}

}  // namespace ty
