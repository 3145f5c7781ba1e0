/// \file measure_command.cpp
/// \brief `terayee measure spectrum RUN --reference REF`: reflectance, transmittance and
/// absorptance against frequency from the power-spectrum lines of a run and of its reference run
/// (the same scene without the sample, `terayee run --reference`).
///   T(f) = P_sample(transmitted line) / P_reference(transmitted line)
///   R(f) = -P[E_sample - E_reference, H_sample - H_reference](reflected line) / P_reference(reflected line)
///   A = 1 - R - T
/// The reflected line lies between the source and the sample with its normal towards the
/// sample; the scattered fields are the difference of the two runs' transformed fields, so
/// the incident wave cancels exactly. Prints a table and writes RUN/spectrum.csv and .json.
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <complex>
#include <fstream>
#include <iostream>

#include "io/scene/diagnostics.h"
#include "io/run/hdf5_file.h"
#include "tools/commands.h"

namespace ty {
namespace {

struct PowerSpectrumData {
  std::vector<double> freq, weight, normal, re, im;
  size_t points = 0;
  std::complex<double> at(size_t f, size_t p, int c) const {
    const size_t k = (f * points + p) * 6 + c;
    return {re[k], im[k]};
  }
};

PowerSpectrumData read_flux(const std::string& run, const std::string& name) {
  const std::string file = run + "/fields.h5";
  const h5::File h = h5::File::open(file);
  const std::string base = "/power-spectra/" + name;
  if (!h.exists(base + "/frequency"))
    throw BadInput(fmt::format("{}: error: the run has no power-spectrum line named '{}'", file, name));
  PowerSpectrumData d;
  d.freq = h.read(base + "/frequency");
  d.weight = h.read(base + "/weights");
  d.normal = h.read(base + "/normal");
  d.re = h.read(base + "/fields/real");
  d.im = h.read(base + "/fields/imag");
  d.points = d.weight.size();
  return d;
}

std::vector<double> power(const PowerSpectrumData& a, const PowerSpectrumData* b) {  // of a, or of a - b
  std::vector<double> P(a.freq.size(), 0.0);
  for (size_t f = 0; f < a.freq.size(); ++f)
    for (size_t p = 0; p < a.points; ++p) {
      std::complex<double> E[3], H[3];
      for (int c = 0; c < 3; ++c) {
        E[c] = a.at(f, p, c) - (b ? b->at(f, p, c) : 0.0);
        H[c] = a.at(f, p, c + 3) - (b ? b->at(f, p, c + 3) : 0.0);
      }
      const double sx = (E[1] * std::conj(H[2]) - E[2] * std::conj(H[1])).real();
      const double sy = (E[2] * std::conj(H[0]) - E[0] * std::conj(H[2])).real();
      P[f] += a.weight[p] * 0.5 * (sx * a.normal[0] + sy * a.normal[1]);
    }
  return P;
}

bool has_flux(const std::string& run, const std::string& name) {
  const h5::File h = h5::File::open(run + "/fields.h5");
  return h.exists("/power-spectra/" + name + "/frequency");
}

}  // namespace

int measure_spectrum(const std::string& run, const std::string& ref, std::string reflected, std::string transmitted) {
  if (reflected.empty() && has_flux(run, "reflected")) reflected = "reflected";
  if (transmitted.empty() && has_flux(run, "transmitted")) transmitted = "transmitted";
  if (reflected.empty() && transmitted.empty())
    throw BadInput(fmt::format("{}: error: name the power-spectrum lines with --reflected and/or --transmitted (no lines "
                               "named 'reflected' or 'transmitted')",
                               run));
  std::vector<double> freq, R, T;
  if (!reflected.empty()) {
    const PowerSpectrumData s = read_flux(run, reflected), r = read_flux(ref, reflected);
    if (s.freq != r.freq || s.points != r.points)
      throw BadInput(fmt::format("{}: error: the reference run's line '{}' differs from the run's", ref, reflected));
    const auto inc = power(r, nullptr), scat = power(s, &r);
    freq = s.freq;
    for (size_t k = 0; k < inc.size(); ++k) R.push_back(-scat[k] / inc[k]);
  }
  if (!transmitted.empty()) {
    const PowerSpectrumData s = read_flux(run, transmitted), r = read_flux(ref, transmitted);
    if (s.freq != r.freq || s.points != r.points)
      throw BadInput(fmt::format("{}: error: the reference run's line '{}' differs from the run's", ref, transmitted));
    const auto inc = power(r, nullptr), out = power(s, nullptr);
    if (!freq.empty() && freq != s.freq)
      throw BadInput(fmt::format("{}: error: the two power-spectrum lines have different bands", run));
    freq = s.freq;
    for (size_t k = 0; k < inc.size(); ++k) T.push_back(out[k] / inc[k]);
  }
  const bool both = !R.empty() && !T.empty();
  std::ofstream csv(run + "/spectrum.csv");
  csv << "frequency_Hz" << (R.empty() ? "" : ",reflectance") << (T.empty() ? "" : ",transmittance")
      << (both ? ",absorptance" : "") << "\n";
  std::cout << fmt::format("{:>14s}{}{}{}\n", "frequency/GHz", R.empty() ? "" : "  reflectance",
                           T.empty() ? "" : "  transmittance", both ? "  absorptance" : "");
  nlohmann::json j;
  j["reference"] = ref;
  j["reflected-line"] = reflected;
  j["transmitted-line"] = transmitted;
  for (size_t k = 0; k < freq.size(); ++k) {
    std::string row = fmt::format("{:14.6f}", freq[k] / 1e9);
    csv << fmt::format("{:.10g}", freq[k]);
    nlohmann::json e;
    e["frequency"] = freq[k];
    if (!R.empty()) row += fmt::format("  {:11.6f}", R[k]), csv << fmt::format(",{:.10g}", R[k]), e["reflectance"] = R[k];
    if (!T.empty()) row += fmt::format("  {:13.6f}", T[k]), csv << fmt::format(",{:.10g}", T[k]), e["transmittance"] = T[k];
    if (both) {
      const double A = 1 - R[k] - T[k];
      row += fmt::format("  {:11.6f}", A), csv << fmt::format(",{:.10g}", A), e["absorptance"] = A;
    }
    csv << "\n";
    std::cout << row << "\n";
    j["spectrum"].push_back(e);
  }
  std::ofstream(run + "/spectrum.json") << j.dump(2) << "\n";
  return 0;
}

}  // namespace ty
