/// \file sweep_slurm.cpp
/// \brief The Slurm job-array script of a sweep: one array task per point, each running
/// `terayee sweep ... --point $SLURM_ARRAY_TASK_ID` with the cores it was given; the
/// table is gathered afterwards by `terayee sweep --collect DIR` (which also makes the
/// reference runs and the measurements). Written to DIR/job.sh; `--submit slurm` hands
/// it to sbatch.
#include <fmt/format.h>

#include <filesystem>
#include <fstream>
#include <iostream>

#include "io/run/atomic_file.h"
#include "io/scene/diagnostics.h"
#include "tools/commands.h"
#include "tools/sweep_jobs.h"

namespace fs = std::filesystem;

namespace ty {
namespace {

/// Single-quoted for the shell.
std::string sh(const std::string& s) {
  std::string q = "'";
  for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return q + "'";
}

}  // namespace

int write_job_script(const SweepOptions& o, int points) {
  const fs::path dir = fs::absolute(o.out);
  const int cpus = o.threads > 0 ? o.threads : 4;
  std::string cmd = fmt::format("{} sweep {} -o {}", sh(fs::read_symlink("/proc/self/exe").string()),
                                sh(fs::absolute(o.scene).string()), sh(dir.string()));
  for (const auto& v : o.vary) cmd += " --vary " + sh(v);
  for (const auto& s : o.sets) cmd += " --set " + sh(s);
  for (const auto& m : o.measures) cmd += " --measure " + sh(m);  // the task's sweep.json must match the sweep's
  if (o.zip) cmd += " --zip";
  if (o.refine > 0) cmd += fmt::format(" --refine {}", o.refine);
  cmd += " --threads \"$SLURM_CPUS_PER_TASK\" --point \"$SLURM_ARRAY_TASK_ID\"";
  std::string text = "#!/bin/bash\n";
  text += fmt::format("# terayee sweep of {} points, one Slurm array task each. Submit: sbatch {}\n", points,
                      (dir / "job.sh").string());
  text += fmt::format("# afterwards: terayee sweep --collect {} (references, measurements, results.csv)\n", dir.string());
  text += "#SBATCH --job-name=terayee-sweep\n";
  text += fmt::format("#SBATCH --array=0-{}\n", points - 1);
  text += "#SBATCH --ntasks=1\n";
  text += fmt::format("#SBATCH --cpus-per-task={}\n", cpus);
  text += fmt::format("#SBATCH --output={}/slurm-%A_%a.out\n", dir.string());
  if (!o.slurm_time.empty()) text += fmt::format("#SBATCH --time={}\n", o.slurm_time);
  text += "export OMP_NUM_THREADS=\"$SLURM_CPUS_PER_TASK\"\n";
  text += "exec " + cmd + "\n";
  const fs::path path = dir / "job.sh";
  write_text_atomically(path.string(), text);
  fs::permissions(path, fs::perms::owner_exec | fs::perms::group_exec, fs::perm_options::add);
  std::cout << "wrote " << path.string() << "\n";
  if (o.job_script != "submit") return 0;
  const std::string log = (dir / "sbatch.log").string();
  const int rc = run_program("sbatch", {path.string()}, log);
  std::ifstream in(log);
  std::cout << in.rdbuf();
  if (rc != 0) std::cerr << fmt::format("terayee sweep: sbatch failed (exit {}); the script is {}\n", rc, path.string());
  return rc == 0 ? 0 : 1;
}

}  // namespace ty
