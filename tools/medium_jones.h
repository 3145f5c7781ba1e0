/// \file medium_jones.h
/// \brief `terayee medium`'s polarization columns: the Jones matrices of the slab (or
/// half-space) from the 4x4 transfer matrix and the Faraday and Kerr rotation and ellipticity
/// of each input (io/analysis/spectroscopy/jones_prediction.h), for the table, CSV and JSON.
#pragma once
#include <nlohmann/json.hpp>
#include <string>

#include "io/analysis/spectroscopy/jones_prediction.h"

namespace ty {

/// The CSV columns appended to medium's table (leading comma, no newline).
std::string jones_csv_header();
std::string jones_csv(const JonesPrediction& p);
nlohmann::json jones_json(const JonesPrediction& p);
/// The printed table (with --polarization): its header, and one row.
void print_jones_header(bool slab);
void print_jones_row(double f, const JonesPrediction& p);
/// `check`'s polarization lines: where the scene has a plane wave along x or y and one
/// magnetic sample slab across it, the table above at a few frequencies of [f_lo, f_hi].
/// Returns whether it printed.
bool report_scene_jones(const Scene& scene, double f_lo, double f_hi);

}  // namespace ty
