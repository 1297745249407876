#pragma once

#include <nappe/analysis/grid_sampling.h>
#include <nappe/analysis/sheet_result.h>
#include <nappe/io/sheet_case.h>
#include <nappe/io/strained_lattice.h>

#include <ostream>
#include <string>

namespace nappe
{
  /// The JSON summary of a solved case with units: sheet, discretisation, energies, the extremes of
  /// the quantity table with their locations, the conformation, warnings and solver statistics; with
  /// @p lattice, what the strained-lattice export wrote (atoms, supercell and its residual strain, files).
  void write_sheet_summary(const std::string &path, const SheetCase &sheet_case, const SheetResult &result,
                           const LatticeExportReport *lattice = nullptr);

  /**
   * The CSV tables of a solved case on a substrate, next to @p stem: <stem>_strain_histogram.csv (one
   * histogram per quantity of the table that has one) and <stem>_suspended_regions.csv.
   */
  void write_substrate_tables(const std::string &stem, const ConformationMeasures &m);

  /// The fields on a grid as CSV: x_nm, y_nm, then one column per field named as in the VTU files.
  void write_field_map(const std::string &path, const GridSamples &samples);

  /// A short human summary of a run, every number with its unit; @p files lists what was written.
  void print_sheet_summary(const SheetCase &sheet_case, const SheetResult &result,
                           const std::vector<std::string> &files, std::ostream &out);
} // namespace nappe
