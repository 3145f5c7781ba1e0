/// \file medium_command.cpp
/// \brief `terayee medium SCENE --medium NAME` (or `--body N`: that body's medium in the state
/// the body starts from, e.g. an antiferromagnetic domain): the linear-response properties of one
/// medium of a scene under the scene's bias, over a frequency band, at an angle of
/// incidence from vacuum (or the scene's chosen incidence index): the permeability tensor,
/// the Ez wave's effective permeability mu_V, and for the Ez and the Hz wave their iso-frequency
/// curve (an ellipse, a hyperbola, or no real branch: from the full in-plane tensor, gyrotropy
/// included, materials/layered/wave_character.h), whether each propagates at this angle or is
/// evanescent (flagged where it decays within 4 cells of the scene's grid) and its power-flow
/// refraction angle with losses
/// (materials/refraction.h), reflection (co- and cross-polarized) and transmission from the
/// 4x4 transfer matrix for both signs of the angle (half-space, or a slab with --thickness),
/// the stationary-phase lateral shift and, with --waist, the shift of that Gaussian beam
/// (materials/angular_spectrum.h). With --thickness and --source-distance it also predicts
/// where the slab images a line source and how large the spot is, from the source's angular
/// spectrum through the transfer matrix, beside the paraxial estimate. The permittivity is
/// the medium's eps(omega) tensor (materials/permittivity/permittivity.h). The Jones matrices of
/// reflection and transmission and the Faraday and Kerr rotation and ellipticity: with
/// --polarization, printed and appended to every CSV and JSON row (tools/medium_jones.h).
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>
#include <iostream>

#include "io/pictures/plot.h"
#include "io/run/atomic_file.h"
#include "io/scene/scene_reader.h"
#include "io/scene/units.h"
#include "materials/layered/angular_spectrum.h"
#include "materials/layered/refraction.h"
#include "materials/layered/wave_character.h"
#include "materials/magnetic/domain_state.h"
#include "materials/permittivity/permittivity.h"
#include "tools/commands.h"
#include "tools/medium_jones.h"

