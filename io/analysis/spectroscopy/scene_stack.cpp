/// \file scene_stack.cpp
/// \brief The layered stack of a scene's plane wave (see scene_stack.h): found from the bodies'
/// faces along the wave's axis, each part's medium taken by the scene's one lookup
/// (io/scene/medium_lookup.h), so the stack is what the run's grid holds.
#include "io/analysis/spectroscopy/scene_stack.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "io/analysis/spectroscopy/jones_prediction.h"
#include "io/scene/constants.h"
#include "io/scene/medium_lookup.h"
#include "materials/magnetic/domain_state.h"
#include "materials/magnetic/linear_response.h"
#include "materials/permittivity/permittivity.h"

namespace ty {
namespace {

const char* axis_name(int a) { return a == 0 ? "x" : "y"; }

/// The plane sources' axis, direction and launch line; every other source, and plane waves that
/// disagree, are errors.
void read_sources(const Scene& scene, SceneStack& st, Diagnostics& d) {
  const Source* first = nullptr;
  for (const Source& src : scene.sources) {
    if (src.kind != Source::Kind::plane) {
      d.error(src.where, "`medium --stack` predicts a plane wave's reflection: this source is not a plane wave");
      continue;
    }
    if (!first) {
      first = &src;
      st.axis = src.line_axis == 'x' ? 0 : 1;
      st.direction = (st.axis == 0 ? std::cos(src.angle) : std::sin(src.angle)) > 0 ? 1 : -1;
      st.launch = src.line_at;
      st.polarization = src.component == Component::Hz ? 1 : 0;
    } else if (src.line_axis != first->line_axis || std::abs(src.angle - first->angle) > 1e-9 ||
               std::abs(src.line_at - first->line_at) > 1e-12) {
      d.error(src.where, fmt::format("this plane wave does not share the first one's launch line and direction (line {})",
                                     first->where.line));
    }
  }
  if (!first) {  // nothing to orient the stack by: the rules below would speak of the wrong axis
    d.error(scene.grid.where, "`medium --stack` needs a plane-wave source (the scene has none)");
    d.throw_if_any();
  }
}

/// Every body must be an unrotated rectangle across the whole width; its faces along the
/// wave's axis are the stack's interfaces.
std::vector<double> faces(const Scene& scene, int axis, Diagnostics& d) {
  const double ext[2] = {scene.grid.extent.x, scene.grid.extent.y};
  const int across = 1 - axis;
  std::vector<double> cut = {0.0, ext[axis]};
  for (const Body& b : scene.bodies) {
    const std::string name = scene.media[b.medium].name;
    const Shape& s = b.shape;
    if (s.kind != Shape::Kind::rectangle || s.rotate != 0) {
      d.error(b.where, fmt::format("body of '{}' is not an unrotated rectangle: not a layer of a stack along {}", name,
                                   axis_name(axis)));
      continue;
    }
    const double c[2] = {s.centre.x, s.centre.y}, h[2] = {s.size.x / 2, s.size.y / 2};
    if (c[across] - h[across] > 0 || c[across] + h[across] < ext[across]) {
      d.error(b.where, fmt::format("body of '{}' does not span the width across the wave ({} from {:.6g} to {:.6g} um "
                                   "of 0 to {:.6g} um): not a layer of a stack",
                                   name, axis_name(across), (c[across] - h[across] + 0) * 1e6,
                                   (c[across] + h[across]) * 1e6, ext[across] * 1e6));
      continue;
    }
    for (const double v : {c[axis] - h[axis], c[axis] + h[axis]})
      if (v > 0 && v < ext[axis]) cut.push_back(v);
  }
  std::sort(cut.begin(), cut.end());
  cut.erase(std::unique(cut.begin(), cut.end(), [&](double a, double b) { return b - a < 1e-12 * ext[axis]; }),
            cut.end());
  return cut;
}

/// Two neighbouring parts are one medium when they are one body, or bodies of one medium
/// where neither carries its own magnetic state.
bool same_part(const Scene& scene, const StackPart& a, const StackPart& b) {
  if (a.medium != b.medium) return false;
  if (a.body == b.body || a.medium < 0) return true;
  const auto own = [&](int body) { return body >= 0 && scene.bodies[body].magnetic.given(); };
  return !own(a.body) && !own(b.body);
}

StackPart make_part(const Scene& scene, int body, double from, double to) {
  StackPart p;
  p.body = body;
  p.medium = body < 0 ? -1 : scene.bodies[body].medium;
  p.from = from, p.to = to;
  if (p.medium >= 0 && scene.media[p.medium].magnet) {
    const Magnet& m = *scene.media[p.medium].magnet;
    p.magnetic = true;
    p.model = MagnetModel(m, scene.bias);
    p.state = choose_body_state(m, scene.bodies[body].magnetic, scene.bias).state;  // the state a run starts from
  }
  return p;
}

/// The parts in the order the wave meets them, from one end of the extent to the other.
std::vector<StackPart> parts(const Scene& scene, const SceneStack& st, const std::vector<double>& cut) {
  const double mid_across = 0.5 * (st.axis == 0 ? scene.grid.extent.y : scene.grid.extent.x);
  std::vector<StackPart> out;
  for (size_t k = 0; k + 1 < cut.size(); ++k) {
    const double m = 0.5 * (cut[k] + cut[k + 1]);
    const int body = body_at(scene, st.axis == 0 ? Vec2{m, mid_across} : Vec2{mid_across, m});
    StackPart p = make_part(scene, body, cut[k], cut[k + 1]);
    if (!out.empty() && same_part(scene, out.back(), p)) out.back().to = p.to;
    else out.push_back(std::move(p));
  }
  if (st.direction < 0) std::reverse(out.begin(), out.end());
  return out;
}

Mark body_mark(const Scene& scene, const StackPart& p) {
  return p.body >= 0 ? scene.bodies[p.body].where : scene.grid.where;
}

/// The incidence medium: isotropic, non-dispersive, lossless, non-magnetic (its index scales
/// the tangential wavenumber); nothing may lie behind the source.
void check_incidence(const Scene& scene, SceneStack& st, const std::vector<StackPart>& all, size_t at, Diagnostics& d) {
  for (size_t k = 0; k < at; ++k)
    d.error(body_mark(scene, all[k].body >= 0 ? all[k] : all[k + 1]),
            fmt::format("the medium changes behind the plane wave's launch line ({} between the grid's edge and the "
                        "line): the wave it reflects would come back, and the stack has no incidence half-space",
                        part_name(st, all[k])));
  const StackPart& in = all[at];
  if (in.medium < 0) return;
  const Medium& m = scene.media[in.medium];
  const auto& e = m.permittivity;
  if (m.magnet || m.tensor || m.perfect_conductor || m.conductivity != 0 || e[0] != e[1] || e[1] != e[2])
    d.error(body_mark(scene, in), fmt::format("the plane wave starts in '{}', which is not an isotropic, "
                                              "non-dispersive, lossless dielectric: the stack's incidence medium "
                                              "must be one",
                                              m.name));
  else
    st.n_in = std::sqrt(e[0]);
}

void check_boundaries(const Scene& scene, SceneStack& st, Diagnostics& d) {
  const Boundary along = st.axis == 0 ? scene.grid.bx : scene.grid.by;
  const Boundary across = st.axis == 0 ? scene.grid.by : scene.grid.bx;
  if (along != Boundary::absorbing)
    d.error(scene.grid.where, fmt::format("boundaries.{} is {}: a stack needs absorbing ends along the wave (its "
                                          "half-spaces)",
                                          axis_name(st.axis), boundary_name(along)));
  if (across == Boundary::absorbing)
    st.notes.push_back(fmt::format("boundaries.{} are absorbing: the launch line is cut off at its ends; the "
                                   "prediction is that of an unbounded plane wave",
                                   axis_name(1 - st.axis)));
  else if (across == Boundary::electric_wall || across == Boundary::magnetic_wall)
    st.notes.push_back(fmt::format("boundaries.{} are walls: they admit the {} wave only at normal incidence; the "
                                   "other wave's columns are those of the unbounded stack",
                                   axis_name(1 - st.axis), across == Boundary::electric_wall ? "Hz" : "Ez"));
  st.kx = scene.grid.bx == Boundary::bloch ? scene.grid.bloch_kx : 0.0;
}

Mat3c turned(const Mat3c& m, int axis, int direction) {
  // the rotation about z taking the direction of travel n to +y: [[ny, -nx], [nx, ny]]
  const double nx = axis == 0 ? direction : 0, ny = axis == 1 ? direction : 0;
  Eigen::Matrix3d R;
  R << ny, -nx, 0, nx, ny, 0, 0, 0, 1;
  return R.cast<std::complex<double>>() * m * R.transpose().cast<std::complex<double>>();
}

Layer layer_at(const SceneStack& s, const StackPart& p, double f) {
  const double w = 2 * constants::pi * f;
  Layer L;
  L.thickness = p.to - p.from;
  if (p.medium < 0) return L;
  L.eps = turned(medium_permittivity(s.media[p.medium], w), s.axis, s.direction);
  if (p.magnetic) L.mu = turned(Mat3c::Identity() + susceptibility(p.model, p.state, w), s.axis, s.direction);
  return L;
}

}  // namespace

std::string part_name(const SceneStack& s, const StackPart& p) {
  return p.medium < 0 ? std::string("vacuum") : s.media[p.medium].name;
}

SceneStack scene_stack(const Scene& scene) {
  Diagnostics d;
  SceneStack st;
  st.media = scene.media;
  read_sources(scene, st, d);
  check_boundaries(scene, st, d);
  const std::vector<double> cut = faces(scene, st.axis, d);
  for (const Body& b : scene.bodies)
    if (scene.media[b.medium].perfect_conductor)
      d.error(b.where, fmt::format("body of '{}' is a perfect conductor: not a layer the transfer matrix takes",
                                   scene.media[b.medium].name));
  d.throw_if_any();
  std::vector<StackPart> all = parts(scene, st, cut);
  // the part holding the launch line (where the line lies on a face: the part the wave enters)
  size_t at = 0;
  for (size_t k = 0; k < all.size(); ++k)
    if (st.direction > 0 ? all[k].from <= st.launch && st.launch < all[k].to
                         : all[k].from < st.launch && st.launch <= all[k].to)
      at = k;
  check_incidence(scene, st, all, at, d);
  d.throw_if_any();
  st.incidence = all[at];
  st.exit = all.back();
  if (all.size() > at + 1) st.layers.assign(all.begin() + at + 1, all.end() - 1);
  return st;
}

double stack_tangential_index(const SceneStack& s, double f) {
  // t = z x n: for n = +-y, t = -+x (k_x . t = -n_y k_x); for n = +-x, t = +-y (no k_y)
  const double k0 = 2 * constants::pi * f / constants::c0;
  return s.axis == 1 ? -s.direction * s.kx / k0 : 0.0;
}

LayerStack stack_layers(const SceneStack& s, double f) {
  LayerStack st;
  st.normal = 1;  // the tensors are turned so that the wave travels along +y
  st.n_in = s.n_in;
  for (const StackPart& p : s.layers) st.layers.push_back(layer_at(s, p, f));
  const Layer out = layer_at(s, s.exit, f);
  st.eps_out = out.eps, st.mu_out = out.mu;
  return st;
}

StackPrediction predict_stack(const SceneStack& s, double f) {
  StackPrediction p;
  p.f = f;
  p.kt = stack_tangential_index(s, f);
  const LayerStack st = stack_layers(s, f);
  p.response = stack_response_kt(st, 2 * constants::pi * f, p.kt);
  p.propagating = std::abs(p.kt) < s.n_in;
  p.r = reflection_jones(p.response);
  // t is the transmitted wave's Jones matrix where the exit is vacuum (its Ez and eta0 Hz are
  // the two waves' E amplitudes)
  p.has_t = st.eps_out.isIdentity(0) && st.mu_out.isIdentity(0);
  if (p.has_t) p.t = transmission_jones(p.response);
  for (int in = 0; in < 2; ++in) {
    p.kerr[in] = jones_rotation(p.r, in, true);
    if (p.has_t) p.faraday[in] = jones_rotation(p.t, in, false);
  }
  return p;
}

}  // namespace ty
