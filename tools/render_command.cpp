/// \file render_command.cpp
/// \brief `terayee render RUN`: pictures of a run. Snapshot frames as PNG (all, every k-th,
/// or one still with --time), an H.264 movie with --movie FILE.mp4, or a still of a spectral
/// map (--map NAME: the steady |E|², a component's real part, or the Poynting vector). The
/// colour limits are fixed for a whole movie (a high percentile of |field| over all frames,
/// or --limits) unless --rescale asks for each frame's own. Plots (--plot) are in
/// render_plots.cpp.
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <complex>
#include <filesystem>
#include <fstream>
#include <iostream>

#include "io/run/atomic_file.h"
#include "io/scene/diagnostics.h"
#include "io/pictures/frame_painter.h"
#include "io/run/hdf5_file.h"
#include "io/pictures/movie_writer.h"
#include "io/run/spectral_map_file.h"
#include "io/scene/scene_reader.h"
#include "tools/commands.h"

namespace fs = std::filesystem;

namespace ty {
namespace {

bool is_electric_name(const std::string& f) { return f == "Ex" || f == "Ey" || f == "Ez"; }
bool is_component(const std::string& f) {
  return is_electric_name(f) || f == "Hx" || f == "Hy" || f == "Hz";
}

/// The frames of one snapshot field, or "intensity": the sum of the squares of the recorded
/// E components, each taken at the nearest node of the first one's grid.
class SnapshotSource {
 public:
  SnapshotSource(const h5::File& h, const std::string& file, std::string field) : h_(h), field_(std::move(field)) {
    if (!h.exists("/snapshots/time")) throw BadInput(fmt::format("{}: error: the run recorded no snapshots", file));
    if (field_ == "intensity") {
      for (const char* c : {"Ex", "Ey", "Ez"})
        if (h.exists(std::string("/snapshots/") + c)) parts_.push_back(c);
      if (parts_.empty()) throw BadInput(fmt::format("{}: error: 'intensity' needs a recorded E component", file));
      units_ = "(V/m)^2";
    } else {
      if (!h.exists("/snapshots/" + field_)) {
        std::string recorded;
        for (const auto& m : h.members("/snapshots"))
          if (m != "time") recorded += (recorded.empty() ? "" : ", ") + m;
        throw BadInput(fmt::format("{}: error: no snapshots of '{}' in the run; it recorded {} (--field)", file,
                                   field_, recorded.empty() ? "none" : recorded));
      }
      parts_ = {field_};
      units_ = h.read_attribute("/snapshots/" + field_, "units");
    }
    // A run folder from disk is input: every shape is checked before it is read, and each
    // field's frames must match its own coordinates (indexes come from those lengths).
    const auto len = [&](const std::string& d) { return h.checked_shape(d, 1, hsize_t(1) << 24)[0]; };
    t_ = h.read_checked("/snapshots/time", {len("/snapshots/time")});
    for (const auto& p : parts_) {
      const std::string gx = "/grid/" + p + "/x", gy = "/grid/" + p + "/y", ds = "/snapshots/" + p;
      const std::vector<hsize_t> want{t_.size(), len(gy), len(gx)};
      if (want[1] == 0 || want[2] == 0 || h.checked_shape(ds, 3, hsize_t(1) << 36) != want)
        throw BadInput(fmt::format("{}: error: {}: its shape is not [{}][{}][{}] (frames of /snapshots/time, "
                                   "lengths of {} and {}, none empty)",
                                   file, ds, want[0], want[1], want[2], gy, gx));
      shapes_.push_back(want);
    }
    x_ = h.read_checked("/grid/" + parts_[0] + "/x", {shapes_[0][2]});
    y_ = h.read_checked("/grid/" + parts_[0] + "/y", {shapes_[0][1]});
    const std::string off = h.read_attribute("/snapshots/" + parts_[0], "time-offset");
    char* end = nullptr;
    const double dt = std::strtod(off.c_str(), &end);
    if (off.empty() || *end != '\0' || !std::isfinite(dt))
      throw BadInput(fmt::format("{}: error: /snapshots/{} (attribute time-offset): '{}' is not a time in seconds",
                                 file, parts_[0], off));
    for (double& t : t_) t += dt;
  }
  size_t frames() const { return t_.size(); }
  const std::vector<double>& x() const { return x_; }
  const std::vector<double>& y() const { return y_; }
  double time(size_t k) const { return t_[k]; }
  const std::string& units() const { return units_; }
  bool non_negative() const { return field_ == "intensity" || field_ == "S"; }

