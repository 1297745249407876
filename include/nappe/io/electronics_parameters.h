#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/io/strained_lattice.h>

namespace nappe
{
  /// The case file's subsection "Electronics": the lattice orientation and the strained-lattice export.
  struct ElectronicsSettings
  {
    /// θ: angle from the x axis to a zigzag direction of the sheet's lattice, counter-clockwise [rad].
    double zigzag_angle = 0.0;
    /// Write <base>_lattice.xyz / .cif after a converged run.
    bool                  export_lattice = false;
    LatticeExportSettings lattice_export;
  };

  /**
   * Declares subsection "Electronics" (entry "Zigzag angle" [deg]) and "Electronics/Lattice export" (Enabled,
   * Region = cell | box | polygon, Box [nm], Polygon [nm], Largest residual strain [-], Vacuum [nm], Formats).
   */
  void declare_electronics_parameters(dealii::ParameterHandler &prm);

  /// Reads them, converts to SI and checks them; throws naming Electronics/… on bad input.
  ElectronicsSettings parse_electronics_parameters(dealii::ParameterHandler &prm);
} // namespace nappe
