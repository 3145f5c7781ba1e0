/// \file units.h
/// \brief Physical constants and the parser for quantities written "<number> <unit>".
///
/// Every dimensional value in a scene carries its unit; a bare number is accepted only
/// for dimensionless kinds and for an exact 0. Values are returned in SI (magnetic
/// fields as mu0*H in tesla). Two units depend on the scene and are returned
/// unresolved: `cells` (multiples of the grid cell) and `periods` (of a source).
#pragma once
#include <optional>
#include <string>
#include <string_view>

namespace ty {

namespace constants {
inline constexpr double c0 = 299792458.0;              ///< speed of light, m/s (exact)
inline constexpr double mu0 = 1.25663706212e-6;        ///< vacuum permeability, H/m (CODATA 2018)
inline constexpr double eps0 = 8.8541878128e-12;       ///< vacuum permittivity, F/m (CODATA 2018)
inline constexpr double eta0 = 376.730313668;          ///< vacuum impedance, ohm (CODATA 2018)
inline constexpr double h = 6.62607015e-34;            ///< Planck constant, J s (exact)
inline constexpr double e = 1.602176634e-19;           ///< elementary charge, C (exact)
inline constexpr double pi = 3.14159265358979323846;
}  // namespace constants

enum class Kind {
  dimensionless,
  length,
  time,
  frequency,
  magnetic_field,
  angle,
  electric_field,
  current,           ///< electric line current, A
  voltage,           ///< magnetic line current, V
  temperature,
  conductivity,
};

std::string_view kind_name(Kind k);   ///< "length", "time", ...
std::string_view kind_units(Kind k);  ///< the units accepted, for messages

/// A parsed value in SI, or in a scene-dependent unit still to be resolved.
struct Quantity {
  double value = 0;
  enum class Relative { none, cells, periods } relative = Relative::none;
};

/// Parses `text` as a quantity of kind `k`. On failure returns nullopt and puts a
/// human-readable reason in `why` (what was given and which units were expected).
std::optional<Quantity> parse_quantity(std::string_view text, Kind k, std::string& why);

/// Formats an SI value with its SI unit, the way the resolved scene writes it.
std::string format_si(double value, Kind k);

}  // namespace ty
