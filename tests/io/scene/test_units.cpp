/// \file test_units.cpp
/// \brief The unit table of scene-format.md. Conversion factors: SI definitions (BIPM,
/// The International System of Units, 9th ed., 2019); 1 Oe <-> 1e-4 T of mu0*H and
/// 1 G = 1e-4 T (CGS-SI correspondence, common practice); wavenumber f = c * nu~, energy
/// f = E/h with the exact 2019 values of c, h and e.
#include <doctest/doctest.h>

#include "io/scene/units.h"

using namespace ty;

namespace {

double si(const char* text, Kind k) {
  std::string why;
  auto q = parse_quantity(text, k, why);
  INFO(text << ": " << why);
  REQUIRE(q.has_value());
  return q->value;
}

std::string error_of(const char* text, Kind k) {
  std::string why;
  auto q = parse_quantity(text, k, why);
  CHECK_FALSE(q.has_value());
  return why;
}

}  // namespace

TEST_CASE("every unit of the table parses to SI") {
  struct Row {
    const char* text;
    Kind kind;
    double value;
  };
  const double c = 299792458.0, h = 6.62607015e-34, e = 1.602176634e-19, mu0 = 1.25663706212e-6;
  const Row rows[] = {
      {"2 m", Kind::length, 2},
      {"3 mm", Kind::length, 3e-3},
      {"20 um", Kind::length, 20e-6},
      {"20 \xC2\xB5m", Kind::length, 20e-6},
      {"20 \xCE\xBCm", Kind::length, 20e-6},
      {"500 nm", Kind::length, 500e-9},
      {"1.5 cm", Kind::length, 1.5e-2},
      {"1 s", Kind::time, 1},
      {"4 ns", Kind::time, 4e-9},
      {"2 ms", Kind::time, 2e-3},
      {"7 us", Kind::time, 7e-6},
      {"7 \xC2\xB5s", Kind::time, 7e-6},
      {"400 ps", Kind::time, 400e-12},
      {"30 fs", Kind::time, 30e-15},
      {"7 Hz", Kind::frequency, 7},
      {"2.5 GHz", Kind::frequency, 2.5e9},
      {"0.25 THz", Kind::frequency, 0.25e12},
      {"8.7 cm^-1", Kind::frequency, 8.7 * 100 * c},
      {"1 meV", Kind::frequency, 1e-3 * e / h},
      {"0.3 T", Kind::magnetic_field, 0.3},
      {"250 mT", Kind::magnetic_field, 0.25},
      {"1000 Oe", Kind::magnetic_field, 0.1},
      {"2 kOe", Kind::magnetic_field, 0.2},
      {"500 G", Kind::magnetic_field, 0.05},
      {"3 kG", Kind::magnetic_field, 0.3},
      {"1e5 A/m", Kind::magnetic_field, 1e5 * mu0},
      {"90 deg", Kind::angle, 3.14159265358979323846 / 2},
      {"0.5 rad", Kind::angle, 0.5},
      {"1 V/m", Kind::electric_field, 1},
      {"1 kV/m", Kind::electric_field, 1e3},
      {"1 kV/cm", Kind::electric_field, 1e5},
      {"2 A", Kind::current, 2},
      {"1 mA", Kind::current, 1e-3},
      {"3 V", Kind::voltage, 3},
      {"4 K", Kind::temperature, 4},
      {"5.8e7 S/m", Kind::conductivity, 5.8e7},
      {"5.5", Kind::dimensionless, 5.5},
      {"2e-4", Kind::dimensionless, 2e-4},
      {"0", Kind::length, 0},
      {"0", Kind::frequency, 0},
      {"-1.5 mm", Kind::length, -1.5e-3},
      {"+2 mm", Kind::length, 2e-3},
  };
  for (const auto& r : rows) {
    INFO(r.text);
    CHECK(si(r.text, r.kind) == doctest::Approx(r.value).epsilon(1e-14));
  }
  // worked values: 1 meV is 241.799 GHz; 8.7 cm^-1 is 260.8 GHz (references.md, MnF2)
  CHECK(si("1 meV", Kind::frequency) == doctest::Approx(241.7989e9).epsilon(1e-6));
  CHECK(si("8.7 cm^-1", Kind::frequency) == doctest::Approx(260.82e9).epsilon(1e-4));
}

TEST_CASE("relative units are returned unresolved") {
  std::string why;
  auto c = parse_quantity("3 cells", Kind::length, why);
  REQUIRE(c);
  CHECK(c->relative == Quantity::Relative::cells);
  CHECK(c->value == 3);
  auto p = parse_quantity("300 periods", Kind::time, why);
  REQUIRE(p);
  CHECK(p->relative == Quantity::Relative::periods);
  CHECK_FALSE(parse_quantity("3 cells", Kind::time, why));
  CHECK_FALSE(parse_quantity("3 periods", Kind::length, why));
}

TEST_CASE("garbage, missing and wrong-kind units are rejected with a reason") {
  CHECK(error_of("0.25", Kind::frequency).find("has no unit") != std::string::npos);
  CHECK(error_of("0.25", Kind::frequency).find("THz") != std::string::npos);
  CHECK(error_of("1 mm", Kind::frequency).find("is a length, but a frequency is expected") != std::string::npos);
  CHECK(error_of("1 furlong", Kind::length).find("unknown unit 'furlong'") != std::string::npos);
  CHECK(error_of("fast", Kind::time).find("not a number") != std::string::npos);
  CHECK(error_of("", Kind::time).find("not a number") != std::string::npos);
  CHECK(error_of("5 mm", Kind::dimensionless).find("bare number") != std::string::npos);
  CHECK(error_of("1 T", Kind::electric_field).find("magnetic field") != std::string::npos);
  CHECK(error_of("inf mm", Kind::length).size() > 0);
  CHECK(error_of("1 THz THz", Kind::frequency).find("unknown unit") != std::string::npos);
  CHECK(error_of("1 thz", Kind::frequency).find("unknown unit 'thz'") != std::string::npos);
}
