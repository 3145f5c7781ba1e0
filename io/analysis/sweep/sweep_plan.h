/// \file sweep_plan.h
/// \brief The points of a sweep: each `--vary KEY=VALUES` is an axis of `--set` values;
/// several axes make a grid (every combination) or, zipped, go in step.
///
/// VALUES is a comma list (`-1 T,0 T,1 T`), a range with a count (`-2T:2T:9`, both ends
/// in the same unit, linearly spaced, ends included), or `@FILE` (one value a line, `#`
/// comments). A `--refine N` sweep is an axis of its own: the cell, cell/2, ... cell/2^(N-1).
#pragma once
#include <string>
#include <utility>
#include <vector>

namespace ty {

struct SweepAxis {
  std::string key;                  ///< a --set path, e.g. "bias.2" or "sources.0.beam.angle"
  std::vector<std::string> values;  ///< as --set values, units included
};

struct SweepPoint {
  int index = 0;
  std::vector<std::pair<std::string, std::string>> sets;  ///< (key, value) per axis
  std::string name;  ///< the point's folder name: its index and values, file-name safe
  /// "key=value" strings for read_scene's overrides and `terayee run --set`
  std::vector<std::string> overrides() const;
};

/// One axis from "KEY=VALUES"; throws BadInput naming `spec` on a malformed one.
SweepAxis parse_axis(const std::string& spec);

/// The refinement axis: `key` (e.g. "grid.cell") at `base`, base/2, ..., `levels` values;
/// `base` is a length with its unit ("20 um").
SweepAxis refine_axis(const std::string& key, const std::string& base, int levels);

/// Every combination of the axes (the first axis slowest), or with `zip` the axes in step
/// (all of one length). Throws BadInput when zipped axes differ in length or a key repeats.
std::vector<SweepPoint> expand(const std::vector<SweepAxis>& axes, bool zip);

}  // namespace ty
