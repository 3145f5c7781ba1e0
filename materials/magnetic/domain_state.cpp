/// \file domain_state.cpp
/// \brief A body's own magnetic state: the medium's magnet with the body's `order` and
/// `state`, and `order: reversed` (domain_state.h).
#include "materials/magnetic/domain_state.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "io/scene/diagnostics.h"

namespace ty {
namespace {

/// The state of equal energy with sublattice 1 turned most against `from`'s (none: throws).
ChosenState reversed_state(const MagnetModel& M, const ChosenState& from, const Mark& where) {
  std::vector<MagneticState> candidates = listed_states(find_ground_states(M));
  candidates.push_back(relax(M, {Vec3(-from.state.m[0]), Vec3(-from.state.m[1])}));  // time-reversed image
  if (M.n == 2) candidates.push_back(relax(M, {from.state.m[1], from.state.m[0]}));  // sublattices exchanged
  double scale = 1e-12;
  for (const auto& c : candidates) scale = std::max(scale, std::abs(c.energy));
  const double etol = 1e-9 * std::max(scale, std::abs(from.state.energy));
  const MagneticState* best = nullptr;
  for (const auto& c : candidates) {
    if (std::abs(c.energy - from.state.energy) > etol) continue;
    const double d = c.m[0].dot(from.state.m[0]);
    if (d < -1e-6 && (!best || d < best->m[0].dot(from.state.m[0]))) best = &c;
  }
  if (!best)
    throw BadInput(Diagnostic{where, fmt::format("'order: reversed': under this bias no state of the same energy has "
                                                 "sublattice 1 turned over (the body would take {}); `terayee "
                                                 "check` lists the states: give 'state: N' on the body instead",
                                                 from.how)}
                       .text());
  const double angle = std::acos(std::clamp(best->m[0].dot(from.state.m[0]), -1.0, 1.0)) * 180 / constants::pi;
  return {*best, fmt::format("{} (a domain: {}, reversed by 'order: reversed', sublattice 1 turned by {:.4g} deg)",
                             best->kind, from.how, angle)};
}

}  // namespace

ChosenState choose_body_state(const Magnet& magnet, const BodyOrder& o, const std::array<double, 3>& bias) {
  if (!o.given()) return choose_state(magnet, bias);
  Magnet g = magnet;
  if (o.order != std::array<double, 3>{0, 0, 0}) g.order = o.order;
  if (!o.state.empty()) {
    g.state.pick = o.state;
    g.state.history.clear();
    g.state.where = o.where;
  }
  ChosenState chosen = choose_state(g, bias);
  if (o.order != std::array<double, 3>{0, 0, 0} && o.state.empty() && g.state.history.empty())
    chosen.how += fmt::format(", with the body's 'order: [{:g}, {:g}, {:g}]'", o.order[0], o.order[1], o.order[2]);
  if (!o.reversed) return chosen;
  return reversed_state(MagnetModel(g, bias), chosen, o.where);
}

}  // namespace ty
