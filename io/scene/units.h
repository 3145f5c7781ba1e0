/// \file units.h
/// \brief The parser for quantities written "<number> <unit>".
///
/// Every dimensional value in a scene carries its unit; a bare number is accepted only
/// for dimensionless kinds and for an exact 0. Values are returned in SI (magnetic
/// fields as mu0*H in tesla). Two units depend on the scene and are returned
/// unresolved: `cells` (multiples of the grid cell) and `periods` (of a source).
#pragma once
#include <optional>
#include <string>
#include <string_view>

#include "io/scene/constants.h"

namespace ty {


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
