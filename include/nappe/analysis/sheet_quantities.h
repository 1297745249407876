#pragma once

#include <nappe/analysis/sheet_evaluation.h>

#include <functional>
#include <string>
#include <vector>

namespace nappe
{
  /// Which extreme of a quantity over the sheet a report states.
  enum class Extreme
  {
    none,             ///< not reported as an extreme
    largest,          ///< the largest value
    smallest,         ///< the smallest value
    largest_magnitude ///< the value of largest magnitude, with its sign
  };

  /**
   * One derived quantity of a solved sheet: its name, unit and how to evaluate it at a point. The
   * table of these (sheet_quantities()) is the one definition that feeds the VTU fields, the extremes
   * with their locations, the strain histograms, the JSON summary and the CSV columns of paths and
   * sweeps. Adding a derived quantity is adding one entry to that table.
   */
  struct SheetQuantity
  {
    std::string name;        ///< e.g. "principal_strain_1"; the field name adds the unit (unit_suffix())
    std::string unit;        ///< unit of reported values: "1", "nm", "1/nm", "N/m", "MPa", "T", "T nm", "eV", …
    double      si_per_unit; ///< the SI value of one unit (reported = SI value / si_per_unit)
    std::string description; ///< one line, for documentation and reports
    std::function<double(const PointState &)> evaluate; ///< the value at a point [SI]
    Extreme     extreme = Extreme::none;
    std::string extreme_key;     ///< key of the extreme in reports, e.g. "max_principal_strain"
    std::string histogram_label; ///< non-empty: an area-weighted histogram of it is reported
    bool        needs_adhesion = false; ///< defined only on a substrate with an adhesion law
    /// Non-empty: the quantity is defined only for models that pass it (e.g. electronic quantities need the
    /// material's lattice and a published coupling constant).
    std::function<bool(const SheetModel &)> needs_model;
    bool        field          = true;  ///< written to the VTU fields

    /// Whether the quantity is defined for @p model (e.g. the gap needs a substrate).
    bool applies_to(const SheetModel &model) const;
    /// The value at @p point in the reported unit.
    double reported(const PointState &point) const { return evaluate(point) / si_per_unit; }
    /// "_nm", "_per_nm", "_N_per_m", "_T_nm", … ("" for dimensionless): appended to names in fields and CSV columns.
    std::string unit_suffix() const;
  };

  /// The table of derived quantities, in report order.
  const std::vector<SheetQuantity> &sheet_quantities();

  /// The quantities of the table that apply to @p model.
  std::vector<const SheetQuantity *> quantities_for(const SheetModel &model);
} // namespace nappe
