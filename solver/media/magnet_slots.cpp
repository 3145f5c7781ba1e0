/// \file magnet_slots.cpp
/// \brief The magnets' slots of a scene (magnet_slots.h).
#include "solver/media/magnet_slots.h"

#include <fmt/format.h>

#include "materials/magnetic/domain_state.h"
#include "materials/magnetic/linear_response.h"

namespace ty {

std::vector<int> magnet_slots(const Scene& s, double dt, MagneticCells& M, std::vector<double>& f_max_of,
                              std::vector<std::string>& notes) {
  std::vector<int> slot_of_body(s.bodies.size(), -1);
  auto add = [&](int medium, const BodyOrder& own, const std::string& who) {
    const Magnet& magnet = *s.media[medium].magnet;
    M.models.emplace_back(magnet, s.bias);
    const ChosenState chosen = choose_body_state(magnet, own, s.bias);
    M.ground.push_back(chosen.state);
    const MagnetModel& mm = M.models.back();
    const auto f = resonances(mm, M.ground.back());
    f_max_of.push_back(f.empty() ? mm.gamma[0] * 1.0 / (2 * constants::pi) : f.back());
    const Vec3 mg = mm.net(M.ground.back().m);
    M.net.push_back({mm.mu[0], mm.n == 2 ? mm.mu[1] : 0.0, mg[0], mg[1], mg[2]});
    const int substeps = LlgCoefficients::from(mm, dt, f_max_of.back()).substeps;
    notes.push_back(fmt::format("{}: starts in {}; cells tilted past {:g} rad take the exponential midpoint, past 7 "
                                "degrees the midpoint rule in {} sub-step{} per time step",
                                who, chosen.how, CellStep::kTilt, substeps, substeps == 1 ? "" : "s"));
    return static_cast<int>(M.models.size()) - 1;
  };
  for (size_t k = 0; k < s.media.size(); ++k) {
    if (!s.media[k].magnet) continue;
    int slot = -1;
    for (size_t b = 0; b < s.bodies.size(); ++b)
      if (s.bodies[b].medium == static_cast<int>(k) && !s.bodies[b].magnetic.given()) {
        if (slot < 0) slot = add(static_cast<int>(k), BodyOrder{}, fmt::format("magnetic medium '{}'", s.media[k].name));
        slot_of_body[b] = slot;
      }
  }
  for (size_t b = 0; b < s.bodies.size(); ++b) {
    const Body& body = s.bodies[b];
    if (s.media[body.medium].magnet && body.magnetic.given())
      slot_of_body[b] = add(body.medium, body.magnetic,
                            fmt::format("magnetic medium '{}', body {} (line {})", s.media[body.medium].name, b + 1,
                                        body.where.line));
  }
  return slot_of_body;
}

}  // namespace ty
