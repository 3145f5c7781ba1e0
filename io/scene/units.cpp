/// \file units.cpp
/// \brief The unit table of the scene format and the strict quantity parser.
#include "io/scene/units.h"

#include <fmt/format.h>

#include <array>
#include <charconv>
#include <cmath>

namespace ty {
namespace {

struct UnitDef {
  std::string_view name;
  Kind kind;
  double to_si;  ///< SI value of one unit
};

using namespace constants;

// Conversion factors. Wavenumber: f = c * nu~ with nu~ in 1/cm. Energy: f = E/h.
// Magnetic fields are quoted as mu0*H in tesla: 1 Oe <-> 1e-4 T, 1 G <-> 1e-4 T,
// 1 A/m <-> mu0 T.
const std::array<UnitDef, 43> kUnits = {{
    {"m", Kind::length, 1.0},
    {"cm", Kind::length, 1e-2},
    {"mm", Kind::length, 1e-3},
    {"um", Kind::length, 1e-6},
    {"\xC2\xB5m", Kind::length, 1e-6},  // µm (micro sign)
    {"\xCE\xBCm", Kind::length, 1e-6},  // μm (Greek mu)
    {"nm", Kind::length, 1e-9},
    {"s", Kind::time, 1.0},
    {"ms", Kind::time, 1e-3},
    {"us", Kind::time, 1e-6},
    {"\xC2\xB5s", Kind::time, 1e-6},  // µs (micro sign)
    {"\xCE\xBCs", Kind::time, 1e-6},  // μs (Greek mu)
    {"ns", Kind::time, 1e-9},
    {"ps", Kind::time, 1e-12},
    {"fs", Kind::time, 1e-15},
    {"Hz", Kind::frequency, 1.0},
    {"kHz", Kind::frequency, 1e3},
    {"MHz", Kind::frequency, 1e6},
    {"GHz", Kind::frequency, 1e9},
    {"THz", Kind::frequency, 1e12},
    {"cm^-1", Kind::frequency, c0 * 100.0},
    {"meV", Kind::frequency, 1e-3 * e / h},
    {"T", Kind::magnetic_field, 1.0},
    {"mT", Kind::magnetic_field, 1e-3},
    {"Oe", Kind::magnetic_field, 1e-4},
    {"kOe", Kind::magnetic_field, 1e-1},
    {"G", Kind::magnetic_field, 1e-4},
    {"kG", Kind::magnetic_field, 1e-1},
    {"A/m", Kind::magnetic_field, mu0},
    {"deg", Kind::angle, pi / 180.0},
    {"rad", Kind::angle, 1.0},
    {"V/m", Kind::electric_field, 1.0},
    {"kV/m", Kind::electric_field, 1e3},
    {"V/cm", Kind::electric_field, 1e2},
    {"kV/cm", Kind::electric_field, 1e5},
    {"A", Kind::current, 1.0},
    {"mA", Kind::current, 1e-3},
    {"uA", Kind::current, 1e-6},
    {"V", Kind::voltage, 1.0},
    {"mV", Kind::voltage, 1e-3},
    {"kV", Kind::voltage, 1e3},
    {"K", Kind::temperature, 1.0},
    {"S/m", Kind::conductivity, 1.0},
}};

std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
  return s;
}

}  // namespace

std::string_view kind_name(Kind k) {
  switch (k) {
    case Kind::dimensionless: return "dimensionless number";
    case Kind::length: return "length";
    case Kind::time: return "time";
    case Kind::frequency: return "frequency";
    case Kind::magnetic_field: return "magnetic field";
    case Kind::angle: return "angle";
    case Kind::electric_field: return "electric field";
    case Kind::current: return "electric line current";
    case Kind::voltage: return "magnetic line current";
    case Kind::temperature: return "temperature";
    case Kind::conductivity: return "conductivity";
  }
  return "?";
}

std::string_view kind_units(Kind k) {
  switch (k) {
    case Kind::dimensionless: return "a bare number";
    case Kind::length: return "m, cm, mm, um (µm), nm or cells";
    case Kind::time: return "s, ms, us, ns, ps, fs or periods";
    case Kind::frequency: return "Hz, kHz, MHz, GHz, THz, cm^-1 or meV";
    case Kind::magnetic_field: return "T, mT, Oe, kOe, G, kG or A/m";
    case Kind::angle: return "deg or rad";
    case Kind::electric_field: return "V/m, kV/m, V/cm or kV/cm";
    case Kind::current: return "A, mA or uA";
    case Kind::voltage: return "V, mV or kV";
    case Kind::temperature: return "K";
    case Kind::conductivity: return "S/m";
  }
  return "?";
}

std::optional<Quantity> parse_quantity(std::string_view text, Kind k, std::string& why) {
  const std::string_view s = trim(text);
  double number = 0;
  const char* first = s.data();
  const char* last = s.data() + s.size();
  if (!s.empty() && *first == '+') ++first;  // from_chars does not take a leading '+'
  auto [ptr, ec] = std::from_chars(first, last, number);
  if (ec != std::errc() || ptr == first) {
    why = fmt::format("'{}' is not a number followed by a unit ({} expected: {})", s, kind_name(k), kind_units(k));
    return std::nullopt;
  }
  if (!std::isfinite(number)) {
    why = fmt::format("'{}' is not a finite number", s);
    return std::nullopt;
  }
  const std::string_view unit = trim(std::string_view(ptr, static_cast<size_t>(last - ptr)));
  if (unit.empty()) {
    if (k == Kind::dimensionless || number == 0.0) return Quantity{number};
    why = fmt::format("'{}' has no unit; a {} needs one of {}", s, kind_name(k), kind_units(k));
    return std::nullopt;
  }
  if (k == Kind::dimensionless) {
    why = fmt::format("'{}' should be a bare number (it is dimensionless), not carry the unit '{}'", s, unit);
    return std::nullopt;
  }
  if (k == Kind::length && unit == "cells") return Quantity{number, Quantity::Relative::cells};
  if (k == Kind::time && unit == "periods") return Quantity{number, Quantity::Relative::periods};
  for (const auto& u : kUnits) {
    if (u.name != unit) continue;
    if (u.kind != k) {
      auto article = [](std::string_view w) { return std::string_view("aeiou").find(w[0]) != std::string_view::npos ? "an" : "a"; };
      why = fmt::format("'{}' is {} {}, but {} {} is expected here ({})", s, article(kind_name(u.kind)),
                        kind_name(u.kind), article(kind_name(k)), kind_name(k), kind_units(k));
      return std::nullopt;
    }
    return Quantity{number * u.to_si};
  }
  why = fmt::format("unknown unit '{}' in '{}' ({} expected: {})", unit, s, kind_name(k), kind_units(k));
  return std::nullopt;
}

std::string format_si(double value, Kind k) {
  const char* unit = "";
  switch (k) {
    case Kind::dimensionless: return fmt::format("{}", value);
    case Kind::length: unit = "m"; break;
    case Kind::time: unit = "s"; break;
    case Kind::frequency: unit = "Hz"; break;
    case Kind::magnetic_field: unit = "T"; break;
    case Kind::angle: unit = "rad"; break;
    case Kind::electric_field: unit = "V/m"; break;
    case Kind::current: unit = "A"; break;
    case Kind::voltage: unit = "V"; break;
    case Kind::temperature: unit = "K"; break;
    case Kind::conductivity: unit = "S/m"; break;
  }
  if (value == 0.0) return "0";
  return fmt::format("{:.17g} {}", value, unit);
}

}  // namespace ty
