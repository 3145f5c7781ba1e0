/// \file simulation.h
/// \brief A simulation built from a Scene: it orders the construction of its rooms, runs
/// the row sweep and lists its state. The rooms, each in its own file:
///   the grid's edges         solver/grid/boundaries/ (one hook interface, a file per kind)
///   the absorber             solver/grid/absorber_hooks.cpp (each side's kind, the strips, the
///                            rows' PML corrections and graded loss)
///   media (coefficient runs) solver/media/coefficient_runs.cpp
///   dispersive nodes (ADE)   solver/media/dispersive_cells.h (built in coefficient_runs.cpp)
///   magnetic cells and step  solver/media/magnetic_step.cpp (magnetic_cells.h)
///   sources (injections)     solver/sources/build_sources.cpp
///   recorders                solver/recorders/ (each builds, records and lists its state)
///
/// One step (leapfrog, Yee 1966), row by row in a single pass over memory: for row j,
/// H(j) from E(j), E(j+1) (plus the PML correction and the row's magnetic injections),
/// then E(j) from H(j), H(j-1) (plus PML and electric injections). A thread owns a block
/// of rows and does the H of its last row first, so no row reads a neighbour's new E.
/// Every value is computed the same way whatever the thread count: results are
/// bit-for-bit identical for any number of threads.
#pragma once
#include <array>
#include <complex>
#include <functional>
#include <memory>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

#include "io/scene/scene.h"
#include "solver/blocking/progress.h"
#include "solver/blocking/recorder_taps.h"
#include "solver/grid/aligned.h"
#include "solver/grid/boundaries/bloch.h"
#include "solver/grid/boundaries/boundaries.h"
#include "solver/grid/cpml.h"
#include "solver/grid/yee_grid.h"
#include "solver/media/dispersive_cells.h"
#include "solver/media/magnetic_cells.h"
#include "solver/media/tensor_cells.h"
#include "solver/parallel/magnet_halo.h"
#include "solver/parallel/ranks.h"
#include "solver/parallel/recorder_gather.h"
#include "solver/recorders/recorders.h"
#include "solver/sources/waveform.h"
#include "solver/stop_rule.h"
#include "solver/threads/block_rows.h"

namespace ty {

template <class R>
class Simulation {
 public:
  /// threads = 0: the scene's setting (or all cores when that is auto). With Bloch x sides
  /// (bloch.h) it builds and owns the sine copy too, and steps both.
  explicit Simulation(const Scene& scene, int threads = 0) : Simulation(scene, threads, 0) {}
  /// The sine copy of a scene with Bloch sides (its power-spectrum lines only), else null.
  const Simulation* sine_copy() const { return twin_.get(); }

  const YeeGrid& grid() const { return g_; }
  const Scene& scene() const { return scene_; }
  int threads() const { return threads_; }
  long total_steps() const { return total_steps_; }
  long steps_done() const { return n_; }
  double time() const { return n_ * g_.dt; }  ///< time of E now

