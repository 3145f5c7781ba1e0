/// \file run_folder.h
/// \brief The run folder of scene-format.md: scene.yaml, fields.h5, fields.xmf,
/// summary.json and log.txt. Results are written under temporary names and put in
/// place (io/run/atomic_file.h) only when the run completes, so an interrupted or
/// failed run never leaves files that look like results; the checkpoint and the
/// partial results it goes with are removed only after every result is in place. Over MPI
/// ranks every rank writes its rows of the snapshot frames into the one file (parallel
/// HDF5, collective writes); rank 0 writes everything else.
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
  /// Makes the folder (if needed) and writes scene.yaml. A folder that is not empty is
  /// refused (BadInput) unless `overwrite` (then the files a run writes are removed,
  /// nothing else). With `resume`, the folder must hold a stopped run of the same
  /// resolved scene instead; one stopped before its first checkpoint starts again.
  RunFolder(const std::string& dir, const Scene& scene, bool resume = false, bool overwrite = false);
  /// Over MPI ranks, the other ranks' side of rank 0's run folder: it touches no file of its
  /// own, but opens fields.h5's partial file with every rank (begin) and writes its rows of
  /// each snapshot frame in the collective writes (frame_rows); every call that rank 0 makes
  /// on its folder, the others make on theirs.
  struct Follower {};
  RunFolder(const std::string& dir, const Scene& scene, Follower);
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
  void frame_rows(std::size_t frame, std::size_t field, int b0, int b1, const float* data) override;
  void frame_rows(std::size_t frame, std::size_t field, int b0, int b1, const double* data) override;
  /// Writes the probes, closes the HDF5 file, renames it, writes fields.xmf and summary.json.
  void finish(const std::vector<ProbeRecorder>& probes, const std::vector<PowerSpectrumRecorder>& power_spectra,
              const std::vector<SpectralMap>& maps, double dt, const nlohmann::json& summary);
  /// A run that stopped by itself after `steps` steps: the frames planned after it are left
  /// out of fields.h5 and fields.xmf when the run finishes.
  void ended_at(long steps);
  /// Closes a run that did not complete. The checkpoint is never removed, nor the
  /// partial results that go with it; without a checkpoint they are removed.
  void abandon();
  /// Whether a checkpoint is to be loaded (resume asked and one was found).
  bool resuming() const { return resume_; }

 private:
  std::string dir_;
  const Scene& scene_;
  std::unique_ptr<h5::File> h5_;
  SnapshotPlan plan_;
  std::size_t frames_planned_ = 0;  ///< frames in fields.h5's series (plan_ may end earlier: ended_at)
  bool single_ = false;
  bool done_ = false;
  bool resume_ = false;
  bool root_ = true;  ///< rank 0's folder (or one process): the one that writes files
  void write_xdmf() const;
  void open_partial(const YeeGrid& g, const SnapshotPlan& plan, bool single, const std::vector<int>& medium_map,
                    int map_nx, int map_ny);
};

}  // namespace ty
