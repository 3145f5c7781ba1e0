/// \file bodies.cpp
/// \brief The `bodies` section: a medium and one shape (rectangle, circle, polygon) each.
#include <algorithm>

#include "io/scene/reader/reader.h"

namespace ty::reader {

void SceneBuilder::read_body(const YAML::Node& b) {
  if (!r_.is_map(b, "bodies item")) return;
  r_.allow(b, {"medium", "rectangle", "circle", "polygon", "sample", "order", "state"}, "a body");
  Body body;
  body.where = r_.mark(b);
  bool ok = read_body_medium(b, body);
  if (ok) read_body_order(b, body);
  int shapes = 0;
  for (auto k : {"rectangle", "circle", "polygon"}) shapes += b[k] ? 1 : 0;
  if (shapes != 1) {
    r_.error(b, "a body needs exactly one shape: rectangle, circle or polygon");
    return;
  }
  if (b["sample"])
    if (auto v = r_.boolean(b["sample"], "sample")) body.sample = *v;
  const Vec2 dx = cell();
  Shape& s = body.shape;
  if (const auto& r = b["rectangle"]) {
    s.kind = Shape::Kind::rectangle;
    if (!r_.is_map(r, "rectangle")) return;
    r_.allow(r, {"centre", "size", "rotate"}, "rectangle");
    r_.require(r, "centre", "rectangle");
    r_.require(r, "size", "rectangle");
    if (r["centre"]) {
      if (auto v = r_.vec2(r["centre"], "centre", Kind::length, dx))
        s.centre = to_internal(*v);
      else
        ok = false;
    }
    if (r["size"]) {
      if (auto v = r_.vec2(r["size"], "size", Kind::length, dx)) {
        s.size = *v;
        if (!(v->x > 0 && v->y > 0)) {
          r_.error(r["size"], "rectangle 'size' must be positive");
          ok = false;
        }
      } else {
        ok = false;
      }
    }
    if (r["rotate"])
      if (auto v = r_.quantity(r["rotate"], "rotate", Kind::angle)) s.rotate = *v;
    ok = ok && r["centre"] && r["size"];
  } else if (const auto& c = b["circle"]) {
    s.kind = Shape::Kind::circle;
    if (!r_.is_map(c, "circle")) return;
    r_.allow(c, {"centre", "radius"}, "circle");
    r_.require(c, "centre", "circle");
    r_.require(c, "radius", "circle");
    if (c["centre"]) {
      if (auto v = r_.vec2(c["centre"], "centre", Kind::length, dx))
        s.centre = to_internal(*v);
      else
        ok = false;
    }
    if (c["radius"]) {
      if (auto v = r_.positive(c["radius"], "radius", Kind::length, cell_any()))
        s.radius = *v;
      else
        ok = false;
    }
    ok = ok && c["centre"] && c["radius"];
  } else if (const auto& p = b["polygon"]) {
    s.kind = Shape::Kind::polygon;
    if (!r_.is_seq(p, "polygon")) return;
    if (p.size() < 3) {
      r_.error(p, "a polygon needs at least three vertices");
      ok = false;
    }
    for (const auto& v : p) {
      if (auto q = r_.vec2(v, "polygon vertex", Kind::length, dx))
        s.vertices.push_back(to_internal(*q));
      else
        ok = false;
    }
  }
  if (ok) scene_.bodies.push_back(body);
}

/// The body's `medium`: a name defined under `media`.
bool SceneBuilder::read_body_medium(const YAML::Node& b, Body& body) {
  bool ok = true;
  if (!b["medium"]) {
    r_.error(b, "a body needs the key 'medium'");
    ok = false;
  } else if (auto name = r_.text(b["medium"], "medium")) {
    auto it = std::find_if(scene_.media.begin(), scene_.media.end(), [&](const Medium& m) { return m.name == *name; });
    if (it == scene_.media.end()) {
      r_.error(b["medium"], fmt::format("body medium '{}' is not defined under 'media'", *name));
      ok = false;
    } else {
      body.medium = static_cast<int>(it - scene_.media.begin());
    }
  }
  return ok;
}

/// A body's own magnetic order (an antiferromagnetic domain): `order: reversed` or a
/// direction, and `state`, for the cells of this body only (materials/magnetic/domain_state.h).
void SceneBuilder::read_body_order(const YAML::Node& b, Body& body) {
  if (!b["order"] && !b["state"]) return;
  const Medium& med = scene_.media[body.medium];
  const std::string here = fmt::format("body of medium '{}'", med.name);
  if (!med.magnet) {
    for (auto k : {"order", "state"})
      if (b[k])
        r_.error(b[k], fmt::format("{}: '{}' chooses a magnetic state, and medium '{}' has no 'magnet' (nor a "
                                   "magnetic crystal)",
                                   here, k, med.name));
    return;
  }
  BodyOrder& o = body.magnetic;
  if (const auto& v = b["order"]) {
    o.where = r_.mark(v);
    if (v.IsScalar()) {
      if (v.Scalar() == "reversed")
        o.reversed = true;
      else
        r_.error(v, fmt::format("{}: 'order' is 'reversed' (the state of equal energy with sublattice 1 turned "
                                "over) or a direction [x, y, z]; got '{}'",
                                here, v.Scalar()));
    } else if (auto d = unit_vector(v, "order")) {
      o.order = *d;
    }
  }
  if (const auto& v = b["state"]) {
    o.where = r_.mark(v);  // a missing state is the likelier error when both are given
    if (auto t = state_pick(v, here)) o.state = *t;
  }
}

}  // namespace ty::reader
