/// \file cli_commands.cpp
/// \brief The options of run, check, crystals, medium, render, sweep and bench, and what each
/// does once parsed (quantities with units checked here, exit status 2 on bad ones).
#include <fmt/format.h>

#include <cmath>
#include <cstdlib>
#include <memory>

#include "io/scene/diagnostics.h"
#include "tools/cli.h"
#include "tools/commands.h"

namespace ty::cli {

double quantity(const std::string& text, Kind k, const std::string& what) {
  std::string why;
  auto v = parse_quantity(text, k, why);
  if (!v || v->relative != Quantity::Relative::none)
    throw BadInput(fmt::format("terayee: error: {}: {}", what, why.empty() ? "cells and periods are not allowed here" : why));
  return v->value;
}

std::complex<double> complex_number(const std::string& text, const std::string& what) {
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
    throw BadInput(fmt::format("terayee: error: {}: '{}' is not a number like 5.5 or 5.5+0.02i", what, text));
  return {re, im};
}

int block_depth(const std::string& text, const std::string& what) {
  if (text == "auto") return 0;
  char* end = nullptr;
  const long d = std::strtol(text.c_str(), &end, 10);
  if (end == text.c_str() || *end != '\0' || d < 1 || d > 64)
    throw BadInput(fmt::format("terayee: error: {}: '{}' is not auto or a whole number from 1 to 64", what, text));
  return static_cast<int>(d);
}

Command add_run(CLI::App& app) {
  auto o = std::make_shared<RunOptions>();
  auto* r = app.add_subcommand("run", "Run a scene and write its run folder");
  r->add_option("scene", o->scene, "Scene file (YAML)")->required()->check(CLI::ExistingFile);
  r->add_option("-o,--out", o->out, "Run folder to write")->required();
  r->add_option("--threads", o->threads, "OpenMP threads (overrides time.threads)")->check(CLI::PositiveNumber);
  r->add_option("--set", o->sets, "Override a scene value: key.path=value (repeatable)");
  r->add_flag("--quiet", o->quiet, "No progress line or log on the terminal");
  r->add_flag("--reference", o->reference,
              "Run the scene without its sample bodies (those marked sample: true, else those holding no source)");
  r->add_flag("--resume", o->resume, "Go on with a stopped run from its checkpoint in the run folder");
  r->add_option("--checkpoint-every", o->checkpoint_minutes, "Minutes of wall time between checkpoints (0: only on stop)")
      ->check(CLI::NonNegativeNumber);
  r->add_option("--stop-at-step", o->stop_at_step, "Stop after this step, leaving a checkpoint to resume from")
      ->check(CLI::PositiveNumber);
  r->add_option("--checkpoint-steps", o->checkpoint_steps, "Also write a checkpoint every this many steps (0: no)")
      ->check(CLI::NonNegativeNumber);
  auto depth = std::make_shared<std::string>("auto");
  r->add_option("--block-depth", *depth,
                "Time steps per pass over the rows: auto (default), 1 (one pass per step) or N (temporal blocking)");
  r->add_flag("--overwrite", o->overwrite,
              "Replace the results of an earlier run in the run folder (without it, a folder that is not empty is refused)");

  return {r, [o, depth] {
            o->block_depth = block_depth(*depth, "--block-depth");
            return run_command(*o);
          }};
}

Command add_check(CLI::App& app) {
  struct Options {
    std::string scene;
    std::vector<std::string> sets;
    int threads = 0, ranks = 0;
  };
  auto o = std::make_shared<Options>();
  auto* c = app.add_subcommand("check", "Validate a scene and print what a run would cost");
  c->add_option("scene", o->scene, "Scene file (YAML)")->required()->check(CLI::ExistingFile);
  c->add_option("--set", o->sets, "Override a scene value: key.path=value (repeatable)");
  c->add_option("--threads", o->threads, "Estimate the run time on this many threads (as run --threads)")
      ->check(CLI::PositiveNumber);
  c->add_option("--ranks", o->ranks, "Also say how P MPI ranks would cut the grid and the halo bytes per step")
      ->check(CLI::PositiveNumber);
  return {c, [o] {
            const int rc = check_command(o->scene, o->sets, o->threads);
            if (rc == 0 && o->ranks > 0) return check_ranks(o->scene, o->sets, o->ranks);
            return rc;
          }};
}

Command add_crystals(CLI::App& app) {
  struct Options {
    std::string name, temperature;
  };
  auto o = std::make_shared<Options>();
  auto* cr = app.add_subcommand("crystals", "The crystal library: what is known, each value with its source");
  cr->add_option("name", o->name, "A crystal (e.g. MnF2); without it, the list");
  cr->add_option("--temperature", o->temperature, "Show the model at this temperature (e.g. 40 K)");
  return {cr, [o] {
            return crystals_command(o->name, o->temperature.empty()
                                                 ? -1.0
                                                 : quantity(o->temperature, Kind::temperature, "--temperature"));
          }};
}

/// `medium --stack`: the options that describe one medium are the scene's here; all refused at once.
template <class Options>
int medium_stack(Options& o, CLI::App& md) {
  std::string refused;
  for (const char* name : {"--medium", "--body", "--angle", "--normal", "--thickness", "--waist", "--line-distance",
                           "--incidence-index", "--source-distance", "--image-range", "--plot"})
    if (md.get_option(name)->count() > 0) refused += std::string(refused.empty() ? "" : ", ") + name;
  if (!refused.empty())
    throw BadInput(fmt::format("terayee medium: error: --stack takes the media, the angle (the Bloch k_x) and the "
                               "thicknesses from the scene: drop {}",
                               refused));
  const bool from = md.get_option("--from")->count() > 0, to = md.get_option("--to")->count() > 0;
  if (from != to) throw BadInput("terayee medium: error: --stack takes both --from and --to, or neither");
  if (from) {
    o.from = quantity(o.from_text, Kind::frequency, "--from");
    o.to = quantity(o.to_text, Kind::frequency, "--to");
    if (!(o.to >= o.from) || o.from <= 0) throw BadInput("terayee medium: error: need 0 < --from <= --to");
  }
  return medium_stack_command(o);
}

Command add_medium(CLI::App& app) {
  struct Options : MediumOptions {
    std::string from_text, to_text, angle_text = "0", thickness_text = "0", waist_text = "0", source_text = "0",
                                    range_text = "0", line_text = "0";
  };
  auto o = std::make_shared<Options>();
  auto* md = app.add_subcommand("medium", "Linear-response properties of a medium of a scene under its bias");
  md->add_option("scene", o->scene, "Scene file (YAML)")->required()->check(CLI::ExistingFile);
  md->add_option("--medium", o->medium, "Name of the medium (or give --body; required without --stack)");
  md->add_option("--body", o->body,
                 "A body of the scene, numbered from 1 as `check` lists them: its medium in the state that body "
                 "starts from (its own `order`, `state` or `order: reversed`: an antiferromagnetic domain)")
      ->check(CLI::PositiveNumber);
  md->add_option("--from", o->from_text, "Lowest frequency, e.g. \"250 GHz\" (required without --stack)");
  md->add_option("--to", o->to_text, "Highest frequency (required without --stack)");
  auto* count = md->add_option("--count", o->count, "Frequencies")->check(CLI::Range(1, 100000));
  md->add_flag("--stack", o->stack,
               "Instead of one medium, the layered stack the scene's plane wave meets (bodies across the whole width, "
               "between the source's medium and the far side's), at the scene's Bloch k_x: R and T of both waves from "
               "the 4x4 transfer matrix; frequencies by default those of the scene's first power-spectrum line, else "
               "the sources' band");
  md->add_option("--angle", o->angle_text, "Angle of incidence from the normal, e.g. \"30 deg\"");
  md->add_option("--normal", o->normal, "Interface normal: x or y")->check(CLI::IsMember({"x", "y"}));
  md->add_option("--thickness", o->thickness_text, "Slab thickness (default: a half-space)");
  md->add_option("--waist", o->waist_text, "Beam waist for the beam-summed lateral shift");
  md->add_option("--line-distance", o->line_text,
                 "With --waist: the shift as seen on a line this far before the face, against the beam's specular "
                 "image (as measure shift sees it; its line-distance)");
  md->add_option("--incidence-index", o->incidence_index, "Refractive index of the incidence side")
      ->check(CLI::PositiveNumber);
  md->add_option("--source-distance", o->source_text,
                 "With --thickness: a line source this far before the slab; predict its image behind it");
  md->add_option("--image-range", o->range_text, "How far behind the slab to look for the image (default 6 wavelengths)");
  md->add_option("--plot", o->plot, "Also draw the table: FILE.png, .pdf or .svg");
  md->add_flag("--polarization", o->polarization,
               "Also the Jones matrices and the Faraday and Kerr rotation and ellipticity of each input wave (printed, and "
               "appended to the CSV and JSON rows)");
  md->add_option("--csv", o->csv, "Also write the table to this CSV file");
  md->add_option("--json", o->json, "Also write the results to this JSON file");
  md->add_option("--set", o->sets, "Override a scene value: key.path=value (repeatable)");

  return {md, [o, md, count] {
            o->count_given = count->count() > 0;
            if (o->stack) return medium_stack(*o, *md);
            std::string missing;
            for (const char* name : {"--from", "--to"})
              if (md->get_option(name)->count() == 0) missing += std::string(missing.empty() ? "" : ", ") + name;
            if (md->get_option("--medium")->count() == 0 && md->get_option("--body")->count() == 0)
              missing += std::string(missing.empty() ? "" : ", ") + "--medium (or --body)";
            if (!missing.empty())
              throw BadInput(fmt::format("terayee medium: error: {} required (or --stack)", missing));
            o->from = quantity(o->from_text, Kind::frequency, "--from");
            o->to = quantity(o->to_text, Kind::frequency, "--to");
            o->angle = quantity(o->angle_text, Kind::angle, "--angle");
            o->thickness = quantity(o->thickness_text, Kind::length, "--thickness");
            o->waist = quantity(o->waist_text, Kind::length, "--waist");
            o->source_distance = quantity(o->source_text, Kind::length, "--source-distance");
            o->image_range = quantity(o->range_text, Kind::length, "--image-range");
            o->line_distance = quantity(o->line_text, Kind::length, "--line-distance");
            if (!(o->to >= o->from) || o->from <= 0) throw BadInput("terayee medium: error: need 0 < --from <= --to");
            if (o->medium.empty() && o->body == 0) throw BadInput("terayee medium: error: need --medium or --body");
            return medium_command(*o);
          }};
}

Command add_render(CLI::App& app) {
  struct Options : RenderOptions {
    std::string time_text, freq_text;
    std::vector<std::string> limits_text;
  };
  auto o = std::make_shared<Options>();
  auto* rd = app.add_subcommand("render", "Pictures of a run: field frames, movies, stills and plots");
  rd->add_option("run", o->run, "Run folder (with --plot sweep: a sweep's folder)")->required()->check(CLI::ExistingDirectory);
  rd->add_option("--field", o->field,
                 "Snapshot field (Ez, Hz, Lx, ..., or intensity: the recorded E components squared); with --map: "
                 "a component, Sx, Sy, S or intensity (default)");
  rd->add_option("--movie", o->movie, "Write an H.264 movie (MP4) of the frames instead of PNG files");
  rd->add_option("--fps", o->fps, "Movie frame rate")->check(CLI::Range(0.1, 240.0));
  rd->add_option("--every", o->every, "Use every k-th frame")->check(CLI::PositiveNumber);
  rd->add_option("--time", o->time_text, "One still: the frame nearest this time, e.g. \"20 ps\"");
  rd->add_option("--map", o->map, "A still of this spectral map");
  rd->add_option("--frequency", o->freq_text, "The map's frequency (default: its first)");
  rd->add_option("--quantity", o->quantity, "With --map: intensity (|F|^2), abs or real")
      ->check(CLI::IsMember({"intensity", "abs", "real"}));
  rd->add_option("--limits", o->limits_text, "Colour limits LO HI in the field's SI units (default: robust, fixed for the movie)")
      ->expected(2);
  rd->add_option("--percentile", o->percentile, "Robust limits: this percentile of |field| over all frames");
  rd->add_flag("--rescale", o->rescale, "Scale the colours to each frame on its own");
  rd->add_option("--colours", o->colours, "diverging or sequential (default: by the field)");
  rd->add_flag("--show-absorber", o->show_absorber, "Show the absorbing layers (shaded) where recorded");
  rd->add_option("--size", o->size, "The field panel's longer side, px")->check(CLI::Range(100, 8000));
  rd->add_option("--format", o->format, "Stills and plots: png, pdf or svg");
  rd->add_option("--out", o->out, "Folder for the pictures (default RUN/pictures)");
  rd->add_option("--plot", o->plot, "A plot instead: spectrum, probes, shift, focus, or sweep or bloch-map (RUN is then a sweep's folder)")
      ->check(CLI::IsMember({"spectrum", "probes", "shift", "focus", "sweep", "bloch-map"}));
  rd->add_option("--predicted", o->predicted,
                 "With --plot spectrum: a CSV written by `terayee medium --csv`; with --plot sweep: a CSV of the swept "
                 "value and the predicted number (SI), drawn dashed");
  rd->add_option("--x", o->x_key, "With --plot sweep: the swept key across");
  rd->add_option("--y", o->y_column, "With --plot sweep: the results column drawn (one line per value of the other keys); with --plot bloch-map: reflectance (default) or transmittance");
  rd->add_flag("--with-map", o->with_map, "With --plot sweep over two keys: also the column in colour over both");

  return {rd, [o] {
            if (!o->time_text.empty()) o->time = quantity(o->time_text, Kind::time, "--time");
            if (!o->freq_text.empty()) o->frequency = quantity(o->freq_text, Kind::frequency, "--frequency");
            for (const auto& l : o->limits_text) {
              char* end = nullptr;
              const double v = std::strtod(l.c_str(), &end);
              if (l.empty() || *end != '\0' || !std::isfinite(v))
                throw BadInput(
                    fmt::format("terayee render: error: --limits: '{}' is not a number (SI units of the field)", l));
              o->limits.push_back(v);
            }
            return render_command(*o);
          }};
}

Command add_sweep(CLI::App& app) {
  struct Options : SweepOptions {
    std::string submit_flag;
    bool print_flag = false;
  };
  auto o = std::make_shared<Options>();
  auto* sp = app.add_subcommand("sweep", "A study of many runs: vary scene values, measure each point, one table");
  sp->add_option("scene", o->scene, "Scene file (YAML)")->check(CLI::ExistingFile);
  sp->add_option("-o,--out", o->out, "Folder of the sweep (points/, references/, results.csv)");
  sp->add_option("--vary", o->vary, "KEY=VALUES: a --set path and a list a,b,c, a range FROM:TO:COUNT or @FILE (repeatable)");
  sp->add_flag("--zip", o->zip, "Vary the keys in step instead of every combination");
  sp->add_option("--set", o->sets, "A fixed override for every point: key.path=value (repeatable)");
  sp->add_option("--measure", o->measures, "\"KIND ARGS\" of terayee measure for each point; 'auto' stands for the "
                                           "point's reference run (repeatable)");
  sp->add_option("--jobs", o->jobs, "Points run at a time (the cores are divided between them)")->check(CLI::Range(1, 1024));
  sp->add_option("--threads", o->threads, "Threads per point (default: usable cores / jobs)")->check(CLI::PositiveNumber);
  sp->add_option("--refine", o->refine, "Also run at the cell, cell/2, ...: N levels, and extrapolate every number")
      ->check(CLI::Range(2, 6));
  sp->add_option("--point", o->point, "Run only this point (what a job-array task does)")->check(CLI::NonNegativeNumber);
  sp->add_flag("--print-job-script", o->print_flag, "Write DIR/job.sh, a Slurm job array of the points, and stop");
  sp->add_option("--submit", o->submit_flag, "slurm: write the job array and submit it with sbatch")->check(CLI::IsMember({"slurm"}));
  sp->add_option("--time-limit", o->slurm_time, "The array tasks' time limit for Slurm, e.g. 12:00:00");
  sp->add_option("--collect", o->collect_only, "Gather a sweep's results (after its array tasks ended)")
      ->check(CLI::ExistingDirectory);

  return {sp, [o] {
            if (o->collect_only.empty() && (o->scene.empty() || o->out.empty()))
              throw BadInput("terayee sweep: needs SCENE and -o DIR (or --collect DIR)");
            if (!o->submit_flag.empty()) o->job_script = "submit";
            else if (o->print_flag) o->job_script = "print";
            if (!o->collect_only.empty()) o->no_runs = true;
            return sweep_command(*o);
          }};
}

Command add_bench(CLI::App& app) {
  struct Options {
    int size = 1024, threads = 0;
    double seconds = 0.5;
    std::string precision = "double", bench_case = "all", depth = "1";
  };
  auto o = std::make_shared<Options>();
  auto* b = app.add_subcommand("bench", "Measure cell-updates per second");
  b->add_option("--case", o->bench_case, "vacuum, dielectric, absorber, magnetic, tilted, recorders, phonon, rotated or all")
      ->check(CLI::IsMember({"vacuum", "dielectric", "absorber", "magnetic", "tilted", "recorders", "phonon", "rotated", "all"}));
  b->add_option("--size", o->size, "Cells per side of the square grid")->check(CLI::Range(16, 16384));
  b->add_option("--threads", o->threads, "OpenMP threads (default: all)")->check(CLI::PositiveNumber);
  b->add_option("--precision", o->precision, "double or single")->check(CLI::IsMember({"double", "single"}));
  b->add_option("--seconds", o->seconds, "Length of one timed sample")->check(CLI::Range(0.05, 60.0));

  b->add_option("--block-depth", o->depth, "Time steps per pass over the rows: 1 (default), N or auto");
  return {b, [o] {
            return bench_command(o->size, o->threads, o->precision, o->seconds, o->bench_case,
                                 block_depth(o->depth, "--block-depth"));
          }};
}

}  // namespace ty::cli
