/// \file run_folder.cpp
/// \brief Writing a run folder; XDMF 3 for the snapshot time series (xdmf.org format
/// description: 2DRectMesh topology, VXVY geometry, HyperSlab data items into HDF5).
#include "io/run/run_folder.h"

#include <fmt/format.h>

#include <exception>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <sstream>

#include "io/run/atomic_file.h"
#include "io/run/folder_scene.h"
#include "io/run/kill_point.h"
#include "io/scene/diagnostics.h"
#include "io/scene/scene_writer.h"
#include "solver/parallel/ranks.h"
#include "solver/grid/poynting.h"

namespace ty {

namespace fs = std::filesystem;

namespace {
const char* kPartial = "fields.h5.partial";
/// The files a run writes; --overwrite removes these and nothing else.
const char* kOwn[] = {"fields.h5", "fields.xmf", "summary.json", "fields.h5.partial", "checkpoint.h5", "log.txt",
                      "scene.yaml"};

/// Frame k of a snapshot field as a 2D dataset (a view of /snapshots/NAME, frame_view).
std::string frame_view_path(size_t k, const std::string& name) { return fmt::format("/frames/{}/{}", k, name); }

}  // namespace

RunFolder::RunFolder(const std::string& dir, const Scene& scene, bool resume, bool overwrite)
    : dir_(dir), scene_(scene) {
  const std::string resolved = folder_scene(scene);
  std::error_code ec;
  for (auto f : {kPartial, "checkpoint.h5", "fields.h5", "fields.xmf", "summary.json", "scene.yaml"})
    discard_temporary(temporary_name(path(f)));  // left by a kill: our own, never complete
  if (resume) {
    if (!fs::exists(path("scene.yaml")))
      throw BadInput(fmt::format("{}: error: there is no stopped run to resume here (no scene.yaml)", dir_));
    if (read_folder_scene(dir_) != resolved)
      throw BadInput(fmt::format("{}: error: the scene differs from the one this run started with; resume with the "
                                 "same scene and --set values",
                                 dir_));
    // Killed before its first checkpoint: start again from step 0 in the same folder.
    resume_ = fs::exists(path("checkpoint.h5"));
    if (resume_ && !fs::exists(path(kPartial)))
      throw BadInput(fmt::format("{}: error: {} is missing; the checkpoint cannot be resumed without it "
                                 "(start again with --overwrite)",
                                 dir_, kPartial));
    return;
  }
  if (fs::exists(dir_) && !fs::is_empty(dir_, ec)) {
    if (!overwrite)
      throw BadInput(fmt::format("{}: error: the run folder is not empty; go on with a stopped run with --resume, "
                                 "or replace its results with --overwrite",
                                 dir_));
    for (auto f : kOwn) fs::remove(path(f), ec);
  }
  fs::create_directories(dir_, ec);
  if (!fs::is_directory(dir_)) throw std::runtime_error(fmt::format("cannot make the run folder '{}'", dir_));
  write_text_atomically(path("scene.yaml"), resolved);
}

RunFolder::RunFolder(const std::string& dir, const Scene& scene, Follower) : dir_(dir), scene_(scene), root_(false) {}

RunFolder::~RunFolder() {
  if (done_) return;
  if (parallel::size() > 1 && std::uncaught_exceptions() > 0) {
    // one rank's error unwinding: closing the shared file is collective and the other ranks
    // are not here, so it stays open and every file stays as it is; main ends every rank
    (void)h5_.release();
    return;
  }
  abandon();
}

void RunFolder::begin(const YeeGrid& g, const SnapshotPlan& plan, bool single, const std::vector<int>& medium_map,
                      int map_nx, int map_ny) {
  plan_ = plan;
  frames_planned_ = plan.steps.size();
  single_ = single;
  if (parallel::size() == 1) return open_partial(g, plan, single, medium_map, map_nx, map_ny);
  // Over ranks: rank 0 lays the file out (or checks it, resuming) alone and closes it; then
  // every rank opens it through MPI-IO for the frames (a refusal on rank 0 ends every rank).
  int failed = 0;  // 2: bad input, 1: a write error
  std::string why;
  if (root_) {
    try {
      open_partial(g, plan, single, medium_map, map_nx, map_ny);
      h5_.reset();
    } catch (const BadInput& e) {
      failed = 2, why = e.what();
    } catch (const std::exception& e) {
      failed = 1, why = e.what();
    }
  }
  failed = static_cast<int>(parallel::max_over_ranks(failed));
  if (failed == 2) throw BadInput(root_ ? why : "another rank refused the partial results");
  if (failed == 1) throw std::runtime_error(root_ ? why : "another rank could not write the partial results");
  h5_ = std::make_unique<h5::File>(h5::File::open_shared(path(kPartial)));
}

void RunFolder::open_partial(const YeeGrid& g, const SnapshotPlan& plan, bool single,
                             const std::vector<int>& medium_map, int map_nx, int map_ny) {
  if (resume_) {  // the datasets exist; frames go on where the checkpoint left them
    h5_ = std::make_unique<h5::File>(h5::File::open_rw(path(kPartial)));
    // read back from disk: each series must still be there with this run's frames and nodes
    // (a damaged file is bad input, not a full disk); a run with no frame in its time has none
    for (const auto& sf : plan.steps.empty() ? std::vector<SnapshotField>{} : plan.fields) {
      const std::vector<hsize_t> want{plan.steps.size(), static_cast<hsize_t>(sf.nj), static_cast<hsize_t>(sf.ni)};
      const std::string ds = "/snapshots/" + sf.name;
      if (h5_->checked_shape(ds, 3, want[0] * want[1] * want[2]) != want)
        throw BadInput(fmt::format("{}: error: {}: not the {} x {} x {} frames this run writes; the partial results do not "
                                   "belong to the checkpoint: run again with --overwrite",
                                   path(kPartial), ds, want[0], want[1], want[2]));
    }
    return;
  }
  h5_ = std::make_unique<h5::File>(h5::File::create(path(kPartial)));
  h5::File& f = *h5_;
  const double cell[2] = {g.dx, g.dy};
  f.write("/grid/cell", {2}, cell, "m");
  f.write("/grid/medium", {static_cast<hsize_t>(map_ny), static_cast<hsize_t>(map_nx)}, medium_map.data(), "");
  f.attribute("/grid/medium", "meaning", "index into the scene's media, -1 = vacuum; row 0 is the lowest y");
  std::vector<double> cx(map_nx), cy(map_ny);
  for (int i = 0; i < map_nx; ++i) cx[i] = (i + 0.5) * g.dx - scene_.origin_shift.x;
  for (int j = 0; j < map_ny; ++j) cy[j] = (j + 0.5) * g.dy - scene_.origin_shift.y;
  f.write("/grid/medium-x", {cx.size()}, cx.data(), "m");
  f.write("/grid/medium-y", {cy.size()}, cy.data(), "m");
  std::string names;
  for (const auto& m : scene_.media) names += (names.empty() ? "" : ",") + m.name;
  f.attribute("/grid/medium", "media", names);
  f.attribute("/grid", "time-step", g.dt);
  f.attribute("/", "title", scene_.title);
  f.attribute("/", "terayee-version", TERAYEE_VERSION);
  if (!plan.steps.empty()) {
    f.write("/snapshots/time", {plan.times.size()}, plan.times.data(), "s");
    for (const auto& sf : plan.fields) {
      f.write("/grid/" + sf.name + "/x", {sf.x.size()}, sf.x.data(), "m");
      f.write("/grid/" + sf.name + "/y", {sf.y.size()}, sf.y.data(), "m");
      const std::string ds = "/snapshots/" + sf.name;
      f.create_frames(ds, plan.steps.size(), sf.nj, sf.ni, single, sf.units);
      f.attribute(ds, "time-offset", sf.time_offset);
      f.attribute(ds, "layout", "[frame][y][x]; row 0 is the lowest y");
    }
  }
  f.flush();
}

void RunFolder::frame(std::size_t k, double, std::size_t field, const float* data) {
  const auto& sf = plan_.fields[field];
  h5_->write_frame("/snapshots/" + sf.name, k, sf.nj, sf.ni, data);
}

void RunFolder::frame(std::size_t k, double, std::size_t field, const double* data) {
  const auto& sf = plan_.fields[field];
  h5_->write_frame("/snapshots/" + sf.name, k, sf.nj, sf.ni, data);
}

void RunFolder::frame_rows(std::size_t k, std::size_t field, int b0, int b1, const float* data) {
  const auto& sf = plan_.fields[field];
  h5_->write_frame_rows("/snapshots/" + sf.name, k, b0, b1, sf.nj, sf.ni, data);
}

void RunFolder::frame_rows(std::size_t k, std::size_t field, int b0, int b1, const double* data) {
  const auto& sf = plan_.fields[field];
  h5_->write_frame_rows("/snapshots/" + sf.name, k, b0, b1, sf.nj, sf.ni, data);
}

namespace {

/// The spectral maps: each field's complex amplitude (or the complex Poynting vector) per
/// frequency on the map's Ez nodes.
void write_spectral_maps(h5::File& f, const std::vector<SpectralMap>& maps) {
  for (const auto& m : maps) {
    const std::string base = "/spectral-maps/" + m.name;
    f.write(base + "/frequency", {m.freq.size()}, m.freq.data(), "Hz");
    f.write(base + "/x", {m.x.size()}, m.x.data(), "m");
    f.write(base + "/y", {m.y.size()}, m.y.data(), "m");
    f.attribute(base, "positions", "the Ez nodes (cell corners); every component averaged to them");
    f.attribute(base, "convention", "E(t) = Re[E exp(-i w t)], amplitude of the steady wave");
    const size_t np = static_cast<size_t>(m.ni) * m.nj;
    const std::vector<hsize_t> shape{m.freq.size(), static_cast<hsize_t>(m.nj), static_cast<hsize_t>(m.ni)};
    for (const auto& name : m.fields) {
      std::vector<double> re(m.freq.size() * np), im(m.freq.size() * np);
      for (size_t fi = 0; fi < m.freq.size(); ++fi)
        for (size_t p = 0; p < np; ++p) {
          std::complex<double> v;
          static const char* comps[6] = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz"};
          int c = -1;
          for (int q = 0; q < 6; ++q)
            if (name == comps[q]) c = q;
          if (c >= 0) {
            v = m.field(fi, p, c);
          } else {  // 1/2 E x H*: real part the time-averaged Poynting vector, imaginary the reactive part
            std::complex<double> E[3], H[3];
            for (int q = 0; q < 3; ++q) E[q] = m.field(fi, p, q), H[q] = m.field(fi, p, q + 3);
            const auto S = poynting(E, H);
            v = name == "Sx" ? S[0] : name == "Sy" ? S[1] : std::complex<double>(std::hypot(S[0].real(), S[1].real()), 0.0);
          }
          re[fi * np + p] = v.real();
          im[fi * np + p] = v.imag();
        }
      f.write(base + "/" + name + "/real", shape, re.data(), field_units(name));
      f.write(base + "/" + name + "/imag", shape, im.data(), field_units(name));
    }
  }
}

/// The power-spectrum lines: the net power, the windows, the transformed fields and the line.
void write_power_spectra(h5::File& f, const std::vector<PowerSpectrumRecorder>& power_spectra, double dt,
                         Vec2 origin_shift) {
  for (const auto& fl : power_spectra) {
    const std::string base = "/power-spectra/" + fl.name;
    const auto P = line_power(fl, [&](size_t a, size_t b, int c) { return fl.field(a, b, c); });
    f.write(base + "/frequency", {fl.freq.size()}, fl.freq.data(), "Hz");
    f.write(base + "/power", {P.size()}, P.data(), "W/m");
    f.attribute(base + "/power", "meaning",
                "net power through the line towards its normal, for a steady wave with the recorded spectrum's "
                "amplitude ((2/T) normalisation, T each frequency's window)");
    std::vector<double> window(fl.freq.size());
    for (size_t k = 0; k < fl.freq.size(); ++k) window[k] = fl.win.seconds(k, dt);
    f.write(base + "/window", {window.size()}, window.data(), "s");
    f.attribute(base + "/window", "meaning",
                "each frequency's DFT window, ending with the run's last step (the whole run when every source is a "
                "pulse; else whole periods in the run's second half, or the last block of a run that stopped itself)");
    const hsize_t np = fl.points.size();
    std::vector<double> re(fl.acc.size()), im(fl.acc.size()), px, py;
    for (size_t k = 0; k < fl.acc.size(); ++k) {
      const auto v = fl.field(k / (np * 6), k / 6 % np, static_cast<int>(k % 6));
      re[k] = v.real(), im[k] = v.imag();
    }
    f.write(base + "/fields/real", {fl.freq.size(), np, 6}, re.data(), "V/m (E), A/m (H)");
    f.write(base + "/fields/imag", {fl.freq.size(), np, 6}, im.data(), "V/m (E), A/m (H)");
    f.attribute(base + "/fields/real", "layout", "[frequency][point][Ex Ey Ez Hx Hy Hz]");
    for (const auto& p : fl.points) px.push_back(p.x - origin_shift.x), py.push_back(p.y - origin_shift.y);
    f.write(base + "/points/x", {np}, px.data(), "m");
    f.write(base + "/points/y", {np}, py.data(), "m");
    f.write(base + "/weights", {np}, fl.weight.data(), "m");
    const double n[2] = {fl.normal.x, fl.normal.y};
    f.write(base + "/normal", {2}, n, "");
  }
}

/// The probes' series on the E time axis.
void write_probes(h5::File& f, const std::vector<ProbeRecorder>& probes, double dt, Vec2 origin_shift) {
  for (const auto& p : probes) {
    std::vector<double> t(p.count);
    for (long k = 0; k < p.count; ++k) t[k] = (k + 1) * dt;
    const std::string base = "/probes/" + p.name;
    f.write(base + "/time", {t.size()}, t.data(), "s");
    f.attribute(base + "/time", "meaning", "the E times (k+1) dt of every series; H and magnetic fields are the mean of their half steps around them");
    for (const auto& name : p.fields) {
      const auto v = p.series(name);
      f.write(base + "/" + name, {v.size()}, v.data(), field_units(name));
    }
    const double at[2] = {p.at.x - origin_shift.x, p.at.y - origin_shift.y};
    f.write(base + "/at", {2}, at, "m");
  }
}

}  // namespace

void RunFolder::finish(const std::vector<ProbeRecorder>& probes, const std::vector<PowerSpectrumRecorder>& power_spectra,
                       const std::vector<SpectralMap>& maps, double dt, const nlohmann::json& summary) {
  // The closing datasets go into a copy, so the partial file stays as the checkpoint
  // knows it until fields.h5 is in place (a kill here leaves a run that resumes). Over
  // ranks every rank closes its side of the frames first, and rank 0 goes on alone.
  h5_.reset();
  if (parallel::size() > 1) parallel::barrier();
  if (!root_) {
    done_ = true;
    return;
  }
  const std::string result = path("fields.h5"), tmp = temporary_name(result);
  fs::copy_file(path(kPartial), tmp, fs::copy_options::overwrite_existing);
  h5_ = std::make_unique<h5::File>(h5::File::open_rw(tmp));
  h5::File& f = *h5_;
  if (frames_planned_ > plan_.steps.size()) {  // stopped by itself before the last planned frames
    for (const auto& sf : plan_.fields) f.shrink_frames("/snapshots/" + sf.name, plan_.steps.size());
    f.remove("/snapshots/time");
    f.write("/snapshots/time", {plan_.times.size()}, plan_.times.data(), "s");
  }
  // Per-frame views of the series for fields.xmf (write_xdmf): ParaView's XDMF 3 reader
  // does not take HyperSlab items into a series, but reads plain 2D datasets; the views
  // hold no data of their own.
  for (size_t k = 0; k < plan_.times.size(); ++k)
    for (const auto& sf : plan_.fields) {
      const std::string view = frame_view_path(k, sf.name);
      f.frame_view(view, "/snapshots/" + sf.name, k);
      f.attribute(view, "units", sf.units);
      f.attribute(view, "time-offset", sf.time_offset);
    }
  write_spectral_maps(f, maps);
  write_power_spectra(f, power_spectra, dt, scene_.origin_shift);
  write_probes(f, probes, dt, scene_.origin_shift);
  f.flush();
  h5_.reset();  // closes the file
  kill_point(KillPoint::result);
  commit_file(tmp, result);
  kill_point(KillPoint::renamed);
  write_xdmf();
  write_text_atomically(path("summary.json"), summary.dump(2) + "\n");
  // Only now, with every result in place, the state of the stopped run goes.
  std::error_code ec;
  fs::remove(path("checkpoint.h5"), ec);
  fs::remove(path(kPartial), ec);
  done_ = true;
}

void RunFolder::ended_at(long steps) {
  std::size_t keep = 0;
  while (keep < plan_.steps.size() && plan_.steps[keep] < steps) ++keep;
  plan_.steps.resize(keep);
  plan_.times.resize(keep);
}

void RunFolder::flush() {
  if (h5_) h5_->flush();
}

void RunFolder::keep() {
  h5_.reset();
  done_ = true;
}

void RunFolder::abandon() {
  // Over ranks every rank comes here at the same step (the guard and the NaN check decide
  // alike on every rank): each closes its side of the shared file (collective), and rank 0
  // removes files only once all have.
  h5_.reset();
  if (parallel::size() > 1) parallel::barrier();
  if (!root_) {
    done_ = true;
    return;
  }
  std::error_code ec;
  discard_temporary(temporary_name(path("fields.h5")));
  // Partial results are kept for the checkpoint they go with; without one they are no use.
  if (!fs::exists(path("checkpoint.h5"))) fs::remove(path(kPartial), ec);
  done_ = true;
}

void RunFolder::write_xdmf() const {
  // One temporal collection of frames; each frame a spatial collection of the fields, all
  // at the frame's time (the E time). Fields recorded off it (H, half a step earlier) say
  // so in an Information element, so that a movie shows every field at every time.
  std::ostringstream x;
  x << "<?xml version=\"1.0\" ?>\n<Xdmf Version=\"3.0\">\n<Domain>\n";
  const int prec = single_ ? 4 : 8;
  if (!plan_.fields.empty()) x << "<Grid Name=\"snapshots\" GridType=\"Collection\" CollectionType=\"Temporal\">\n";
  for (size_t k = 0; !plan_.fields.empty() && k < plan_.times.size(); ++k) {
    x << fmt::format("  <Grid Name=\"frame-{}\" GridType=\"Collection\" CollectionType=\"Spatial\">\n", k);
    x << fmt::format("    <Time Value=\"{:.17g}\"/>\n", plan_.times[k]);
    for (const auto& sf : plan_.fields) {
      x << fmt::format("    <Grid Name=\"{}\" GridType=\"Uniform\">\n", sf.name);
      x << fmt::format(
          "      <Information Name=\"time-offset\" Value=\"{:.17g}\">seconds: this field's values are at the "
          "frame's time plus this offset</Information>\n",
          sf.time_offset);
      x << fmt::format("      <Topology TopologyType=\"2DRectMesh\" Dimensions=\"{} {}\"/>\n", sf.nj, sf.ni);
      x << "      <Geometry GeometryType=\"VXVY\">\n";
      for (const auto& [axis, n] : {std::pair{"x", sf.ni}, std::pair{"y", sf.nj}})
        x << fmt::format(
            "        <DataItem Dimensions=\"{}\" NumberType=\"Float\" Precision=\"8\" "
            "Format=\"HDF\">fields.h5:/grid/{}/{}</DataItem>\n",
            n, sf.name, axis);
      x << "      </Geometry>\n";
      x << fmt::format("      <Attribute Name=\"{} ({})\" AttributeType=\"Scalar\" Center=\"Node\">\n", sf.name,
                       sf.units);
      x << fmt::format(
          "        <DataItem Dimensions=\"{} {}\" NumberType=\"Float\" Precision=\"{}\" "
          "Format=\"HDF\">fields.h5:{}</DataItem>\n",
          sf.nj, sf.ni, prec, frame_view_path(k, sf.name));
      x << "      </Attribute>\n    </Grid>\n";
    }
    x << "  </Grid>\n";
  }
  if (!plan_.fields.empty()) x << "</Grid>\n";
  x << "</Domain>\n</Xdmf>\n";
  write_text_atomically(path("fields.xmf"), x.str());
}

}  // namespace ty
