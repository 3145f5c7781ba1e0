/// \file check_waves.h
/// \brief The resolution and wave reports of `terayee check`: cells per wavelength per axis
/// with each medium's own index over the sources' band (a magnetic medium's n(omega) from
/// its waves, materials/layered/wave_character.h), the waves of a magnetic medium for each
/// interface normal (Ez and Hz waves, or the coupled waves of a bias with an in-plane
/// part), their negative bands followed to where they end, and the warnings: too few cells
/// per wavelength, an evanescent decay length under kDecayCells cells, a run too short to
/// resolve a negative band.
#pragma once
#include <array>
#include <string>

#include "io/scene/scene.h"
#include "materials/magnetic/linear_response.h"

namespace ty {

/// Fewest cells per wavelength a dielectric needs (test_dispersion: -1.27% phase error at 10).
inline constexpr double kCellsPerWavelength = 10;
/// Fewest cells per wavelength, counted with the crystal's own n(omega), in a magnetic medium.
/// Measured (tests/data/hexaferrite-halfspace.yaml: BaFe12O19 half-space, 0.3 T along c, normal
/// incidence, 58-61.5 GHz below the pole of mu_V at 62.22 GHz, R against the Polder closed form
/// of `terayee medium`): 18 cells per wavelength in the crystal R off by 0.39, 22: 0.028,
/// 26: 0.013, 29: 0.007, 35 and more: within 0.005 (the measurement's own scatter). The
/// issue's antiferromagnet agrees (15: R 0.21 instead of 0.013; 30: within 0.03), where a
/// dielectric at 15 is within 1%.
inline constexpr double kMagneticCellsPerWavelength = 30;
/// Fewest cells across the 1/e length of an evanescent field (negative bands, total reflection).
inline constexpr double kDecayCells = 4;

/// Axes (0: x, 1: y) along which no field can vary: a periodic side, bodies uniform along it
/// and only plane waves travelling across it. Their cell size does not count.
std::array<bool, 2> uniform_axes(const Scene& s);

/// One source's band: cells per wavelength of vacuum and every medium along each counted axis;
/// returns the number of warnings.
int report_source_resolution(const Scene& s, const Source& src, const std::array<bool, 2>& uniform);

/// Total internal reflection: a beam or plane wave launched in a denser non-magnetic medium at an
/// angle, meeting a medium of lower index across a face normal to x or y, leaves an evanescent
/// field of 1/e length lambda0 / (2 pi sqrt(n1^2 sin^2 theta - n2^2)) (Born & Wolf, Principles
/// of Optics, sec. 1.5.4) at the source's highest frequency; a warning where it is under
/// kDecayCells cells. Returns the number of warnings.
int report_total_reflection(const Scene& s, const Source& src, const std::array<bool, 2>& uniform);

/// The waves of one magnetic medium (state st) for each interface normal over [lo, hi] (the
/// scan), negative bands followed past it; warnings on decay lengths and on the run's frequency
/// resolution against the bands within [f_lo, f_hi] (the sources' band). Returns the warnings.
int report_magnet_waves(const Scene& s, const Medium& med, const MagnetModel& M, const MagneticState& st, double lo,
                        double hi, double f_lo, double f_hi, const std::array<bool, 2>& uniform);

}  // namespace ty
