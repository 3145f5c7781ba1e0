/// \file crystal_permittivity.cpp
/// \brief A library crystal's dispersive, oriented permittivity (crystal_permittivity.h).
#include "io/scene/crystals/crystal_permittivity.h"

#include <cmath>

namespace ty {

PermittivityModel crystal_axis_model(const Crystal& c, int axis) {
  PermittivityModel m;
  m.eps_inf = c.permittivity[axis].value;
  for (const CrystalPhonon& p : c.phonons)
    if (p.axis == axis) {
      m.lorentz.push_back(p.term);
      m.eps_inf -= p.term.delta_eps;
    }
  return m;
}

bool crystal_permittivity(const Crystal& c, const Rot3& r, PermittivityTensor& out) {
  PermittivityModel m[3];
  for (int k = 0; k < 3; ++k) m[k] = crystal_axis_model(c, k);
  // crystal axis k lies along R e_k, column k of r
  for (int kz = 0; kz < 3; ++kz) {
    if (std::abs(std::abs(r[2][kz]) - 1) > 1e-9) continue;
    const int k1 = kz == 0 ? 1 : 0, k2 = kz == 2 ? 1 : 2;
    out.axis = {m[k1], m[k2], m[kz]};
    out.rotate = std::atan2(r[1][k1], r[0][k1]);
    return true;
  }
  // an axis unlike the other two lying in the plane: it is u, the other two (alike) v and z
  for (int k = 0; k < 3; ++k) {
    const int o1 = (k + 1) % 3, o2 = (k + 2) % 3;
    if (!(m[o1] == m[o2]) || std::abs(r[2][k]) > 1e-9) continue;
    out.axis = {m[k], m[o1], m[o1]};
    out.rotate = std::atan2(r[1][k], r[0][k]);
    return true;
  }
  // otherwise only a crystal alike along every axis turns freely
  if (m[0] == m[1] && m[1] == m[2]) {
    out.axis = {m[0], m[1], m[2]};
    out.rotate = 0;
    return true;
  }
  return false;
}

}  // namespace ty
