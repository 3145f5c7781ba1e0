/// \file jones_prediction.cpp
/// \brief The transfer matrix's Jones matrices of a slab of a scene's medium (see
/// jones_prediction.h for the signs).
#include "io/analysis/spectroscopy/jones_prediction.h"

#include <fmt/format.h>

#include <cmath>

#include "io/scene/constants.h"
#include "materials/magnetic/linear_response.h"
#include "materials/magnetic/state_choice.h"
#include "materials/permittivity/permittivity.h"

namespace ty {

Jones transmission_jones(const StackResponse& s) {
  Jones J{};
  for (int in = 0; in < 2; ++in)
    for (int out = 0; out < 2; ++out) J[out][in] = s.t[in][out];
  return J;
}

Jones reflection_jones(const StackResponse& s) {
  Jones J{};
  for (int in = 0; in < 2; ++in) J[0][in] = s.r[in][0], J[1][in] = -s.r[in][1];
  return J;
}

SlabModel slab_model(const Scene& scene, int medium, double thickness, int normal) {
  SlabModel m;
  m.medium = scene.media.at(medium);
  if (m.medium.magnet) {
    m.magnetic = true;
    m.model = MagnetModel(*m.medium.magnet, scene.bias);
    m.state = choose_state(*m.medium.magnet, scene.bias).state;  // the state a run starts from
  }
  m.thickness = thickness;
  m.normal = normal;
  return m;
}

LayerStack slab_stack(const SlabModel& m, double f) {
  const double w = 2 * constants::pi * f;
  const Mat3c eps = medium_permittivity(m.medium, w);
  const Mat3c mu = m.magnetic ? Mat3c(Mat3c::Identity() + susceptibility(m.model, m.state, w)) : Mat3c::Identity();
  LayerStack st;
  st.normal = m.normal;
  if (m.thickness > 0)
    st.layers = {{eps, mu, m.thickness}};
  else
    st.eps_out = eps, st.mu_out = mu;
  return st;
}

JonesPrediction predict_jones(const SlabModel& m, double f, double angle) {
  const StackResponse s = stack_response(slab_stack(m, f), 2 * constants::pi * f, angle);
  JonesPrediction p;
  p.has_t = m.thickness > 0;
  p.r = reflection_jones(s);
  if (p.has_t) p.t = transmission_jones(s);
  for (int in = 0; in < 2; ++in) {
    p.kerr[in] = jones_rotation(p.r, in, true);
    if (p.has_t) p.faraday[in] = jones_rotation(p.t, in, false);
  }
  return p;
}

Jones with_vacuum_path(const Jones& J, double f, double d) {
  const std::complex<double> phase = std::exp(std::complex<double>(0, -2 * constants::pi * f * d / constants::c0));
  Jones out = J;
  for (auto& row : out)
    for (auto& z : row) z *= phase;
  return out;
}

std::optional<SampleSlab> sample_slab(const Scene& scene, int axis, int direction, std::string& why) {
  const Body* found = nullptr;
  int count = 0;
  for (const Body& b : scene.bodies)
    if (b.sample) found = &b, ++count;
  if (count != 1) {
    why = fmt::format("the scene has {} bodies marked `sample: true` (one is needed)", count);
    return std::nullopt;
  }
  const Shape& s = found->shape;
  if (s.kind != Shape::Kind::rectangle || s.rotate != 0) {
    why = "the sample body is not an unrotated rectangle";
    return std::nullopt;
  }
  const double ext[2] = {scene.grid.extent.x, scene.grid.extent.y};
  const double c[2] = {s.centre.x, s.centre.y}, h[2] = {s.size.x / 2, s.size.y / 2};
  const int across = 1 - axis;
  if (c[across] - h[across] > 0 || c[across] + h[across] < ext[across]) {
    why = "the sample body does not reach across the grid";
    return std::nullopt;
  }
  SampleSlab slab;
  slab.medium = found->medium;
  const double lo = c[axis] - h[axis], hi = c[axis] + h[axis];
  slab.front = direction > 0 ? lo : hi;
  const bool beyond = direction > 0 ? hi >= ext[axis] : lo <= 0;
  slab.thickness = beyond ? 0.0 : hi - lo;
  return slab;
}

std::optional<SceneSample> scene_sample(const Scene& scene, std::string& why) {
  const Source* plane = nullptr;
  for (const Source& s : scene.sources)
    if (s.kind == Source::Kind::plane) plane = &s;
  const double c = plane ? std::cos(plane->angle) : 0, sn = plane ? std::sin(plane->angle) : 0;
  if (!plane || !(std::abs(c) > 1 - 1e-12 || std::abs(sn) > 1 - 1e-12)) {
    why = "no plane wave along x or y";
    return std::nullopt;
  }
  SceneSample out;
  out.axis = std::abs(c) > 0.5 ? 0 : 1;
  out.direction = (out.axis == 0 ? c : sn) > 0 ? 1 : -1;
  const auto slab = sample_slab(scene, out.axis, out.direction, why);
  if (!slab) return std::nullopt;
  out.slab = *slab;
  out.model = slab_model(scene, slab->medium, slab->thickness, out.axis);
  return out;
}

}  // namespace ty
