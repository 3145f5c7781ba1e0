/// \file cli.h
/// \brief The command line's pieces: each command registers its options on the CLI11 app
/// and returns what to do once they are parsed (cli_commands.cpp, cli_measure.cpp).
#pragma once
#include <CLI/CLI.hpp>

#include <complex>
#include <functional>
#include <string>
#include <vector>

#include "io/scene/units.h"

namespace ty::cli {

/// A (sub)command and its action, run when the command line chose it.
struct Command {
  CLI::App* app = nullptr;
  std::function<int()> action;
};

/// A command-line quantity with its unit, in SI (relative units are not allowed here).
double quantity(const std::string& text, Kind k, const std::string& what);
/// A complex number "RE", "RE+IMi" or "RE-IMi" (a permittivity).
std::complex<double> complex_number(const std::string& text, const std::string& what);
/// --block-depth: auto (0) or a whole number of steps from 1 to 64; BadInput otherwise.
int block_depth(const std::string& text, const std::string& what);

Command add_run(CLI::App& app);
Command add_check(CLI::App& app);
Command add_crystals(CLI::App& app);
Command add_medium(CLI::App& app);
Command add_render(CLI::App& app);
Command add_sweep(CLI::App& app);
Command add_bench(CLI::App& app);
/// `measure` and its subcommands (spectrum, material, focus, angle, shift).
std::vector<Command> add_measure(CLI::App& app);

}  // namespace ty::cli
