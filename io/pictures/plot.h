/// \file plot.h
/// \brief Line plots for the measurements (spectra, probe traces, beam profiles, permeability
/// tables, sweeps) and maps of a value over two axes (a sweep over two keys), drawn by PLplot
/// through its cairo devices into PNG, PDF or SVG (by the file's extension). Every plot also
/// writes the data it shows beside it, FILE.csv, one row a point: panel, series, x, y (a map:
/// x, y, z). A line plot is one or more panels stacked vertically.
#pragma once
#include <cmath>
#include <string>
#include <vector>

namespace ty {

struct PlotSeries {
  std::string label;
  std::vector<double> x, y;
  enum class Style { line, dashed, points, line_points } style = Style::line;
  int colour = -1;  ///< index into the palette; -1: the series' position
};

struct PlotPanel {
  std::string xlabel, ylabel, title;
  std::vector<PlotSeries> series;
  std::vector<std::pair<double, double>> shaded;  ///< x bands shaded behind the curves
  std::string shaded_label;                       ///< their legend entry
  std::vector<double> marks;                      ///< vertical dotted lines at these x
  double ymin = NAN, ymax = NAN;                  ///< NaN: from the data
  double xmin = NAN, xmax = NAN;
  /// The series are drawn as value × scale (e.g. 1e6 for µm); FILE.csv holds the values
  /// themselves. Limits, marks and bands are in drawn units.
  double x_scale = 1, y_scale = 1;
};

struct Plot {
  std::string title;  ///< over the first panel when it has none of its own
  std::vector<PlotPanel> panels;
  int width = 900, height = 600;  ///< px (PNG) or pt (PDF, SVG)
};

/// Writes the plot (PNG, PDF or SVG by extension) and FILE.csv beside it. Both are written
/// under temporary names and renamed when complete.
void write_plot(const Plot& plot, const std::string& path);

/// A value over a grid of two axes, drawn as coloured cells (edges halfway between the
/// values, so uneven axes are drawn as they are) with a colour bar; missing values (NaN) are
/// left blank.
struct MapPlot {
  std::string title, xlabel, ylabel, zlabel;
  std::vector<double> x, y;  ///< the axes' values, ascending
  std::vector<double> z;     ///< z[j * x.size() + i] at (x[i], y[j]); NaN: no value
  double x_scale = 1, y_scale = 1, z_scale = 1;  ///< drawn as value × scale; FILE.csv holds the values
  int width = 900, height = 600;
};

/// Writes the map (PNG, PDF or SVG by extension) and FILE.csv (x, y, z, one row a cell) beside it.
void write_map_plot(const MapPlot& map, const std::string& path);

/// The path of the data written beside a plot: FILE.png -> FILE.csv.
std::string plot_data_path(const std::string& path);

}  // namespace ty
