/// \file crystal_table.h
/// \brief The crystal library: published (or recalled, and then said so) parameters of
/// magnetically ordered crystals, each value with its source and the temperature it holds
/// at, in the crystal's own frame (a, b, c; orthonormalised: x along a, z along c, y = z x x).
///
/// The table is data only; it sits in io/scene because the scene reader fills a medium
/// from it (`crystal: NAME`, with its file:line:col errors) and io/scene is the lowest
/// layer. The temperature laws that act on these values are in materials/crystals/.
#pragma once
#include <array>
#include <string_view>
#include <vector>

#include "io/scene/permittivity_model.h"

namespace ty {

/// A value and where it comes from: "Author, Journal vol, page (year), at 4.2 K", or
/// "from memory" where the value was recalled rather than read, or "derived: ...".
struct Cited {
  double value = 0;
  std::string_view source;
};

/// One Lorentz oscillator of the permittivity along one crystal axis (a phonon), in the
/// permittivity model's own terms (io/scene/permittivity_model.h): eps(f) = eps_inf +
/// delta_eps f_to^2 / (f_to^2 - f^2 - i f damping). Recorded as data; a medium naming the
/// crystal takes the constant `permittivity` unless the scene gives a `permittivity` map.
struct CrystalPhonon {
  int axis = 0;  ///< 0 = a, 1 = b, 2 = c
  LorentzTerm term;
};

struct CrystalAxisTerm {
  std::array<double, 3> axis{0, 0, 1};  ///< crystal frame
  Cited field;                          ///< mu0*H_A, T; > 0 easy, < 0 hard
};

/// One point of a line's width against temperature: the zero-field resonance's full width at
/// half maximum (a published table, read off or recalled as its source says).
struct LinewidthPoint {
  double temperature = 0;  ///< K
  double fwhm = 0;         ///< Hz
};

struct Crystal {
  std::string_view name;
  std::string_view kind;  ///< what the model takes it as
  int sublattices = 2;
  Cited saturation;  ///< mu0*Ms per sublattice, T
  Cited g;
  Cited exchange;  ///< mu0*H_E = lambda*mu0*Ms, T (two sublattices)
  std::vector<CrystalAxisTerm> anisotropy;
  std::array<double, 3> dm_axis{0, 0, 1};
  Cited dzyaloshinskii;                  ///< mu0*H_D along dm_axis, T
  std::array<double, 3> order{0, 0, 1};  ///< sublattice 1's side, crystal frame
  Cited damping;                         ///< Gilbert alpha (0 with no source: none published here)
  /// the zero-field line's width against temperature (empty: none): with `temperature` and
  /// no damping given, it sets the damping (materials/crystals/temperature.h)
  std::vector<LinewidthPoint> linewidth;
  std::string_view linewidth_source;
  Cited spin;                            ///< S of the Brillouin law
  Cited ordering;                        ///< Neel or Curie temperature, K
  double reference = 0;                  ///< K, where the magnetic values hold
  Cited anisotropy_power;                ///< Callen-Callen exponent of the anisotropy energy
  double lowest = 0;                     ///< K: below it the model does not hold (e.g. a Morin transition)
  std::string_view lowest_why;
  std::array<Cited, 3> permittivity;  ///< constant, along a, b, c (below the phonons)
  std::vector<CrystalPhonon> phonons;
  std::string_view phonon_source;
  std::vector<Cited> resonances;  ///< measured zero-field resonances at `reference`, Hz
  std::string_view note;
};

/// Every crystal the library knows, in a fixed order.
const std::vector<Crystal>& crystal_table();
/// The entry named `name` (case-insensitive), or nullptr.
const Crystal* find_crystal(std::string_view name);

}  // namespace ty
