/// \file state_choice.cpp
/// \brief Choosing a magnet's starting state: by `state`, or along its bias `history`.
#include "materials/magnetic/state_choice.h"

#include <fmt/format.h>

#include <cmath>

#include "io/scene/diagnostics.h"

namespace ty {
namespace {

constexpr double kHistoryStep = 5e-3;  // T: the largest bias step of the continuation

std::string field_text(const std::array<double, 3>& b) { return fmt::format("[{:g}, {:g}, {:g}] T", b[0], b[1], b[2]); }

ChosenState follow_history(const Magnet& magnet, const std::array<double, 3>& bias) {
  std::vector<std::array<double, 3>> path = magnet.state.history;
  path.push_back(bias);
  MagneticState st = find_ground_states(MagnetModel(magnet, path[0])).ground;
  std::string jumps, route = field_text(path[0]);
  for (size_t k = 1; k < path.size(); ++k) {
    const Vec3 a(path[k - 1][0], path[k - 1][1], path[k - 1][2]), b(path[k][0], path[k][1], path[k][2]);
    const int steps = std::max(1, static_cast<int>(std::ceil((b - a).norm() / kHistoryStep)));
    for (int i = 1; i <= steps; ++i) {
      const Vec3 p = a + (b - a) * (static_cast<double>(i) / steps);
      const MagneticState next = relax(MagnetModel(magnet, {p[0], p[1], p[2]}), st.m);
      if (next.kind != st.kind || (next.m[0] - st.m[0]).norm() > 0.5)
        jumps += fmt::format("; {} -> {} at {}", st.kind, next.kind, field_text({p[0], p[1], p[2]}));
      st = next;
    }
    route += " -> " + field_text(path[k]);
  }
  return {st, fmt::format("{}, followed along the bias history {}{}", st.kind, route, jumps)};
}

}  // namespace

ChosenState choose_state(const Magnet& magnet, const std::array<double, 3>& bias) {
  if (!magnet.state.history.empty()) return follow_history(magnet, bias);
  const GroundStates found = find_ground_states(MagnetModel(magnet, bias));
  const auto all = listed_states(found);
  const std::string& pick = magnet.state.pick;
  auto label = [&](size_t k) {
    const char* rank = k == 0 ? "lowest" : k <= found.degenerate.size() ? "degenerate with 1" : "metastable";
    return fmt::format("state {} of {} ({} {})", k + 1, all.size(), rank, all[k].kind);
  };
  size_t k = 0;
  if (pick == "lowest") return {all[0], label(0)};
  if (pick.find_first_not_of("0123456789") == std::string::npos) {
    k = std::stoul(pick) - 1;
    if (k >= all.size())
      throw BadInput(Diagnostic{magnet.state.where, fmt::format("'state: {}': under this bias the magnet has {} "
                                                                "state{} (`terayee check` lists them)",
                                                                pick, all.size(), all.size() == 1 ? "" : "s")}
                         .text());
  } else {
    while (k < all.size() && all[k].kind != pick) ++k;
    if (k == all.size())
      throw BadInput(
          Diagnostic{magnet.state.where, fmt::format("'state: {}': under this bias no {} state exists (`terayee check` "
                                                     "lists the states)",
                                                     pick, pick)}
              .text());
  }
  return {all[k], fmt::format("{}, chosen by 'state: {}'", label(k), pick)};
}

}  // namespace ty
