/// \file check_command.cpp
/// \brief `terayee check SCENE`: validates a scene and prints what a run would be: cells,
/// time step, steps, memory, resolution of each medium at each source's band, and an
/// estimate of the run time from a short measurement on this machine.
#include <fmt/format.h>
#include <omp.h>

#include <algorithm>
#include <cmath>
#include <iostream>

#include "io/scene_reader.h"
#include "io/units.h"
#include "solver/yee_grid.h"
#include "tools/commands.h"

namespace ty {

int check_command(const std::string& path, const std::vector<std::string>& sets) {
  const Scene s = read_scene(path, sets);
  const GridSpec& G = s.grid;
  const int ex = static_cast<int>(std::lround(G.extent.x / G.dx)), ey = static_cast<int>(std::lround(G.extent.y / G.dy));
  const int npx = G.bx == Boundary::absorbing ? G.absorber.cells : 0, npy = G.by == Boundary::absorbing ? G.absorber.cells : 0;
  const long nx = ex + 2 * npx, ny = ey + 2 * npy;
  const double dt = s.time.courant * courant_limit_dt(G.dx, G.dy);
  const long steps = std::max(1L, static_cast<long>(std::ceil(s.time.stop / dt - 1e-9)));
  const size_t real = s.time.precision == Precision::single ? 4 : 8;
  const double mem = 6.0 * nx * ny * real + 6.0 * (2.0 * (npx + 1) * ny + 2.0 * (npy + 1) * nx) * real;
  std::cout << fmt::format("scene: {}\n", s.title.empty() ? path : s.title);
  std::cout << fmt::format("  grid: {} x {} cells of {:.4g} x {:.4g} um ({} x {} in the extent; boundaries x {}, y {})\n",
                           nx, ny, G.dx * 1e6, G.dy * 1e6, ex, ey, boundary_name(G.bx), boundary_name(G.by));
  std::cout << fmt::format("  time: step {:.5g} fs (courant {}), {} steps to {:.5g} ps\n", dt * 1e15, s.time.courant,
                           steps, s.time.stop * 1e12);
  std::cout << fmt::format("  memory: about {:.1f} MB of fields ({} precision)\n", mem / 1e6,
                           real == 4 ? "single" : "double");
  int warnings = 0;
  for (const auto& w : s.warnings) {
    std::cout << "  warning: " << w << "\n";
    ++warnings;
  }
  // resolution: cells per wavelength in each medium at each source's highest frequency
  std::vector<std::pair<std::string, double>> media{{"vacuum", 1.0}};
  for (const auto& m : s.media)
    if (!m.perfect_conductor) media.emplace_back(m.name, *std::max_element(m.permittivity.begin(), m.permittivity.end()));
  for (size_t k = 0; k < s.sources.size(); ++k) {
    const Source& src = s.sources[k];
    double f = src.frequency;
    if (src.waveform.kind == Waveform::Kind::pulse)
      f += std::sqrt(2.0 * std::log(100.0)) * 2.0 * std::sqrt(std::log(2.0)) / (2 * constants::pi * src.waveform.fwhm);
    if (src.waveform.kind == Waveform::Kind::chirp) f = std::max(src.waveform.from, src.waveform.to);
    std::cout << fmt::format("  source {} (line {}): band up to {:.4g} THz\n", k + 1, src.where.line, f / 1e12);
    for (const auto& [name, eps] : media) {
      const double cpw = constants::c0 / (f * std::sqrt(eps)) / std::max(G.dx, G.dy);
      std::cout << fmt::format("    {:<20s} {:6.1f} cells per wavelength{}\n", name, cpw,
                               cpw < 10 ? "  <- warning: under 10, expect visible dispersion error" : "");
      if (cpw < 10) ++warnings;
    }
    if (src.kind == Source::Kind::beam && src.waist < 2 * constants::c0 / src.frequency)
      std::cout << "    note: the waist is under two wavelengths; the beam is far from paraxial\n";
  }
  // run time from a short measurement of this machine's vacuum rate
  const int threads = s.time.threads > 0 ? s.time.threads : omp_get_max_threads();
  const double rate = measure_vacuum_rate(256, threads, real == 4, 0.1, 3);
  const double est = static_cast<double>(nx) * ny * steps / rate;
  std::cout << fmt::format("  estimated run time: {:.3g} s on {} threads (at {:.3g} cell-updates/s measured here)\n",
                           est, threads, rate);
  std::cout << fmt::format("check passed with {} warning{}\n", warnings, warnings == 1 ? "" : "s");
  return 0;
}

}  // namespace ty