  /// One time step with sources, without recorders.
  void step();
  /// Over several ranks (solver/parallel/slab_step.cpp): this rank's rows [lo, hi) of the
  /// sweep and the rank count. A rank's arrays hold current values only in its rows (and the
  /// halo and recorder rows it receives); no rank ever holds the whole grid's. gather_sums()
  /// (collective) gives every rank each row's held energy and work (held_energy.cpp): enough
  /// for held_energy(), injected_energy(), the guard and the stop rule; gather_sums(true), for
  /// the summary, also each row's field energy (field_energy()) and the midpoint cell-steps.
  int ranks() const { return ranks_; }
  int row_lo() const { return row0_; }
  int row_hi() const { return row1_; }
  void gather_sums(bool summary = false);
  /// The parts [a, b) of state array `name` of visit_state (n values) that this rank's rows
  /// update (solver/parallel/state_owners.cpp): over ranks, each rank writes these of a
  /// checkpoint, together the array a one-process run holds; one rank owns all of it. The
  /// second form: the parts rank r of P would own (the same cut, slabs.h); with `widen` > 0 the
  /// parts it reads back: `widen` rows more on each side (across a periodic seam too) of an array
  /// divided by rows, and the whole of an array every rank holds alike.
  std::vector<std::pair<std::size_t, std::size_t>> owned_parts(const std::string& name, std::size_t n) const {
    return owned_parts(name, n, rank_, ranks_);
  }
  std::vector<std::pair<std::size_t, std::size_t>> owned_parts(const std::string& name, std::size_t n, int r, int P,
                                                               int widen = 0) const;
  /// One time step, then the recorders.
  void advance();
  /// Steps per pass over the rows (temporal blocking, solver/blocking/): 1 (the default), 0 = auto
  /// (fitted to the caches), N; a scene with something that reaches across rows or steps keeps 1 (block_note: why).
  void set_block_depth(int requested);
  int block_depth() const { return block_depth_; }
  const std::string& block_note() const { return block_why_; }
  /// Up to `most` steps, each followed by the recorders where they read it; several at once
  /// (a block of block_depth() steps at most) where none reads the steps inside. Returns the
  /// steps taken. The fields are the same bits as after as many advance() calls.
  long advance_up_to(long most);
  /// `depth` steps in one wavefront pass (block_step.cpp), without recorders; a depth
  /// above 1 needs set_block_depth to have allowed at least that depth.
  void step_block(int depth);
  /// `stop: auto`: whether the run is done now (looked at every stop_rule().plan().check
  /// steps; false between checks and for runs of fixed length).
  bool settled();
  const StopRule& stop_rule() const { return stop_; }
  /// All the energy the grid holds, J/m (both Bloch copies): the fields', the magnets', the
  /// dispersive media's oscillators'; what the guard and `stop: auto` watch.
  double held_energy() const;

  R* field(Component c) { return f_[static_cast<int>(c)].data(); }
  const R* field(Component c) const { return f_[static_cast<int>(c)].data(); }
  R& at(Component c, int i, int j) { return f_[static_cast<int>(c)][g_.at(i, j)]; }

  /// Electromagnetic energy per unit length in z, J/m (E at n, H at n-1/2); with Bloch sides
  /// both copies' (the complex field's).
  double field_energy() const;
  /// Energy of the magnetic media relative to their ground states (exchange, anisotropy,
  /// bias, DM; the wave-field coupling is in field_energy), J/m.
  double magnetic_energy() const;
  const MagneticCells& magnets() const { return mag_; }
  /// Magnetic cell-steps so far that were tilted past the small-signal step and took the
  /// midpoint rule (cell_step.h); over ranks, the other ranks' as of the last gather_sums(true).
  long midpoint_cell_steps() const {
    long s = mhalo_.tilted_elsewhere;
    for (size_t t = 0; t < mag_tilted_.size(); t += 8) s += mag_tilted_[t];
    return s;
  }
  /// With Bloch sides and magnetic cells: why the two copies no longer add up to one complex
  /// solution (a cell of either copy tilted past the small-signal step, whose nonlinear
  /// steps do not superpose), else empty. The run stops on it (tools/run_command.cpp).
  std::string bloch_superposition_broken() const;
  MagneticCells& magnets() { return mag_; }
  const DispersiveCells& dispersive() const { return disp_; }
  const TensorCells& tensor_cells() const { return tensor_; }
  /// Value of a magnetic output field (Mx, Lx, dLx, M1x, ...) in list cell k.
  double magnetic_value(const std::string& field, long k) const { return magnetic_value(field, k, mag_.latest); }
  /// The same in the state m[p] (a block's recorders: the state of a step inside it).
  double magnetic_value(const std::string& field, long k, int p) const;
  /// Every piece of state a resumed run needs, one call per array, f(name, data, count),
  /// data a pointer to R, double or long. Saving and loading both go through this one list,
  /// so their order cannot drift apart. Derived data (coefficients, stencils) is rebuilt
  /// from the scene instead.
  template <class F>
  void visit_state(F&& f);  // solver/state_list.h
  /// A visit_state visitor behind one type: the Bloch pair's cosine copy hands its sine copy this, prefixing the names.
  struct StateVisitor {
    std::function<void(const std::string&, R*, std::size_t)> r;
    std::function<void(const std::string&, double*, std::size_t)> d;
    std::function<void(const std::string&, long*, std::size_t)> l;
    template <class T>
    void operator()(const std::string& n, T* p, std::size_t k) {
      if constexpr (std::is_same_v<T, long>) l(n, p, k);
      else if constexpr (std::is_same_v<T, double>) d(n, p, k);
      else r(n, p, k);
    }
  };
  /// An upper bound of the energy the sources have put into the grid so far, J/m (each injection's work on the
  /// leapfrog's conserved energy, simulation.cpp), for the run's guard; summed over rows in order (any thread count).
  double injected_energy() const {
    double w = 0;
    for (double v : injected_) w += v;
    return twin_ ? w + twin_->injected_energy() : w;  // a Bloch pair: both copies' sources
  }
  /// The first node holding a NaN or infinity, if any (row-major, E before H); collective.
  bool find_nonfinite(int& i, int& j, Component& c) const;

