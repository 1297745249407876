#pragma once

namespace nappe
{
  /**
   * Largest substrate height (and depth) nappe accepts from a file, a formula or a length entry of the
   * topography: 1 mm [m]. Common practice, no source: the substrate features of strain engineering are
   * nanometres to micrometres tall, so a height beyond a millimetre is a unit or export mistake (an STL
   * scaled by 1e30, a height of 1e308); far below overflow, and small enough that the nanometre-scale gap
   * w − s keeps about ten significant digits in double precision.
   */
  constexpr double max_topography_height = 1e-3;
} // namespace nappe
