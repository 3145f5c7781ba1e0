/// \file test_permittivity.cpp
/// \brief eps(omega) of oscillators, Drude terms and rotated axes against the textbook
/// relations: Lyddane-Sachs-Teller, the Drude plasma edge, a rotated tensor's principal axes,
/// and the extraordinary ray's index and walk-off in a uniaxial crystal cut with its axis in
/// the plane (Born & Wolf, Principles of Optics, 7th ed., sec. 15.3; Yariv & Yeh, Optical
/// Waves in Crystals, ch. 4).
#include <doctest/doctest.h>

#include <Eigen/Eigenvalues>
#include <cmath>

#include "io/scene/constants.h"
#include "materials/layered/refraction.h"
#include "materials/layered/transfer_matrix.h"
#include "materials/permittivity/permittivity.h"

using namespace ty;
using constants::pi;
using cd = std::complex<double>;

TEST_CASE("Permittivity: Lyddane-Sachs-Teller and the Drude plasma edge") {
  // GaAs, from memory (Blakemore, J. Appl. Phys. 53, R123 (1982)): eps_inf 10.89,
  // TO 8.02 THz, LO 8.75 THz
  PermittivityModel gaas;
  gaas.eps_inf = 10.89;
  gaas.lorentz = {{8.02e12, strength_from_lo(10.89, 8.02e12, 8.75e12), 0}};
  // LST (Lyddane, Sachs & Teller, Phys. Rev. 59, 673 (1941)): eps(0)/eps_inf = (w_LO/w_TO)^2,
  // and eps(w_LO) = 0 for the undamped oscillator
  CHECK(axis_permittivity(gaas, 1e6).real() == doctest::Approx(10.89 * std::pow(8.75 / 8.02, 2)).epsilon(1e-9));
  CHECK(std::abs(axis_permittivity(gaas, 2 * pi * 8.75e12)) < 1e-9);
  CHECK(lo_frequency(gaas, gaas.lorentz[0]) == doctest::Approx(8.75e12).epsilon(1e-12));
  // reststrahlen: eps < 0 strictly between TO and LO, > 0 outside
  CHECK(axis_permittivity(gaas, 2 * pi * 8.4e12).real() < 0);
  CHECK(axis_permittivity(gaas, 2 * pi * 7.9e12).real() > 0);
  CHECK(axis_permittivity(gaas, 2 * pi * 8.8e12).real() > 0);
  // damping makes Im eps > 0 (absorption, fields exp(-i w t))
  gaas.lorentz[0].damping = 0.08e12;
  CHECK(axis_permittivity(gaas, 2 * pi * 8.02e12).imag() > 0);

  // Drude (Ashcroft & Mermin ch. 1): eps = eps_inf - wp^2/w^2 without collisions, zero at
  // the screened plasma frequency wp/sqrt(eps_inf)
  PermittivityModel doped;
  doped.eps_inf = 12.9;
  doped.drude = {{5e12, 0}};
  CHECK(std::abs(axis_permittivity(doped, 2 * pi * 5e12 / std::sqrt(12.9))) < 1e-9);
  doped.drude[0].collision = 0.5e12;  // Im eps = wp^2 C / (w (w^2 + C^2))
  const double w = 2 * pi * 2e12, wp = 2 * pi * 5e12, C = 2 * pi * 0.5e12;
  CHECK(axis_permittivity(doped, w).imag() == doctest::Approx(wp * wp * C / (w * (w * w + C * C))).epsilon(1e-12));
}

TEST_CASE("Permittivity: a rotated tensor has its principal axes where they were put") {
  PermittivityTensor t;
  t.axis[0].eps_inf = 6.0;
  t.axis[1].eps_inf = 2.5;
  t.axis[2].eps_inf = 4.0;
  t.rotate = 35 * pi / 180;
  const Mat3c e = tensor_permittivity(t, 1e12);
  CHECK(std::abs(e(0, 1) - e(1, 0)) < 1e-15);  // symmetric (Born & Wolf sec. 15.1: no optical activity)
  Eigen::SelfAdjointEigenSolver<Eigen::Matrix2d> es(e.block<2, 2>(0, 0).real());
  CHECK(es.eigenvalues()[0] == doctest::Approx(2.5));
  CHECK(es.eigenvalues()[1] == doctest::Approx(6.0));
  const Eigen::Vector2d u = es.eigenvectors().col(1);
  CHECK(std::abs(std::atan(u[1] / u[0]) - t.rotate) < 1e-12);
  CHECK(e(2, 2).real() == 4.0);
}

