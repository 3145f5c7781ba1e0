/// \file run_folder.h
/// \brief The run folder of scene-format.md: scene.yaml, fields.h5, fields.xmf,
/// summary.json and log.txt. Results are written under temporary names and renamed
/// only when the run completes, so an interrupted or failed run never leaves files
/// that look like results.
#pragma once
#include <memory>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "io/run/hdf5_file.h"
#include "io/scene/scene.h"
#include "solver/recorders/power_spectrum.h"
#include "solver/recorders/recorders.h"
#include "solver/recorders/spectral_map.h"
#include "solver/grid/yee_grid.h"

namespace ty {

class RunFolder : public SnapshotSink {
 public:
  /// Makes the folder (if needed), removes old results there, writes scene.yaml. With
  /// `resume`, the folder must hold a stopped run of the same resolved scene instead.
  RunFolder(const std::string& dir, const Scene& scene, bool resume = false);
  ~RunFolder() override;

  const std::string& dir() const { return dir_; }
  std::string path(const std::string& name) const { return dir_ + "/" + name; }

  /// Opens fields.h5 (as a partial file) and lays out the grid and snapshot datasets.
  void begin(const YeeGrid& g, const SnapshotPlan& plan, bool single, const std::vector<int>& medium_map,
             int map_nx, int map_ny);
  /// Flushes the partial results (before a checkpoint is written).
  void flush();
  /// Leaves the partial results and the checkpoint in place for a later --resume.
  void keep();
  void frame(std::size_t frame, double time, std::size_t field, const float* data) override;
  void frame(std::size_t frame, double time, std::size_t field, const double* data) override;
  /// Writes the probes, closes the HDF5 file, renames it, writes fields.xmf and summary.json.
  void finish(const std::vector<ProbeRecorder>& probes, const std::vector<PowerSpectrumRecorder>& power_spectra,
              const std::vector<SpectralMap>& maps, double dt, const nlohmann::json& summary);
  /// Removes the partial files of a run that did not complete.
  void abandon();

 private:
  std::string dir_;
  const Scene& scene_;
  std::unique_ptr<h5::File> h5_;
  SnapshotPlan plan_;
  bool single_ = false;
  bool done_ = false;
  bool resume_ = false;
  void write_xdmf() const;
};

}  // namespace ty
