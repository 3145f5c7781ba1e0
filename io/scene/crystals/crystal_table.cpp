/// \file crystal_table.cpp
/// \brief The values of the crystal library (see crystal_table.h). "from memory" marks a
/// value recalled, not read from the source at the time of writing: check it against the
/// source before relying on it. Every magnetic value holds at the entry's `reference`.
#include "io/scene/crystals/crystal_table.h"

#include <algorithm>
#include <cctype>
#include <string>

// Entries name only the members they set (C++20 designated initializers); the others keep
// their default member initializers, which -Wextra would otherwise report one by one.
#pragma GCC diagnostic ignored "-Wmissing-field-initializers"

namespace ty {
namespace {

constexpr double kWavenumber = 29.9792458e9;  // Hz per cm^-1
constexpr double kRoot3 = 1.7320508075688772, kRoot6 = 2.449489742783178;

/// MnF2 and FeF2: uniaxial two-sublattice antiferromagnets.
void add_uniaxial_antiferromagnets(std::vector<Crystal>& t) {
  t.push_back(Crystal{
      .name = "MnF2",
      .kind = "antiferromagnet, uniaxial (easy axis c), two sublattices",
      .saturation = {0.754, "from memory (2 Mn2+ of 5 muB in the 78.6 A^3 rutile cell gives 0.74 T)"},
      .g = {2.00, "from memory (Mn2+, an S-state ion)"},
      .exchange = {55.0, "from memory (52.6 T is also quoted); with the anisotropy it gives the measured 261 GHz"},
      .anisotropy = {{{0, 0, 1}, {0.787, "from memory"}}},
      .linewidth = {{4.2, 0.3e9}, {20, 0.5e9}, {30, 1.0e9}, {40, 2.5e9}, {50, 6e9}, {60, 15e9}},
      .linewidth_source = "from memory, rough (each width to a factor of about 2): the trend Johnson & Nethercot, "
                          "Phys. Rev. 114, 705 (1959) report, a narrow line at 4.2 K broadening steeply towards T_N",
      .spin = {2.5, "Mn2+, S = 5/2"},
      .ordering = {67.3, "from memory (Heller & Benedek, Phys. Rev. Lett. 8, 428 (1962): 67.3 K)"},
      .reference = 0,
      .anisotropy_power = {2,
                           "mostly dipolar anisotropy: energy ~ m^2, field ~ m (Keffer, Phys. Rev. 87, 608 "
                           "(1952), from memory)"},
      .permittivity = {{{5.5, "from memory (far infrared, below the phonons)"},
                        {5.5, "from memory"},
                        {5.5, "from memory"}}},
      .phonon_source = "not recorded (no source at hand)",
      .resonances = {{8.7 * kWavenumber,
                      "Johnson & Nethercot, Phys. Rev. 114, 705 (1959): 8.7 cm^-1 at 4.2 K, "
                      "from memory"}},
      .note = "spin-flop near 9.3 T along c at 4.2 K"});
  t.push_back(Crystal{
      .name = "FeF2",
      .kind = "antiferromagnet, uniaxial (easy axis c), two sublattices",
      .saturation = {0.704, "from memory"},
      .g = {2.25, "from memory"},
      .exchange = {53.3, "from memory"},
      .anisotropy = {{{0, 0, 1}, {19.7, "from memory"}}},
      .linewidth = {{4.2, 0.25 * kWavenumber},
                    {20, 0.3 * kWavenumber},
                    {40, 0.6 * kWavenumber},
                    {55, 1.5 * kWavenumber},
                    {65, 3.0 * kWavenumber},
                    {72, 6.0 * kWavenumber}},
      .linewidth_source = "from memory, rough (each width to a factor of about 2, in cm^-1 x 29.98 GHz): Ohlmann & "
                          "Tinkham, Phys. Rev. 123, 425 (1961), the far-infrared line's width against temperature",
      .spin = {2, "Fe2+, S = 2"},
      .ordering = {78.4, "from memory"},
      .reference = 0,
      .anisotropy_power = {3, "single-ion anisotropy: Callen & Callen, J. Phys. Chem. Solids 27, 1271 (1966), l = 2"},
      .permittivity = {{{5.5, "from memory"}, {5.5, "from memory"}, {5.5, "from memory"}}},
      .phonon_source = "not recorded (no source at hand)",
      .resonances = {{52.7 * kWavenumber,
                      "Ohlmann & Tinkham, Phys. Rev. 123, 425 (1961): 52.7 cm^-1 at 4.2 K, "
                      "from memory"}},
      .note = "the resonance lies near 1.58 THz; spin-flop above 40 T"});
}

/// NiO (easy plane and in-plane axis) and alpha-Fe2O3 (Dzyaloshinskii-Moriya).
void add_easy_plane_and_canted(std::vector<Crystal>& t) {
  t.push_back(Crystal{
      .name = "NiO",
      .kind = "antiferromagnet, biaxial (hard axis [111], easy axis [11-2] in the (111) plane; one T-domain), "
              "two sublattices",
      .saturation = {0.70, "derived: g S muB per Ni2+ (S = 1, g = 2.18), two per sublattice in the 4.177 A cubic cell"},
      .g = {2.18, "from memory"},
      .exchange = {968, "from memory"},
      .anisotropy = {{{1 / kRoot3, 1 / kRoot3, 1 / kRoot3}, {-0.635, "from memory"}},
                     {{1 / kRoot6, 1 / kRoot6, -2 / kRoot6}, {0.011, "from memory"}}},
      .order = {1 / kRoot6, 1 / kRoot6, -2 / kRoot6},
      .spin = {1, "Ni2+, S = 1"},
      .ordering = {523, "from memory"},
      .reference = 0,
      .anisotropy_power = {3, "Callen & Callen, J. Phys. Chem. Solids 27, 1271 (1966), l = 2"},
      .permittivity = {{{12.0, "from memory (static)"}, {12.0, "from memory"}, {12.0, "from memory"}}},
      .phonons = {{0, {11.9e12, 6.3, 0.6e12}}, {1, {11.9e12, 6.3, 0.6e12}}, {2, {11.9e12, 6.3, 0.6e12}}},
      .phonon_source = "from memory, rough: one TO phonon near 397 cm^-1, eps_inf 5.7, eps(0) 12.0; the damping is "
                       "invented (5% of f_TO)",
      .resonances = {{36 * kWavenumber,
                      "Sievers & Tinkham, Phys. Rev. 129, 1566 (1963): 36 cm^-1 at low "
                      "temperature, from memory"},
                     {0.14e12, "from memory"}},
      .note = "the cubic cell's rhombohedral distortion is left out; the other T-domains (other [111] axes) are other "
              "rotations"});
  t.push_back(Crystal{
      .name = "Fe2O3",
      .kind = "antiferromagnet with Dzyaloshinskii-Moriya canting (weak ferromagnet, alpha-Fe2O3 above the Morin "
              "transition), easy plane (hard axis c), two sublattices",
      .saturation = {1.15,
                     "derived: 5 muB per Fe3+ at 5.26 g/cm^3 gives 1.17 T at 0 K, times the mean-field 0.98 "
                     "at 300 K"},
      .g = {2.0, "from memory (Fe3+, an S-state ion)"},
      .exchange = {900, "from memory"},
      .anisotropy = {{{0, 0, 1}, {-0.0178, "fitted by us to the recalled out-of-plane mode (below)"}}},
      .dm_axis = {0, 0, 1},
      .dzyaloshinskii = {2.2, "from memory"},
      .order = {1, 0, 0},
      .spin = {2.5, "Fe3+, S = 5/2"},
      .ordering = {950, "from memory (948-960 K quoted)"},
      .reference = 300,
      .anisotropy_power = {3, "Callen & Callen, J. Phys. Chem. Solids 27, 1271 (1966), l = 2"},
      .lowest = 260,
      .lowest_why = "below the Morin transition (about 260 K, from memory) the spins turn to the c axis, which "
                    "this entry does not describe",
      .permittivity = {{{20, "from memory, uncertain"},
                        {20, "from memory, uncertain"},
                        {20, "from memory, uncertain"}}},
      .phonon_source = "not recorded (no source at hand)",
      .resonances = {{0.17e12, "from memory: the out-of-plane (quasi-antiferromagnetic) mode at room temperature"}},
      .note = "the in-plane anisotropy is left out, so the in-plane direction of the Neel vector is set by `order`"});
}

/// An orthoferrite (YFeO3) and Cr2O3.
void add_orthoferrite_and_chromia(std::vector<Crystal>& t) {
  t.push_back(Crystal{
      .name = "YFeO3",
      .kind = "orthoferrite: antiferromagnet with Dzyaloshinskii-Moriya canting (Neel vector along a, weak moment "
              "along c), two sublattices",
      .saturation = {0.48,
                     "derived: 5 muB per Fe3+, four in the 224 A^3 cell, 0.52 T at 0 K, times the mean-field "
                     "0.93 at 300 K"},
      .g = {2.0, "from memory"},
      .exchange = {640, "from memory"},
      .anisotropy = {{{1, 0, 0}, {0.1269, "fitted by us to the two recalled modes (below)"}},
                     {{0, 0, 1}, {0.0372, "fitted by us to the two recalled modes (below)"}}},
      .dm_axis = {0, 1, 0},
      .dzyaloshinskii = {14, "from memory"},
      .order = {1, 0, 0},
      .spin = {2.5, "Fe3+, S = 5/2"},
      .ordering = {645, "from memory"},
      .reference = 300,
      .anisotropy_power = {3, "Callen & Callen, J. Phys. Chem. Solids 27, 1271 (1966), l = 2"},
      .permittivity = {{{20, "from memory, uncertain"},
                        {20, "from memory, uncertain"},
                        {20, "from memory, uncertain"}}},
      .phonon_source = "not recorded (no source at hand)",
      .resonances = {{0.30e12, "from memory: quasi-ferromagnetic mode at room temperature"},
                     {0.53e12, "from memory: quasi-antiferromagnetic mode at room temperature"}},
      .note = "no spin reorientation in YFeO3 (Y carries no moment)"});
  t.push_back(
      Crystal{.name = "Cr2O3",
              .kind = "antiferromagnet, uniaxial (easy axis c), two sublattices",
              .saturation = {0.72, "derived: 3 muB per Cr3+ at 5.22 g/cm^3"},
              .g = {2.0, "from memory"},
              .exchange = {245, "from memory (Foner, Phys. Rev. 130, 183 (1963))"},
              .anisotropy = {{{0, 0, 1}, {0.07, "from memory (Foner, Phys. Rev. 130, 183 (1963))"}}},
              .spin = {1.5, "Cr3+, S = 3/2"},
              .ordering = {307, "from memory"},
              .reference = 0,
              .anisotropy_power = {3, "Callen & Callen, J. Phys. Chem. Solids 27, 1271 (1966), l = 2"},
              .permittivity = {{{11.9, "from memory, uncertain"},
                                {11.9, "from memory, uncertain"},
                                {11.9,
                                 "from memory, "
                                 "uncertain"}}},
              .phonon_source = "not recorded (no source at hand)",
              .resonances = {{0.165e12, "from memory (Foner, Phys. Rev. 130, 183 (1963): about 5.5 cm^-1 at 4.2 K)"}},
              .note = "magnetoelectric; the model leaves that out. Spin-flop near 5.9 T along c"});
}

/// YIG and a barium hexaferrite.
void add_ferrimagnets_and_ferrites(std::vector<Crystal>& t) {
  t.push_back(
      Crystal{.name = "YIG",
              .kind = "ferrimagnet (Y3Fe5O12) taken as one sublattice of its net moment (a ferromagnet)",
              .sublattices = 1,
              .saturation = {0.175, "from memory (4 pi Ms = 1750 G at room temperature)"},
              .g = {2.00, "from memory"},
              .damping = {3e-5, "from memory (best polished single crystals; more in most samples)"},
              .spin = {2.5,
                       "an effective S for the net moment: the one-sublattice Brillouin law is a rough stand-in for "
                       "the three-sublattice mean field"},
              .ordering = {559, "from memory"},
              .reference = 300,
              .anisotropy_power = {3, "Callen & Callen, J. Phys. Chem. Solids 27, 1271 (1966)"},
              .permittivity = {{{15, "from memory"}, {15, "from memory"}, {15, "from memory"}}},
              .phonon_source = "not recorded (no source at hand)",
              .note = "the weak cubic anisotropy is left out, so the moment lies along the bias (or `order`)"});
  t.push_back(Crystal{
      .name = "BaFe12O19",
      .kind = "barium hexaferrite (M-type), a ferrimagnet taken as one sublattice of its net moment (a hard "
              "ferromagnet, easy axis c)",
      .sublattices = 1,
      .saturation = {0.47, "from memory (4 pi Ms of about 4.7 kG at room temperature)"},
      .g = {2.0, "from memory"},
      .anisotropy = {{{0, 0, 1}, {1.7, "from memory (mu0 H_A = 17 kOe)"}}},
      .spin = {2.5, "an effective S for the net moment (rough)"},
      .ordering = {723, "from memory (450 C)"},
      .reference = 300,
      .anisotropy_power = {3, "Callen & Callen, J. Phys. Chem. Solids 27, 1271 (1966)"},
      .permittivity = {{{17, "from memory, uncertain"},
                        {17, "from memory, uncertain"},
                        {17,
                         "from memory, "
                         "uncertain"}}},
      .phonon_source = "not recorded (no source at hand)",
      .resonances = {{47.6e9, "from memory: natural resonance near 48 GHz (gamma mu0 H_A, no demagnetization)"}},
      .note = "a reversed bias below mu0 H_A leaves the moment metastable against it: choose it with `state`"});
}

std::vector<Crystal> build() {
  std::vector<Crystal> t;
  add_uniaxial_antiferromagnets(t);
  add_easy_plane_and_canted(t);
  add_orthoferrite_and_chromia(t);
  add_ferrimagnets_and_ferrites(t);
  return t;
}

}  // namespace

const std::vector<Crystal>& crystal_table() {
  static const std::vector<Crystal> t = build();
  return t;
}

const Crystal* find_crystal(std::string_view name) {
  auto lower = [](std::string_view s) {
    std::string o(s);
    std::transform(o.begin(), o.end(), o.begin(), [](unsigned char c) { return std::tolower(c); });
    return o;
  };
  for (const auto& c : crystal_table())
    if (lower(c.name) == lower(name)) return &c;
  return nullptr;
}

}  // namespace ty
