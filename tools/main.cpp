/// \file main.cpp
/// \brief The terayee command line: run, check, crystals, medium, measure, render, bench. Exit status 0 success,
/// 1 run-time failure, 2 bad input or usage, 128 + signal a run stopped by a signal (docs/runs.md).
#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include <iostream>

#include "io/scene/diagnostics.h"
#include "io/scene/units.h"
#include "solver/parallel/ranks.h"
#include "solver/threads/wait_policy.h"
#include "tools/commands.h"

namespace {

/// A command-line quantity with its unit, in SI (relative units are not allowed here).
double quantity_option(const std::string& text, ty::Kind k, const std::string& what) {
  std::string why;
  auto v = ty::parse_quantity(text, k, why);
  if (!v || v->relative != ty::Quantity::Relative::none)
    throw ty::BadInput(fmt::format("terayee: error: {}: {}", what, why.empty() ? "cells and periods are not allowed here" : why));
  return v->value;
}

/// A complex number "RE", "RE+IMi" or "RE-IMi" (a permittivity).
std::complex<double> complex_option(const std::string& text, const std::string& what) {
  const char* p = text.c_str();
  char* end = nullptr;
  const double re = std::strtod(p, &end);
  double im = 0;
  bool ok = end != p;
  if (ok && *end != '\0') {
    const char* q = end;
    im = std::strtod(q, &end);
    ok = end != q && (*q == '+' || *q == '-') && std::string(end) == "i";
  }
  if (!ok || !std::isfinite(re) || !std::isfinite(im))
    throw ty::BadInput(fmt::format("terayee: error: {}: '{}' is not a number like 5.5 or 5.5+0.02i", what, text));
  return {re, im};
}

}  // namespace

