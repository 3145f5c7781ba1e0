/// \file medium_command.cpp
/// \brief `terayee medium SCENE --medium NAME`: the linear-response properties of one
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
/// the medium's eps(omega) tensor (materials/permittivity/permittivity.h).
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>
#include <iostream>

#include "io/pictures/plot.h"
#include "io/scene/scene_reader.h"
#include "io/scene/units.h"
#include "materials/layered/angular_spectrum.h"
#include "materials/layered/refraction.h"
#include "materials/layered/wave_character.h"
#include "materials/magnetic/state_choice.h"
#include "materials/permittivity/permittivity.h"
#include "tools/commands.h"

namespace ty {
namespace {

using cd = std::complex<double>;

struct Setup {
  Medium medium;  // its permittivity: dispersion, rotated axes and conductivity
  MagnetModel model;
  MagneticState state;
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
  s.medium = med;
  if (med.magnet) {
    s.magnetic = true;
    s.model = MagnetModel(*med.magnet, scene.bias);
    s.state = choose_state(*med.magnet, scene.bias).state;  // the state a run starts from
  }
  s.thickness = o.thickness;
  s.normal = o.normal == "x" ? 0 : 1;
  s.n_in = o.incidence_index;
  const int nn = s.normal;  // the interface normal's axis
  const double th = o.angle;
  std::ofstream csv;
  if (!o.csv.empty()) {
    csv.open(o.csv);
    csv << "frequency_Hz,mu_xx_re,mu_xx_im,mu_yy_re,mu_yy_im,mu_zz_re,mu_zz_im,mu_xy_re,mu_xy_im,muV_re,muV_im,"
           "character,refraction_deg,r_plus_abs,r_plus_phase,r_minus_abs,r_minus_phase,cross_plus,T_plus,T_minus,"
           "artmann_plus_m,artmann_minus_m,beam_plus_m,beam_minus_m,eps_xx_re,eps_xx_im,eps_yy_re,eps_yy_im,eps_zz_re,eps_zz_im,eps_xy_re,eps_xy_im,r_hz_plus_abs,T_hz_plus,"
           "ez_at_angle,ez_decay_m,hz_character,hz_at_angle,hz_refraction_deg,hz_decay_m,mu_xz_re,mu_xz_im,mu_yz_re,mu_yz_im,"
           "normal_n2_1_re,normal_n2_1_im,normal_n2_2_re,normal_n2_2_im,normal_coupled\n";
  }
  std::cout << fmt::format("medium '{}' under the bias [{}, {}, {}] T, interface normal {}, angle {:+.3f} deg{}\n",
                           med.name, scene.bias[0], scene.bias[1], scene.bias[2], o.normal, th * 180 / constants::pi,
                           o.thickness > 0 ? fmt::format(", slab {:.4g} um", o.thickness * 1e6) : ", half-space");
  const double cell_n = s.normal == 0 ? scene.grid.dx : scene.grid.dy;  // the cell across the interface
  std::cout << fmt::format("{:>11s} {:>9s} {:>9s} {:>9s} {:>10s} {:>10s} {:>10s} {:>5s} {:>8s} {:>10s} {:>5s} {:>8s} {:>7s} "
                           "{:>7s} {:>7s} {:>10s} {:>10s}\n",
                           "f/GHz", "mu_xx", "mu_yy", "mu_zz", "Im mu_xy", "Re mu_V", "Ez curve", "here", "refr/deg",
                           "Hz curve", "here", "refr/deg", "|r+|", "|r-|", "T+", "D+/um", "D-/um");
  std::cout << "  (curve: the iso-frequency curve of the wave, wave_character.h; here: 'prop' or 'evan' at this angle, "
               "'evan!' where its field decays by 1/e within 4 cells of the scene's grid)\n";
  bool coupling_told = false;
  if (o.source_distance > 0 && o.thickness <= 0)
    throw BadInput("terayee medium: error: --source-distance needs --thickness (the slab the source faces)");
  nlohmann::json rows = nlohmann::json::array();
  PlotSeries curves[7];
  const char* curve_names[7] = {"Re μ_xx", "Re μ_yy", "Re μ_V (Ez wave)", "Im μ_xy", "|r|² at +angle", "|r|² at −angle",
                                "T at +angle"};
  for (int c = 0; c < 7; ++c) curves[c].label = curve_names[c];
  curves[3].style = curves[5].style = PlotSeries::Style::dashed;
  for (int q = 0; q < o.count; ++q) {
    const double f = o.count == 1 ? o.from : o.from + (o.to - o.from) * q / (o.count - 1);
    const Mat3c mu = mu_at(s, f), eps = eps_at(s, f);
    const cd muv = voigt_permeability(mu, nn);
    const Waves wv = waves_at(eps, mu, f, nn, s.n_in * std::sin(th), cell_n);
    const std::string &character = wv.character, &hz_character = wv.hz_character, &ez_here = wv.ez_here,
                      &hz_here = wv.hz_here;
    const double refr = wv.refr, refr_hz = wv.refr_hz, ez_decay = wv.ez_decay, hz_decay = wv.hz_decay;
    const NormalModes& modes = wv.modes;
    if (modes.coupled && !coupling_told) {
      coupling_told = true;
      std::cout << fmt::format("  note: mu_xz, mu_yz are not zero (the bias or the moment has a part in the plane): the Ez "
                               "and Hz waves couple, so each wave's columns describe it alone; at normal incidence the "
                               "coupled waves have (k/k0)^2 = {:.4g}{:+.4g}i, {:.4g}{:+.4g}i at {:.4f} GHz (CSV and "
                               "JSON: every row)\n",
                               modes.n2[0].real(), modes.n2[0].imag(), modes.n2[1].real(), modes.n2[1].imag(), f / 1e9);
    }
    const LayerStack st = stack_at(s, f);
    const double w = 2 * constants::pi * f;
    const auto rp = stack_response(st, w, th), rm = stack_response(st, w, -th);
    const double dp = artmann_shift(st, w, th, 0), dm = artmann_shift(st, w, -th, 0);
    const double bp = o.waist > 0 ? beam_shift(st, w, th, 0, o.waist, o.line_distance) : std::nan("");
    const double bm = o.waist > 0 ? beam_shift(st, w, -th, 0, o.waist, o.line_distance) : std::nan("");
    std::cout << fmt::format("{:11.4f} {:9.4f} {:9.4f} {:9.4f} {:10.4f} {:10.4f} {:>10s} {:>5s} {:8.2f} {:>10s} {:>5s} "
                             "{:8.2f} {:7.4f} {:7.4f} {:7.4f} {:10.3f} {:10.3f}\n",
                             f / 1e9, mu(0, 0).real(), mu(1, 1).real(), mu(2, 2).real(), mu(0, 1).imag(), muv.real(),
                             character, ez_here, refr, hz_character, hz_here, refr_hz, std::abs(rp.r[0][0]),
                             std::abs(rm.r[0][0]), rp.T[0], dp * 1e6, dm * 1e6);
    if (csv)
      csv << fmt::format("{:.10g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{},{:.8g},{:.8g},"
                         "{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g}",
                         f, mu(0, 0).real(), mu(0, 0).imag(), mu(1, 1).real(), mu(1, 1).imag(), mu(2, 2).real(),
                         mu(2, 2).imag(), mu(0, 1).real(), mu(0, 1).imag(), muv.real(), muv.imag(), character, refr,
                         std::abs(rp.r[0][0]), std::arg(rp.r[0][0]), std::abs(rm.r[0][0]), std::arg(rm.r[0][0]),
                         std::abs(rp.r[0][1]), rp.T[0], rm.T[0], dp, dm, bp, bm)
          << fmt::format(",{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g}", eps(0, 0).real(),
                         eps(0, 0).imag(), eps(1, 1).real(), eps(1, 1).imag(), eps(2, 2).real(), eps(2, 2).imag(),
                         eps(0, 1).real(), eps(0, 1).imag(), std::abs(rp.r[1][1]), rp.T[1])
          << fmt::format(",{},{:.8g},{},{},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{}\n",
                         ez_here, ez_decay, hz_character, hz_here, refr_hz, hz_decay, mu(0, 2).real(), mu(0, 2).imag(),
                         mu(1, 2).real(), mu(1, 2).imag(), modes.n2[0].real(), modes.n2[0].imag(), modes.n2[1].real(),
                         modes.n2[1].imag(), modes.coupled ? 1 : 0);
    nlohmann::json row;
    row["frequency"] = f;
    row["mu"] = {{mu(0, 0).real(), mu(0, 0).imag(), mu(1, 1).real(), mu(1, 1).imag(), mu(2, 2).real(), mu(2, 2).imag()}};
    row["mu-xy"] = {mu(0, 1).real(), mu(0, 1).imag()};
    row["mu-V"] = {muv.real(), muv.imag()};
    row["eps"] = {{eps(0, 0).real(), eps(0, 0).imag(), eps(1, 1).real(), eps(1, 1).imag(), eps(2, 2).real(),
                   eps(2, 2).imag()}};
    row["eps-xy"] = {eps(0, 1).real(), eps(0, 1).imag()};
    row["r-hz-plus"] = {std::abs(rp.r[1][1]), std::arg(rp.r[1][1])};
    row["T-hz-plus"] = rp.T[1];
    row["character"] = character;
    row["ez-here"] = ez_here, row["hz-here"] = hz_here, row["hz-character"] = hz_character;
    row["ez-decay"] = std::isfinite(ez_decay) ? nlohmann::json(ez_decay) : nlohmann::json();
    row["hz-decay"] = std::isfinite(hz_decay) ? nlohmann::json(hz_decay) : nlohmann::json();
    row["hz-refraction-angle-deg"] = std::isnan(refr_hz) ? nlohmann::json() : nlohmann::json(refr_hz);
    row["mu-xz"] = {mu(0, 2).real(), mu(0, 2).imag()};
    row["mu-yz"] = {mu(1, 2).real(), mu(1, 2).imag()};
    row["normal-incidence-n2"] = {{modes.n2[0].real(), modes.n2[0].imag()}, {modes.n2[1].real(), modes.n2[1].imag()}};
    row["normal-incidence-coupled"] = modes.coupled;
    row["refraction-angle-deg"] = std::isnan(refr) ? nlohmann::json() : nlohmann::json(refr);
    row["r-plus"] = {std::abs(rp.r[0][0]), std::arg(rp.r[0][0])};
    row["r-minus"] = {std::abs(rm.r[0][0]), std::arg(rm.r[0][0])};
    row["T-plus"] = rp.T[0], row["T-minus"] = rm.T[0];
    row["artmann-plus"] = dp, row["artmann-minus"] = dm;
    if (o.waist > 0) row["beam-shift-plus"] = bp, row["beam-shift-minus"] = bm;
    if (o.source_distance > 0) {
      // a line source before the slab: its image from the angular spectrum (no paraxial
      // approximation), looked for from a tenth of a wavelength to `image-range` behind the face
      const double lambda0 = constants::c0 / f;
      const LineImage img = line_source_image(st, w, o.source_distance, 0.1 * lambda0,
                                              o.image_range > 0 ? o.image_range : 6 * lambda0);
      std::cout << fmt::format("  line source {:.4g} um before the slab: paraxial image {:.4g} um behind it; "
                               "transfer-matrix focus {:.4g} um behind the far face, FWHM across {:.4g} um, along "
                               "{:.4g} um\n",
                               o.source_distance * 1e6, img.paraxial * 1e6, img.peak * 1e6, img.fwhm_across * 1e6,
                               img.fwhm_along * 1e6);
      row["image"] = {{"source-distance", o.source_distance}, {"paraxial", img.paraxial}, {"focus", img.peak},
                      {"fwhm-across", img.fwhm_across}, {"fwhm-along", img.fwhm_along}};
    }
    rows.push_back(row);
    if (!o.plot.empty()) {
      const double vals[7] = {mu(0, 0).real(), mu(1, 1).real(), muv.real(), mu(0, 1).imag(),
                              std::norm(rp.r[0][0]), std::norm(rm.r[0][0]), rp.T[0]};
      for (int c = 0; c < 7; ++c) curves[c].x.push_back(f / 1e9), curves[c].y.push_back(vals[c]);
    }
  }
  if (!o.plot.empty()) {
    PlotPanel mu_panel, r_panel;
    mu_panel.xlabel = r_panel.xlabel = "frequency (GHz)";
    mu_panel.ylabel = "permeability";
    r_panel.ylabel = fmt::format("power fraction ({})", o.thickness > 0 ? "slab" : "half-space");
    mu_panel.series = {curves[0], curves[1], curves[2], curves[3]};
    r_panel.series = {curves[4], curves[5], curves[6]};
    // the Ez wave's negative bands, edges refined by bisection (linear_response.h)
    const auto re_muv = [&](double f) { return voigt_permeability(mu_at(s, f), nn).real(); };
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
    plot.title = fmt::format("medium '{}', bias [{}, {}, {}] T, angle {:+.1f} deg", med.name, scene.bias[0],
                             scene.bias[1], scene.bias[2], th * 180 / constants::pi);
    plot.panels = {mu_panel, r_panel};
    plot.height = 800;
    write_plot(plot, o.plot);
    std::cout << fmt::format("plot -> {} (data: {})\n", o.plot, plot_data_path(o.plot));
  }
  if (!o.json.empty()) std::ofstream(o.json) << nlohmann::json{{"medium", med.name}, {"rows", rows}}.dump(2) << "\n";
  return 0;
}

}  // namespace ty
