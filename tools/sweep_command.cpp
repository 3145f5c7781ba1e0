/// \file sweep_command.cpp
/// \brief `terayee sweep`: a study of many runs. Every point of the `--vary` axes is a run
/// folder DIR/points/NAME; its measurements (`--measure "KIND ARGS"`, the measure commands'
/// own arguments, `auto` for a reference made once per distinct reference scene) are
/// gathered into DIR/results.csv and .json; `--refine N` adds the cell as an axis and
/// extrapolates each number (io/analysis/sweep/richardson.h). Points run locally, `--jobs`
/// at a time with the cores divided between them, or as a Slurm job array
/// (tools/sweep_slurm.cpp). A second call skips finished points and resumes stopped ones.
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <functional>
#include <iomanip>
#include <iostream>
#include <map>
#include <sstream>

#include "io/analysis/sweep/refinement_table.h"
#include "io/analysis/sweep/results_table.h"
#include "io/analysis/sweep/sweep_plan.h"
#include "io/run/atomic_file.h"
#include "io/scene/diagnostics.h"
#include "io/scene/scene_reader.h"
#include "io/scene/scene_writer.h"
#include "solver/threads/thread_count.h"
#include "tools/commands.h"
#include "tools/sweep_jobs.h"

namespace fs = std::filesystem;

