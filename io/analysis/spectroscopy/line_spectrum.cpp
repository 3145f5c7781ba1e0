/// \file line_spectrum.cpp
/// \brief Line means of one component and their ratios (see line_spectrum.h).
#include "io/analysis/spectroscopy/line_spectrum.h"

#include <cmath>

#include "io/scene/constants.h"

namespace ty {

std::complex<double> line_mean(const PowerSpectrumLine& a, const PowerSpectrumLine* minus, size_t f, int c) {
  std::complex<double> s = 0;
  double w = 0;
  for (size_t p = 0; p < a.points; ++p) {
    s += a.weight[p] * (a.at(f, p, c) - (minus ? minus->at(f, p, c) : 0.0));
    w += a.weight[p];
  }
  return s / w;
}

int dominant_polarization(const PowerSpectrumLine& ref) {
  double ez = 0, hz = 0;
  for (size_t f = 0; f < ref.freq.size(); ++f)
    ez = std::max(ez, std::abs(line_mean(ref, nullptr, f, 2))),
    hz = std::max(hz, constants::eta0 * std::abs(line_mean(ref, nullptr, f, 5)));
  return hz > ez ? 5 : 2;
}

ComplexSpectrum complex_spectrum(const LinePair* reflected, const LinePair* transmitted, int c, bool r_incident) {
  ComplexSpectrum out;
  const size_t nf = reflected ? reflected->sample.freq.size() : transmitted->sample.freq.size();
  for (size_t f = 0; f < nf; ++f) {
    if (transmitted)
      out.t.push_back(line_mean(transmitted->sample, nullptr, f, c) / line_mean(transmitted->reference, nullptr, f, c));
    if (reflected && r_incident) {
      const std::complex<double> scattered = line_mean(reflected->sample, &reflected->reference, f, c);
      out.r.push_back((c == 5 ? -1.0 : 1.0) * scattered / line_mean(reflected->reference, nullptr, f, c));
    }
  }
  return out;
}

}  // namespace ty
