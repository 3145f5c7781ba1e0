/// \file colour_map.h
/// \brief The two colour maps of terayee's pictures, both perceptually uniform:
///   "tide"  diverging blue - white - red for signed fields (limits symmetric about zero),
///           Moreland's Msh interpolation (K. Moreland, "Diverging Color Maps for Scientific
///           Visualization", ISVC 2009, sec. 4), between his blue and red end points;
///   "dusk"  sequential dark violet - blue - teal - green - pale yellow for intensities and
///           magnitudes: CIELAB lightness L* rising linearly from 10 to 96 while the hue turns
///           (the linear-lightness design of Kindlmann, Reinhard & Creem, IEEE Vis 2002, and
///           Moreland 2016), re-spaced so that equal steps in value are equal CIELAB distances.
/// Each map is tabulated once at 256 entries, packed as opaque cairo ARGB32 pixels.
#pragma once
#include <array>
#include <cstdint>
#include <string>

namespace ty {

struct Rgb {
  double r = 0, g = 0, b = 0;  ///< sRGB, 0..1
};

class ColourMap {
 public:
  enum class Kind { diverging, sequential };
  static const ColourMap& tide();  ///< diverging
  static const ColourMap& dusk();  ///< sequential
  static const ColourMap& of(Kind k) { return k == Kind::diverging ? tide() : dusk(); }

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
  ColourMap(std::string name, Kind kind);
  std::string name_;
  Kind kind_;
  std::array<Rgb, kSize> table_;
  std::array<uint32_t, kSize> packed_;
};

/// CIELAB (D65 white) of an sRGB colour, and back (out-of-gamut values are clamped).
std::array<double, 3> rgb_to_lab(Rgb c);
Rgb lab_to_rgb(const std::array<double, 3>& lab, bool* in_gamut = nullptr);

}  // namespace ty