namespace ty {
namespace {

using cd = std::complex<double>;

struct Setup {
  Medium medium;  // its permittivity: dispersion, rotated axes and conductivity
  MagnetModel model;
  MagneticState state;
  std::string how;  // which state, and whose (the medium's, or --body's)
  bool magnetic = false;
  double thickness = 0;
  int normal = 1;
  double n_in = 1;
};

Mat3c eps_at(const Setup& s, double f) {  // eps(w) + i sigma / (eps0 w)
  return medium_permittivity(s.medium, 2 * constants::pi * f);
}

Mat3c mu_at(const Setup& s, double f) {
  if (!s.magnetic) return Mat3c::Identity();
  return Mat3c::Identity() + susceptibility(s.model, s.state, 2 * constants::pi * f);
}

LayerStack stack_at(const Setup& s, double f) {
  LayerStack st;
  st.n_in = s.n_in;
  st.normal = s.normal;
  if (s.thickness > 0) st.layers = {{eps_at(s, f), mu_at(s, f), s.thickness}};
  else st.eps_out = eps_at(s, f), st.mu_out = mu_at(s, f);
  return st;
}

/// The two waves' columns at one frequency: each wave's iso-frequency curve and, at this
/// angle (tangential kt in units of k0), whether it propagates, its power-flow angle (deg) and
/// its 1/e length along the normal (m); the waves of normal incidence for any bias.
struct Waves {
  std::string character, hz_character, ez_here, hz_here;
  double refr = 0, refr_hz = 0, ez_decay = 0, hz_decay = 0;
  NormalModes modes;
};

Waves waves_at(const Mat3c& eps, const Mat3c& mu, double f, int nn, double kt, double cell_n) {
  Waves w;
  w.character = iso_curve_name(ez_iso_curve(eps(2, 2), mu));
  w.hz_character = iso_curve_name(hz_iso_curve(eps, mu(2, 2)));
  // power-flow direction inside, losses included (the same relation as the curves)
  const Refraction rf = ez_refraction(eps(2, 2), mu, nn, kt), rh = hz_refraction(eps, mu(2, 2), nn, kt);
  w.refr = rf.propagates ? rf.angle * 180 / constants::pi : std::nan("");
  w.refr_hz = rh.propagates ? rh.angle * 180 / constants::pi : std::nan("");
  const double lambda_bar = constants::c0 / (2 * constants::pi * f);  // 1/k0
  w.ez_decay = decay_length(rf) * lambda_bar, w.hz_decay = decay_length(rh) * lambda_bar;
  auto here = [&](const Refraction& r, double decay) {
    return is_propagating(r) ? std::string("prop") : decay < 4 * cell_n ? std::string("evan!") : std::string("evan");
  };
  w.ez_here = here(rf, w.ez_decay), w.hz_here = here(rh, w.hz_decay);
  w.modes = normal_modes(eps, mu, nn);  // (k/k0)^2 H = Q H (wave_character.h)
  return w;
}

/// Everything `medium` reports at one frequency.
struct Point {
  double f = 0;
  Mat3c mu, eps;
  cd muv;      // the Ez wave's effective permeability
  Waves wv;    // both waves' curves, character here, refraction and decay
  StackResponse rp, rm;  // the 4x4 transfer matrix at +angle and -angle
  double dp = 0, dm = 0;                          // stationary-phase (Artmann) shifts
  double bp = std::nan(""), bm = std::nan("");  // the Gaussian beam's shifts (with --waist)
};

Point evaluate(const Setup& s, const MediumOptions& o, double f, double cell_n) {
  Point p;
  p.f = f;
  p.mu = mu_at(s, f), p.eps = eps_at(s, f);
  p.muv = voigt_permeability(p.mu, s.normal);
  p.wv = waves_at(p.eps, p.mu, f, s.normal, s.n_in * std::sin(o.angle), cell_n);
  const LayerStack st = stack_at(s, f);
  const double w = 2 * constants::pi * f, th = o.angle;
  p.rp = stack_response(st, w, th), p.rm = stack_response(st, w, -th);
  p.dp = artmann_shift(st, w, th, 0), p.dm = artmann_shift(st, w, -th, 0);
  if (o.waist > 0) {
    p.bp = beam_shift(st, w, th, 0, o.waist, o.line_distance);
    p.bm = beam_shift(st, w, -th, 0, o.waist, o.line_distance);
  }
  return p;
}

constexpr const char* kCsvHeader =
    "frequency_Hz,mu_xx_re,mu_xx_im,mu_yy_re,mu_yy_im,mu_zz_re,mu_zz_im,mu_xy_re,mu_xy_im,muV_re,muV_im,"
    "character,refraction_deg,r_plus_abs,r_plus_phase,r_minus_abs,r_minus_phase,cross_plus,T_plus,T_minus,"
    "artmann_plus_m,artmann_minus_m,beam_plus_m,beam_minus_m,eps_xx_re,eps_xx_im,eps_yy_re,eps_yy_im,eps_zz_re,"
    "eps_zz_im,eps_xy_re,eps_xy_im,r_hz_plus_abs,T_hz_plus,ez_at_angle,ez_decay_m,hz_character,hz_at_angle,"
    "hz_refraction_deg,hz_decay_m,mu_xz_re,mu_xz_im,mu_yz_re,mu_yz_im,normal_n2_1_re,normal_n2_1_im,normal_n2_2_re,"
    "normal_n2_2_im,normal_coupled\n";

std::string csv_line(const Point& p) {
  const Mat3c &mu = p.mu, &eps = p.eps;
  const Waves& wv = p.wv;
  const auto &rp = p.rp, &rm = p.rm;
  return fmt::format("{:.10g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{},{:.8g},{:.8g},"
                     "{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g}",
                     p.f, mu(0, 0).real(), mu(0, 0).imag(), mu(1, 1).real(), mu(1, 1).imag(), mu(2, 2).real(),
                     mu(2, 2).imag(), mu(0, 1).real(), mu(0, 1).imag(), p.muv.real(), p.muv.imag(), wv.character,
                     wv.refr, std::abs(rp.r[0][0]), std::arg(rp.r[0][0]), std::abs(rm.r[0][0]), std::arg(rm.r[0][0]),
                     std::abs(rp.r[0][1]), rp.T[0], rm.T[0], p.dp, p.dm, p.bp, p.bm) +
         fmt::format(",{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g}", eps(0, 0).real(),
                     eps(0, 0).imag(), eps(1, 1).real(), eps(1, 1).imag(), eps(2, 2).real(), eps(2, 2).imag(),
                     eps(0, 1).real(), eps(0, 1).imag(), std::abs(rp.r[1][1]), rp.T[1]) +
         fmt::format(",{},{:.8g},{},{},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{}\n",
                     wv.ez_here, wv.ez_decay, wv.hz_character, wv.hz_here, wv.refr_hz, wv.hz_decay, mu(0, 2).real(),
                     mu(0, 2).imag(), mu(1, 2).real(), mu(1, 2).imag(), wv.modes.n2[0].real(), wv.modes.n2[0].imag(),
                     wv.modes.n2[1].real(), wv.modes.n2[1].imag(), wv.modes.coupled ? 1 : 0);
}

nlohmann::json json_row(const Point& p) {
  const Mat3c &mu = p.mu, &eps = p.eps;
  const Waves& wv = p.wv;
  const auto &rp = p.rp, &rm = p.rm;
  const auto number_or_null = [](double v, bool ok) { return ok ? nlohmann::json(v) : nlohmann::json(); };
  nlohmann::json row;
  row["frequency"] = p.f;
  row["mu"] = {{mu(0, 0).real(), mu(0, 0).imag(), mu(1, 1).real(), mu(1, 1).imag(), mu(2, 2).real(), mu(2, 2).imag()}};
  row["mu-xy"] = {mu(0, 1).real(), mu(0, 1).imag()};
  row["mu-V"] = {p.muv.real(), p.muv.imag()};
  row["eps"] = {{eps(0, 0).real(), eps(0, 0).imag(), eps(1, 1).real(), eps(1, 1).imag(), eps(2, 2).real(),
                 eps(2, 2).imag()}};
  row["eps-xy"] = {eps(0, 1).real(), eps(0, 1).imag()};
  row["r-hz-plus"] = {std::abs(rp.r[1][1]), std::arg(rp.r[1][1])};
  row["T-hz-plus"] = rp.T[1];
  row["character"] = wv.character;
  row["ez-here"] = wv.ez_here, row["hz-here"] = wv.hz_here, row["hz-character"] = wv.hz_character;
  row["ez-decay"] = number_or_null(wv.ez_decay, std::isfinite(wv.ez_decay));
  row["hz-decay"] = number_or_null(wv.hz_decay, std::isfinite(wv.hz_decay));
  row["hz-refraction-angle-deg"] = number_or_null(wv.refr_hz, !std::isnan(wv.refr_hz));
  row["mu-xz"] = {mu(0, 2).real(), mu(0, 2).imag()};
  row["mu-yz"] = {mu(1, 2).real(), mu(1, 2).imag()};
  row["normal-incidence-n2"] = {{wv.modes.n2[0].real(), wv.modes.n2[0].imag()},
                                {wv.modes.n2[1].real(), wv.modes.n2[1].imag()}};
  row["normal-incidence-coupled"] = wv.modes.coupled;
  row["refraction-angle-deg"] = number_or_null(wv.refr, !std::isnan(wv.refr));
  row["r-plus"] = {std::abs(rp.r[0][0]), std::arg(rp.r[0][0])};
  row["r-minus"] = {std::abs(rm.r[0][0]), std::arg(rm.r[0][0])};
  row["T-plus"] = rp.T[0], row["T-minus"] = rm.T[0];
  row["artmann-plus"] = p.dp, row["artmann-minus"] = p.dm;
  if (std::isfinite(p.bp) || std::isfinite(p.bm)) row["beam-shift-plus"] = p.bp, row["beam-shift-minus"] = p.bm;
  return row;
}

void print_header(const Scene& scene, const Setup& s, const MediumOptions& o) {
  const Medium& med = s.medium;
  std::cout << fmt::format("medium '{}' under the bias [{}, {}, {}] T, interface normal {}, angle {:+.3f} deg{}\n",
                           med.name, scene.bias[0], scene.bias[1], scene.bias[2], o.normal,
                           o.angle * 180 / constants::pi,
                           o.thickness > 0 ? fmt::format(", slab {:.4g} um", o.thickness * 1e6) : ", half-space");
  if (s.magnetic) {  // the state, and whose (the medium's, or --body's)
    const Vec3 net = s.model.net(s.state.m);
    std::cout << fmt::format("state: {}; net moment mu0*M = ({:.6g}, {:.6g}, {:.6g}) T\n", s.how, net.x(), net.y(),
                             net.z());
  }
  std::cout << fmt::format("{:>11s} {:>9s} {:>9s} {:>9s} {:>10s} {:>10s} {:>10s} {:>5s} {:>8s} {:>10s} {:>5s} {:>8s} {:>7s} "
                           "{:>7s} {:>7s} {:>10s} {:>10s}\n",
                           "f/GHz", "mu_xx", "mu_yy", "mu_zz", "Im mu_xy", "Re mu_V", "Ez curve", "here", "refr/deg",
                           "Hz curve", "here", "refr/deg", "|r+|", "|r-|", "T+", "D+/um", "D-/um");
  std::cout << "  (curve: the iso-frequency curve of the wave, wave_character.h; here: 'prop' or 'evan' at this angle, "
               "'evan!' where its field decays by 1/e within 4 cells of the scene's grid)\n";
}

void print_point(const Point& p) {
  const Waves& wv = p.wv;
  std::cout << fmt::format("{:11.4f} {:9.4f} {:9.4f} {:9.4f} {:10.4f} {:10.4f} {:>10s} {:>5s} {:8.2f} {:>10s} {:>5s} "
                           "{:8.2f} {:7.4f} {:7.4f} {:7.4f} {:10.3f} {:10.3f}\n",
                           p.f / 1e9, p.mu(0, 0).real(), p.mu(1, 1).real(), p.mu(2, 2).real(), p.mu(0, 1).imag(),
                           p.muv.real(), wv.character, wv.ez_here, wv.refr, wv.hz_character, wv.hz_here, wv.refr_hz,
                           std::abs(p.rp.r[0][0]), std::abs(p.rm.r[0][0]), p.rp.T[0], p.dp * 1e6, p.dm * 1e6);
}

void print_coupling_once(const Point& p, bool& told) {
  const NormalModes& modes = p.wv.modes;
  if (!modes.coupled || told) return;
  told = true;
  std::cout << fmt::format("  note: mu_xz, mu_yz are not zero (the bias or the moment has a part in the plane): the Ez "
                           "and Hz waves couple, so each wave's columns describe it alone; at normal incidence the "
                           "coupled waves have (k/k0)^2 = {:.4g}{:+.4g}i, {:.4g}{:+.4g}i at {:.4f} GHz (CSV and "
                           "JSON: every row)\n",
                           modes.n2[0].real(), modes.n2[0].imag(), modes.n2[1].real(), modes.n2[1].imag(), p.f / 1e9);
}

/// A line source before the slab: its image from the angular spectrum (no paraxial
/// approximation), looked for from a tenth of a wavelength to `image-range` behind the face.
nlohmann::json line_image(const Setup& s, const MediumOptions& o, double f) {
  const double lambda0 = constants::c0 / f;
  const LineImage img = line_source_image(stack_at(s, f), 2 * constants::pi * f, o.source_distance, 0.1 * lambda0,
                                          o.image_range > 0 ? o.image_range : 6 * lambda0);
  std::cout << fmt::format("  line source {:.4g} um before the slab: paraxial image {:.4g} um behind it; "
                           "transfer-matrix focus {:.4g} um behind the far face, FWHM across {:.4g} um, along "
                           "{:.4g} um\n",
                           o.source_distance * 1e6, img.paraxial * 1e6, img.peak * 1e6, img.fwhm_across * 1e6,
                           img.fwhm_along * 1e6);
  return {{"source-distance", o.source_distance}, {"paraxial", img.paraxial}, {"focus", img.peak},
          {"fwhm-across", img.fwhm_across}, {"fwhm-along", img.fwhm_along}};
}

/// Two panels: the permeability (the Ez wave's negative bands shaded, edges refined by
/// bisection: linear_response.h) and the reflected and transmitted power fractions.
void write_medium_plot(const Setup& s, const Scene& scene, const MediumOptions& o, const std::vector<Point>& points) {
  PlotSeries curves[7];
  const char* names[7] = {"Re μ_xx", "Re μ_yy", "Re μ_V (Ez wave)", "Im μ_xy", "|r|² at +angle", "|r|² at −angle",
                          "T at +angle"};
  for (int c = 0; c < 7; ++c) curves[c].label = names[c];
  curves[3].style = curves[5].style = PlotSeries::Style::dashed;
  for (const Point& p : points) {
    const double vals[7] = {p.mu(0, 0).real(), p.mu(1, 1).real(), p.muv.real(), p.mu(0, 1).imag(),
                            std::norm(p.rp.r[0][0]), std::norm(p.rm.r[0][0]), p.rp.T[0]};
    for (int c = 0; c < 7; ++c) curves[c].x.push_back(p.f / 1e9), curves[c].y.push_back(vals[c]);
  }
  PlotPanel mu_panel, r_panel;
  mu_panel.xlabel = r_panel.xlabel = "frequency (GHz)";
  mu_panel.ylabel = "permeability";
  r_panel.ylabel = fmt::format("power fraction ({})", o.thickness > 0 ? "slab" : "half-space");
  mu_panel.series = {curves[0], curves[1], curves[2], curves[3]};
  r_panel.series = {curves[4], curves[5], curves[6]};
  const auto re_muv = [&](double f) { return voigt_permeability(mu_at(s, f), s.normal).real(); };
  for (const Band& b : negative_bands(re_muv, o.from, o.to, 4000)) {
    mu_panel.shaded.push_back({b.from / 1e9, b.to / 1e9});
    r_panel.shaded.push_back({b.from / 1e9, b.to / 1e9});
  }
  mu_panel.shaded_label = r_panel.shaded_label = "Re μ_V < 0";
  // the permeability near a line spans decades: show the range that matters for the waves
  double lo = 0, hi = 1;
  for (int c = 0; c < 4; ++c)
    for (double y : curves[c].y)
      if (std::isfinite(y)) lo = std::min(lo, y), hi = std::max(hi, y);
  lo = std::max(lo, -20.0), hi = std::min(hi, 20.0);
  mu_panel.ymin = lo - 0.05 * (hi - lo), mu_panel.ymax = hi + 0.05 * (hi - lo);
  r_panel.ymin = 0, r_panel.ymax = 1.05;
  Plot plot;
  plot.title = fmt::format("medium '{}', bias [{}, {}, {}] T, angle {:+.1f} deg", s.medium.name, scene.bias[0],
                           scene.bias[1], scene.bias[2], o.angle * 180 / constants::pi);
  plot.panels = {mu_panel, r_panel};
  plot.height = 800;
  write_plot(plot, o.plot);
  std::cout << fmt::format("plot -> {} (data: {})\n", o.plot, plot_data_path(o.plot));
}

/// The medium asked for: by --medium, or the medium of --body (both: they must agree).
int medium_index(const Scene& scene, const MediumOptions& o) {
  if (o.body > static_cast<int>(scene.bodies.size()))
    throw BadInput(fmt::format("--body: error: the scene has {} bodies, not {}", scene.bodies.size(), o.body));
  const int of_body = o.body > 0 ? scene.bodies[o.body - 1].medium : -1;
  if (o.medium.empty()) return of_body;
  int k = -1;
  for (size_t q = 0; q < scene.media.size(); ++q)
    if (scene.media[q].name == o.medium) k = static_cast<int>(q);
  if (k < 0) throw BadInput(fmt::format("{}: error: the scene has no medium named '{}'", o.scene, o.medium));
  if (of_body >= 0 && of_body != k)
    throw BadInput(fmt::format("--body: error: body {} is of medium '{}', not '{}'", o.body, scene.media[of_body].name,
                               o.medium));
  return k;
}

/// The magnetic state: the one a run starts from in the medium's bodies, or in --body's
/// (its own order or state: materials/magnetic/domain_state.h). Said on the first line.
ChosenState state_for(const Scene& scene, const Medium& med, const MediumOptions& o) {
  if (o.body == 0) return choose_state(*med.magnet, scene.bias);
  const Body& b = scene.bodies[o.body - 1];
  ChosenState c = choose_body_state(*med.magnet, b.magnetic, scene.bias);
  c.how = fmt::format("body {} (line {}): {}", o.body, b.where.line,
                      b.magnetic.given() ? "its own state, " + c.how : "the medium's state, " + c.how);
  return c;
}

Setup setup_for(const Scene& scene, const MediumOptions& o) {
  const int k = medium_index(scene, o);
  const Medium& med = scene.media[k];
  if (med.perfect_conductor) throw BadInput(fmt::format("{}: error: '{}' is a perfect conductor", o.scene, med.name));
  if (o.source_distance > 0 && o.thickness <= 0)
    throw BadInput("terayee medium: error: --source-distance needs --thickness (the slab the source faces)");
  Setup s;
  s.medium = med;
  if (med.magnet) {
    s.magnetic = true;
    s.model = MagnetModel(*med.magnet, scene.bias);
    const ChosenState c = state_for(scene, med, o);  // the state a run starts from
    s.state = c.state, s.how = c.how;
  }
  s.thickness = o.thickness;
  s.normal = o.normal == "x" ? 0 : 1;
  s.n_in = o.incidence_index;
  return s;
}

}  // namespace

int medium_command(const MediumOptions& o) {
  const Scene scene = read_scene(o.scene, o.sets);
  const Setup s = setup_for(scene, o);
  print_header(scene, s, o);
  const double cell_n = s.normal == 0 ? scene.grid.dx : scene.grid.dy;  // the cell across the interface
  std::string csv = kCsvHeader;
  if (o.polarization) csv.insert(csv.size() - 1, jones_csv_header());
  nlohmann::json rows = nlohmann::json::array();
  std::vector<Point> points;
  std::vector<JonesPrediction> jones;  // the polarization columns (medium_jones.h)
  SlabModel slab = slab_model(scene, medium_index(scene, o), o.thickness, s.normal);
  slab.state = s.state;  // --body's own state where it has one
  bool coupling_told = false;
  for (int q = 0; q < o.count; ++q) {
    const double f = o.count == 1 ? o.from : o.from + (o.to - o.from) * q / (o.count - 1);
    const Point p = evaluate(s, o, f, cell_n);
    jones.push_back(predict_jones(slab, f, o.angle));
    print_coupling_once(p, coupling_told);
    print_point(p);
    std::string line = csv_line(p);
    csv += o.polarization ? line.insert(line.size() - 1, jones_csv(jones.back())) : line;
    nlohmann::json row = json_row(p);
    if (o.polarization) row["polarization"] = jones_json(jones.back());
    if (o.source_distance > 0) row["image"] = line_image(s, o, f);
    rows.push_back(row);
    points.push_back(p);
  }
  if (o.polarization) {
    print_jones_header(o.thickness > 0);
    for (size_t q = 0; q < points.size(); ++q) print_jones_row(points[q].f, jones[q]);
  }
  if (!o.plot.empty()) write_medium_plot(s, scene, o, points);
  if (!o.csv.empty()) write_text_atomically(o.csv, csv);
  if (!o.json.empty()) {
    nlohmann::json out{{"medium", s.medium.name}, {"rows", rows}};
    if (s.magnetic) {
      const Vec3 net = s.model.net(s.state.m);
      out["state"] = s.how, out["net-moment"] = {net.x(), net.y(), net.z()};  // T
    }
    write_text_atomically(o.json, out.dump(2) + "\n");
  }
  return 0;
}

}  // namespace ty