  std::vector<ProbeRecorder>& probes() { return probes_; }
  /// With Bloch sides, the complex field's lines: each sum the cosine copy's plus i times the sine copy's
  /// (linear in the field), so the power through a line is that of the wave exp(i k_x x) alone.
  const std::vector<PowerSpectrumRecorder>& power_spectra() const;
  const std::vector<SpectralMap>& spectral_maps() const { return maps_; }
  const SnapshotPlan& snapshot_plan() const { return snaps_.plan; }
  void set_snapshot_sink(SnapshotSink* sink) { sink_ = sink; }
  /// Medium index of each cell of the extent ([row][column], -1 = vacuum); over ranks rank 0 alone holds it.
  const std::vector<int>& medium_map() const { return medium_map_; }
  int map_nx() const { return map_nx_; }
  int map_ny() const { return map_ny_; }
  /// H and E of a row's interior in one loop (fused_row.h; on by default, same bits): off or on; rows taking it.
  void set_row_fusion(bool on);
  int fused_rows() const;
  /// Bytes held by fields, coefficients, absorbers and recorders.
  std::size_t memory_bytes() const { return bytes_; }
  /// What the run should warn about (a lossy launch medium ...), and what it should say
  /// (the magnetic media's ground states and steps), for the log and the summary.
  const std::vector<std::string>& warnings() const { return warnings_; }
  const std::vector<std::string>& notes() const { return notes_; }

 private:
  struct Run {
    int i0, i1;
    R ca, kx, ky;
  };
  struct Injection {
    long index;
    int comp;
    int row, slot;      // slot: value slot
    double weight = 0;  // energy per unit length of the node per (field unit)^2, J/m/(V/m)^2
    double before = 0;  // the node's value before this step's update of its row (for injected_)
  };
  struct Emitter {  // value of one injection: Re[A g_s(t - tau)], or coef * signal for points
    std::complex<double> A;
    double tau;
    int signal;
    bool h_phase;
  };

