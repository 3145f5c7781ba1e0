/// \file main.cpp
/// \brief The terayee command line: run, check, crystals, medium, measure, render, bench. Exit status 0 success,
/// 1 run-time failure, 2 bad input or usage, 128 + signal a run stopped by a signal (docs/runs.md).
#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include <iostream>

#include "io/scene/diagnostics.h"
#include "solver/parallel/ranks.h"
#include "solver/threads/wait_policy.h"
#include "tools/cli.h"

int main(int argc, char** argv) {
  ty::bound_thread_waits(argv);  // before any parallel region
  ty::parallel::Session mpi(argc, argv);  // one rank without MPI or outside mpirun
  const bool speaks = ty::parallel::rank() == 0;  // over ranks, only rank 0 reports errors
  CLI::App app{"terayee: 2D FDTD simulation of terahertz waves in dielectric and magnetically ordered media"};
  app.set_version_flag("--version", std::string("terayee ") + TERAYEE_VERSION);
  app.require_subcommand(1);
  namespace cli = ty::cli;
  std::vector<cli::Command> commands = {cli::add_run(app), cli::add_check(app), cli::add_crystals(app),
                                        cli::add_medium(app)};
  for (auto& c : cli::add_measure(app)) commands.push_back(std::move(c));
  for (auto add : {cli::add_render, cli::add_sweep, cli::add_bench}) commands.push_back(add(app));
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? 0 : 2;
  }
  try {
    const bool run_chosen = commands.front().app->parsed();
    if (ty::parallel::size() > 1 && !run_chosen)
      throw ty::BadInput(fmt::format("terayee: error: only `terayee run` spreads over MPI ranks ({} ranks here); run "
                                     "this command as one process",
                                     ty::parallel::size()));
    for (const auto& c : commands)
      if (c.app->parsed()) return c.action();
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
