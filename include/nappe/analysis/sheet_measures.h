#pragma once

#include <deal.II/base/point.h>

#include <nappe/analysis/sheet_quantities.h>
#include <nappe/solvers/sheet_system.h>

#include <string>
#include <vector>

namespace nappe
{
  /// A value and where it occurs (on the reference sheet) [m].
  struct LocatedValue
  {
    double           value = 0.0;
    dealii::Point<2> location;
  };

  /// The extreme of one quantity of the table (sheet_quantities.h) over the sheet, in SI.
  struct QuantityExtreme
  {
    const SheetQuantity *quantity = nullptr;
    LocatedValue         extreme;
  };

  /**
   * Pointwise extremes of a solved sheet, sampled at the quadrature points: one entry for every
   * quantity of the table that has an Extreme and applies to the model, in table order. The same on
   * every rank (ties go to the lowest rank, then to the first point met).
   */
  struct SheetMeasures
  {
    std::vector<QuantityExtreme> extremes;

    /// The extreme reported under @p key (SheetQuantity::extreme_key); throws if there is none.
    const LocatedValue &at(const std::string &key) const;
  };

  SheetMeasures measure_sheet(const SheetSystem &system, const Vector &state, const LoadLevel &level);
} // namespace nappe