namespace ty {
namespace {

std::vector<std::string> words(const std::string& s) {
  std::istringstream in(s);
  std::vector<std::string> w;
  for (std::string t; in >> std::quoted(t);) w.push_back(t);
  return w;
}

bool finished(const fs::path& run) {
  std::ifstream in(run / "summary.json");
  if (!in) return false;
  try {
    return nlohmann::json::parse(in).value("completed", false);
  } catch (const nlohmann::json::exception&) {
    return false;
  }
}

/// The `terayee run` arguments for `scene` with `sets` into `out`, resuming when it stopped.
std::vector<std::string> run_args(const SweepOptions& o, const std::vector<std::string>& sets, const fs::path& out,
                                  bool reference, int threads) {
  std::vector<std::string> a{"run", o.scene, "-o", out.string(), "--quiet", "--threads", std::to_string(threads)};
  if (reference) a.push_back("--reference");
  for (const auto& s : sets) a.insert(a.end(), {"--set", s});
  if (fs::exists(out / "checkpoint.h5")) a.push_back("--resume");
  else if (fs::exists(out) && !fs::is_empty(out)) a.push_back("--overwrite");  // a point that failed before it saved
  return a;
}

/// What identifies a reference run: its resolved scene, with the bias dropped when no
/// magnetic body remains (it then changes nothing).
std::string reference_key(const Scene& s) {
  Scene r = reference_scene(s);
  bool magnetic = false;
  std::vector<bool> used(r.media.size(), false);
  for (const auto& b : r.bodies) magnetic = magnetic || r.media[b.medium].magnet.has_value(), used[b.medium] = true;
  for (size_t k = 0; k < r.media.size(); ++k)  // a medium no remaining body holds changes nothing
    if (!used[k]) {
      Medium blank;
      blank.name = r.media[k].name;
      r.media[k] = blank;
    }
  if (!magnetic) r.bias = {0, 0, 0};
  r.file.clear();
  return resolved_scene_yaml(r);
}

struct Plan {
  std::vector<std::string> keys;
  std::vector<SweepPoint> points;
  std::vector<std::string> ref_of;           ///< per point: the reference folder ("" without one)
  std::map<std::string, std::vector<std::string>> ref_sets;  ///< reference folder -> its overrides
  bool needs_reference = false;
};

Plan make_plan(const SweepOptions& o) {
  Plan p;
  std::vector<SweepAxis> axes;
  for (const auto& v : o.vary) axes.push_back(parse_axis(v));
  const Scene base = read_scene(o.scene, o.sets);
  if (o.refine > 0) {
    const double dx = base.grid.dx, dy = base.grid.dy;
    SweepAxis a{"grid.cell", {}};
    for (int k = 0; k < o.refine; ++k) {
      const double f = 1e6 / double(1 << k);
      a.values.push_back(dx == dy ? fmt::format("{:.10g} um", dx * f) : fmt::format("[{:.10g} um, {:.10g} um]", dx * f, dy * f));
    }
    if (o.refine < 2 || o.refine > 6) throw BadInput("terayee sweep: --refine takes 2 to 6 levels");
    axes.push_back(a);
  }
  if (axes.empty()) throw BadInput("terayee sweep: give at least one --vary KEY=VALUES (or --refine N)");
  for (const auto& a : axes) p.keys.push_back(a.key);
  p.points = expand(axes, o.zip);
  for (const auto& m : o.measures)
    for (const auto& w : words(m)) p.needs_reference = p.needs_reference || w == "auto";
  std::map<std::string, std::string> refs;  // reference key -> folder
  for (const auto& pt : p.points) {
    std::vector<std::string> sets = o.sets;
    for (const auto& s : pt.overrides()) sets.push_back(s);
    const Scene s = read_scene(o.scene, sets);  // every point checked before anything runs
    std::string ref;
    if (p.needs_reference) {
      const std::string key = reference_key(s);
      auto [it, fresh] = refs.emplace(key, fmt::format("references/ref-{:03d}", refs.size()));
      if (fresh) p.ref_sets[it->second] = sets;
      ref = it->second;
    }
    p.ref_of.push_back(ref);
  }
  return p;
}

nlohmann::json plan_json(const SweepOptions& o, const Plan& p) {
  nlohmann::json j;
  j["terayee-version"] = TERAYEE_VERSION;
  j["scene"] = fs::absolute(o.scene).string();
  std::ifstream in(o.scene);
  j["scene-text"] = std::string(std::istreambuf_iterator<char>(in), {});
  j["vary"] = o.vary, j["zip"] = o.zip, j["set"] = o.sets, j["measure"] = o.measures, j["refine"] = o.refine;
  j["swept"] = p.keys;
  for (size_t k = 0; k < p.points.size(); ++k)
    j["points"].push_back({{"name", p.points[k].name}, {"set", p.points[k].overrides()}, {"reference", p.ref_of[k]}});
  return j;
}

/// Runs the measurements of one point; adds their numbers to `row`.
void measure_point(const SweepOptions& o, const fs::path& dir, const fs::path& run, const std::string& ref,
                   ResultRow& row) {
  for (const auto& m : o.measures) {
    auto w = words(m);
    if (w.empty()) continue;
    std::vector<std::string> args{"measure", w[0], run.string()};
    for (size_t k = 1; k < w.size(); ++k) args.push_back(w[k] == "auto" ? (dir / ref).string() : w[k]);
    const int rc = run_one(args, (run / "measure.log").string());
    std::ifstream in(run / (w[0] + ".json"));
    if (rc != 0 || !in) {
      row.status = "measure-failed";
      continue;
    }
    try {
      flatten_measurement(nlohmann::json::parse(in), w[0], row.measured);
    } catch (const nlohmann::json::exception&) {
      row.status = "measure-failed";
    }
  }
}

}  // namespace

int sweep_command(SweepOptions o) {
  const fs::path dir = o.out;
  if (!o.collect_only.empty()) {  // the options come back from the sweep's own record
    std::ifstream in(fs::path(o.collect_only) / "sweep.json");
    if (!in) throw BadInput(fmt::format("terayee sweep --collect: no sweep.json in '{}'", o.collect_only));
    const auto j = nlohmann::json::parse(in, nullptr, false);
    if (j.is_discarded()) throw BadInput(fmt::format("terayee sweep --collect: '{}/sweep.json' is not JSON", o.collect_only));
    o.scene = j.value("scene", ""), o.out = o.collect_only;
    o.vary = j.value("vary", std::vector<std::string>{}), o.zip = j.value("zip", false);
    o.sets = j.value("set", std::vector<std::string>{}), o.measures = j.value("measure", std::vector<std::string>{});
    o.refine = j.value("refine", 0);
    o.collect_only.clear();
    o.no_runs = true;
    return sweep_command(o);
  }
  const Plan p = make_plan(o);
  fs::create_directories(dir / "points");
  if (p.needs_reference) fs::create_directories(dir / "references");
  const nlohmann::json record = plan_json(o, p);
  if (std::ifstream old(dir / "sweep.json"); old) {
    const auto j = nlohmann::json::parse(old, nullptr, false);
    if (!j.is_discarded() && (j["points"] != record["points"] || j["measure"] != record["measure"]))
      throw BadInput(fmt::format("terayee sweep: '{}' holds a different sweep (its sweep.json); choose another folder",
                                 dir.string()));
  }
  write_text_atomically((dir / "sweep.json").string(), record.dump(2) + "\n");  // array tasks read it while others write
  if (!o.job_script.empty()) return write_job_script(o, static_cast<int>(p.points.size()));

  const int jobs = std::max(1, o.jobs);
  const int threads = o.threads > 0 ? o.threads : std::max(1, usable_cores() / jobs);
  if (o.point >= static_cast<int>(p.points.size()))
    throw BadInput(fmt::format("terayee sweep: --point {} but the sweep has {} points", o.point, p.points.size()));
  std::vector<size_t> todo;
  for (size_t k = 0; k < p.points.size(); ++k)
    if ((o.point < 0 || static_cast<int>(k) == o.point) && !finished(dir / "points" / p.points[k].name)) todo.push_back(k);

  std::vector<Job> runs;
  for (const auto& [folder, sets] : p.ref_sets)  // by the local sweep or --collect; array tasks make none
    if (o.point < 0 && !finished(dir / folder))
      runs.push_back({run_args(o, sets, dir / folder, true, threads), (dir / (folder + ".log")).string(), {}});
  if (!o.no_runs) {
    for (size_t k : todo) {
      std::vector<std::string> sets = o.sets;
      for (const auto& s : p.points[k].overrides()) sets.push_back(s);
      const fs::path out = dir / "points" / p.points[k].name;
      runs.push_back({run_args(o, sets, out, false, threads), (dir / "points" / (p.points[k].name + ".log")).string(), {}});
    }
  }
  const auto t0 = std::chrono::steady_clock::now();
  const int total = static_cast<int>(runs.size());
  int failed = 0;
  for (auto& r : runs) r.done = [&failed](int status) { failed += status != 0; };
  std::cerr << fmt::format("sweep: {} points ({} to run), {} at a time with {} threads each\n", p.points.size(), total,
                           jobs, threads);
  run_jobs(std::move(runs), jobs, [&](int done, int running) {
    const double el = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    const double eta = done > 0 ? el / done * (total - done) : 0;
    std::cerr << fmt::format("sweep: {}/{} runs finished, {} running, {} failed, {:.0f} s elapsed, about {:.0f} s left\n",
                             done, total, running, failed, el, eta);
  });
  if (o.point >= 0) return failed ? 1 : 0;  // an array task: the table is made by --collect

  std::vector<ResultRow> rows;
  for (size_t k = 0; k < p.points.size(); ++k) {
    ResultRow row{p.points[k].name, p.points[k].sets, "done", nlohmann::json::object()};
    const fs::path run = dir / "points" / p.points[k].name;
    if (!finished(run)) row.status = fs::exists(run) ? "failed" : "missing";
    else measure_point(o, dir, run, p.ref_of[k], row);
    rows.push_back(row);
  }
  write_results(dir.string(), p.keys, rows);
  if (o.refine > 0) write_refinement(dir.string(), rows);
  int bad = 0;
  for (const auto& r : rows) bad += r.status != "done";
  std::cerr << fmt::format("sweep: {} of {} points done; results in {}/results.csv\n", rows.size() - bad, rows.size(),
                           dir.string());
  return bad ? 1 : 0;
}

}  // namespace ty
