/// \file commands.h
/// \brief The subcommands of the terayee program.
#pragma once
#include <cmath>
#include <complex>
#include <optional>
#include <string>
#include <vector>

#include "io/scene/scene.h"

namespace ty {

struct RunOptions {
  std::string scene;
  std::string out;
  int threads = 0;
  std::vector<std::string> sets;
  bool quiet = false;
  bool resume = false;            ///< go on from RUN/checkpoint.h5
  bool reference = false;         ///< run without the sample bodies
  double checkpoint_minutes = 30; ///< wall time between checkpoints (0: only when stopped)
  long stop_at_step = 0;          ///< stop (with a checkpoint) after this step (0: no)
  long checkpoint_steps = 0;      ///< also a checkpoint every this many steps (0: no)
  bool overwrite = false;         ///< replace the results in a run folder that is not empty
  int block_depth = 0;            ///< steps per pass over the rows (0: auto, 1: one pass; solver/blocking/)
};

int run_command(const RunOptions& o);
/// threads: what the run will be given (--threads); 0: what it would choose itself.
int check_command(const std::string& scene, const std::vector<std::string>& sets, int threads = 0);
/// `check --ranks P`: how P MPI ranks would cut the grid and the halo per step (check_ranks.cpp).
int check_ranks(const std::string& scene, const std::vector<std::string>& sets, int ranks);
/// `name` empty: the list; `temperature` < 0: the crystal's reference temperature.
int crystals_command(const std::string& name, double temperature);
struct MediumOptions {
  std::string scene, medium, normal = "y", csv, json;
  std::vector<std::string> sets;
  double from = 0, to = 0, angle = 0, thickness = 0, waist = 0, incidence_index = 1;
  double source_distance = 0, image_range = 0;  ///< line-source image behind a slab
  double line_distance = 0;  ///< where the beam-summed shift is seen: a line this far before the interface
  std::string plot;          ///< also draw the table: FILE.png, .pdf or .svg
  bool polarization = false; ///< also print the Jones, Faraday and Kerr table
  int body = 0;              ///< 1, 2, ... as `check` numbers them: that body's medium and own state (0: none)
  bool stack = false;        ///< the scene's layered stack instead of one medium (medium_stack.cpp)
  int count = 101;
  bool count_given = false;
};
int medium_command(const MediumOptions& o);
/// `medium SCENE --stack`: R and T of the stack the scene's plane wave meets (tools/medium_stack.cpp).
int medium_stack_command(const MediumOptions& o);

int measure_spectrum(const std::string& run, const std::string& reference, std::string reflected,
                     std::string transmitted);
int measure_focus(const std::string& run, const std::string& map, const std::string& reference, double freq,
                  const std::string& axis, double face, bool has_face);
int measure_angle(const std::string& run, const std::string& map, const std::vector<double>& region,
                  const std::string& normal, double incidence, bool has_incidence);
/// `terayee measure material` (tools/measure_material_command.cpp).
struct MaterialOptions {
  std::string run, reference, probe, field = "Ez", window = "main", json, reflected_probe;
  double thickness = 0, from = 0, to = 0;  ///< m; Hz (0, 0: the band the reference pulse covers)
  int count = 101;
  std::optional<std::complex<double>> permittivity;
  char front_axis = 'x';  ///< --front x=VALUE: the slab's front face
  double front = 0;
  std::string detector;           ///< an EO crystal (ZnTe, GaP): the traces as it records them
  double detector_thickness = 0;  ///< m
  std::string traces;             ///< write the (detected) traces to this CSV file
};
int measure_material(const MaterialOptions& o);
/// `terayee measure polarization` (tools/measure_polarization.cpp).
struct PolarizationOptions {
  std::vector<std::string> runs, references;  ///< one or two, in the same order
  std::string probe, line, json, csv, plot;  ///< probe or line: where the fields are taken
  bool reflected = false;
  double from = 0, to = 0;  ///< Hz (0, 0: the band the first reference pulse covers)
  int count = 101;
};
int measure_polarization(const PolarizationOptions& o);
struct ShiftOptions {
  std::string run, reference, map, reversed, reversed_reference;
  char line_axis = 'y';
  double line = 0, interface = 0, frequency = 0;
};
int measure_shift(const ShiftOptions& o);
struct RenderOptions {
  std::string run, field, movie, out, map, quantity, plot, predicted, colours, format = "png";
  std::string x_key, y_column;  ///< --plot sweep: the swept key across, the results column drawn
  bool with_map = false;        ///< --plot sweep over two keys: also the column as a map
  double fps = 12, time = NAN, frequency = 0, percentile = 99.5;
  std::vector<double> limits;  ///< LO HI, or empty for robust limits
  bool rescale = false, show_absorber = false;
  int size = 800, every = 1;
};
int render_command(const RenderOptions& o);
/// `render --plot spectrum|probes|shift|focus` (render_plots.cpp).
int render_plot(const RenderOptions& o, const std::string& out_dir);
/// `render DIR --plot sweep`: a sweep's results column against a swept value (render_sweep.cpp).
int plot_sweep(const RenderOptions& o, const std::string& out_dir);
/// `render DIR --plot bloch-map`: a sweep over the Bloch wavenumber as maps over frequency and
/// k_x, and over frequency and angle (render_bloch_map.cpp).
int plot_bloch_map(const RenderOptions& o, const std::string& out_dir);
/// The layout file written beside a still: FILE.png -> FILE-layout.json.
std::string plot_layout_path(const std::string& picture);
/// `terayee sweep` (tools/sweep_command.cpp).
struct SweepOptions {
  std::string scene, out;
  std::vector<std::string> vary;      ///< KEY=VALUES, one axis each
  bool zip = false;                   ///< the axes in step instead of every combination
  std::vector<std::string> sets;      ///< fixed overrides for every point
  std::vector<std::string> measures;  ///< "KIND ARGS" of `terayee measure`, `auto` for the reference
  int jobs = 1;                       ///< points at a time
  int threads = 0;                    ///< per point (0: the usable cores divided by jobs)
  int refine = 0;                     ///< levels of cell refinement (0: none)
  int point = -1;                     ///< run this point only (a job-array task)
  bool no_runs = false;               ///< gather only
  std::string job_script;             ///< "print" or "submit": a Slurm job array instead of local runs
  std::string slurm_time;             ///< the array tasks' time limit, e.g. 12:00:00
  std::string collect_only;           ///< --collect DIR
};
int sweep_command(SweepOptions o);
int write_job_script(const SweepOptions& o, int points);

int bench_command(int size, int threads, const std::string& precision, double seconds, const std::string& which,
                  int block_depth = 1);

/// Cell-updates per second of a square vacuum grid with periodic sides (used by bench
/// and by check's run-time estimate).
double measure_vacuum_rate(int size, int threads, bool single, double seconds, int samples);

/// Cell-updates per second of a small periodic grid filled with one magnetic medium of
/// the scene (its bias, cell and time step), for check's run-time estimate.
double measure_magnetic_rate(const Scene& scene, int medium, int threads, double seconds);

}  // namespace ty
