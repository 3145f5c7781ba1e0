/// \file medium_jones.cpp
/// \brief The Jones and rotation columns of `terayee medium` (see medium_jones.h).
#include "tools/medium_jones.h"

#include <fmt/format.h>

#include <cmath>
#include <iostream>

#include "io/scene/constants.h"

namespace ty {

namespace {

constexpr double kDeg = 180 / constants::pi;
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
                       s[0].theta * kDeg, s[0].eta * kDeg, s[1].theta * kDeg, s[1].eta * kDeg);
  };
  if (p.has_t) part(p.t, p.faraday);
  part(p.r, p.kerr);
  std::cout << row << "\n";
}

}  // namespace ty
