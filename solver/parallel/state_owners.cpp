/// \file state_owners.cpp
/// \brief Which elements of each state array (Simulation::visit_state) a rank owns over
/// ranks: those its own rows update (slabs.h), the same rows whose sums gather_sums() takes from
/// it. A checkpoint written by every rank together (io/run/checkpoint.cpp) has each rank
/// write exactly its parts, so the file holds the arrays a one-process run holds, whatever
/// the rank count, and a resume on any rank count reads them whole.
///
///   fields                rows [lo, hi), the ghost row -1 with the first rank and ny with the last
///   absorber x strips     [row][line]: rows [lo, hi)
///   absorber y strips     [line][column]: the lines whose row is in [lo, hi)
///   dispersive poles      the poles of the nodes of rows [lo, hi) (the list is sorted by row)
///   magnetic cells        the cells whose Hz node is in rows [lo, hi); the trailing zero of
///                         dM (entry count()) with rank 0
///   guard's work per row  rows [lo, hi)
///   sine/...              a Bloch pair's sine copy: its arrays as the cosine copy's
///   snapshots' kept E     the frame rows of rows [lo, hi) (each rank keeps only those: snapshots.h)
///   spectral maps         each frequency's points on the map rows in [lo, hi) (each rank sums only
///                         those: recorder_gather.cpp)
///   rotated tensors' list the same on every rank (slab_step.cpp steps it whole): rank 0
///   recorders, stop rule, clock: every rank holds the same values (recorder_gather.cpp gathers
///                         the nodes they read), so rank 0 writes them
/// A state array not named here has no owner over ranks: a logic error, so that new state
/// cannot be written wrong unnoticed.
#include <algorithm>
#include <stdexcept>

#include "solver/parallel/slabs.h"
#include "solver/simulation.h"

namespace ty {

template <class R>
std::vector<std::pair<std::size_t, std::size_t>> Simulation<R>::owned_parts(const std::string& name, std::size_t n,
                                                                            int r, int P, int widen) const {
  using Parts = std::vector<std::pair<std::size_t, std::size_t>>;
  if (n == 0) return {};
  if (P == 1) return {{0, n}};
  int lo, hi;  // rank r's rows
  parallel::slab_rows(g_.ny, r, P, lo, hi);
  const int ny = g_.ny, f0 = lo, f1 = hi;  // the snapshots' kept E: its own rows alone
  lo = std::max(0, lo - widen), hi = std::min(ny, hi + widen);
  const bool first = r == 0, last = r == P - 1, seam = widen > 0 && walls_.periodic_y;
  const auto in = [&](int j) { return j >= lo && j < hi; };
  const auto mine = [&](int j) { return in(j) || (seam && ((first && j >= ny - widen) || (last && j < widen))); };
  const auto starts = [&](const char* p) { return name.rfind(p, 0) == 0; };
  Parts parts;
  const auto add = [&parts](std::size_t a, std::size_t b) {  // adjacent parts merge
    if (!parts.empty() && parts.back().second == a) parts.back().second = b;
    else if (b > a) parts.emplace_back(a, b);
  };
  const auto rows = [&](std::size_t per_row) { return Parts{{lo * per_row, hi * per_row}}; };
  if (starts("sine/") && twin_) return twin_->owned_parts(name.substr(5), n, r, P, widen);  // a Bloch pair's sine copy
  if (starts("fields/"))
    return {{static_cast<std::size_t>(g_.row_begin(first ? -1 : lo)),
             static_cast<std::size_t>(g_.row_begin(last ? g_.ny + 1 : hi))}};
  if (starts("absorber/psi-") && name.back() == 'x') return rows(static_cast<std::size_t>(px_.count()));
  if (starts("absorber/psi-")) {
    for (int l = 0; l < py_.count(); ++l)
      if (mine(py_.lines[l])) add(static_cast<std::size_t>(l) * g_.nx, static_cast<std::size_t>(l + 1) * g_.nx);
    return parts;
  }
  if (name == "guard/injected-work") return rows(1);
  if (name == "media/polarization" || name == "media/polarization-rate") {
    const int q0 = disp_.row_first[lo], q1 = disp_.row_first[hi];
    const auto a = static_cast<std::size_t>(disp_.pole_first[q0]), b = static_cast<std::size_t>(disp_.pole_first[q1]);
    return a < b ? Parts{{a, b}} : Parts{};  // a rank without poles writes none
  }
  if (starts("magnets/")) {
    const std::size_t cells = static_cast<std::size_t>(mag_.count());
    for (std::size_t k = 0; k < cells && k < n; ++k)
      if (mine(mag_.cj[k])) add(k, k + 1);
    if (first && n > cells) add(cells, n);
    return parts;
  }
  if (starts("spectral-maps/")) {  // each rank sums its own rows' points (recorder_gather.cpp), and reads back those
    for (const SpectralMap& m : maps_)
      if (name == "spectral-maps/" + m.name) {
        int b0, b1;
        map_rows(m, r, P, b0, b1);
        const std::size_t np = static_cast<std::size_t>(m.ni) * m.nj, w = 12;  // a point: 6 complex, 12 doubles
        for (std::size_t f = 0; f < m.freq.size(); ++f)
          add((f * np + static_cast<std::size_t>(b0) * m.ni) * w, (f * np + static_cast<std::size_t>(b1) * m.ni) * w);
        return parts;
      }
  }
  if (name == "snapshots/E-before-frame") return snaps_.e_before_parts(FrameRows{f0, f1, true});  // snapshots.h
  for (const char* p : {"probes/", "power-spectra/", "snapshots/", "clock/", "stop-rule/",
                        "media/tensor-"})
    if (starts(p)) return first || widen > 0 ? Parts{{0, n}} : Parts{};  // read back: whole by every rank
  throw std::logic_error("state '" + name + "' has no owner over ranks (solver/parallel/state_owners.cpp)");
}

using OwnedParts = std::vector<std::pair<std::size_t, std::size_t>>;
template OwnedParts Simulation<float>::owned_parts(const std::string&, std::size_t, int, int, int) const;
template OwnedParts Simulation<double>::owned_parts(const std::string&, std::size_t, int, int, int) const;

}  // namespace ty
