/// \file spectral_map_file.h
/// \brief A spectral map of a finished run, as io/run_folder writes it: its nodes, its
/// frequencies, and one frequency's complex field at a time (read as one [y][x] slice).
/// The one reader behind `measure focus|shift|angle` and `render --map`.
#pragma once
#include <complex>
#include <string>
#include <vector>

#include "io/run/hdf5_file.h"

namespace ty {

class SpectralMapFile {
 public:
  /// RUN/fields.h5's map `name`; BadInput (file: error: ...) when the run has none.
  SpectralMapFile(const std::string& run, const std::string& name);

  const std::string& file() const { return file_; }
  const std::string& name() const { return name_; }
  const std::vector<double>& x() const { return x_; }  ///< node positions, m (user coordinates)
  const std::vector<double>& y() const { return y_; }
  const std::vector<double>& frequencies() const { return f_; }
  /// The index of frequency f (Hz); f <= 0 gives the map's first. BadInput when the map
  /// holds no frequency within 1e-6 of f.
  size_t frequency_index(double f) const;
  bool has(const std::string& field) const;
  /// The field's complex amplitudes [y][x] at frequency index k; BadInput when not recorded.
  std::vector<std::complex<double>> field(const std::string& field, size_t k) const;
  std::string units(const std::string& field) const;
  /// The E components the map holds (of Ex, Ey, Ez), in that order.
  std::vector<std::string> electric() const;
  /// |E|^2 [y][x] at frequency index k, summed over the E components the map holds;
  /// BadInput when it holds none.
  std::vector<double> intensity(size_t k) const;

 private:
  h5::File h_;
  std::string file_, name_, base_;
  std::vector<double> x_, y_, f_;
};

}  // namespace ty
