/// \file reader.h
/// \brief Private to the scene reader: the typed getters (`Reader`: strict keys, units,
/// ranges, each error with its file:line:col) and the state shared by the section readers
/// (`SceneBuilder`: media, grid and time, bodies, sources, outputs, one file each).
#pragma once
#include <fmt/format.h>
#include <yaml-cpp/yaml.h>

#include <array>
#include <initializer_list>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "io/scene/scene.h"
#include "io/scene/units.h"

namespace ty::reader {

/// A node that came from a `--set KEY=VALUE` option rather than from the file: its errors
/// are blamed on the option.
struct OverrideNode {
  YAML::Node node;
  std::string item;  ///< "KEY=VALUE" as given
};

/// Typed getters: each records an error at the node's place and returns nullopt when the
/// value is missing, of the wrong type, unit or range.
class Reader {
 public:
  Reader(Diagnostics& d, std::string file, std::vector<OverrideNode> overrides = {})
      : d_(d), file_(std::move(file)), overrides_(std::move(overrides)) {}

  Mark mark(const YAML::Node& n) const;
  void error(const YAML::Node& n, std::string msg) { d_.error(mark(n), std::move(msg)); }
  void error(const Mark& m, std::string msg) { d_.error(m, std::move(msg)); }

  /// True when `n` is a map (a list); otherwise records an error naming `what`.
  bool is_map(const YAML::Node& n, std::string_view what);
  bool is_seq(const YAML::Node& n, std::string_view what);
  /// Unknown keys are errors (a misspelt key would otherwise be silently ignored).
  void allow(const YAML::Node& map, std::initializer_list<std::string_view> keys, std::string_view where);
  void require(const YAML::Node& map, std::string_view key, std::string_view where);

  std::optional<std::string> text(const YAML::Node& n, std::string_view key);
  /// A quantity of kind `k`. `cell` resolves `cells` (0: not allowed here; negative: the
  /// cell is not square and the value has no axis); `period` resolves `periods` (0: not
  /// allowed here).
  std::optional<double> quantity(const YAML::Node& n, std::string_view key, Kind k, double cell = 0, double period = 0);
  std::optional<double> positive(const YAML::Node& n, std::string_view key, Kind k, double cell = 0, double period = 0);
  /// [x, y]; `cell` resolves `cells` per axis: x in cell.x, y in cell.y.
  std::optional<Vec2> vec2(const YAML::Node& n, std::string_view key, Kind k, Vec2 cell = {});
  std::optional<std::array<double, 3>> vec3(const YAML::Node& n, std::string_view key, Kind k);
  std::optional<int> integer(const YAML::Node& n, std::string_view key, int lo, int hi);
  std::optional<bool> boolean(const YAML::Node& n, std::string_view key);

  template <class E>
  std::optional<E> choice(const YAML::Node& n, std::string_view key,
                          std::initializer_list<std::pair<std::string_view, E>> options) {
    auto t = text(n, key);
    if (!t) return std::nullopt;
    std::string list;
    for (const auto& [name, value] : options) {
      if (name == *t) return value;
      list += (list.empty() ? "" : ", ") + std::string(name);
    }
    error(n, fmt::format("'{}' must be one of {}; got '{}'", key, list, *t));
    return std::nullopt;
  }

 private:
  Diagnostics& d_;
  std::string file_;
  std::vector<OverrideNode> overrides_;
};

/// A file waveform's table (reader/waveform_table.cpp): its samples into w.table_time (in s,
/// the column times time_unit) and w.table_value; errors at the file's line and column.
void read_waveform_table(Reader& r, const YAML::Node& at, const std::string& path, double time_unit, Waveform& w);

/// Applies one "key.path=value" option to the tree; throws BadInput naming the option.
void apply_override(YAML::Node root, const std::string& item);
/// The node an applied option replaced, with everything below it (for Reader's marks).
void collect_override_nodes(const YAML::Node& root, const std::string& item, std::vector<OverrideNode>& out);
/// Records an error for every key given twice in one map (both places in the message).
void find_duplicate_keys(const YAML::Node& n, Reader& r);

/// A medium's `permittivity` written as a map (permittivity.cpp): dispersion and rotated axes.
std::optional<PermittivityTensor> read_permittivity_map(Reader& r, const YAML::Node& p, const std::string& where);

/// Reads the sections in an order that lets relative units resolve: media and the sources'
/// frequencies first (they decide `cells-per-wavelength`), then the grid (the cell size that
/// `cells` refers to), then bodies, sources and outputs.
class SceneBuilder {
 public:
  SceneBuilder(Diagnostics& d, const std::string& file, std::vector<OverrideNode> overrides)
      : r_(d, file, std::move(overrides)) {
    scene_.file = file;
  }
  Reader& reader() { return r_; }
  Scene build(const YAML::Node& root);

