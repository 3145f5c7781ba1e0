/// \file test_crystals_command.cpp
/// \brief `terayee crystals`: the list names every entry, one entry prints each value with
/// its source and the model's line beside the published one, and NiO says its phonon feeds its
/// permittivity; an unknown name exits 2.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "tests/helpers.h"

TEST_CASE("terayee crystals: the list, one crystal's values with sources, and an unknown name") {
  const std::string bin = TERAYEE_BINARY;
  const std::string out = (std::filesystem::temp_directory_path() / "terayee-crystals.txt").string();
  auto text = [&] {
    std::ifstream in(out);
    std::stringstream ss;
    ss << in.rdbuf();
    return ss.str();
  };
  // shell() sends the command's own output to /dev/null: a subshell keeps the redirection
  REQUIRE(ty::test::shell("(" + bin + " crystals > '" + out + "')") == 0);
  for (auto name : {"MnF2", "FeF2", "NiO", "Fe2O3", "YFeO3", "Cr2O3", "YIG", "BaFe12O19"})
    CHECK_MESSAGE(text().find(name) != std::string::npos, name);
  REQUIRE(ty::test::shell("(" + bin + " crystals mnf2 --temperature '40 K' > '" + out + "')") == 0);
  const std::string t = text();
  CHECK(t.find("mu0*H_E                55 T  [from memory") != std::string::npos);
  CHECK(t.find("Johnson & Nethercot") != std::string::npos);
  CHECK(t.find("resonances of the model at 40 K: 216.4 GHz") != std::string::npos);  // as test_temperature.cpp
  // NiO's phonon is fed into its permittivity: the background is its static 12.0 less the
  // phonon's strength 6.3 (the entry's phonon source: eps_inf 5.7)
  REQUIRE(ty::test::shell("(" + bin + " crystals NiO > '" + out + "')") == 0);
  CHECK(text().find("a medium naming NiO takes them: a dispersive permittivity, background a 5.7, b 5.7, c 5.7") !=
        std::string::npos);
  CHECK(ty::test::shell(bin + " crystals MnF3") == 2);
  CHECK(ty::test::shell(bin + " crystals MnF2 --temperature '70 K'") == 2);
}
