/// \file spectrum.cpp
/// \brief R, T and A from power-spectrum lines (see spectrum.h for the formulas and the rule
/// that picks the incident power).
#include "io/analysis/spectrum.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "io/scene/diagnostics.h"

namespace ty {
namespace {

double peak(const std::vector<double>& v) {
  double m = 0;
  for (double x : v) m = std::max(m, std::abs(x));
  return m;
}

void check_pair(const LinePair& p) {
  if (p.sample.freq != p.reference.freq || p.sample.points != p.reference.points)
    throw BadInput(fmt::format("{}: error: the reference run's line '{}' differs from the run's ({})", p.reference.file,
                               p.reference.name, p.sample.file));
}

/// The reference power through a line, with the name of the line.
struct Incident {
  const LinePair* line = nullptr;
  std::vector<double> power;
};

/// The incident power for a ratio measured on `own`: its reference power, or `other`'s
/// where its own is negligible against `scale` (the largest power through the lines).
const Incident& incident_for(const Incident& own, const Incident& other, double scale, const char* ratio) {
  auto carries = [&](const Incident& i) { return i.line && peak(i.power) >= kNegligiblePower * scale; };
  const Incident* use = carries(own) ? &own : carries(other) ? &other : nullptr;
  if (!use)
    throw BadInput(fmt::format(
        "{}: error: {}: the reference run's power through line '{}' is negligible ({:.3g} W/m at most, against "
        "{:.3g} W/m through the lines){}: there is no incident power to normalise to; add a line between the "
        "source and the sample (or past the sample) that the incident wave crosses",
        own.line->reference.file, ratio, own.line->reference.name, peak(own.power), scale,
        other.line ? fmt::format(", and so is its power through '{}'", other.line->reference.name) : std::string()));
  const double floor = kNegligiblePower * peak(use->power);
  for (size_t k = 0; k < use->power.size(); ++k)
    if (!(std::abs(use->power[k]) >= floor))
      throw BadInput(
          fmt::format("{}: error: {}: the incident power through line '{}' at {:.6g} GHz is negligible "
                      "({:.3g} of its peak over the band): narrow the line's band to where the source "
                      "radiates",
                      use->line->reference.file, ratio, use->line->reference.name, use->line->reference.freq[k] / 1e9,
                      std::abs(use->power[k]) / peak(use->power)));
  return *use;
}

}  // namespace

SpectrumResult reflectance_transmittance(const LinePair* reflected, const LinePair* transmitted) {
  if (!reflected && !transmitted) throw BadInput("terayee measure spectrum: error: no power-spectrum line to measure");
  if (reflected) check_pair(*reflected);
  if (transmitted) check_pair(*transmitted);
  if (reflected && transmitted && reflected->sample.freq != transmitted->sample.freq)
    throw BadInput(fmt::format("{}: error: the two power-spectrum lines have different bands", reflected->sample.file));
  Incident inc_r, inc_t;
  std::vector<double> scattered, through;
  double scale = 0;
  if (reflected) {
    inc_r = {reflected, line_power(reflected->reference)};
    scattered = line_power(reflected->sample, &reflected->reference);
    scale = std::max({scale, peak(inc_r.power), peak(scattered)});
  }
  if (transmitted) {
    inc_t = {transmitted, line_power(transmitted->reference)};
    through = line_power(transmitted->sample);
    scale = std::max({scale, peak(inc_t.power), peak(through)});
  }
  SpectrumResult out;
  out.freq = reflected ? reflected->sample.freq : transmitted->sample.freq;
  if (reflected) {
    const Incident& inc = incident_for(inc_r, inc_t, scale, "reflectance");
    out.R_incident_line = inc.line->reference.name;
    for (size_t k = 0; k < scattered.size(); ++k) out.R.push_back(-scattered[k] / inc.power[k]);
  }
  if (transmitted) {
    const Incident& inc = incident_for(inc_t, inc_r, scale, "transmittance");
    out.T_incident_line = inc.line->reference.name;
    for (size_t k = 0; k < through.size(); ++k) out.T.push_back(through[k] / inc.power[k]);
  }
  return out;
}

}  // namespace ty
