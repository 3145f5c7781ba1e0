/// \file validation_memory.cpp
/// \brief The memory a run of a scene will hold at its peak, from the Scene alone, by the
/// solver's own allocations (solver/simulation.cpp and the rooms it builds, the recorders,
/// io/run/run_folder.cpp's closing datasets): what is held through the run, what only the
/// construction holds (the dispersive nodes' and magnetic cells' build lists), and what only the end holds
/// (the results converted for writing). The peak is the held part plus the larger of the
/// two passing ones; docs/runs.md has the measured peaks beside these estimates.
#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <fstream>

#include "io/scene/medium_lookup.h"
#include "io/scene/validation.h"

namespace ty {
namespace {

/// One magnetic cell's arrays in solver/media/magnetic_cells.h: its list entry, three ints
/// (indices, medium; with the slack of arrays grown by push_back), on every MPI rank; and its
/// state, four neighbours' indices, two copies of two sublattices' moments (12 doubles) and two
/// copies of the change of mu0 M_y (2 doubles), resident only on the rank that steps it.
constexpr double kMagneticListBytes = 1.5 * 3 * 4, kMagneticStateBytes = 4 * 4 + 14 * 8;
/// What the HDF5 library holds per snapshot frame view written at the end (a virtual
/// dataset over one frame of a series and its attributes, for fields.xmf): measured, 20-21
/// kB a view from 100 to 1600 views (mnf2-mirror.yaml with snapshots every 40 to 2.5 ps).
constexpr double kFrameViewBytes = 21e3;
/// A dispersive E node (solver/media/dispersive_cells.h): index, component, correction and
/// first pole, and per pole its coefficients, on every MPI rank; its state (E before the step,
/// per pole P and its rate) resident only on the rank that steps it.
constexpr double kDispersiveNodeBytes = 24, kDispersivePoleBytes = 48;
constexpr double kDispersiveNodeStateBytes = 8, kDispersivePoleStateBytes = 16;
/// While the media are built each node is a DispersiveNode with its own pole vector (a heap
/// block of its own).
constexpr double kDispersiveBuildNodeBytes = 96, kDispersiveBuildPoleBytes = 40;
/// A point stencil (sampling.h) of one component: four weights and four indices.
constexpr double kStencilBytes = 4 * 8 + 4 * 8 + 16;

/// Cells a region (or the extent) covers at a stride, as the recorders count them.
double region_cells(const Scene& s, const Output& o) {
  const Vec2 size = o.region.given ? o.region.size : s.grid.extent;
  return (std::floor(size.x / s.grid.dx / o.stride) + 1) * (std::floor(size.y / s.grid.dy / o.stride) + 1);
}

/// Cells of the whole grid (absorber included) whose medium satisfies `pick`: counted cell
/// by cell where the grid is small enough to count quickly, else the bodies' bounding boxes
/// (an upper bound).
template <class Pick>
double cells_of(const Scene& s, const RunSizes& z, Pick&& pick) {
  const GridSpec& G = s.grid;
  if (z.nx * z.ny <= 1e6) {
    double n = 0;
    for (long j = 0; j < static_cast<long>(z.ny); ++j)
      for (long i = 0; i < static_cast<long>(z.nx); ++i) {
        const int m = medium_at(s, {(i - z.npml_x + 0.5) * G.dx, (j - z.npml_y + 0.5) * G.dy});
        if (m >= 0 && pick(s.media[m])) ++n;
      }
    return n;
  }
  double n = 0;
  for (const auto& b : s.bodies) {
    if (!pick(s.media[b.medium])) continue;
    Vec2 lo, hi;
    b.shape.bounds(lo, hi);
    const double wx = std::clamp(hi.x, -z.npml_x * G.dx, G.extent.x + z.npml_x * G.dx) -
                      std::clamp(lo.x, -z.npml_x * G.dx, G.extent.x + z.npml_x * G.dx);
    const double wy = std::clamp(hi.y, -z.npml_y * G.dy, G.extent.y + z.npml_y * G.dy) -
                      std::clamp(lo.y, -z.npml_y * G.dy, G.extent.y + z.npml_y * G.dy);
    n += (std::ceil(wx / G.dx) + 1) * (std::ceil(wy / G.dy) + 1);
  }
  return std::min(n, z.nx * z.ny);
}

void add_media(const Scene& s, RunSizes& z) {
  const double real = s.time.precision == Precision::single ? 4 : 8;
  const double cells = z.nx * z.ny;
  // six components on rows padded to a cache line, a ghost row above and below (yee_grid.cpp)
  const double align = 64 / real, stride = std::ceil((align + z.nx + 1) / align) * align;
  const double fields = 6 * stride * (z.ny + 2) * real;
  // the CPML's four auxiliary fields and two coefficients per node on each axis's strips
  const double cpml = 6 * (2 * (z.npml_x + 1) * z.ny + 2 * (z.npml_y + 1) * z.nx) * real;
  // the medium of each cell of the extent, an int each
  const double map = 4 * std::round(s.grid.extent.x / s.grid.dx) * std::round(s.grid.extent.y / s.grid.dy);
  // per row: its fused span (columns and E's k, row_fusion.cpp) and its coefficient runs' first index
  const double rows = z.ny * (8 + 2 * real + 3 * 4);
  z.memory.push_back({"fields and absorber", fields + cpml + rows, s.grid.where});
  z.memory.push_back({"medium map", map, s.grid.where});  // over ranks rank 0's alone
  // while the media are built (row by row, coefficient_runs.cpp): each thread's row of ca and cb,
  // a run per coefficient change; with rotated in-plane media, four bytes a node (which nodes
  // sample them, and the tensor list's marks)
  const bool rotated = std::any_of(s.media.begin(), s.media.end(), [](const Medium& m) { return m.rotated_in_plane(); });
  if (rotated)
    z.memory.push_back({"rotated media's marks while built", 4 * cells, s.grid.where, MemoryItem::Phase::build});
  double poles = 0;
  for (const auto& m : s.media)
    if (m.tensor && m.tensor->dispersive())
      for (const auto& a : m.tensor->axis) poles = std::max(poles, double(a.lorentz.size() + a.drude.size()));
  if (poles > 0) {
    const double n = 3 * cells_of(s, z, [](const Medium& m) { return m.tensor && m.tensor->dispersive(); });
    z.memory.push_back(
        {"dispersive nodes", n * (kDispersiveNodeBytes + poles * kDispersivePoleBytes), s.media.front().where});
    z.memory.push_back({"dispersive nodes' state", n * (kDispersiveNodeStateBytes + poles * kDispersivePoleStateBytes),
                        s.media.front().where});
    z.memory.push_back({"dispersive nodes while built", n * (kDispersiveBuildNodeBytes + poles * kDispersiveBuildPoleBytes),
                        s.media.front().where, MemoryItem::Phase::build});
  }
}

void add_magnets(const Scene& s, RunSizes& z) {
  const double cells = cells_of(s, z, [](const Medium& m) { return m.magnet.has_value(); });
  if (cells == 0) return;
  // the list (found cell by cell while built: no grid-sized array) and the cells' state
  z.memory.push_back({"magnetic cells", cells * kMagneticListBytes, s.media.front().where});
  z.memory.push_back({"magnetic cells' state", cells * kMagneticStateBytes, s.media.front().where});
}

void add_recorders(const Scene& s, RunSizes& z) {
  using Phase = MemoryItem::Phase;
  const double real = s.time.precision == Precision::single ? 4 : 8;
  double series = 0;  // the longest probe's conversion at the end: its time axis, one field and six components
  for (const auto& o : s.outputs) {
    const std::string name = fmt::format("'{}'", o.name);
    switch (o.kind) {
      case Output::Kind::probe: {  // six wave components every step, and each magnetic field
        double magnetic = 0;
        for (const auto& f : o.fields) magnetic += f[0] == 'M' || f[0] == 'L' || f[0] == 'd' ? 1 : 0;
        z.memory.push_back({"probe " + name, z.steps * (6 + magnetic) * 8, o.where});
        series = std::max(series, z.steps * 8 * 8);
        break;
      }
      case Output::Kind::power_spectrum: {  // six complex running sums per point and frequency
        const double len = std::hypot(o.to.x - o.from.x, o.to.y - o.from.y);
        const double points = std::max(1.0, std::ceil(len / std::min(s.grid.dx, s.grid.dy))) + 1;
        z.memory.push_back(
            {"power spectrum " + name, o.count * points * 6 * 16 + points * 6 * (8 + kStencilBytes), o.where});
        // written at the end: their real and imaginary parts, doubles
        z.memory.push_back({"power spectrum " + name + " written", o.count * points * 6 * 16, o.where, Phase::finish});
        break;
      }
      case Output::Kind::spectral_map: {
        const double nodes = region_cells(s, o), nf = o.frequencies.size();
        z.memory.push_back({"spectral map " + name, nf * nodes * 6 * 16 + nodes * (6 * 8 + 16), o.where});
        z.memory.push_back({"spectral map " + name + " written", nf * nodes * 16, o.where, Phase::finish});
        break;
      }
      case Output::Kind::snapshots: {  // a frame's buffer, E kept for the Poynting fields, the plan
        const double nodes = region_cells(s, o);
        double poynting = 0;
        for (const auto& f : o.fields) poynting += f[0] == 'S' ? 1 : 0;
        const double frames = std::min(z.steps, std::floor(s.time.stop / o.every) + 1);
        z.memory.push_back({"snapshots " + name, nodes * (real + poynting * 3 * 8) + frames * 16, o.where});
        z.memory.push_back({"snapshot frame views (fields.xmf) written", frames * o.fields.size() * kFrameViewBytes, o.where,
                            Phase::finish});
        break;
      }
    }
  }
  for (const auto& o : s.outputs)
    if (o.kind == Output::Kind::probe) {  // one probe's series at a time
      z.memory.push_back({"probe series converted for writing", series, o.where, Phase::finish});
      break;
    }
}

}  // namespace

double RunSizes::memory_bytes() const {
  double held = 0, build = 0, finish = 0;
  for (const auto& m : memory)
    (m.phase == MemoryItem::Phase::held ? held : m.phase == MemoryItem::Phase::build ? build : finish) += m.bytes;
  return held + std::max(build, finish);
}

void add_memory(const Scene& s, RunSizes& z) {
  add_media(s, z);
  add_magnets(s, z);
  if (s.grid.bx == Boundary::bloch) {  // the sine copy (solver/grid/boundaries/bloch.h): a second grid and its media
    const size_t n = z.memory.size();
    for (size_t k = 0; k < n; ++k) {
      MemoryItem copy = z.memory[k];
      copy.what += " (the Bloch sides' sine copy)";
      z.memory.push_back(copy);
    }
  }
  add_recorders(s, z);
}

double machine_memory_bytes() {
  double bytes = static_cast<double>(sysconf(_SC_PHYS_PAGES)) * static_cast<double>(sysconf(_SC_PAGE_SIZE));
  for (const char* path : {"/sys/fs/cgroup/memory.max", "/sys/fs/cgroup/memory/memory.limit_in_bytes"}) {
    std::ifstream in(path);
    double limit = 0;
    if (in >> limit && limit > 0) bytes = std::min(bytes, limit);  // "max" reads as no number
  }
  return bytes;
}

double resident_bytes() {
  std::ifstream in("/proc/self/statm");
  double pages = 0, resident = 0;
  if (!(in >> pages >> resident)) return 0;
  return resident * static_cast<double>(sysconf(_SC_PAGE_SIZE));
}

}  // namespace ty