TEST_CASE("Permittivity: extraordinary ray of a uniaxial crystal, index and walk-off") {
  // Calcite-like indices (n_o 1.658, n_e 1.486 at 590 nm, Born & Wolf table 15.1, from
  // memory); the optic axis u in the plane at 40 deg from x; the Hz wave's E lies in the
  // plane, so it is the extraordinary wave. Born & Wolf sec. 15.3 / Yariv & Yeh ch. 4:
  //   1/n(theta)^2 = cos^2(theta)/n_o^2 + sin^2(theta)/n_e^2  (theta: k from the optic axis)
  //   tan(theta_S) = (n_o/n_e)^2 tan(theta)  (theta_S: the ray S from the optic axis), so the
  //   walk-off rho = theta_S - theta has tan(rho) = (n(theta)^2/2) sin(2 theta) (1/n_e^2 - 1/n_o^2)
  const double no = 1.658, ne = 1.486;
  PermittivityTensor t;
  t.axis[0].eps_inf = ne * ne;
  t.axis[1].eps_inf = t.axis[2].eps_inf = no * no;
  t.rotate = 40 * pi / 180;
  const Mat3c eps = tensor_permittivity(t, 2 * pi * 5e14);
  for (double incidence : {0.0, 20.0, 45.0, 70.0}) {
    const double kt = std::sin(incidence * pi / 180);  // from vacuum, interface normal y
    const Refraction r = hz_refraction(eps, 1.0, 1, kt);
    REQUIRE(r.propagates);
    CHECK(std::abs(r.kn.imag()) < 1e-12);
    // k in scene axes: t = -x, n = +y (refraction.h)
    const double kx = -kt, ky = r.kn.real();
    const double k_angle = std::atan2(ky, kx), theta = k_angle - t.rotate;
    const double n_theta = 1 / std::sqrt(std::pow(std::cos(theta) / no, 2) + std::pow(std::sin(theta) / ne, 2));
    CHECK(std::hypot(kx, ky) == doctest::Approx(n_theta).epsilon(1e-12));
    const double rho = std::atan(0.5 * n_theta * n_theta * std::sin(2 * theta) * (1 / (ne * ne) - 1 / (no * no)));
    // S (sx, sy) from s_t along -x and s_n along y
    const double s_angle = std::atan2(r.s_n, -r.s_t);
    // n_e < n_o: the ray turns away from the optic axis, theta + rho farther from it
    CHECK(s_angle - k_angle == doctest::Approx(rho).epsilon(1e-9));
    MESSAGE("incidence " << incidence << " deg: theta " << theta * 180 / pi << " deg, walk-off " << rho * 180 / pi
                         << " deg");
  }
}

TEST_CASE("Permittivity: the transfer matrix reflects the rotated, dispersive Hz wave as Fresnel with n(theta)") {
  // Normal incidence along y on a half-space whose optic axis u (with a phonon) lies in the
  // plane at 25 deg from x. The Hz wave's E is in the plane: the extraordinary wave, with
  // n^2 = eps_u eps_v / eps_yy (Born & Wolf sec. 15.3, index ellipsoid for k along y; D_y = 0),
  // reflected as r = (1 - n)/(1 + n) in |r| (Born & Wolf sec. 1.5.2). The Ez wave sees eps_zz.
  PermittivityTensor t;
  t.axis[0].eps_inf = 6.0;
  t.axis[0].lorentz = {{5e12, 3.0, 0.2e12}};  // invented
  t.axis[1].eps_inf = t.axis[2].eps_inf = 3.0;
  t.rotate = 25 * pi / 180;
  for (double f : {2e12, 4.8e12, 5.5e12, 8e12}) {
    const double w = 2 * pi * f;
    LayerStack st;
    st.normal = 1;
    st.eps_out = tensor_permittivity(t, w);
    const StackResponse r = stack_response(st, w, 0.0);
    const cd eu = axis_permittivity(t.axis[0], w), ev = axis_permittivity(t.axis[1], w);
    const cd n_e = std::sqrt(eu * ev / st.eps_out(1, 1)), n_z = std::sqrt(ev);
    CHECK(std::abs(r.r[1][1]) == doctest::Approx(std::abs((1.0 - n_e) / (1.0 + n_e))).epsilon(1e-9));
    CHECK(std::abs(r.r[0][0]) == doctest::Approx(std::abs((1.0 - n_z) / (1.0 + n_z))).epsilon(1e-9));
    CHECK(std::abs(r.r[0][1]) < 1e-12);  // no Ez-Hz coupling: eps_xz = eps_yz = 0
  }
}
