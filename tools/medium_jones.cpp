/// \file medium_jones.cpp
/// \brief The Jones and rotation columns of `terayee medium` (see medium_jones.h).
#include "tools/medium_jones.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <iostream>
#include <vector>

#include "io/scene/constants.h"
#include "materials/magnetic/linear_response.h"

namespace ty {

namespace {

constexpr double kDeg = 180 / constants::pi;

/// An angle in degrees as printed to 4 decimals, with no "-0.0000".
double shown_deg(double rad) {
  const double d = rad * kDeg;
  return std::abs(d) < 5e-5 ? 0.0 : d;
}
const char* const kElement[2][2] = {{"zz", "zu"}, {"uz", "uu"}};  // [out][in]

nlohmann::json matrix_json(const Jones& J) {
  nlohmann::json j;
  for (int out = 0; out < 2; ++out)
    for (int in = 0; in < 2; ++in) j[kElement[out][in]] = {J[out][in].real(), J[out][in].imag()};
  return j;
}

nlohmann::json states_json(const PolarizationState s[2]) {
  nlohmann::json j;
  const char* names[2] = {"Ez-input", "Hz-input"};
  for (int in = 0; in < 2; ++in)
    j[names[in]] = {{"rotation-rad", s[in].theta},
                    {"ellipticity-rad", s[in].eta},
                    {"rotation-deg", s[in].theta * kDeg},
                    {"ellipticity-deg", s[in].eta * kDeg}};
  return j;
}

}  // namespace

std::string jones_csv_header() {
  std::string h;
  for (const char* g : {"t", "r"})
    for (int out = 0; out < 2; ++out)
      for (int in = 0; in < 2; ++in) h += fmt::format(",J{0}_{1}_re,J{0}_{1}_im", g, kElement[out][in]);
  for (const char* g : {"faraday", "kerr"})
    for (const char* in : {"ez", "hz"}) h += fmt::format(",{0}_{1}_rotation_rad,{0}_{1}_ellipticity_rad", g, in);
  return h;
}

std::string jones_csv(const JonesPrediction& p) {
  std::string s;
  for (const Jones* J : {&p.t, &p.r})
    for (int out = 0; out < 2; ++out)
      for (int in = 0; in < 2; ++in) s += fmt::format(",{:.8g},{:.8g}", (*J)[out][in].real(), (*J)[out][in].imag());
  for (const PolarizationState* st : {p.faraday, p.kerr})
    for (int in = 0; in < 2; ++in) s += fmt::format(",{:.8g},{:.8g}", st[in].theta, st[in].eta);
  return s;
}

nlohmann::json jones_json(const JonesPrediction& p) {
  nlohmann::json j;
  j["jones-reflected"] = matrix_json(p.r);
  j["kerr"] = states_json(p.kerr);
  if (p.has_t) j["jones-transmitted"] = matrix_json(p.t), j["faraday"] = states_json(p.faraday);
  return j;
}

void print_jones_header(bool slab) {
  std::cout << "Jones matrices from the 4x4 transfer matrix, basis (E.z, E.u), u = z x k (docs/measurements.md); "
               "rotation counterclockwise for an observer facing the wave is positive\n";
  std::string h = fmt::format("{:>11s}", "f/GHz");
  if (slab)
    h += fmt::format(" {:>8s} {:>8s} {:>9s} {:>9s} {:>9s} {:>9s}", "|t_zz|", "|t_uz|", "F_Ez/deg", "eF_Ez/deg",
                     "F_Hz/deg", "eF_Hz/deg");
  h += fmt::format(" {:>8s} {:>8s} {:>9s} {:>9s} {:>9s} {:>9s}", "|r_zz|", "|r_uz|", "K_Ez/deg", "eK_Ez/deg",
                   "K_Hz/deg", "eK_Hz/deg");
  std::cout << h << "\n  (F: Faraday rotation, eF: its ellipticity; K, eK: Kerr; per input wave)\n";
}

void print_jones_row(double f, const JonesPrediction& p) {
  std::string row = fmt::format("{:11.4f}", f / 1e9);
  auto part = [&](const Jones& J, const PolarizationState s[2]) {
    row += fmt::format(" {:8.5f} {:8.5f} {:9.4f} {:9.4f} {:9.4f} {:9.4f}", std::abs(J[0][0]), std::abs(J[1][0]),
                       shown_deg(s[0].theta), shown_deg(s[0].eta), shown_deg(s[1].theta), shown_deg(s[1].eta));
  };
  if (p.has_t) part(p.t, p.faraday);
  part(p.r, p.kerr);
  std::cout << row << "\n";
}

bool report_scene_jones(const Scene& scene, double f_lo, double f_hi) {
  std::string why;
  const auto sample = scene_sample(scene, why);
  if (!sample || !sample->model.magnetic) return false;  // only a magnetic sample turns the polarization
  std::cout << fmt::format("  polarization of the sample slab (medium '{}', {}), normal incidence:\n",
                           scene.media[sample->slab.medium].name,
                           sample->slab.thickness > 0 ? fmt::format("{:.4g} um thick", sample->slab.thickness * 1e6)
                                                      : std::string("a half-space"));
  print_jones_header(sample->slab.thickness > 0);
  // even steps over the band, and each resonance of the sample's state inside it 2% below and above
  // (where the rotation changes fastest)
  std::vector<double> freq;
  const int count = f_hi > f_lo ? 7 : 1;
  for (int k = 0; k < count; ++k) freq.push_back(count == 1 ? f_hi : f_lo + (f_hi - f_lo) * k / (count - 1));
  for (const double r : resonances(sample->model.model, sample->model.state))
    for (const double x : {0.98 * r, 1.02 * r})
      if (x > f_lo && x < f_hi) freq.push_back(x);
  std::sort(freq.begin(), freq.end());
  for (const double f : freq) print_jones_row(f, predict_jones(sample->model, f));
  return true;
}

}  // namespace ty