int main(int argc, char** argv) {
  ty::bound_thread_waits(argv);  // before any parallel region
  ty::parallel::Session mpi(argc, argv);  // one rank without MPI or outside mpirun
  const bool speaks = ty::parallel::rank() == 0;  // over ranks, only rank 0 reports errors
  CLI::App app{"terayee: 2D FDTD simulation of terahertz waves in dielectric and magnetically ordered media"};
  app.set_version_flag("--version", std::string("terayee ") + TERAYEE_VERSION);
  app.require_subcommand(1);

  ty::RunOptions run;
  auto* r = app.add_subcommand("run", "Run a scene and write its run folder");
  r->add_option("scene", run.scene, "Scene file (YAML)")->required()->check(CLI::ExistingFile);
  r->add_option("-o,--out", run.out, "Run folder to write")->required();
  r->add_option("--threads", run.threads, "OpenMP threads (overrides time.threads)")->check(CLI::PositiveNumber);
  r->add_option("--set", run.sets, "Override a scene value: key.path=value (repeatable)");
  r->add_flag("--quiet", run.quiet, "No progress line or log on the terminal");
  r->add_flag("--reference", run.reference,
              "Run the scene without its sample bodies (those marked sample: true, else those holding no source)");
  r->add_flag("--resume", run.resume, "Go on with a stopped run from its checkpoint in the run folder");
  r->add_option("--checkpoint-every", run.checkpoint_minutes, "Minutes of wall time between checkpoints (0: only on stop)")
      ->check(CLI::NonNegativeNumber);
  r->add_option("--stop-at-step", run.stop_at_step, "Stop after this step, leaving a checkpoint to resume from")
      ->check(CLI::PositiveNumber);
  r->add_option("--checkpoint-steps", run.checkpoint_steps, "Also write a checkpoint every this many steps (0: no)")
      ->check(CLI::NonNegativeNumber);
  r->add_flag("--overwrite", run.overwrite,
              "Replace the results of an earlier run in the run folder (without it, a folder that is not empty is refused)");

  std::string check_scene;
  std::vector<std::string> check_sets;
  auto* c = app.add_subcommand("check", "Validate a scene and print what a run would cost");
  c->add_option("scene", check_scene, "Scene file (YAML)")->required()->check(CLI::ExistingFile);
  c->add_option("--set", check_sets, "Override a scene value: key.path=value (repeatable)");
  int check_threads = 0;
  c->add_option("--threads", check_threads, "Estimate the run time on this many threads (as run --threads)")
      ->check(CLI::PositiveNumber);
  int check_ranks = 0;
  c->add_option("--ranks", check_ranks, "Also say how P MPI ranks would cut the grid and the halo bytes per step")
      ->check(CLI::PositiveNumber);

  std::string crystal_name, crystal_temperature;
  auto* cr = app.add_subcommand("crystals", "The crystal library: what is known, each value with its source");
  cr->add_option("name", crystal_name, "A crystal (e.g. MnF2); without it, the list");
  cr->add_option("--temperature", crystal_temperature, "Show the model at this temperature (e.g. 40 K)");

  ty::MediumOptions med;
  std::string med_from, med_to, med_angle = "0", med_thickness = "0", med_waist = "0", med_source = "0",
                                                            med_range = "0", med_line = "0";
  auto* md = app.add_subcommand("medium", "Linear-response properties of a medium of a scene under its bias");
  md->add_option("scene", med.scene, "Scene file (YAML)")->required()->check(CLI::ExistingFile);
  md->add_option("--medium", med.medium, "Name of the medium")->required();
  md->add_option("--from", med_from, "Lowest frequency, e.g. \"250 GHz\"")->required();
  md->add_option("--to", med_to, "Highest frequency")->required();
  md->add_option("--count", med.count, "Frequencies")->check(CLI::Range(1, 100000));
  md->add_option("--angle", med_angle, "Angle of incidence from the normal, e.g. \"30 deg\"");
  md->add_option("--normal", med.normal, "Interface normal: x or y")->check(CLI::IsMember({"x", "y"}));
  md->add_option("--thickness", med_thickness, "Slab thickness (default: a half-space)");
  md->add_option("--waist", med_waist, "Beam waist for the beam-summed lateral shift");
  md->add_option("--line-distance", med_line,
                 "With --waist: the shift as seen on a line this far before the face, against the beam's specular "
                 "image (as measure shift sees it; its line-distance)");
  md->add_option("--incidence-index", med.incidence_index, "Refractive index of the incidence side")
      ->check(CLI::PositiveNumber);
  md->add_option("--source-distance", med_source,
                 "With --thickness: a line source this far before the slab; predict its image behind it");
  md->add_option("--image-range", med_range, "How far behind the slab to look for the image (default 6 wavelengths)");
  md->add_option("--plot", med.plot, "Also draw the table: FILE.png, .pdf or .svg");
  md->add_option("--csv", med.csv, "Also write the table to this CSV file");
  md->add_option("--json", med.json, "Also write the results to this JSON file");
  md->add_option("--set", med.sets, "Override a scene value: key.path=value (repeatable)");

  auto* m = app.add_subcommand("measure", "Numbers from a run folder");
  m->require_subcommand(1);
  std::string m_run, m_ref, m_reflected, m_transmitted;
  auto* ms = m->add_subcommand("spectrum", "Reflectance, transmittance and absorptance from power-spectrum lines");
  ms->add_option("run", m_run, "Run folder")->required()->check(CLI::ExistingDirectory);
  ms->add_option("--reference", m_ref, "Run folder of the reference run (terayee run --reference)")
      ->required()
      ->check(CLI::ExistingDirectory);
  ms->add_option("--reflected", m_reflected, "Power-spectrum line before the sample (default: the one named 'reflected')");
  ms->add_option("--transmitted", m_transmitted, "Power-spectrum line behind the sample (default: the one named 'transmitted')");

  ty::MaterialOptions mat;
  std::string mat_thickness, mat_perm, mat_from, mat_to, mat_front;
  auto* mm = m->add_subcommand("material", "A slab's t(f), n + i kappa (and mu, eps) from a probe behind it against the reference run");
  mm->add_option("run", mat.run, "Run folder")->required()->check(CLI::ExistingDirectory);
  mm->add_option("--reference", mat.reference, "Run folder of the reference run (terayee run --reference)")
      ->required()
      ->check(CLI::ExistingDirectory);
  mm->add_option("--probe", mat.probe, "The probe behind the slab")->required();
  mm->add_option("--thickness", mat_thickness, "The slab's thickness, e.g. \"100 um\"")->required();
  mm->add_option("--field", mat.field, "The probe's field to analyse (default Ez)");
  mm->add_option("--permittivity", mat_perm, "The slab's permittivity, e.g. 5.5 or 5.5+0.02i: retrieve mu from t");
  mm->add_option("--window", mat.window, "main (the main pulse alone) or all (with its echoes)")
      ->check(CLI::IsMember({"main", "all"}));
  mm->add_option("--from", mat_from, "Lowest frequency (default: where the reference spectrum is above 1% of its peak)");
  mm->add_option("--to", mat_to, "Highest frequency");
  mm->add_option("--count", mat.count, "Frequencies")->check(CLI::Range(2, 100000));
  mm->add_option("--reflected-probe", mat.reflected_probe, "A probe before the slab: eps and mu from r and t");
  mm->add_option("--front", mat_front, "With --reflected-probe: the slab's front face, x=VALUE or y=VALUE");
  mm->add_option("--json", mat.json, "Write the spectra to this JSON file");

  std::string f_run, f_map, f_ref, f_freq, f_axis = "x", f_face;
  auto* mf = m->add_subcommand("focus", "The focal spot in a spectral map");
  mf->add_option("run", f_run, "Run folder")->required()->check(CLI::ExistingDirectory);
  mf->add_option("--map", f_map, "Spectral map name")->required();
  mf->add_option("--frequency", f_freq, "One of the map's frequencies (default: its first)");
  mf->add_option("--axis", f_axis, "The beam's axis: x or y")->check(CLI::IsMember({"x", "y"}));
  mf->add_option("--reference", f_ref, "Reference run folder, for the peak relative to the incident beam")
      ->check(CLI::ExistingDirectory);
  mf->add_option("--face", f_face, "Coordinate of a face along the axis, e.g. \"1.2 mm\"");

  std::string a_run, a_map, a_normal = "y", a_inc;
  std::vector<std::string> a_region;
  auto* ma = m->add_subcommand("angle", "Direction of power flow of a beam inside a region");
  ma->add_option("run", a_run, "Run folder")->required()->check(CLI::ExistingDirectory);
  ma->add_option("--map", a_map, "Spectral map name (with Sx and Sy)")->required();
  ma->add_option("--region", a_region, "Centre and size: \"CX\" \"CY\" \"SX\" \"SY\" with units")->required()->expected(4);
  ma->add_option("--normal", a_normal, "Interface normal: x or y")->check(CLI::IsMember({"x", "y"}));
  ma->add_option("--incidence", a_inc, "Angle of incidence, for the sign of the refraction");

  ty::ShiftOptions sh;
  std::string sh_line, sh_interface, sh_angle, sh_freq;
  auto* msh = m->add_subcommand("shift", "Lateral shift of a reflected beam");
  msh->add_option("run", sh.run, "Run folder")->required()->check(CLI::ExistingDirectory);
  msh->add_option("--reference", sh.reference, "Reference run folder (the incident beam)")->required()->check(CLI::ExistingDirectory);
  msh->add_option("--map", sh.map, "Spectral map name")->required();
  msh->add_option("--line", sh_line, "The measurement line parallel to the interface: y=VALUE or x=VALUE")->required();
  msh->add_option("--interface", sh_interface,
                  "The body's face along its normal (the node plane where it acts is taken from the run's grid)")
      ->required();
  msh->add_option("--angle", sh_angle,
                  "Not needed: the zero point is the incident beam's own specular image (accepted for older scripts)");
  msh->add_option("--frequency", sh_freq, "One of the map's frequencies (default: its first)");
  msh->add_option("--reversed", sh.reversed, "Run folder with the bias reversed")->check(CLI::ExistingDirectory);
  msh->add_option("--reversed-reference", sh.reversed_reference, "Its reference run")->check(CLI::ExistingDirectory);

  ty::RenderOptions ro;
  std::string ro_time, ro_freq;
  std::vector<std::string> ro_limits;
  auto* rd = app.add_subcommand("render", "Pictures of a run: field frames, movies, stills and plots");
  rd->add_option("run", ro.run, "Run folder (with --plot sweep: a sweep's folder)")->required()->check(CLI::ExistingDirectory);
  rd->add_option("--field", ro.field,
                 "Snapshot field (Ez, Hz, Lx, ..., or intensity: the recorded E components squared); with --map: "
                 "a component, Sx, Sy, S or intensity (default)");
  rd->add_option("--movie", ro.movie, "Write an H.264 movie (MP4) of the frames instead of PNG files");
  rd->add_option("--fps", ro.fps, "Movie frame rate")->check(CLI::Range(0.1, 240.0));
  rd->add_option("--every", ro.every, "Use every k-th frame")->check(CLI::PositiveNumber);
  rd->add_option("--time", ro_time, "One still: the frame nearest this time, e.g. \"20 ps\"");
  rd->add_option("--map", ro.map, "A still of this spectral map");
  rd->add_option("--frequency", ro_freq, "The map's frequency (default: its first)");
  rd->add_option("--quantity", ro.quantity, "With --map: intensity (|F|^2), abs or real")
      ->check(CLI::IsMember({"intensity", "abs", "real"}));
  rd->add_option("--limits", ro_limits, "Colour limits LO HI in the field's SI units (default: robust, fixed for the movie)")
      ->expected(2);
  rd->add_option("--percentile", ro.percentile, "Robust limits: this percentile of |field| over all frames");
  rd->add_flag("--rescale", ro.rescale, "Scale the colours to each frame on its own");
  rd->add_option("--colours", ro.colours, "diverging or sequential (default: by the field)");
  rd->add_flag("--show-absorber", ro.show_absorber, "Show the absorbing layers (shaded) where recorded");
  rd->add_option("--size", ro.size, "The field panel's longer side, px")->check(CLI::Range(100, 8000));
  rd->add_option("--format", ro.format, "Stills and plots: png, pdf or svg");
  rd->add_option("--out", ro.out, "Folder for the pictures (default RUN/pictures)");
  rd->add_option("--plot", ro.plot, "A plot instead: spectrum, probes, shift, focus, or sweep or bloch-map (RUN is then a sweep's folder)")
      ->check(CLI::IsMember({"spectrum", "probes", "shift", "focus", "sweep", "bloch-map"}));
  rd->add_option("--predicted", ro.predicted,
                 "With --plot spectrum: a CSV written by `terayee medium --csv`; with --plot sweep: a CSV of the swept "
                 "value and the predicted number (SI), drawn dashed");
  rd->add_option("--x", ro.x_key, "With --plot sweep: the swept key across");
  rd->add_option("--y", ro.y_column, "With --plot sweep: the results column drawn (one line per value of the other keys); with --plot bloch-map: reflectance (default) or transmittance");
  rd->add_flag("--with-map", ro.with_map, "With --plot sweep over two keys: also the column in colour over both");

  ty::SweepOptions sw;
  std::string sw_submit;
  bool sw_print = false;
  auto* sp = app.add_subcommand("sweep", "A study of many runs: vary scene values, measure each point, one table");
  sp->add_option("scene", sw.scene, "Scene file (YAML)")->check(CLI::ExistingFile);
  sp->add_option("-o,--out", sw.out, "Folder of the sweep (points/, references/, results.csv)");
  sp->add_option("--vary", sw.vary, "KEY=VALUES: a --set path and a list a,b,c, a range FROM:TO:COUNT or @FILE (repeatable)");
  sp->add_flag("--zip", sw.zip, "Vary the keys in step instead of every combination");
  sp->add_option("--set", sw.sets, "A fixed override for every point: key.path=value (repeatable)");
  sp->add_option("--measure", sw.measures, "\"KIND ARGS\" of terayee measure for each point; 'auto' stands for the "
                                           "point's reference run (repeatable)");
  sp->add_option("--jobs", sw.jobs, "Points run at a time (the cores are divided between them)")->check(CLI::Range(1, 1024));
  sp->add_option("--threads", sw.threads, "Threads per point (default: usable cores / jobs)")->check(CLI::PositiveNumber);
  sp->add_option("--refine", sw.refine, "Also run at the cell, cell/2, ...: N levels, and extrapolate every number")
      ->check(CLI::Range(2, 6));
  sp->add_option("--point", sw.point, "Run only this point (what a job-array task does)")->check(CLI::NonNegativeNumber);
  sp->add_flag("--print-job-script", sw_print, "Write DIR/job.sh, a Slurm job array of the points, and stop");
  sp->add_option("--submit", sw_submit, "slurm: write the job array and submit it with sbatch")->check(CLI::IsMember({"slurm"}));
  sp->add_option("--time-limit", sw.slurm_time, "The array tasks' time limit for Slurm, e.g. 12:00:00");
  sp->add_option("--collect", sw.collect_only, "Gather a sweep's results (after its array tasks ended)")
      ->check(CLI::ExistingDirectory);

  int size = 1024, threads = 0;
  double seconds = 0.5;
  std::string precision = "double", bench_case = "all";
  auto* b = app.add_subcommand("bench", "Measure cell-updates per second");
  b->add_option("--case", bench_case, "vacuum, dielectric, absorber, magnetic, tilted, recorders or all")
      ->check(CLI::IsMember({"vacuum", "dielectric", "absorber", "magnetic", "tilted", "recorders", "all"}));
  b->add_option("--size", size, "Cells per side of the square grid")->check(CLI::Range(16, 16384));
  b->add_option("--threads", threads, "OpenMP threads (default: all)")->check(CLI::PositiveNumber);
  b->add_option("--precision", precision, "double or single")->check(CLI::IsMember({"double", "single"}));
  b->add_option("--seconds", seconds, "Length of one timed sample")->check(CLI::Range(0.05, 60.0));

  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? 0 : 2;
  }
  try {
    if (ty::parallel::size() > 1 && !*r)
      throw ty::BadInput(fmt::format("terayee: error: only `terayee run` spreads over MPI ranks ({} ranks here); run "
                                     "this command as one process",
                                     ty::parallel::size()));
    if (*r) return ty::run_command(run);
    if (*c) {
      const int rc = ty::check_command(check_scene, check_sets, check_threads);
      if (rc == 0 && check_ranks > 0) return ty::check_ranks(check_scene, check_sets, check_ranks);
      return rc;
    }
    if (*ms) return ty::measure_spectrum(m_run, m_ref, m_reflected, m_transmitted);
    if (*mm) {
      auto q = quantity_option;
      mat.thickness = q(mat_thickness, ty::Kind::length, "--thickness");
      if (!mat_from.empty()) mat.from = q(mat_from, ty::Kind::frequency, "--from");
      if (!mat_to.empty()) mat.to = q(mat_to, ty::Kind::frequency, "--to");
      if (mat_from.empty() != mat_to.empty() || (!mat_from.empty() && !(mat.to > mat.from && mat.from > 0)))
        throw ty::BadInput("terayee measure material: error: --from and --to go together, 0 < --from < --to");
      if (!mat_perm.empty()) mat.permittivity = complex_option(mat_perm, "--permittivity");
      if (mat.reflected_probe.empty() != mat_front.empty())
        throw ty::BadInput("terayee measure material: error: --reflected-probe and --front go together");
      if (!mat_front.empty()) {
        if (mat_front.size() < 3 || (mat_front[0] != 'x' && mat_front[0] != 'y') || mat_front[1] != '=')
          throw ty::BadInput("terayee measure material: error: --front must be x=VALUE or y=VALUE");
        mat.front_axis = mat_front[0];
        mat.front = q(mat_front.substr(2), ty::Kind::length, "--front");
      }
      return ty::measure_material(mat);
    }
    if (*msh) {
      auto q = quantity_option;
      if (sh_line.size() < 3 || (sh_line[0] != 'x' && sh_line[0] != 'y') || sh_line[1] != '=')
        throw ty::BadInput("terayee measure shift: error: --line must be y=VALUE or x=VALUE");
      sh.line_axis = sh_line[0];
      sh.line = q(sh_line.substr(2), ty::Kind::length, "--line");
      sh.interface = q(sh_interface, ty::Kind::length, "--interface");
      if (!sh_angle.empty()) q(sh_angle, ty::Kind::angle, "--angle");  // checked, not used
      if (!sh_freq.empty()) sh.frequency = q(sh_freq, ty::Kind::frequency, "--frequency");
      if (sh.reversed.empty() != sh.reversed_reference.empty())
        throw ty::BadInput("terayee measure shift: error: --reversed and --reversed-reference go together");
      return ty::measure_shift(sh);
    }
    if (*ma) {
      std::vector<double> region;
      for (const auto& t : a_region) region.push_back(quantity_option(t, ty::Kind::length, "--region"));
      const double inc = a_inc.empty() ? 0.0 : quantity_option(a_inc, ty::Kind::angle, "--incidence");
      return ty::measure_angle(a_run, a_map, region, a_normal, inc, !a_inc.empty());
    }
    if (*mf) {
      const double freq = f_freq.empty() ? 0.0 : quantity_option(f_freq, ty::Kind::frequency, "--frequency");
      const double face = f_face.empty() ? 0.0 : quantity_option(f_face, ty::Kind::length, "--face");
      return ty::measure_focus(f_run, f_map, f_ref, freq, f_axis, face, !f_face.empty());
    }
    if (*cr)
      return ty::crystals_command(crystal_name, crystal_temperature.empty()
                                                    ? -1.0
                                                    : quantity_option(crystal_temperature, ty::Kind::temperature,
                                                                      "--temperature"));
    if (*md) {
      auto q = quantity_option;
      med.from = q(med_from, ty::Kind::frequency, "--from");
      med.to = q(med_to, ty::Kind::frequency, "--to");
      med.angle = q(med_angle, ty::Kind::angle, "--angle");
      med.thickness = q(med_thickness, ty::Kind::length, "--thickness");
      med.waist = q(med_waist, ty::Kind::length, "--waist");
      med.source_distance = q(med_source, ty::Kind::length, "--source-distance");
      med.image_range = q(med_range, ty::Kind::length, "--image-range");
      med.line_distance = q(med_line, ty::Kind::length, "--line-distance");
      if (!(med.to >= med.from) || med.from <= 0) throw ty::BadInput("terayee medium: error: need 0 < --from <= --to");
      return ty::medium_command(med);
    }
    if (*rd) {
      if (!ro_time.empty()) ro.time = quantity_option(ro_time, ty::Kind::time, "--time");
      if (!ro_freq.empty()) ro.frequency = quantity_option(ro_freq, ty::Kind::frequency, "--frequency");
      for (const auto& l : ro_limits) {
        char* end = nullptr;
        const double v = std::strtod(l.c_str(), &end);
        if (l.empty() || *end != '\0' || !std::isfinite(v))
          throw ty::BadInput(fmt::format("terayee render: error: --limits: '{}' is not a number (SI units of the field)", l));
        ro.limits.push_back(v);
      }
      return ty::render_command(ro);
    }
    if (*sp) {
      if (sw.collect_only.empty() && (sw.scene.empty() || sw.out.empty()))
        throw ty::BadInput("terayee sweep: needs SCENE and -o DIR (or --collect DIR)");
      if (!sw_submit.empty()) sw.job_script = "submit";
      else if (sw_print) sw.job_script = "print";
      if (!sw.collect_only.empty()) sw.no_runs = true;
      return ty::sweep_command(sw);
    }
    if (*b) return ty::bench_command(size, threads, precision, seconds, bench_case);
  } catch (const ty::BadInput& e) {  // the same input on every rank: the same error on every rank
    if (speaks) std::cerr << e.what() << "\n";
    return 2;
  } catch (const std::exception& e) {
    if (ty::parallel::size() > 1) {  // one rank's failure (a write error): end them all
      std::cerr << fmt::format("terayee (rank {}): error: {}\n", ty::parallel::rank(), e.what());
      ty::parallel::abort(1);
    }
    std::cerr << "terayee: error: " << e.what() << "\n";
    return 1;
  }
  return 2;
}
