#pragma once

#include <nappe/analysis/sheet_quantities.h>
#include <nappe/solvers/sheet_system.h>

#include <vector>

namespace nappe
{
  /// The fields of the quantity table at the points of a regular grid over the sheet.
  struct GridSamples
  {
    std::vector<const SheetQuantity *> quantities; ///< the table's fields that apply, in table order
    std::vector<dealii::Point<2>>      points;     ///< grid points on the sheet, in order of y then x [m]
    std::vector<std::vector<double>>   values;     ///< per point, per quantity, in the reported units
  };

  /**
   * Samples every field of the quantity table on an nx × ny grid spanning the sheet's bounding box;
   * grid points outside the sheet (e.g. around a disk) are left out. Collective; the result is
   * complete on rank 0 and empty elsewhere. Each point is evaluated in one cell (the first in grid
   * order that contains it), at the element's own accuracy: no smoothing.
   */
  GridSamples sample_on_grid(const SheetSystem &system, const Vector &state, const LoadLevel &level, unsigned int nx,
                             unsigned int ny);

  /// The grid for a map of the sheet: @p points_along_longer_side along the longer side of its
  /// bounding box and proportionally many (at least 3) along the other; returns (nx, ny).
  std::pair<unsigned int, unsigned int> map_grid_size(const SheetSystem &system,
                                                      unsigned int       points_along_longer_side = 201);
} // namespace nappe