  void read(size_t k, std::vector<float>& out) {
    h_.read_frame("/snapshots/" + parts_[0], k, out);
    if (parts_.size() == 1 && field_ != "intensity") return;
    const size_t nx = x_.size(), ny = y_.size();
    for (auto& v : out) v *= v;
    for (size_t p = 1; p < parts_.size(); ++p) {
      const auto& shape = shapes_[p];  // checked: no dimension is 0
      h_.read_frame("/snapshots/" + parts_[p], k, scratch_);
      for (size_t j = 0; j < ny; ++j)
        for (size_t i = 0; i < nx; ++i) {
          const float v = scratch_[std::min<size_t>(j, shape[1] - 1) * shape[2] + std::min<size_t>(i, shape[2] - 1)];
          out[j * nx + i] += v * v;
        }
    }
  }

 private:
  const h5::File& h_;
  std::string field_, units_;
  std::vector<std::string> parts_;
  std::vector<double> x_, y_, t_;
  std::vector<std::vector<hsize_t>> shapes_;  ///< [frame][y][x] of each part
  std::vector<float> scratch_;
};

/// The given percentile of |v| over a sample of at most `budget` values.
double percentile_abs(std::vector<float>& sample, double pct) {
  if (sample.empty()) return 1;
  const size_t k = std::min(sample.size() - 1, static_cast<size_t>(pct / 100 * (sample.size() - 1) + 0.5));
  std::nth_element(sample.begin(), sample.begin() + static_cast<long>(k), sample.end());
  return sample[k];
}

void sample_abs(const std::vector<float>& v, size_t every, std::vector<float>& sample) {
  for (size_t q = 0; q < v.size(); q += every)
    if (std::isfinite(v[q])) sample.push_back(std::abs(v[q]));
}

std::string time_label(double t, double spacing) {
  const bool ns = t >= 1e-9;
  const double unit = ns ? 1e-9 : 1e-12;
  const int decimals = std::clamp(static_cast<int>(std::ceil(-std::log10(std::max(spacing, 1e-30) / unit))) + 1, 1, 6);
  return fmt::format("t = {:.{}f} {}", t / unit, decimals, ns ? "ns" : "ps");
}

/// Title, outlines and the region of interest, from the run's resolved scene.
FrameStyle base_style(const std::string& run, const RenderOptions& o) {
  const Scene s = read_scene(run + "/scene.yaml");
  FrameStyle st;
  st.title = s.title;
  for (const Body& b : s.bodies) {
    Shape sh = b.shape;  // internal -> user coordinates
    sh.centre.x -= s.origin_shift.x, sh.centre.y -= s.origin_shift.y;
    for (auto& v : sh.vertices) v.x -= s.origin_shift.x, v.y -= s.origin_shift.y;
    st.bodies.push_back(sh);
  }
  st.extent = {-s.origin_shift.x, s.grid.extent.x - s.origin_shift.x, -s.origin_shift.y, s.grid.extent.y - s.origin_shift.y};
  st.show_absorber = o.show_absorber;
  st.size = o.size;
  return st;
}

void set_limits(FrameStyle& st, const RenderOptions& o, bool non_negative, double robust) {
  if (!o.colours.empty())
    st.colours = ColourMap::kind_named(o.colours);
  else
    st.colours = non_negative ? ColourMap::Kind::sequential : ColourMap::Kind::diverging;
  if (o.limits.size() == 2) {
    st.lo = o.limits[0], st.hi = o.limits[1];
  } else {
    const double a = robust > 0 && std::isfinite(robust) ? robust : 1.0;
    st.lo = st.colours == ColourMap::Kind::diverging ? -a : 0.0;
    st.hi = a;
  }
  if (!(st.hi > st.lo)) throw BadInput("terayee render: error: --limits needs LO < HI");
}

void write_layout(const std::string& path, const FramePainter& p, const FrameStyle& st) {
  const FrameLayout& L = p.layout();
  nlohmann::json j;
  j["size"] = {L.width, L.height};
  j["panel"] = {{"x", L.panel_x}, {"y", L.panel_y}, {"width", L.panel_w}, {"height", L.panel_h}};
  j["view-m"] = {{"x0", L.view.x0}, {"x1", L.view.x1}, {"y0", L.view.y0}, {"y1", L.view.y1}};
  j["colours"] = ColourMap::of(st.colours).name();
  j["limits"] = {st.lo, st.hi};
  write_text_atomically(path, j.dump(2) + "\n");
}

// The field to show: the one asked for, else a wave field if one was recorded, else the
// first one listed.
std::string default_field(const h5::File& h, const std::string& asked) {
  std::string field = asked;
  if (!field.empty()) return field;
  for (const auto& name : h.members("/snapshots"))
    if (name != "time" && (field.empty() || (is_component(name) && !is_component(field)))) field = name;
  for (const char* c : {"Ez", "Hz"})
    if (h.exists(std::string("/snapshots/") + c)) field = c;
  return field;
}

// The frames to paint: the one nearest --time (within half an interval), or every o.every-th.
std::vector<size_t> frames_to_paint(const SnapshotSource& src, const RenderOptions& o, const std::string& file) {
  const size_t n = src.frames();
  std::vector<size_t> pick;
  if (std::isfinite(o.time)) {
    const double half = n > 1 ? 0.5 * std::abs(src.time(1) - src.time(0)) : 0.0;
    if (n == 0 || o.time < src.time(0) - half * (1 + 1e-9) || o.time > src.time(n - 1) + half * (1 + 1e-9))
      throw BadInput(fmt::format("{}: error: --time {:.6g} ps lies outside the snapshots ({:.6g} to {:.6g} ps)", file,
                                 o.time * 1e12, n ? src.time(0) * 1e12 : NAN, n ? src.time(n - 1) * 1e12 : NAN));
    size_t k = 0;
    for (size_t q = 0; q < n; ++q)
      if (std::abs(src.time(q) - o.time) < std::abs(src.time(k) - o.time)) k = q;
    pick = {k};
  } else {
    for (size_t k = 0; k < n; k += static_cast<size_t>(o.every)) pick.push_back(k);
  }
  if (pick.empty()) throw BadInput(fmt::format("{}: error: the run has no snapshot frames", file));
  return pick;
}

int render_snapshots(const RenderOptions& o, const std::string& out_dir) {
  const std::string file = o.run + "/fields.h5";
  const h5::File h = h5::File::open(file);
  if (!h.exists("/snapshots/time")) throw BadInput(fmt::format("{}: error: the run recorded no snapshots", file));
  const std::string field = default_field(h, o.field);
  SnapshotSource src(h, file, field);
  const size_t n = src.frames();
  const std::vector<size_t> pick = frames_to_paint(src, o, file);
  const auto t0 = std::chrono::steady_clock::now();
  std::vector<float> v;
  // robust limits over all frames shown: a sample of at most ~4 million values
  const size_t per_frame = src.x().size() * src.y().size();
  const size_t every = std::max<size_t>(1, pick.size() * per_frame / 4000000);
  double robust = 1;
  if (o.limits.size() != 2 && !o.rescale) {
    std::vector<float> sample;
    for (size_t k : pick) src.read(k, v), sample_abs(v, every, sample);
    robust = percentile_abs(sample, o.percentile);
  }
  FrameStyle st = base_style(o.run, o);
  st.field = field == "intensity" ? "E²" : field;
  st.units = src.units();
  st.caption = field == "intensity" ? "E² (sum of the recorded E components squared), snapshot" : field + ", snapshot";
  set_limits(st, o, src.non_negative(), robust);
  FramePainter painter(st, src.x(), src.y());
  const double spacing = n > 1 ? src.time(1) - src.time(0) : src.time(0);
  std::unique_ptr<MovieWriter> movie;
  if (!o.movie.empty()) {
    if (fs::path(o.movie).has_parent_path()) fs::create_directories(fs::path(o.movie).parent_path());
    movie = std::make_unique<MovieWriter>(o.movie, painter.layout().width, painter.layout().height, o.fps);
  } else {
    fs::create_directories(out_dir);
  }
  const std::string stem = field;
  for (size_t q = 0; q < pick.size(); ++q) {
    const size_t k = pick[q];
    src.read(k, v);
    if (o.rescale) {
      std::vector<float> sample;
      sample_abs(v, 1, sample);
      const double a = percentile_abs(sample, o.percentile);
      set_limits(st, o, src.non_negative(), a);
      painter.set_limits(st.lo, st.hi);
    }
    const std::string label = time_label(src.time(k), spacing);
    painter.paint(v.data(), label);
    if (movie) {
      movie->add(painter.pixels(), painter.stride());
    } else {
      const double fs_ = std::round(src.time(k) * 1e15);  // the name carries the time to 1 fs
      const std::string name = pick.size() == 1 ? fmt::format("{}-t{:.7g}ps.{}", stem, fs_ * 1e-3, o.format)
                                                : fmt::format("{}-{:04d}.png", stem, k + 1);
      painter.write((fs::path(out_dir) / name).string(), v.data(), label);
    }
  }
  if (movie) movie->finish();
  const double secs = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  if (!movie) write_layout((fs::path(out_dir) / (stem + "-layout.json")).string(), painter, st);
  std::cout << fmt::format("{} frame{} of {} ({}x{} nodes) -> {} ({}x{} px), colours '{}' over [{:.4g}, {:.4g}] {}, "
                           "{:.2f} s\n",
                           pick.size(), pick.size() == 1 ? "" : "s", field, src.x().size(), src.y().size(),
                           movie ? o.movie : out_dir, painter.layout().width, painter.layout().height,
                           ColourMap::of(st.colours).name(), st.lo, st.hi, st.units, secs);
  return 0;
}

int render_map(const RenderOptions& o, const std::string& out_dir) {
  const SpectralMapFile map(o.run, o.map);
  const size_t k = map.frequency_index(o.frequency);
  const double f = map.frequencies()[k];
  const size_t np = map.x().size() * map.y().size();
  const std::string field = o.field.empty() ? "intensity" : o.field;
  std::string quantity = o.quantity.empty() ? (is_component(field) ? "intensity" : "real") : o.quantity;
  std::vector<float> v(np, 0.0f);
  std::string units;
  if (field == "intensity") {  // |E|^2 over the recorded E components
    const auto I = map.intensity(k);
    std::copy(I.begin(), I.end(), v.begin());
    quantity = "intensity";
    units = map.units(map.electric()[0]);
  } else if (field == "S" && !map.has("S") && map.has("Sx") && map.has("Sy")) {  // |<S>| from its components
    const auto sx = map.field("Sx", k), sy = map.field("Sy", k);
    for (size_t q = 0; q < np; ++q) v[q] = static_cast<float>(std::hypot(sx[q].real(), sy[q].real()));
    quantity = "magnitude";
    units = map.units("Sx");
  } else {
    const auto F = map.field(field, k);
    for (size_t q = 0; q < np; ++q)
      v[q] = static_cast<float>(quantity == "intensity" ? std::norm(F[q]) : quantity == "abs" ? std::abs(F[q]) : F[q].real());
    units = map.units(field);
  }
  const bool non_negative = quantity != "real" || field == "S";
  std::string label = field == "intensity" ? "|E|²" : quantity == "intensity" ? "|" + field + "|²"
                                                 : quantity == "abs"         ? "|" + field + "|"
                                                 : field[0] == 'S'           ? field
                                                                             : "Re " + field;
  if (quantity == "intensity") units = "(" + units + ")^2";
  std::vector<float> sample;
  sample_abs(v, 1, sample);
  FrameStyle st = base_style(o.run, o);
  st.field = label;
  st.units = units;
  st.caption = fmt::format("{} of the steady wave at {:.6g} GHz (spectral map '{}')", label, f / 1e9, o.map);
  set_limits(st, o, non_negative, percentile_abs(sample, o.percentile));
  FramePainter painter(st, map.x(), map.y());
  painter.paint(v.data(), "");
  fs::create_directories(out_dir);
  std::string tag = field == "intensity" ? "intensity" : quantity + "-" + field;
  const std::string path =
      (fs::path(out_dir) / fmt::format("{}-{}-{:.6g}GHz.{}", o.map, tag, f / 1e9, o.format)).string();
  painter.write(path, v.data(), "");
  write_layout(plot_layout_path(path), painter, st);
  std::cout << fmt::format("{} -> {} ({}x{} px), colours '{}' over [{:.4g}, {:.4g}] {}\n", label, path,
                           painter.layout().width, painter.layout().height, ColourMap::of(st.colours).name(), st.lo,
                           st.hi, units);
  return 0;
}

}  // namespace

std::string plot_layout_path(const std::string& picture) {
  return fs::path(picture).replace_extension("").string() + "-layout.json";
}

int render_command(const RenderOptions& o) {
  if (o.plot == "bloch-map") {
    if (o.format != "png" && o.format != "pdf" && o.format != "svg")
      throw BadInput("terayee render: error: --format is png, pdf or svg");
    return plot_bloch_map(o, o.out.empty() ? o.run + "/pictures" : o.out);
  }
  if (o.plot == "sweep") {
    if (o.format != "png" && o.format != "pdf" && o.format != "svg")
      throw BadInput("terayee render: error: --format is png, pdf or svg");
    if (o.x_key.empty() || o.y_column.empty())
      throw BadInput("terayee render: error: --plot sweep needs --x KEY (a swept key) and --y COLUMN (a results column)");
    return plot_sweep(o, o.out.empty() ? o.run + "/pictures" : o.out);
  }
  if (!fs::exists(o.run + "/fields.h5"))
    throw BadInput(fmt::format("{}: error: not a finished run folder (no fields.h5)", o.run));
  if (o.format != "png" && o.format != "pdf" && o.format != "svg")
    throw BadInput("terayee render: error: --format is png, pdf or svg");
  if (!o.movie.empty() && fs::path(o.movie).extension() != ".mp4")
    throw BadInput("terayee render: error: --movie FILE must end in .mp4");
  if (!o.limits.empty() && o.limits.size() != 2) throw BadInput("terayee render: error: --limits takes LO HI");
  if (!(o.percentile > 0 && o.percentile <= 100)) throw BadInput("terayee render: error: --percentile is in (0, 100]");
  if (!o.colours.empty()) ColourMap::kind_named(o.colours);  // an unknown or old name fails before any work
  const std::string out_dir = o.out.empty() ? o.run + "/pictures" : o.out;
  if (!o.plot.empty()) return render_plot(o, out_dir);
  if (!o.map.empty()) return render_map(o, out_dir);
  return render_snapshots(o, out_dir);
}

}  // namespace ty
