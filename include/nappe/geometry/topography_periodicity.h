#pragma once

#include <nappe/geometry/topography.h>

#include <string>

namespace nappe
{
  /**
   * Why a topography is not periodic on a periodic cell with lattice vectors @p a1, @p a2 [m] and
   * lower-left corner @p origin, or an empty string if it is. A topography with a lattice()
   * (gratings, egg cartons, arrays, tilings) is checked exactly: each cell vector must be a whole
   * number of its periods. Any topography is then sampled along the cell's edges: the height and the
   * slope on each edge must equal those on the opposite edge, to 1e-6 of the height range there (a
   * formula or a height map whose extent is not the cell fails here). The text names the cell and
   * the topography's own lengths.
   */
  std::string periodicity_mismatch(const Topography &topography, const dealii::Point<2> &origin,
                                   const dealii::Tensor<1, 2> &a1, const dealii::Tensor<1, 2> &a2);
} // namespace nappe
