/// \file recorder_taps.h
/// \brief Recorders inside a block (wavefront.h): the reads of the probes and power-spectrum
/// lines, each one point stencil of one component (or one magnetic cell's value), listed by
/// the row after whose unit (j, t) they are taken.
///
/// A stencil reads two neighbouring rows r - 1, r; after unit (r, t) both hold their final
/// values of step t. A unit writes H up to g rows above its own (g = 0; magnetic scenes
/// g = 1), so step t + 1 first overwrites row r - 1 in unit (r - 1 - g, t + 1), which comes
/// after unit (r - 1 - g + lead, t) = (r, t) or later, since lead >= g + 1 (wavefront.h): the
/// taps of row r are taken inside unit (r, t), before its thread reports the row done.
/// A magnetic cell's value of step t (the state m[n & 1] that step n writes, which the
/// recorders read after it: MagneticCells::newest) is written by the cell's unit of step t and
/// overwritten by that of step t + 2, so it is taken right after the cell's unit (cj, t). The thread of step t takes them into its own slots;
/// after the block the recorders sum the slots step by step (ProbeRecorder::record_values,
/// PowerSpectrumRecorder::record_values) exactly as record() sums the reads each step, so a
/// blocked run records the same bits.
#pragma once
#include <string>
#include <vector>

#include "solver/recorders/power_spectrum.h"
#include "solver/recorders/probe.h"

namespace ty::blocking {

struct FieldTap {
  const PointStencil* stencil;
  int comp;
  int slot;
  int group;  ///< the recorder: probes first, then power-spectrum lines
};
struct CellTap {
  long cell;
  const std::string* field;
  int slot;
  int group;
};

/// The taps of a scene's probes and power-spectrum lines, and the block's slots.
struct RecorderTaps {
  std::vector<int> field_first, cell_first;  ///< per row (size ny + 1): first tap of the row
  std::vector<FieldTap> field;
  std::vector<CellTap> cell;
  std::vector<int> slot0;  ///< per group: its first slot
  int slots = 0;
  std::vector<double> values;  ///< [step of the block][slot]
  std::vector<char> active;    ///< [step of the block][group]: the recorder reads that step

  int groups() const { return static_cast<int>(slot0.size()); }
  bool empty() const { return slot0.empty(); }
  /// Lists the taps (row_of: the row of a grid index; cell_row: the row of a magnetic cell)
  /// and sizes the slots for blocks of `depth` steps (outside the time loop).
  void build(const std::vector<ProbeRecorder>& probes, const std::vector<PowerSpectrumRecorder>& lines, int ny,
             long stride, const std::vector<int>& cell_row, int depth);
  /// Takes the taps of row j for step t of the block; F: the fields, value(field, cell): a
  /// magnetic field's value in a list cell at that step.
  template <class R, class Value>
  void take(int j, int t, const R* const* F, Value&& value) {
    double* v = values.data() + static_cast<size_t>(t) * slots;
    const char* on = active.data() + static_cast<size_t>(t) * groups();
    for (int q = field_first[j]; q < field_first[j + 1]; ++q) {
      const FieldTap& a = field[q];
      if (on[a.group]) v[a.slot] = (*a.stencil)(F[a.comp]);
    }
    for (int q = cell_first[j]; q < cell_first[j + 1]; ++q) {
      const CellTap& a = cell[q];
      if (on[a.group]) v[a.slot] = value(*a.field, a.cell);
    }
  }
};

}  // namespace ty::blocking
