#pragma once

#include <nappe/geometry/topography.h>

#include <string>

namespace nappe
{
  /**
   * Write t sampled on the n_x × n_y grid spanning [lower, upper] (both corners included) as CSV with
   * the header row `x_nm,y_nm,height_nm,dsdx,dsdy` and one row per node, x varying fastest; lengths in
   * nm, slopes dimensionless, 17 significant digits. The file is written under a temporary name in the
   * same directory and renamed over `filename` only when complete, so readers never see a partial
   * file. Throws if the file cannot be written. n_x, n_y ≥ 2.
   */
  void write_topography_csv(const Topography &t, const std::string &filename, const dealii::Point<2> &lower,
                            const dealii::Point<2> &upper, unsigned int n_x, unsigned int n_y);
} // namespace nappe
