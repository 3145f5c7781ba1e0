/// \file colour_map.h
/// \brief The two colour maps of terayee's pictures, both perceptually uniform in CIELAB
/// (equal steps in value are equal Delta E*ab steps):
///   "diverging"   for signed fields (limits symmetric about zero): dark teal - near-white -
///                 copper orange. Lightness L* falls linearly from 95 at zero to 38 at both
///                 ends, so |value| reads as darkness alike on both sides; the sign is the hue,
///                 teal (h = 200 deg) for negative, orange (h = 55 deg) for positive. The two
///                 hues lie on opposite sides of both opponent axes (a* and b*), so a viewer
///                 missing either axis (red-green or blue-yellow deficiency) still tells the
///                 signs apart (checked with Machado et al. 2009, colour_vision.h).
///   "sequential"  for intensities and magnitudes: dark violet - blue - teal - green - pale
///                 yellow, L* rising linearly from 10 to 96 while the hue turns (the
///                 linear-lightness design of Kindlmann, Reinhard & Creem, IEEE Vis 2002).
/// Each map's path is sampled finely and re-spaced to equal CIELAB arc length, then tabulated
/// at 256 entries, packed as opaque cairo ARGB32 pixels.
#pragma once
#include <array>
#include <cstdint>
#include <string>

#include "io/pictures/colour_space.h"

namespace ty {

class ColourMap {
 public:
  enum class Kind { diverging, sequential };
  static const ColourMap& diverging();
  static const ColourMap& sequential();
  static const ColourMap& of(Kind k) { return k == Kind::diverging ? diverging() : sequential(); }
  /// The map a user named ("diverging" or "sequential"); BadInput otherwise, naming the new
  /// name where an old one ("tide", "dusk") was given.
  static Kind kind_named(const std::string& name);

  const std::string& name() const { return name_; }
  Kind kind() const { return kind_; }
  /// The colour at t in [0, 1] (clamped), from the table.
  Rgb at(double t) const;
  /// The packed pixel for t in [0, 1] (clamped; NaN gives mid grey).
  uint32_t pixel(double t) const {
    if (!(t == t)) return 0xff808080u;
    const int k = t <= 0 ? 0 : t >= 1 ? kSize - 1 : static_cast<int>(t * kSize);
    return packed_[k];
  }
  /// The t whose colour is nearest to c (CIELAB distance): reading a picture back.
  double invert(Rgb c) const;

  static constexpr int kSize = 256;

 private:
  explicit ColourMap(Kind kind);
  std::string name_;
  Kind kind_;
  std::array<Rgb, kSize> table_;
  std::array<uint32_t, kSize> packed_;
};

/// The diverging map's design path in CIELAB, s in [-1, 1] (0: the centre), before re-spacing.
Lab diverging_path(double s);

}  // namespace ty
