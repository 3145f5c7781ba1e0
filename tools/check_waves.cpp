/// \file check_waves.cpp
/// \brief Resolution and wave reports of `terayee check` (see check_waves.h).
#include "tools/check_waves.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <iostream>

#include "io/scene/medium_lookup.h"
#include "materials/dielectric.h"
#include "materials/layered/wave_character.h"
#include "materials/magnetic/state_choice.h"
#include "materials/permittivity/permittivity.h"

namespace ty {
namespace {

using cd = std::complex<double>;
const char* kAxis[2] = {"x", "y"};

std::string band_list(const std::vector<Band>& bands) {
  if (bands.empty()) return "none";
  std::string out;
  for (const auto& b : bands)
    out += fmt::format("{}{:.4f}-{:.4f} GHz", out.empty() ? "" : ", ", b.from / 1e9, b.to / 1e9);
  return out;
}

/// The medium's tensors at f (Hz): eps(omega) and mu = 1 + chi of its magnet in state st.
struct Tensors {
  Mat3c eps, mu;
};
Tensors tensors_at(const Medium& med, const MagnetModel* M, const MagneticState* st, double f) {
  const double w = 2 * constants::pi * f;
  return {medium_permittivity(med, w), M ? Mat3c(Mat3c::Identity() + susceptibility(*M, *st, w)) : Mat3c::Identity()};
}

/// The source band a resolution check looks at (its lower edge kept off zero, as elsewhere).
std::pair<double, double> checked_band(const Source& src) {
  const Band2 b = source_band(src);
  return {std::max(b.lo, 0.01 * src.frequency), b.hi};
}

struct Shortest {
  double cpw = 1e300, f = 0;
  int wave = 0;
};
/// Fewest cells per wavelength along axis a over [f0, f1] for waves travelling along a.
Shortest shortest_wave(const Medium& med, const MagnetModel* M, const MagneticState* st, double f0, double f1,
                       double cell) {
  Shortest out;
  const int samples = 1000;
  for (int q = 0; q <= samples; ++q) {
    const double f = f0 + (f1 - f0) * q / samples;
    const Tensors t = tensors_at(med, M, st, f);
    for (int a = 0; a < 2; ++a) {
      const NormalModes nm = normal_modes(t.eps, t.mu, a);
      for (int w = 0; w < 2; ++w) {
        const double re_n = std::sqrt(nm.n2[w]).real();
        const double cpw = re_n > 0 ? constants::c0 / (f * re_n) / cell : 1e300;
        if (cpw < out.cpw) out = {cpw, f, nm.coupled ? 2 + w : w};
      }
    }
  }
  return out;
}

const char* wave_name(int w) {
  static const char* names[4] = {"Ez wave", "Hz wave", "coupled wave of lower (k/k0)^2",
                                 "coupled wave of higher (k/k0)^2"};
  return names[w];
}

/// A warning where the evanescent field of (k/k0)^2 = n2(f) decays by 1/e within kDecayCells
/// cells over [x0, x1], the part of band b within the sources' band. Returns the warnings (0, 1).
int warn_decay(const std::function<cd(double)>& n2, const Band& b, double x0, double x1, double cell,
               const std::string& what) {
  double shortest = 1e300, f_at = x0, short_from = 0, short_to = 0;
  for (int q = 0; q <= 400; ++q) {
    const double f = x0 + (x1 - x0) * q / 400;
    const double im = std::abs(std::sqrt(n2(f)).imag());
    const double len = im > 0 ? constants::c0 / (2 * constants::pi * f * im) : 1e300;
    if (len < shortest) shortest = len, f_at = f;
    if (len < kDecayCells * cell) short_to = f, short_from = short_from > 0 ? short_from : f;
  }
  if (shortest >= kDecayCells * cell) return 0;
  std::cout << fmt::format(
      "    warning: the {} decays by 1/e in under {:g} cells over {:.4f}-{:.4f} GHz of the band "
      "{:.4f}-{:.4f} GHz (shortest {:.4g} um = {:.2f} cells, at {:.4f} GHz)\n",
      what, kDecayCells, short_from / 1e9, short_to / 1e9, b.from / 1e9, b.to / 1e9, shortest * 1e6, shortest / cell,
      f_at / 1e9);
  return 1;
}

}  // namespace

std::array<bool, 2> uniform_axes(const Scene& s) {
  std::array<bool, 2> u{s.grid.bx == Boundary::periodic, s.grid.by == Boundary::periodic};
  for (int a = 0; a < 2; ++a) {
    if (!u[a]) continue;
    for (const Source& src : s.sources) {  // a plane wave across axis a: travelling along the other
      const double along = a == 0 ? std::cos(src.angle) : std::sin(src.angle);
      if (src.kind != Source::Kind::plane || std::abs(along) > 1e-12) u[a] = false;
    }
    const double d[2] = {s.grid.dx, s.grid.dy};
    const long n[2] = {std::lround(s.grid.extent.x / d[0]), std::lround(s.grid.extent.y / d[1])};
    auto at = [&](long i, long j) {  // cell (i along x, j along y) of the extent (internal coordinates)
      return medium_at(s, {(i + 0.5) * d[0], (j + 0.5) * d[1]});
    };
    for (long i = 0; i < n[1 - a] && u[a]; ++i)  // every line along axis a holds one medium
      for (long j = 1; j < n[a] && u[a]; ++j)
        if (a == 0 ? at(0, i) != at(j, i) : at(i, 0) != at(i, j)) u[a] = false;
  }
  return u;
}

int report_source_resolution(const Scene& s, const Source& src, const std::array<bool, 2>& uniform) {
  int warnings = 0;
  const auto band = checked_band(src);  // plain names: clang 14 (tools/fuzz.sh) captures no structured binding
  const double f0 = band.first, f1 = band.second;
  const double cell[2] = {s.grid.dx, s.grid.dy};
  std::cout << fmt::format("  source {} (line {}): band {:.4g}-{:.4g} THz; cells per wavelength along each axis{}\n",
                           &src - s.sources.data() + 1, src.where.line, f0 / 1e12, f1 / 1e12,
                           uniform[0] || uniform[1] ? " (an axis along which nothing varies is not counted)" : "");
  auto line = [&](const std::string& name, auto&& count, double need, const std::string& why) {
    std::string text = fmt::format("    {:<20s}", name), under;
    for (int a = 0; a < 2; ++a) {
      if (uniform[a]) {
        text += fmt::format(" {}: uniform", kAxis[a]);
        continue;
      }
      const Shortest sh = count(cell[a]);
      text += fmt::format(" {}: {:6.1f}{}", kAxis[a], sh.cpw,
                          sh.f > 0 ? fmt::format(" (at {:.4g} THz, {})", sh.f / 1e12, wave_name(sh.wave)) : "");
      if (sh.cpw < need) under += under.empty() ? kAxis[a] : std::string(" and ") + kAxis[a];
    }
    if (!under.empty()) {
      text += fmt::format("  <- warning: under {:g} along {}{}", need, under, why);
      ++warnings;
    }
    std::cout << text << "\n";
  };
  line(
      "vacuum",
      [&](double c) {
        return Shortest{constants::c0 / f1 / c, 0, 0};
      },
      kCellsPerWavelength, ", expect visible dispersion error");
  for (const Medium& m : s.media) {
    if (m.perfect_conductor) continue;
    if (!m.magnet) {
      const double eps = *std::max_element(m.permittivity.begin(), m.permittivity.end());
      line(
          m.name,
          [&](double c) {
            return Shortest{constants::c0 / (f1 * std::sqrt(eps)) / c, 0, 0};
          },
          kCellsPerWavelength, ", expect visible dispersion error");
      continue;
    }
    const MagnetModel M(*m.magnet, s.bias);
    const MagneticState st = choose_state(*m.magnet, s.bias).state;
    line(
        m.name + " (n(f))", [&](double c) { return shortest_wave(m, &M, &st, f0, f1, c); }, kMagneticCellsPerWavelength,
        " in a magnet (near a pole of mu_V, 22 gave R off by 0.03)");
  }
  return warnings;
}

int report_total_reflection(const Scene& s, const Source& src, const std::array<bool, 2>& uniform) {
  if (src.kind == Source::Kind::point) return 0;
  auto index = [&](int m) {  // vacuum -1; magnets and conductors are left to their own reports
    if (m < 0) return 1.0;
    const Medium& med = s.media[m];
    if (med.perfect_conductor || med.magnet) return 0.0;
    return std::sqrt(*std::max_element(med.permittivity.begin(), med.permittivity.end()));
  };
  // where the wave starts: the beam's focus, or the middle of the plane wave's launch line
  const Vec2 from = src.kind == Source::Kind::beam ? src.focus
                    : src.line_axis == 'x'         ? Vec2{src.line_at, 0.5 * s.grid.extent.y}
                                                   : Vec2{0.5 * s.grid.extent.x, src.line_at};
  const double n1 = index(medium_at(s, from));
  const double f = source_band(src).hi, cell[2] = {s.grid.dx, s.grid.dy};
  const double dir[2] = {std::cos(src.angle), std::sin(src.angle)};
  // the media the grid holds (-1: vacuum), by their cells
  std::vector<bool> present(s.media.size() + 1, false);
  const long nx = std::lround(s.grid.extent.x / cell[0]), ny = std::lround(s.grid.extent.y / cell[1]);
  for (long j = 0; j < ny; ++j)
    for (long i = 0; i < nx; ++i) present[medium_at(s, {(i + 0.5) * cell[0], (j + 0.5) * cell[1]}) + 1] = true;
  int warnings = 0;
  for (int a = 0; a < 2; ++a) {
    if (uniform[a]) continue;
    const double kt = n1 * std::abs(dir[1 - a]);  // tangential wavenumber on a face normal to a, units of k0
    int lowest = -2;                              // the medium of lowest index: the shortest decay
    for (int m = -1; m < static_cast<int>(s.media.size()); ++m)
      if (present[m + 1] && index(m) > 0 && kt > index(m) && (lowest < -1 || index(m) < index(lowest))) lowest = m;
    if (lowest < -1) continue;
    const double n2 = index(lowest);
    const double len = constants::c0 / (2 * constants::pi * f * std::sqrt(kt * kt - n2 * n2));
    if (len >= kDecayCells * cell[a]) continue;
    std::cout << fmt::format(
        "    warning: where it is totally reflected on a face normal to {} (n {:.4g} to {}, n "
        "{:.4g}), the field beyond decays by 1/e in {:.4g} um = {:.2f} cells: under {:g}\n",
        kAxis[a], n1, lowest < 0 ? std::string("vacuum") : "'" + s.media[lowest].name + "'", n2, len * 1e6,
        len / cell[a], kDecayCells);
    ++warnings;
  }
  return warnings;
}

int report_magnet_waves(const Scene& s, const Medium& med, const MagnetModel& M, const MagneticState& st, double lo,
                        double hi, double f_lo, double f_hi, const std::array<bool, 2>& uniform) {
  int warnings = 0;
  const int samples = 20000;
  const double floor = 1e-3 * lo, ceiling = 4 * hi;
  auto at = [&](double f) { return tensors_at(med, &M, &st, f); };
  // the off-diagonal elements that are there at all (bias along z: only mu_xy, mu_yx)
  const char* names[3] = {"x", "y", "z"};
  double big[3][3] = {};
  for (int q = 0; q <= 200; ++q) {
    const Mat3c mu = at(lo + (hi - lo) * q / 200).mu;
    for (int a = 0; a < 3; ++a)
      for (int b = 0; b < 3; ++b) big[a][b] = std::max(big[a][b], std::abs(mu(a, b)));
  }
  std::string off;
  for (int a = 0; a < 3; ++a)
    for (int b = a + 1; b < 3; ++b)
      if (big[a][b] + big[b][a] > 1e-9 * (big[a][a] + big[b][b]))
        off += fmt::format("{}mu_{}{}", off.empty() ? "" : ", ", names[a], names[b]);
  std::cout << "      off-diagonal elements: " << (off.empty() ? "none" : off) << "\n";
  const double run_res = 1.0 / s.time.stop;
  std::vector<Band> resolved;  // bands already found too narrow for the run
  const double cell[2] = {s.grid.dx, s.grid.dy};
  for (int a = 0; a < 2; ++a) {
    const int t = 1 - a;
    bool coupled = false;
    for (int q = 0; q <= 200 && !coupled; ++q) {
      const Tensors x = at(lo + (hi - lo) * q / 200);
      coupled = normal_modes(x.eps, x.mu, a).coupled;
    }
    std::cout << fmt::format("      interface normal {} (waves along {}):{}\n", kAxis[a], kAxis[a],
                             coupled
                                 ? fmt::format(" the Ez and Hz waves are coupled (mu_{0}z or mu_{1}z: a bias or moment "
                                               "with a part in the plane; along {1}: the Faraday geometry)",
                                               names[t], names[a])
                                 : "");
    for (int w = 0; w < 2; ++w) {
      const auto n2 = [&, w](double f) {
        const Tensors x = at(f);
        return normal_modes(x.eps, x.mu, a).n2[w];
      };
      const std::vector<Band> bands =
          whole_negative_bands([&](double f) { return n2(f).real(); }, lo, hi, samples, floor, ceiling);
      const std::string what =
          coupled ? fmt::format("{} (eigenvalue of -J P J M)", wave_name(2 + w))
          : w == 0
              ? fmt::format("Ez wave, eps_zz mu_V (mu_V = mu_{0}{0} - mu_{0}{1} mu_{1}{0} / mu_{1}{1})", names[t],
                            names[a])
              : fmt::format("Hz wave, eps'_{0}{0} mu'_zz (mu'_zz = mu_zz - mu_z{1} mu_{1}z / mu_{1}{1}, eps' likewise)",
                            names[t], names[a]);
      std::cout << fmt::format("        {} < 0: {}\n", what, band_list(bands));
      for (const Band& b : bands) {
        const double x0 = std::max(b.from, f_lo), x1 = std::min(b.to, f_hi);
        if (!(x1 > x0) || uniform[a]) continue;  // outside the sources' band, or no wave along a
        const bool told = std::any_of(resolved.begin(), resolved.end(), [&](const Band& r) {
          return std::abs(r.from - b.from) < 1e-9 * b.to && std::abs(r.to - b.to) < 1e-9 * b.to;
        });
        if (!told && run_res > 0.5 * (b.to - b.from)) {  // the same band of another wave is told once
          resolved.push_back(b);
          std::cout << fmt::format(
              "    warning: the run resolves {:.3g} GHz, coarser than half the band "
              "{:.4f}-{:.4f} GHz of the {} along {}; run longer\n",
              run_res / 1e9, b.from / 1e9, b.to / 1e9, wave_name(coupled ? 2 + w : w), kAxis[a]);
          ++warnings;
        }
        warnings +=
            warn_decay(n2, b, x0, x1, cell[a], fmt::format("{} along {}", wave_name(coupled ? 2 + w : w), kAxis[a]));
      }
    }
  }
  return warnings;
}

}  // namespace ty
