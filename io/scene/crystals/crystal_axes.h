/// \file crystal_axes.h
/// \brief Orienting a crystal's own axes (a, b, c; orthonormalised with x along a and z
/// along c) in the scene: by a cut or by Euler angles. A crystal vector v lies along R v in
/// scene coordinates (x right, y up, z out of the simulated plane).
///
///   cut c: a -> x, b -> y, c -> z   (the default: c out of the plane)
///   cut a: b -> x, c -> y, a -> z
///   cut b: c -> x, a -> y, b -> z
///   rotation [phi, theta, psi]: proper Euler angles, z-x'-z'' (intrinsic),
///     R = Rz(phi) Rx(theta) Rz(psi) (Goldstein, Classical Mechanics, 3rd ed., sec. 4.4),
///     applied after the cut.
#pragma once
#include <array>

namespace ty {

using Rot3 = std::array<std::array<double, 3>, 3>;

/// `axis` is 'a', 'b' or 'c'.
Rot3 cut_rotation(char axis);
Rot3 euler_rotation(double phi, double theta, double psi);
Rot3 operator*(const Rot3& a, const Rot3& b);
std::array<double, 3> operator*(const Rot3& r, const std::array<double, 3>& v);

/// The diagonal tensor diag(e) of the crystal frame in scene axes, R diag(e) R^T. Returns
/// false (and leaves `out` alone) when the result is not diagonal to 1e-9 of its largest
/// element: only diagonal permittivities are supported by a constant medium.
bool rotate_diagonal(const Rot3& r, const std::array<double, 3>& e, std::array<double, 3>& out);

}  // namespace ty