  Scene scene_;
  YeeGrid g_;
  int threads_ = 1;
  long total_steps_ = 0;
  long n_ = 0;
  R sx_, sy_;  // c dt / dx, c dt / dy
  std::array<AlignedArray<R>, 6> f_;
  // media: runs per (row, E component), flat; row_runs_[3 j + c] .. [3 j + c + 1]; each run's cb
  std::vector<Run> runs_;
  std::vector<double> run_cb_;
  std::vector<int> row_runs_;
  std::vector<char> simple_row_;  // vacuum-like row: one run per component, ca = 1, equal k
  struct FusedSpan { int a = 0, b = 0; R kx = 0, ky = 0; };  // a row's columns [a, b) in fused_row.h, E's k
  std::vector<FusedSpan> fused_;  // per row (a == b: none), row_fusion.cpp
  // PML
  CpmlAxis px_, py_;
  std::vector<R> pbx_[2], pax_[2], pkx_[2], pby_[2], pay_[2], pky_[2];
  std::vector<R> pdx_[2], pdy_[2];  // graded loss: decay per step of the lines (1 on PML sides)
  AlignedArray<R> psi_hyx_, psi_hzx_, psi_eyx_, psi_ezx_, cb_eyx_, cb_ezx_;  // [row][column of px_]
  AlignedArray<R> psi_hxy_, psi_hzy_, psi_exy_, psi_ezy_, cb_exy_, cb_ezy_;  // [row of py_][column]
  std::vector<int> pml_row_of_;  // row -> index into py_.lines, or -1
  // sources
  std::vector<Signal> signals_;
  std::vector<Emitter> emitters_;
  std::vector<double> emitter_value_;
  std::vector<Injection> inj_h_, inj_e_;
  std::vector<int> inj_h_row_, inj_e_row_;  // offsets per row, size ny+1
  std::vector<double> injected_;            // per row: energy the injections put in, J/m
  std::vector<double> row_held_, row_fields_;  // over ranks, per row: row_held(), row_fields() (gather_sums), J/m
  Boundaries walls_;
  // recorders
  std::vector<ProbeRecorder> probes_;
  std::vector<PowerSpectrumRecorder> power_spectra_;
  std::vector<SpectralMap> maps_;
  SnapshotRecorder<R> snaps_;
  SnapshotSink* sink_ = nullptr;
  StopRule stop_;
  std::vector<int> medium_map_;
  int map_nx_ = 0, map_ny_ = 0;
  MagneticCells mag_;
  DispersiveCells disp_;
  TensorCells tensor_;  // in-plane nodes near eps_xy != 0, stepped after the sweep
  std::vector<std::vector<double>> mag_scratch_;  // per thread: b(n+1/2) of one row's cells
  std::vector<long> mag_tilted_;                  // per thread (every 8th): cell steps by the midpoint rule
  std::vector<double> row_work_;  // work of rows 0 .. j-1, magnetic cells weighed (block_rows.h work_rows)
  std::size_t bytes_ = 0;
  std::vector<std::string> warnings_, notes_;
  // slabs over ranks (slab_step.cpp)
  int rank_ = 0, ranks_ = 1, row0_ = 0, row1_ = 0;
  int up_ = -1, down_ = -1;  // the ranks whose rows lie above and below ours (-1: none)
  std::vector<R> halo_e_out_, halo_e_in_, halo_h_out_, halo_h_in_;
  parallel::Request halo_req_[4];
  parallel::RecorderGather<R> rgather_;  // what the recorders read of other ranks' rows (recorder_gather.h)
  std::vector<int> work_counts_;  // gather_sums' bytes per rank (a double a row)
  std::vector<R> tensor_buf_;      // the tensor list's E, each rank's Ex then Ey nodes, in rank order
  std::vector<int> tensor_counts_;  // bytes of them per rank
  std::vector<long> tensor_runs_;   // rank r's runs of the list (tensor_rows): 4r..4r+3 = a[0], b[0], a[1], b[1]
  parallel::MagnetHalo<R> mhalo_;  // magnetic cells over ranks (magnetic_slab_step.cpp)
  // Bloch sides (bloch.h): the sine copy, owned by the cosine copy and stepped with it
  std::unique_ptr<Simulation> twin_;
  Simulation* partner_ = nullptr;  // the other copy of the pair (either way), else null
  int copy_ = 0;  // 0: the cosine (or only) copy, 1: the sine copy
  bloch::Phase phase_;
  mutable std::vector<PowerSpectrumRecorder> joined_;

