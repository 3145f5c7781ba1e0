/// \file cli_measure.cpp
/// \brief The options of `terayee measure` (spectrum, material, polarization, focus, angle, shift) and what
/// each does once parsed.
#include <fmt/format.h>

#include <memory>

#include "io/analysis/spectroscopy/eo_detector.h"
#include "io/scene/diagnostics.h"
#include "tools/cli.h"
#include "tools/commands.h"

namespace ty::cli {
namespace {

Command add_spectrum(CLI::App& m) {
  struct Options {
    std::string run, ref, reflected, transmitted;
  };
  auto o = std::make_shared<Options>();
  auto* ms = m.add_subcommand("spectrum", "Reflectance, transmittance and absorptance from power-spectrum lines");
  ms->add_option("run", o->run, "Run folder")->required()->check(CLI::ExistingDirectory);
  ms->add_option("--reference", o->ref, "Run folder of the reference run (terayee run --reference)")
      ->required()
      ->check(CLI::ExistingDirectory);
  ms->add_option("--reflected", o->reflected, "Power-spectrum line before the sample (default: the one named 'reflected')");
  ms->add_option("--transmitted", o->transmitted, "Power-spectrum line behind the sample (default: the one named 'transmitted')");

  return {ms, [o] { return measure_spectrum(o->run, o->ref, o->reflected, o->transmitted); }};
}

/// "x=VALUE" or "y=VALUE": the axis and the length.
bool axis_value(const std::string& text, char& axis, double& value, const std::string& what) {
  if (text.size() < 3 || (text[0] != 'x' && text[0] != 'y') || text[1] != '=') return false;
  axis = text[0];
  value = quantity(text.substr(2), Kind::length, what);
  return true;
}

/// --from and --to of a measure command: both or neither, 0 < --from < --to.
void read_band(const std::string& from_text, const std::string& to_text, double& from, double& to,
               const std::string& command) {
  if (!from_text.empty()) from = quantity(from_text, Kind::frequency, "--from");
  if (!to_text.empty()) to = quantity(to_text, Kind::frequency, "--to");
  if (from_text.empty() != to_text.empty() || (!from_text.empty() && !(to > from && from > 0)))
    throw BadInput(fmt::format("terayee measure {}: error: --from and --to go together, 0 < --from < --to", command));
}

Command add_material(CLI::App& m) {
  struct Options : MaterialOptions {
    std::string thickness_text, perm_text, from_text, to_text, front_text, detector_text;
  };
  auto o = std::make_shared<Options>();
  auto* mm = m.add_subcommand("material", "A slab's t(f), n + i kappa (and mu, eps) from a probe behind it against the reference run");
  mm->add_option("run", o->run, "Run folder")->required()->check(CLI::ExistingDirectory);
  mm->add_option("--reference", o->reference, "Run folder of the reference run (terayee run --reference)")
      ->required()
      ->check(CLI::ExistingDirectory);
  mm->add_option("--probe", o->probe, "The probe behind the slab")->required();
  mm->add_option("--thickness", o->thickness_text, "The slab's thickness, e.g. \"100 um\"")->required();
  mm->add_option("--field", o->field, "The probe's field to analyse (default Ez)");
  mm->add_option("--permittivity", o->perm_text, "The slab's permittivity, e.g. 5.5 or 5.5+0.02i: retrieve mu from t");
  mm->add_option("--window", o->window, "main (the main pulse alone) or all (with its echoes)")
      ->check(CLI::IsMember({"main", "all"}));
  mm->add_option("--from", o->from_text, "Lowest frequency (default: where the reference spectrum is above 1% of its peak)");
  mm->add_option("--to", o->to_text, "Highest frequency");
  mm->add_option("--count", o->count, "Frequencies")->check(CLI::Range(2, 100000));
  mm->add_option("--reflected-probe", o->reflected_probe, "A probe before the slab: eps and mu from r and t");
  mm->add_option("--front", o->front_text, "With --reflected-probe: the slab's front face, x=VALUE or y=VALUE");
  mm->add_option("--json", o->json, "Write the spectra to this JSON file");
  mm->add_option("--detector", o->detector, "An electro-optic detector crystal (ZnTe or GaP): the traces as it records them");
  mm->add_option("--detector-thickness", o->detector_text, "With --detector: the crystal's thickness, e.g. \"1 mm\"");
  mm->add_option("--traces", o->traces, "Write the traces analysed (detected, with --detector) to this CSV file");

  return {mm, [o] {
            o->thickness = quantity(o->thickness_text, Kind::length, "--thickness");
            read_band(o->from_text, o->to_text, o->from, o->to, "material");
            if (!o->perm_text.empty()) o->permittivity = complex_number(o->perm_text, "--permittivity");
            if (o->reflected_probe.empty() != o->front_text.empty())
              throw BadInput("terayee measure material: error: --reflected-probe and --front go together");
            if (!o->front_text.empty() && !axis_value(o->front_text, o->front_axis, o->front, "--front"))
              throw BadInput("terayee measure material: error: --front must be x=VALUE or y=VALUE");
            if (o->detector.empty() != o->detector_text.empty())
              throw BadInput("terayee measure material: error: --detector and --detector-thickness go together");
            if (!o->detector.empty()) {
              eo_crystal(o->detector);  // refused here, before any run folder is read
              o->detector_thickness = quantity(o->detector_text, Kind::length, "--detector-thickness");
              if (!(o->detector_thickness > 0))
                throw BadInput("terayee measure material: error: --detector-thickness must be positive");
            }
            return measure_material(*o);
          }};
}

Command add_polarization(CLI::App& m) {
  struct Options : PolarizationOptions {
    std::string from_text, to_text;
  };
  auto o = std::make_shared<Options>();
  auto* mp = m.add_subcommand("polarization",
                              "The Jones matrix, Faraday or Kerr rotation and ellipticity from runs driven by each "
                              "polarization against their reference runs");
  mp->add_option("runs", o->runs, "Run folder(s): one per input polarization (Ez wave, Hz wave), one or two")
      ->required()
      ->expected(1, 2)
      ->check(CLI::ExistingDirectory);
  mp->add_option("--reference", o->references, "Each run's reference run (terayee run --reference), in the same order")
      ->required()
      ->expected(1, 2)
      ->check(CLI::ExistingDirectory);
  mp->add_option("--probe", o->probe, "The probe (recording Ez and Hz): behind the sample, or before it with --reflected");
  mp->add_option("--line", o->line, "Or a power-spectrum line (its own frequencies)");
  mp->add_flag("--reflected", o->reflected, "The probe is before the sample: the Jones matrix of reflection (Kerr)");
  mp->add_option("--from", o->from_text, "Lowest frequency (default: where the reference spectrum is above 1% of its peak)");
  mp->add_option("--to", o->to_text, "Highest frequency");
  mp->add_option("--count", o->count, "Frequencies")->check(CLI::Range(2, 100000));
  mp->add_option("--json", o->json, "Write J, the rotation and ellipticity (and the prediction) to this JSON file");
  mp->add_option("--csv", o->csv, "Write the same to this CSV file");
  mp->add_option("--plot", o->plot, "Draw the rotation and ellipticity, measured and predicted: FILE.png, .pdf or .svg");

  return {mp, [o] {
            read_band(o->from_text, o->to_text, o->from, o->to, "polarization");
            return measure_polarization(*o);
          }};
}

Command add_focus(CLI::App& m) {
  struct Options {
    std::string run, map, ref, freq, axis = "x", face;
  };
  auto o = std::make_shared<Options>();
  auto* mf = m.add_subcommand("focus", "The focal spot in a spectral map");
  mf->add_option("run", o->run, "Run folder")->required()->check(CLI::ExistingDirectory);
  mf->add_option("--map", o->map, "Spectral map name")->required();
  mf->add_option("--frequency", o->freq, "One of the map's frequencies (default: its first)");
  mf->add_option("--axis", o->axis, "The beam's axis: x or y")->check(CLI::IsMember({"x", "y"}));
  mf->add_option("--reference", o->ref, "Reference run folder, for the peak relative to the incident beam")
      ->check(CLI::ExistingDirectory);
  mf->add_option("--face", o->face, "Coordinate of a face along the axis, e.g. \"1.2 mm\"");

  return {mf, [o] {
            const double freq = o->freq.empty() ? 0.0 : quantity(o->freq, Kind::frequency, "--frequency");
            const double face = o->face.empty() ? 0.0 : quantity(o->face, Kind::length, "--face");
            return measure_focus(o->run, o->map, o->ref, freq, o->axis, face, !o->face.empty());
          }};
}

Command add_angle(CLI::App& m) {
  struct Options {
    std::string run, map, normal = "y", inc;
    std::vector<std::string> region;
  };
  auto o = std::make_shared<Options>();
  auto* ma = m.add_subcommand("angle", "Direction of power flow of a beam inside a region");
  ma->add_option("run", o->run, "Run folder")->required()->check(CLI::ExistingDirectory);
  ma->add_option("--map", o->map, "Spectral map name (with Sx and Sy)")->required();
  ma->add_option("--region", o->region, "Centre and size: \"CX\" \"CY\" \"SX\" \"SY\" with units")->required()->expected(4);
  ma->add_option("--normal", o->normal, "Interface normal: x or y")->check(CLI::IsMember({"x", "y"}));
  ma->add_option("--incidence", o->inc, "Angle of incidence, for the sign of the refraction");

  return {ma, [o] {
            std::vector<double> region;
            for (const auto& t : o->region) region.push_back(quantity(t, Kind::length, "--region"));
            const double inc = o->inc.empty() ? 0.0 : quantity(o->inc, Kind::angle, "--incidence");
            return measure_angle(o->run, o->map, region, o->normal, inc, !o->inc.empty());
          }};
}

Command add_shift(CLI::App& m) {
  struct Options : ShiftOptions {
    std::string line_text, interface_text, angle_text, freq_text;
  };
  auto o = std::make_shared<Options>();
  auto* msh = m.add_subcommand("shift", "Lateral shift of a reflected beam");
  msh->add_option("run", o->run, "Run folder")->required()->check(CLI::ExistingDirectory);
  msh->add_option("--reference", o->reference, "Reference run folder (the incident beam)")->required()->check(CLI::ExistingDirectory);
  msh->add_option("--map", o->map, "Spectral map name")->required();
  msh->add_option("--line", o->line_text, "The measurement line parallel to the interface: y=VALUE or x=VALUE")->required();
  msh->add_option("--interface", o->interface_text,
                  "The body's face along its normal (the node plane where it acts is taken from the run's grid)")
      ->required();
  msh->add_option("--angle", o->angle_text,
                  "Not needed: the zero point is the incident beam's own specular image (accepted for older scripts)");
  msh->add_option("--frequency", o->freq_text, "One of the map's frequencies (default: its first)");
  msh->add_option("--reversed", o->reversed, "Run folder with the bias reversed")->check(CLI::ExistingDirectory);
  msh->add_option("--reversed-reference", o->reversed_reference, "Its reference run")->check(CLI::ExistingDirectory);

  return {msh, [o] {
            if (!axis_value(o->line_text, o->line_axis, o->line, "--line"))
              throw BadInput("terayee measure shift: error: --line must be y=VALUE or x=VALUE");
            o->interface = quantity(o->interface_text, Kind::length, "--interface");
            if (!o->angle_text.empty()) quantity(o->angle_text, Kind::angle, "--angle");  // checked, not used
            if (!o->freq_text.empty()) o->frequency = quantity(o->freq_text, Kind::frequency, "--frequency");
            if (o->reversed.empty() != o->reversed_reference.empty())
              throw BadInput("terayee measure shift: error: --reversed and --reversed-reference go together");
            return measure_shift(*o);
          }};
}

}  // namespace

std::vector<Command> add_measure(CLI::App& app) {
  auto* m = app.add_subcommand("measure", "Numbers from a run folder");
  m->require_subcommand(1);
  return {add_spectrum(*m), add_material(*m), add_polarization(*m), add_focus(*m), add_angle(*m), add_shift(*m)};
}

}  // namespace ty::cli
