/// \file check_command.cpp
/// \brief `terayee check SCENE`: validates a scene and prints what a run would be: cells,
/// time step, steps, memory at the peak (every allocation that grows with the scene, and
/// this program's own), resolution of each medium at each source's band, and the run time
/// from a short timing of the scene's own simulation on this machine (run_estimate.h).
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <iostream>

#include "io/scene/medium_lookup.h"
#include "io/scene/scene_reader.h"
#include "io/scene/units.h"
#include "io/scene/validation.h"
#include "materials/dielectric.h"
#include "materials/crystals/temperature.h"
#include "materials/magnetic/linear_response.h"
#include "materials/magnetic/domain_state.h"
#include "materials/permittivity/permittivity.h"
#include "solver/grid/yee_grid.h"
#include "solver/stop_rule.h"
#include "tools/check_waves.h"
#include "tools/commands.h"
#include "tools/medium_jones.h"
#include "tools/run_estimate.h"

namespace ty {
namespace {

double clean(double v) { return std::abs(v) < 1e-12 ? 0.0 : v; }
/// For a fixed-point print with six decimals: what would print as -0.000000 is zero.
double clean6(double v) { return std::abs(v) < 5e-7 ? 0.0 : v; }

std::string direction(const Vec3& m) {
  const double theta = std::acos(std::clamp(m.z(), -1.0, 1.0)) * 180 / constants::pi;
  const double phi = clean6(std::atan2(m.y(), m.x()) * 180 / constants::pi);
  const std::string v = fmt::format("({:+.6f}, {:+.6f}, {:+.6f})", clean6(m.x()), clean6(m.y()), clean6(m.z()));
  if (std::hypot(m.x(), m.y()) < 1e-9) return fmt::format("{} = polar {:.4f} deg", v, theta);
  return fmt::format("{} = polar {:.4f} deg, azimuth {:.4f} deg", v, theta, phi);
}

std::string band_list(const std::vector<Band>& bands) {
  if (bands.empty()) return "none";
  std::string out;
  for (const auto& b : bands) out += fmt::format("{}{:.4f}-{:.4f} GHz", out.empty() ? "" : ", ", b.from / 1e9, b.to / 1e9);
  return out;
}

/// The state each body of magnetic medium k starts from: the medium's, or its own (an
/// antiferromagnetic domain: `order`, `state` on the body; materials/magnetic/domain_state.h).
void report_bodies(const Scene& s, size_t k, const MagnetModel& M) {
  for (size_t b = 0; b < s.bodies.size(); ++b) {
    const Body& body = s.bodies[b];
    if (body.medium != static_cast<int>(k)) continue;
    if (!body.magnetic.given()) {
      std::cout << fmt::format("    body {} (line {}): the medium's state\n", b + 1, body.where.line);
      continue;
    }
    const ChosenState own = choose_body_state(*s.media[k].magnet, body.magnetic, s.bias);
    std::cout << fmt::format("    body {} (line {}): its own state, {}\n", b + 1, body.where.line, own.how);
    for (int q = 0; q < M.n; ++q) std::cout << fmt::format("      sublattice {}: {}\n", q + 1, direction(own.state.m[q]));
    const Vec3 net = M.net(own.state.m);
    std::cout << fmt::format("      net moment mu0*M = ({:.6g}, {:.6g}, {:.6g}) T\n", clean(net.x()), clean(net.y()),
                             clean(net.z()));
  }
}

/// A medium's temperature: how its values were scaled, and the damping its linewidth table set.
void report_thermal(const Medium& med, const MagnetModel& M) {
  if (const Thermal& th = med.magnet->thermal; th.active()) {
    const ThermalScale t = thermal_scale(th);
    std::cout << fmt::format("    {} at {:g} K (values given at {:g} K): mu0*Ms x {:.4f}, exchange and DM fields "
                             "x {:.4f}, anisotropy fields x {:.4f}\n",
                             med.crystal.empty() ? "thermal data" : med.crystal, th.temperature, th.reference,
                             t.magnetization, t.magnetization, t.anisotropy);
    if (!th.linewidth.empty())
      std::cout << fmt::format("    damping {:.4g} at {:g} K: the zero-field line's width there, {:.4g} GHz, from the "
                               "linewidth table ({} points, {:g}-{:g} K)\n",
                               M.alpha[0], th.temperature, thermal_linewidth(th) / 1e9, th.linewidth.size(),
                               th.linewidth.front()[0], th.linewidth.back()[0]);
  }
}

/// Ground state, resonances and negative-permeability bands of each magnetic medium;
/// returns the number of warnings.
int report_magnets(const Scene& s, double f_lo, double f_hi, const std::array<bool, 2>& uniform) {
  int warnings = 0;
  for (size_t k = 0; k < s.media.size(); ++k) {
    const Medium& med = s.media[k];
    if (!med.magnet) continue;
    const MagnetModel M(*med.magnet, s.bias);
    const GroundStates gs = find_ground_states(M);
    const ChosenState chosen = choose_state(*med.magnet, s.bias);
    const MagneticState& st0 = chosen.state;
    std::cout << fmt::format("  magnetic medium '{}' ({} sublattice{}), bias [{}, {}, {}] T:\n", med.name, M.n,
                             M.n == 1 ? "" : "s", s.bias[0], s.bias[1], s.bias[2]);
    report_thermal(med, M);
    const auto all = listed_states(gs);
    std::cout << "    states under this bias (choose one with 'state: N' in the magnet block):\n";
    for (size_t q = 0; q < all.size(); ++q)
      std::cout << fmt::format("      {}: {}, {}\n", q + 1, all[q].kind,
                               q == 0                         ? std::string("lowest")
                               : q <= gs.degenerate.size()    ? std::string("degenerate with 1 (another branch)")
                                                              : fmt::format("metastable, {:.6g} T^2 above (mu0 x energy "
                                                                            "density)",
                                                                            all[q].energy - gs.ground.energy));
    std::cout << fmt::format("    starts in: {}{}\n", chosen.how,
                             st0.soft ? " (degenerate: the state is chosen deterministically, see docs/magnets.md)" : "");
    for (int q = 0; q < M.n; ++q) std::cout << fmt::format("      sublattice {}: {}\n", q + 1, direction(st0.m[q]));
    const Vec3 net = M.net(st0.m);
    std::cout << fmt::format("      net moment mu0*M = ({:.6g}, {:.6g}, {:.6g}) T\n", clean(net.x()), clean(net.y()),
                             clean(net.z()));
    report_bodies(s, k, M);
    if (std::hypot(net.x(), net.y()) > 1e-9) {
      std::cout << "    warning: the ground state has a net moment in the plane; the static field inside a body would "
                   "differ from the bias (terayee does not solve static demagnetization)\n";
      ++warnings;
    }
    std::vector<double> f;  // distinct lines (degenerate pairs listed once)
    std::string fl;
    const std::vector<DampedMode> modes = damped_modes(M, st0);
    for (double x : resonances(M, st0)) {
      if (!f.empty() && std::abs(x / f.back() - 1) < 1e-9) {
        fl += " (twice)";
        continue;
      }
      f.push_back(x);
      fl += fmt::format("{}{:.4f} GHz", fl.empty() ? "" : ", ", x / 1e9);
      // the ring-down of the damped mode nearest this line: a guess for a pulsed run's `stop`
      const DampedMode* near = nullptr;
      for (const auto& m : modes)
        if (!near || std::abs(m.frequency - x) < std::abs(near->frequency - x)) near = &m;
      if (near && near->decay > 0) fl += fmt::format(" (rings down by 1/e in {:.3g} s)", 1.0 / near->decay);
    }
    std::cout << "    resonances: " << (fl.empty() ? "none" : fl) << "\n";
    if (!f.empty())
      std::cout << "      (a pulsed run that should hold its lines needs several ring-downs; 'stop: auto' decides by itself)\n";
    double lo = f_lo, hi = f_hi;
    if (!f.empty()) lo = std::min(lo, 0.8 * f.front()), hi = std::max(hi, 1.2 * f.back());
    if (!(hi > lo)) continue;
    auto component = [&](int a, int b) {
      return [&, a, b](double x) {
        const Mat3c mu = Mat3c::Identity() + susceptibility(M, st0, 2 * constants::pi * x);
        return mu(a, b).real();
      };
    };
    const int samples = 20000;
    std::cout << fmt::format("    negative bands over {:.4f}-{:.4f} GHz (real parts; a band reaching the scan's edge is "
                             "followed to its end):\n",
                             lo / 1e9, hi / 1e9);
    const char* names[3] = {"mu_xx", "mu_yy", "mu_zz"};
    for (int a = 0; a < 3; ++a)
      std::cout << fmt::format("      {}: {}\n", names[a],
                               band_list(whole_negative_bands(component(a, a), lo, hi, samples, 1e-3 * lo, 4 * hi)));
    warnings += report_magnet_waves(s, med, M, st0, lo, hi, f_lo, f_hi, uniform);
  }
  return warnings;
}

/// Each dispersive medium: per principal axis its oscillators' TO-LO (reststrahlen) bands and
/// plasma frequencies, and the fewest cells per wavelength over the sources' band, where
/// |eps(omega)| is largest (near a TO line the polariton's wavelength is short).
int report_dispersion(const Scene& s, double f_lo, double f_hi, double cell) {
  int warnings = 0;
  for (const auto& med : s.media) {
    if (!med.tensor || !med.tensor->dispersive()) continue;
    std::cout << fmt::format("  dispersive medium '{}' (axes u, v at {:.4g} deg from x, and z):\n", med.name,
                             med.tensor->rotate * 180 / constants::pi);
    const char* names[3] = {"u", "v", "z"};
    for (int a = 0; a < 3; ++a) {
      const PermittivityModel& m = med.tensor->axis[a];
      std::string line = fmt::format("    {}: background {:g}", names[a], m.eps_inf);
      for (const auto& t : m.lorentz)
        line += fmt::format("; TO {:.4g} THz, LO {:.4g} THz", t.f_to / 1e12, lo_frequency(m, t) / 1e12);
      for (const auto& t : m.drude) line += fmt::format("; plasma {:.4g} THz", t.plasma / 1e12);
      std::cout << line << "\n";
    }
    if (!(f_hi > f_lo)) continue;
    double n_max = 1, f_at = f_lo;
    for (int q = 0; q <= 400; ++q) {
      const double f = f_lo + (f_hi - f_lo) * q / 400.0;
      const Mat3c e = medium_permittivity(med, 2 * constants::pi * f);
      for (int c = 0; c < 3; ++c)
        if (std::sqrt(std::abs(e(c, c))) > n_max) n_max = std::sqrt(std::abs(e(c, c))), f_at = f;
    }
    const double cpw = constants::c0 / (f_at * n_max) / cell;
    std::cout << fmt::format("    largest |n| in the sources' band: {:.3g} at {:.4g} THz, {:.1f} cells per wavelength{}\n",
                             n_max, f_at / 1e12, cpw, cpw < 10 ? "  <- warning: under 10" : "");
    if (cpw < 10) ++warnings;
  }
  return warnings;
}

std::string format_duration(double s) {
  if (s < 120) return fmt::format("{:.3g} s", s);
  if (s < 7200) return fmt::format("{:.3g} min", s / 60);
  return fmt::format("{:.3g} h", s / 3600);
}

/// The memory estimate's parts: what the run holds throughout, and the passing parts of its
/// construction and of its closing write (the peak takes the larger).
void print_memory(const RunSizes& z, double base) {
  const char* when[3] = {"", ", while the simulation is built", ", while the results are written"};
  std::cout << fmt::format("    this program (code and libraries): {:.1f} MB\n", base / 1e6);
  for (const auto& m : z.memory)
    if (m.bytes >= 0.1e6)
      std::cout << fmt::format("    {}: {:.1f} MB{}\n", m.what, m.bytes / 1e6, when[static_cast<int>(m.phase)]);
}

}  // namespace

int check_command(const std::string& path, const std::vector<std::string>& sets, int threads) {
  Scene s = read_scene(path, sets);
  const std::vector<std::string> found = validate_scene(s, machine_memory_bytes());  // before anything is sized
  s.warnings.insert(s.warnings.end(), found.begin(), found.end());
  const GridSpec& G = s.grid;
  const YeeGrid g = grid_for(s, 8);
  const int npx = g.npml_x, npy = g.npml_y, ex = g.nx - 2 * npx, ey = g.ny - 2 * npy;
  const long nx = g.nx, ny = g.ny;
  const double dt = g.dt;
  const long steps = steps_for(s, g);
  const size_t real = s.time.precision == Precision::single ? 4 : 8;
  const double base = resident_bytes();  // this program's code and libraries, as a run's
  const RunSizes sizes = run_sizes(s);
  const double mem = base + sizes.memory_bytes();
  std::cout << fmt::format("scene: {}\n", s.title.empty() ? path : s.title);
  std::cout << fmt::format("  grid: {} x {} cells of {:.4g} x {:.4g} um ({} x {} in the extent; boundaries x {}, y {})\n",
                           nx, ny, G.dx * 1e6, G.dy * 1e6, ex, ey, boundary_name(G.bx), boundary_name(G.by));
  std::cout << fmt::format("  time: step {:.5g} fs (step-fraction {}), {} steps to {:.5g} ps\n", dt * 1e15, s.time.step_fraction,
                           steps, s.time.stop * 1e12);
  if (s.time.auto_stop.on) {
    const StopPlan p = plan_stop(s, dt, steps);
    std::cout << fmt::format("  stop: auto ({}), looked at every {} steps ({:.4g} ps); the limit, {} steps ({:.5g} ps), "
                             "is rounded down to whole checks\n",
                             p.cw ? "cw: when two blocks of the spectra agree within the tolerance"
                                  : "pulsed: when the energy and the spectra have settled",
                             p.check, p.check * dt * 1e12, p.total, p.total * dt * 1e12);
  }
  std::cout << fmt::format("  memory: about {:.1f} MB at the peak ({} precision):\n", mem / 1e6,
                           real == 4 ? "single" : "double");
  print_memory(sizes, base);
  int warnings = 0;
  for (const auto& w : s.warnings) {
    std::cout << "  warning: " << w << "\n";
    ++warnings;
  }
  // resolution: cells per wavelength along each axis, each medium with its own index over each source's band
  const std::array<bool, 2> uniform = uniform_axes(s);
  for (const Source& src : s.sources) {
    warnings += report_source_resolution(s, src, uniform);
    warnings += report_total_reflection(s, src, uniform);
    if (src.kind == Source::Kind::beam && src.waist < 2 * constants::c0 / src.frequency)
      std::cout << "    note: the waist is under two wavelengths; the beam is far from paraxial\n";
  }
  double f_lo = 1e300, f_hi = 0;
  for (const auto& src : s.sources) {
    const Band2 b = source_band(src);
    f_lo = std::min(f_lo, std::max(b.lo, 0.01 * src.frequency)), f_hi = std::max(f_hi, b.hi);
  }
  warnings += report_magnets(s, f_lo, f_hi, uniform);
  report_scene_jones(s, f_lo, f_hi);  // Faraday and Kerr of a magnetic sample slab, as `medium --polarization`
  // the coarser counted axis (an axis along which nothing varies does not count)
  const double counted_cell = uniform[0] && uniform[1] ? 0.0
                              : uniform[0]             ? G.dy
                              : uniform[1]             ? G.dx
                                                       : std::max(G.dx, G.dy);
  if (counted_cell > 0) warnings += report_dispersion(s, f_lo, f_hi, counted_cell);
  // run time: the scene's own simulation timed briefly, times the run's counts (run_estimate.h)
  const double limit = machine_memory_bytes();
  const RunTimeEstimate est = estimate_run_time(s, threads, mem, std::min(2e9, 0.25 * limit));
  std::cout << fmt::format("  estimated run time: {} on {} thread{} ({}fastest of short repeats here):\n",
                           format_duration(est.total()), est.threads, est.threads == 1 ? "" : "s",
                           est.built ? "the scene's own simulation, " : "a cell-rate model (too large to build here), ");
  for (const auto& p : est.parts)
    if (p.seconds > 0) std::cout << fmt::format("    {}: {} ({})\n", p.what, format_duration(p.seconds), p.count);
  if (!est.blocking.empty()) std::cout << fmt::format("  block depth (run --block-depth auto): {}\n", est.blocking);
  std::cout << fmt::format("check passed with {} warning{}\n", warnings, warnings == 1 ? "" : "s");
  return 0;
}

}  // namespace ty
