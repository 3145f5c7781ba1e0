/// \file richardson.h
/// \brief Richardson extrapolation of a number measured on successively refined grids, with
/// the observed order of convergence and an error band (Roache, Verification and
/// Validation in Computational Science and Engineering, Hermosa, 1998, ch. 5: the grid
/// convergence index GCI = Fs |f_fine - f_medium| / (r^p - 1), Fs = 1.25 with three grids
/// and an observed order, 3 with two grids and an assumed one).
#pragma once
#include <optional>
#include <vector>

namespace ty {

struct Extrapolated {
  double value = 0;         ///< Richardson-extrapolated f at zero cell size
  double order = 0;         ///< observed order p (the assumed one with two grids)
  bool order_observed = false;
  double error = 0;         ///< GCI of the finest grid, in the units of f (|f_fine - f_exact| estimate)
  bool monotone = true;     ///< false: the differences change sign (oscillatory convergence; p not defined)
};

/// `f` measured at cells h, h/r, h/r^2, ... (coarsest first), r the refinement ratio;
/// `assumed_order` is used when only two grids exist or the convergence is not monotone.
/// Empty with fewer than two values.
std::optional<Extrapolated> richardson(const std::vector<double>& f, double r = 2.0, double assumed_order = 2.0);

/// The same from the last three of `f` measured at cells `h` (coarsest first) in any ratios:
/// the order p solves (f3 - f2)/(f2 - f1) = (h3^p - h2^p)/(h2^p - h1^p) (f = f0 + C h^p;
/// solved by bisection where Celik et al., J. Fluids Eng. 130, 078001 (2008) iterate), then
/// f0 = f3 + (f3 - f2)/((h2/h3)^p - 1) and the GCI with r = h2/h3. With a constant ratio it
/// is richardson(f, r). Empty unless h and f hold three or more values, h falling.
std::optional<Extrapolated> richardson_cells(const std::vector<double>& h, const std::vector<double>& f,
                                             double assumed_order = 2.0);

}  // namespace ty