 private:
  Reader r_;
  Scene scene_;
  double f_top_ = 0;          // highest frequency of any source's band
  double common_period_ = 0;  // 1/f when every source shares one frequency
  std::vector<double> freq_;  // each source's frequency (0 = unknown)
  bool grid_ok_ = false;

  /// The cell that `cells` refers to, per axis (zero until the grid is read).
  Vec2 cell() const { return grid_ok_ ? Vec2{scene_.grid.dx, scene_.grid.dy} : Vec2{}; }
  /// The same for a length along no axis (a radius): -1 when the cell is not square.
  double cell_any() const {
    if (!grid_ok_) return 0;
    return scene_.grid.dx == scene_.grid.dy ? scene_.grid.dx : -1;
  }
  Vec2 to_internal(Vec2 p) const { return {p.x + scene_.origin_shift.x, p.y + scene_.origin_shift.y}; }

  // media.cpp
  void read_media(const YAML::Node& m);
  std::optional<std::array<double, 3>> unit_vector(const YAML::Node& n, std::string_view key);
  /// `base`: the crystal's magnet, whose values the block's keys override (none required).
  std::optional<Magnet> read_magnet(const YAML::Node& m, const std::string& where, const Magnet* base = nullptr);
  bool read_sublattices(const YAML::Node& subs, const std::string& here, const Magnet* base, Magnet& g);
  bool read_anisotropy(const YAML::Node& a, const std::string& here, Magnet& g);
  bool read_exchange(const YAML::Node& m, const std::string& here, bool sublattices_ok, Magnet& g);
  // media_crystal.cpp
  /// `crystal`, `cut`, `rotation`: fills med's permittivity and returns the crystal's magnet
  /// in scene axes (nullopt on an error).
  std::optional<Magnet> read_crystal(const YAML::Node& v, const std::string& where, Medium& med);
  void read_temperature(const YAML::Node& v, const std::string& where, Medium& med);
  void read_thermal(const YAML::Node& t, const std::string& here, Thermal& th);
  void read_linewidth(const YAML::Node& w, const std::string& here, Thermal& th);
  void check_linewidth(const YAML::Node& m, const std::string& here, const Magnet& g);
  void read_state(const YAML::Node& m, const std::string& here, Magnet& g);
  std::optional<std::string> state_pick(const YAML::Node& s, const std::string& here);
  // grid_time.cpp
  void prescan_sources(const YAML::Node& list);
  void read_grid(const YAML::Node& g);
  bool read_cell(const YAML::Node& g);
  void read_boundaries(const YAML::Node& g);
  void read_bloch(const YAML::Node& g);
  double bloch_index(const YAML::Node& in);  ///< n of `bloch.in`'s medium (1 without it)
  void read_time(const YAML::Node& t);
  void read_auto_stop(const YAML::Node& t);  ///< `stop: auto` and its keys
  // bodies.cpp
  void read_body(const YAML::Node& b);
  bool read_body_medium(const YAML::Node& b, Body& body);
  void read_body_order(const YAML::Node& b, Body& body);
  // sources.cpp
  Waveform read_waveform(const YAML::Node& w, double f);
  void read_file_waveform(const YAML::Node& w, Waveform& wf);
  bool read_probe_line(const YAML::Node& l, Output& out);
  void read_source(const YAML::Node& item, size_t index);
  void read_point_source(const YAML::Node& s, Source& src, bool& ok);
  void read_line_source(const YAML::Node& s, const std::string& kind, Source& src, bool& ok);
  void read_launch(const YAML::Node& l, Source& src, bool& ok);
  // outputs.cpp
  bool read_output_name(const YAML::Node& o, Output& out, const char* what);
  bool read_region(const YAML::Node& o, Output& out);
  void read_power_spectrum(const YAML::Node& o, Output& out);
  void read_spectral_map(const YAML::Node& o, Output& out);
  void read_output(const YAML::Node& item);
  bool read_fields(const YAML::Node& o, const std::string& kind, Output& out);
};

}  // namespace ty::reader
