/// \file scene.h
/// \brief The plain description of a simulation, as read from a scene file: every value
/// in SI, every default filled in. Nothing here knows YAML or the grid's memory layout.
///
/// Positions are in scene coordinates (x right, y up), already shifted so that the
/// origin is the lower-left corner of `grid.extent`; `origin_shift` records the shift
/// so that outputs can be written back in the user's coordinates.
#pragma once
#include <array>
#include <optional>
#include <string>
#include <vector>

#include "io/scene/diagnostics.h"
#include "io/scene/permittivity_model.h"

namespace ty {

struct Vec2 {
  double x = 0, y = 0;
};

/// The six wave-field components, in the order the solver stores them.
enum class Component : int { Ex = 0, Ey, Ez, Hx, Hy, Hz };
const char* component_name(Component c);
inline bool is_electric(Component c) { return static_cast<int>(c) < 3; }

/// bloch: periodic up to the phase exp(i k_x L_x) at the fixed transverse wavenumber
/// GridSpec::bloch_kx (x sides only; solver/grid/boundaries/bloch.h).
enum class Boundary { absorbing, periodic, electric_wall, magnetic_wall, bloch };
const char* boundary_name(Boundary b);

/// The absorbing layers. Two kinds: the convolutional PML (Roden & Gedney 2000):
/// sigma = strength * sigma_opt * (rho/d)^grading, sigma_opt = 0.8 (grading+1) / (eta0 * cell);
/// kappa = 1 + (kappa_max-1)(rho/d)^grading; alpha = alpha_max (1 - rho/d); and the graded
/// loss (solver/grid/graded_loss.h), in which nothing can amplify. `automatic` gives a side
/// whose layer holds magnetic cells the graded loss, the others the PML; `pml` (kept to test
/// the run's guard: it can amplify backward waves) and `graded` give every side that kind.
struct Absorber {
  enum class Kind { automatic, pml, graded } kind = Kind::automatic;
  /// Cells a side; 0: automatic (absorber_cells): kPmlCells for the PML; for the graded loss
  /// kGradedWavelengths wavelengths of the lowest carrier in the medium there, at least
  /// kGradedCells and at most kMostCells.
  int cells = 0;
  static constexpr int kPmlCells = 16;
  static constexpr int kGradedCells = 40;
  static constexpr int kMostCells = 200;
  static constexpr double kGradedWavelengths = 2.5;
  double grading = 3.0;
  double strength = 1.0;
  double kappa_max = 1.0;
  double alpha_max = 0.05;  ///< S/m
};

struct GridSpec {
  Vec2 extent;            ///< size of the region of interest, m
  double dx = 0, dy = 0;  ///< cell size, m
  Boundary bx = Boundary::absorbing, by = Boundary::absorbing;
  Absorber absorber;
  bool origin_corner = false;
  double bloch_kx = 0;  ///< rad/m, the transverse wavenumber of `bloch` x sides
  Mark where;  ///< the `grid` section
};

enum class Precision { double_, single };

/// `time.stop: auto`: the run decides when it is done (solver/stop_rule.h), within `limit`.
struct AutoStop {
  bool on = false;
  double energy_left = 1e-5;  ///< pulsed: stop when the energy left is below this fraction of its peak
  double tolerance = 1e-3;    ///< the spectra's largest change between two checks, relative to their largest value
  double check_every = 0;     ///< s between checks (cw: the length of each DFT window); 0 = automatic
  Mark where;                 ///< `stop: auto`
};

struct TimeSpec {
  double stop = 0;       ///< s; with `stop: auto`, the limit (the latest the run may stop)
  AutoStop auto_stop;
  double step_fraction = 0.95; ///< the time step as a fraction of the 2D stability limit
  Precision precision = Precision::double_;
  int threads = 0;       ///< 0 = auto
  Mark where;            ///< `time.stop`
};

/// One sublattice of a magnetic medium.
struct Sublattice {
  double saturation = 0;  ///< mu0*Ms, T
  double g = 2.0;         ///< Lande g
  double damping = 0;     ///< Gilbert alpha
};

struct UniaxialAnisotropy {
  std::array<double, 3> axis{0, 0, 1};  ///< unit vector, scene coordinates
  double field = 0;                      ///< mu0*H_A, T; > 0 easy axis, < 0 hard axis
};

/// How a magnet's values change with temperature (materials/crystals/temperature.h): the
/// values of the `magnet` block hold at `reference`; at `temperature` the sublattice
/// magnetization is scaled by the mean-field Brillouin law of spin `spin` and ordering
/// temperature `ordering`, the exchange and Dzyaloshinskii fields like it, the anisotropy
/// fields by the Callen-Callen law m^(power-1). `spin` 0: no scaling (the values as given).
struct Thermal {
  double temperature = 0;  ///< K
  double reference = 0;    ///< K
  double spin = 0;         ///< S of the mean-field Brillouin law
  double ordering = 0;     ///< Neel or Curie temperature, K
  double anisotropy_power = 3;  ///< K(T)/K(ref) = (m(T)/m(ref))^power; 3 = Callen-Callen, l = 2
  /// the zero-field line's full width at half maximum against temperature, (K, Hz), rising
  /// in K; when given, it sets the damping at `temperature` (materials/crystals/temperature.h)
  std::vector<std::array<double, 2>> linewidth;
  bool active() const { return spin > 0; }
};

/// Which stationary state a magnet starts from (materials/magnetic/state_choice.h).
struct StateChoice {
  std::string pick = "lowest";  ///< lowest, a number as `check` lists them, or a kind (collinear, spin-flop, ...)
  std::vector<std::array<double, 3>> history;  ///< bias path before the scene's bias, mu0*H, T
  Mark where;
};

/// The `magnet` block: sublattice magnetizations moved by the Landau-Lifshitz-Gilbert
/// equation (conventions in docs/magnets.md).
struct Magnet {
  std::vector<Sublattice> sublattices;        ///< 1 (ferromagnet, ferrite) or 2
  double lambda = 0;                          ///< molecular-field constant, H_ex,1 = -lambda M2
  std::vector<UniaxialAnisotropy> anisotropy;
  std::array<double, 3> dzyaloshinskii{0, 0, 0};  ///< mu0*H_D, T
  std::array<double, 3> order{0, 0, 0};           ///< sublattice 1's side; zero = not given
  Thermal thermal;
  StateChoice state;
  double exchange_field() const;                  ///< mu0*H_E = lambda * mu0*Ms1, T
};

struct Medium {
  std::string name;
  std::string crystal;  ///< the library entry it was filled from (io/scene/crystals/), empty if none
  std::optional<Magnet> magnet;
  std::array<double, 3> permittivity{1, 1, 1};  ///< relative, along x, y, z (with `tensor`: its background's diagonal)
  /// the `permittivity` block's map form: dispersion per principal axis and the in-plane rotation
  std::optional<PermittivityTensor> tensor;
  double conductivity = 0;                      ///< S/m
  bool perfect_conductor = false;
  Mark where;
  /// eps_xy != 0: its in-plane axes turned off the grid's (stepped by solver/media/tensor_cells.h)
  bool rotated_in_plane() const { return !perfect_conductor && tensor && !tensor->diagonal_in_plane(); }
};

struct Shape {
  enum class Kind { rectangle, circle, polygon } kind = Kind::rectangle;
  Vec2 centre;
  Vec2 size;          ///< rectangle
  double rotate = 0;  ///< rectangle, rad, counter-clockwise
  double radius = 0;  ///< circle
  std::vector<Vec2> vertices;  ///< polygon
  bool contains(Vec2 p) const;
  void bounds(Vec2& lo, Vec2& hi) const;
};

/// A body's own magnetic order (an antiferromagnetic domain): its cells start from this
/// state instead of the medium's (materials/magnetic/domain_state.h).
struct BodyOrder {
  bool reversed = false;                 ///< `order: reversed`: the state of equal energy with sublattice 1 turned over
  std::array<double, 3> order{0, 0, 0};  ///< `order: [x, y, z]`: the magnet's `order` for this body
  std::string state;                     ///< `state: ...` as in the magnet block (empty: the medium's)
  Mark where;
  bool given() const { return reversed || order != std::array<double, 3>{0, 0, 0} || !state.empty(); }
};

struct Body {
  int medium = 0;  ///< index into Scene::media
  Shape shape;
  bool sample = false;
  BodyOrder magnetic;  ///< per-body state of a magnetic medium (none given: the medium's)
  Mark where;
};

struct Waveform {
  enum class Kind { cw, pulse, chirp, single_cycle, file } kind = Kind::cw;
  double ramp = 0;                 ///< cw: raised-cosine turn-on, s
  double fwhm = 0, delay = 0;      ///< pulse: intensity FWHM and peak time, s; single-cycle: its centre (zero crossing), s
  double from = 0, to = 0, length = 0;  ///< chirp: linear sweep, Hz, Hz, s
  std::string file;                     ///< file: the table as given in the scene
  std::string time_unit = "s";          ///< file: the unit of its time column
  std::vector<double> table_time, table_value;  ///< file: its samples (s; relative, times the amplitude)
};

struct Source {
  enum class Kind { point, beam, plane } kind = Kind::point;
  Component component = Component::Ez;  ///< point: the current's component; beam/plane: Ez or Hz
  double frequency = 0;                 ///< carrier, Hz (chirp: centre of the sweep)
  double amplitude = 0;                 ///< point: A or V; beam/plane: peak E, V/m
  Waveform waveform;
  Vec2 at;                 ///< point
  double spread = 0;       ///< point: Gaussian footprint (standard deviation), m
  Vec2 focus;              ///< beam
  double waist = 0;        ///< beam: 1/e field radius, m
  double angle = 0;        ///< beam/plane: direction of travel from +x towards +y, rad
  char line_axis = 'x';    ///< launch line {x: ...} or {y: ...}
  double line_at = 0;      ///< its coordinate, m
  Mark where;
};

struct Region {
  bool given = false;
  Vec2 centre, size;
};

struct Output {
  enum class Kind { snapshots, probe, power_spectrum, spectral_map } kind = Kind::snapshots;
  std::string name;
  std::vector<std::string> fields;
  double every = 0;  ///< snapshots: s
  int stride = 1;
  Region region;
  Vec2 at;  ///< probe (a line probe: the middle of its line)
  bool over_line = false;  ///< probe: the mean over the line from -> to (a finite detector)
  Vec2 from, to;     ///< power spectrum: the line, positive towards z x (to - from); line probe: its ends
  double band_from = 0, band_to = 0;  ///< power spectrum: Hz
  int count = 0;     ///< power spectrum: frequencies
  std::vector<double> frequencies;  ///< spectral-map: Hz
  Mark where;
  /// A power spectrum's k-th frequency of `count` (Hz), evenly spaced from band_from to band_to.
  double band_frequency(int k) const {
    return count == 1 ? band_from : band_from + (band_to - band_from) * k / (count - 1);
  }
};

struct Scene {
  std::string file;
  std::string title;
  GridSpec grid;
  TimeSpec time;
  std::array<double, 3> bias{0, 0, 0};  ///< mu0*H0, T
  std::vector<Medium> media;
  std::vector<Body> bodies;
  std::vector<Source> sources;
  std::vector<Output> outputs;
  Vec2 origin_shift;  ///< user coordinates = internal coordinates - origin_shift
  bool reference = false;  ///< the sample bodies were removed (a reference run)
  std::vector<std::string> warnings;  ///< found while reading (rounded extents, ...)
};

/// Where a beam's axis meets its launch line (for a plane wave, the middle of the line
/// within the extent), internal coordinates. The launch medium is taken there, delays are
/// measured from there, and a body holding it holds the source.
Vec2 launch_point(const Source& s, Vec2 extent);

/// The frequencies a source's spectrum covers down to 1% of its peak amplitude, Hz
/// (a cw source: its frequency; a chirp: its sweep).
struct Band2 {
  double lo = 0, hi = 0;
};
Band2 source_band(const Source& s);
/// When a source has stopped for good, s: a pulse's Gaussian envelope 6 standard deviations
/// after its peak (below 1.6e-8 of it), a single cycle 6/w after its centre, a chirp's or a
/// table's end; infinity for cw.
double source_end(const Source& s);

/// The scene of a reference run: without the bodies marked `sample: true`, or, where none
/// is marked, without every body that holds no source (a point source inside it, or the
/// point where a beam's axis or a plane wave's line meets its launch line).
Scene reference_scene(const Scene& s);

/// Cells of the absorbing layer on each side of an axis (0: x, 1: y): the scene's
/// `absorber.cells` when given; kPmlCells for `pml`, and for `auto` where no magnetic medium
/// reaches an edge of the extent along that axis (bodies run on through the layer); else (a
/// graded layer) Absorber::kGradedWavelengths wavelengths of the lowest source frequency in
/// the densest such medium (sqrt of its largest permittivity), within kGradedCells ..
/// kMostCells.
/// 0 when that axis is not absorbing.
int absorber_cells(const Scene& s, int axis);

}  // namespace ty