  Simulation(const Scene& scene, int threads, int copy);
  /// The step of a Bloch pair (bloch_pair.cpp): step_fused's sweep over both copies in
  /// lock-step, the seam's ghosts written from both.
  void step_pair();
  void build_bloch_pair();
  void pair_h_row(int j);
  void pair_h_ghosts(int j);  ///< both copies' H ghost columns of row j (bloch.h), after their final H
  void pair_before_sweep();        ///< both copies' sources and edges before the sweep
  void pair_before_first_e_row();  ///< and before E of row 0
  /// step_magnetic's sweep over both copies of a pair with magnetic cells (bloch_magnets.cpp).
  void step_pair_magnetic();
  /// A magnetic cell's quantity across the Bloch seam for this copy (own, other: this copy's and the partner's
  /// value there; left: the cell seen at column -1, else at nx); without a pair own (periodic).
  double seam_value(double own, double other, bool left) const;

  // the energy held (solver/guard/held_energy.cpp): row j's fields, and with its magnets and
  // poles; one copy's rows and rotated tensors; the magnetic cells [k0, k1) (magnetic_values.cpp)
  double row_fields(int j) const;
  double row_held(int j) const;
  double copy_held() const;
  double magnetic_energy_of(long k0, long k1) const;
  void build_media();
  double node_cb(int c, int i, int j) const;  ///< cb of E node (c, i, j), from its run (the builders')
  void node_coefficients(int c, int i, int j, double& a, double& b, std::vector<DispersiveNode>& out) const;
  void join_dispersive_nodes(std::vector<std::vector<DispersiveNode>>& found);
  void mark_tensor_nodes(std::vector<char> (&in)[2]) const;
  // the absorber's hooks (absorber_hooks.cpp): its strips, and the CPML correction of the
  // H and E updates of row j (Roden & Gedney 2000)
  void build_pml();
  void pml_h_row(int j);
  bool in_absorber(int j) const { return px_.count() > 0 || pml_row_of_[j] >= 0; }
  void pml_e_row(int j);
  /// The graded loss (graded_loss.h) on the E (electric) or H nodes of row j, after their
  /// final update; mask: which of the three components (bit 0: x, 1: y, 2: z).
  void graded_decay(int j, bool electric, int mask = 7);
  void build_sources();
  void add_point_source(const Source& src, int signal);  ///< a point source's Gaussian footprint of injections
  void add_launch_sheet(const Source& src, int signal);  ///< a beam's or plane wave's one-sided TF/SF sheet
  void build_recorders(const StopPlan& plan);
  void build_slabs();
  void step_slab();
  /// A Bloch pair's step over ranks: step_slab's with each row done for both copies (step_pair).
  void step_slab_pair();
  /// step_slab's halo exchange in its parts (each copy of a pair its own messages): post the
  /// E receive and send and the H receive; wait for E(hi); send H(hi-1); wait for H(lo-1); the sends.
  void halo_post();
  void halo_take_e();
  void halo_send_h();
  void halo_take_h();
  void halo_done();
  /// The rotated tensors' list stepped over ranks (slab_step.cpp): its nodes' E after the
  /// sweep gathered from their rows' ranks, then the whole list stepped on every rank alike.
  void tensor_step_slab();
  /// The tensor list's nodes of rank r's rows: Ex nodes [a[0], b[0]), Ey nodes [a[1], b[1]).
  void tensor_rows(int r, long* a, long* b) const;
  /// What the recorders read of other ranks' rows, gathered before step k's record (recorder_gather.cpp):
  /// the probes' and lines' stencil nodes, the maps' rows (all of them in one allgather each).
  void build_recorder_gather(), gather_for_recorders(long k), gather_nodes(), gather_maps();
  void map_rows(const SpectralMap& m, int r, int P, int& b0, int& b1) const;  // map m's rows of rank r of P
  void gather_rows(const std::vector<int>& rows, const std::vector<int>& counts);
  // magnetic cells over ranks (solver/parallel/magnetic_slab_step.cpp, magnet_halo.h)
  void build_magnetic_slabs();
  void step_magnetic_slab();
  void step_magnetic_slab_pair();  // both copies of a Bloch pair, as step_pair_magnetic
  /// The main thread's halo exchange at one of the step's points (magnetic_slab_step.cpp).
  void magnet_exchange(int point);
  void pack_cell_row(int j, double* to) const;
  void unpack_cell_row(int j, const double* from);
  /// The other ranks' midpoint cell-steps (gather_sums(true)); the recorder rows' cells.
  void gather_tilted_count();
  void gather_recorder_cells();
  void build_magnets();
  void build_fusion();
  void step_fused(), step_magnetic();
  /// mu0 H at the magnetic cells of row j as H is now, b[c * longest_row + q] for the row's
  /// q-th cell.
  void gather_row(int j, double* b) const;
  const R* hy_above(int j) const;
  /// The magnetic cells of row j (old: their field at n-1/2 from gather_row): the field at
  /// n+1/2, their step, and the scatter into Hx and Hz.
  void magnetic_row(int j, long n, const double* old, double* scratch, long& tilted);
  /// Unit (j, t) of a blocked magnetic scene (wavefront.h, kMagneticLead): step n's work on
  /// row j as step_magnetic does it, with H one row ahead; ring: b(n-1/2) of two rows.
  void magnetic_unit(int j, long n, const double* ev, double* const* ring, double* scratch, long& tilted);
  /// The scatter into the Hx nodes at the ends of row j's runs from the changes magnetic_row(j)
  /// left in scratch (a Bloch pair's seam node also takes the partner's, in partner_scratch).
  void scatter_run_ends(int j, const double* scratch, const double* partner_scratch = nullptr);
  /// The scatter into the Hy nodes of row j (from cell rows j and j-1).
  void scatter_hy(int j, long n);
  void add_injection(bool h_phase, Component c, int i, int j, std::complex<double> A, double tau, int signal);
  void compute_emitters();
  /// The injections' values of step `step` (H at step dt, E at (step + 1/2) dt) into out.
  void emitters_at(long step, double* out) const;
  /// H of row j, but for its columns [skip0, skip1); ev: the step's injection values
  /// (emitter_value_ for the step now, or a wavefront step's own, solver/blocking/)
  void h_row(int j, const double* ev, int skip0 = 0, int skip1 = 0);
  void h_row(int j) { h_row(j, emitter_value_.data()); }
  std::array<R*, 6> fields() { return {f_[0].data(), f_[1].data(), f_[2].data(), f_[3].data(), f_[4].data(), f_[5].data()}; }
  /// The edges' hook after everything that adds to H row j (boundaries.h).
  void h_boundaries(int j) { walls_.after_h_row(fields().data(), j, g_); }
  /// E of row j (but for [skip0, skip1)): the update below, with the dispersive nodes' currents around it.
  void e_row(int j, const double* ev, int skip0 = 0, int skip1 = 0);
  void e_row(int j) { e_row(j, emitter_value_.data()); }
  void e_row_update(int j, const double* ev, int skip0, int skip1);  ///< runs, absorber, sources
  void he_row(int j, const double* ev);  ///< h_row and e_row of row j, its fused span in one loop
  void record();
  /// The recorders that read the whole grid (spectral maps, snapshots) after the step just taken.
  void record_whole();
  // temporal blocking (solver/blocking/block_step.cpp)
  int block_depth_ = 1;
  std::string block_why_ = "one pass per step";
  std::vector<double> emitter_block_;  // [step of the block][emitter]
  blocking::Progress progress_;
  blocking::RecorderTaps taps_;     // probes and power-spectrum lines read inside the blocks
  std::vector<double> mag_ring_;    // [step of the block]: b(n-1/2) of two cell rows
  /// After a block from step n0: the probes and power-spectrum lines of its steps, in order,
  /// from the values its units took.
  void record_taps(long n0, int depth);
  blocking::DepthChoice block_choice(int requested) const;
  long next_read_step() const;  ///< the first step from n_ on whose fields a recorder reads (LONG_MAX: none)
};

extern template class Simulation<float>;
extern template class Simulation<double>;

}  // namespace ty

#include "solver/state_list.h"  // the definition of visit_state
