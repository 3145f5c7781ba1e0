/// \file test_check_domains.cpp
/// \brief `terayee check` lists the state each body of a magnetic medium starts from: on the
/// bundled scenarios/yfeo3-domains.yaml the reversed body's sublattices and net moment are
/// those of the medium's state turned over (time reversal: m_s -> -m_s, so the weak moment
/// D x L changes sign; Gurevich & Melkov, Magnetization Oscillations and Waves, ch. 1).
#include <doctest/doctest.h>

#include <regex>
#include <string>
#include <vector>

#include "tests/tools/capture.h"

namespace {
std::string check_output(const std::string& scene) {
  const std::string out = ty::test::capture(std::string(TERAYEE_BINARY) + " check '" + TERAYEE_SOURCE_DIR + "/" + scene +
                                            "' 2>&1; echo \"exit status $?\"");
  REQUIRE(out.ends_with("exit status 0\n"));
  return out;
}
}  // namespace

TEST_CASE("terayee check: each body's state, a reversed domain with the opposite net moment") {
  const std::string out = check_output("scenarios/yfeo3-domains.yaml");
  INFO(out);
  CHECK(out.find("body 1 (line 27): the medium's state") != std::string::npos);
  CHECK(out.find("body 2 (line 28): its own state") != std::string::npos);
  CHECK(out.find("reversed by 'order: reversed'") != std::string::npos);
  // the net moments printed: the medium's first, then body 2's
  const std::regex net(R"(net moment mu0\*M = \(([-0-9.e]+), ([-0-9.e]+), ([-0-9.e]+)\) T)");
  std::vector<double> z;
  for (auto it = std::sregex_iterator(out.begin(), out.end(), net); it != std::sregex_iterator(); ++it)
    z.push_back(std::stod((*it)[3]));
  REQUIRE(z.size() == 2);
  CHECK(z[0] > 1e-3);  // YFeO3's weak moment along c (about 0.01 T in the library's values)
  CHECK(z[1] == doctest::Approx(-z[0]).epsilon(1e-6));
}
