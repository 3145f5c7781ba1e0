/// \file constants.h
/// \brief Physical constants, SI: the one place they are defined (CODATA 2018 values;
/// the exact ones since the 2019 redefinition of the SI).
#pragma once

namespace ty::constants {
inline constexpr double pi = 3.14159265358979323846;
inline constexpr double c0 = 299792458.0;          ///< speed of light, m/s (exact)
inline constexpr double mu0 = 1.25663706212e-6;    ///< vacuum permeability, H/m
inline constexpr double eps0 = 8.8541878128e-12;   ///< vacuum permittivity, F/m
inline constexpr double eta0 = 376.730313668;      ///< vacuum impedance, ohm
inline constexpr double h = 6.62607015e-34;        ///< Planck constant, J s (exact)
inline constexpr double hbar = 1.054571817e-34;    ///< reduced Planck constant, J s (exact)
inline constexpr double e = 1.602176634e-19;       ///< elementary charge, C (exact)
inline constexpr double mu_B = 9.2740100783e-24;   ///< Bohr magneton, J/T
inline constexpr double k_B = 1.380649e-23;        ///< Boltzmann constant, J/K (exact)
}  // namespace ty::constants
