#pragma once

#include <nappe/solvers/sheet_system.h>

#include <string>

namespace nappe
{
  /**
   * Writes the sheet's fields for ParaView as <directory>/<name>.pvtu with one <name>_<rank>.vtu
   * piece per rank: every field of the quantity table (sheet_quantities.h) that applies to the
   * model, each with its unit in its name (w_nm, u_x_nm, N_xx_N_per_m, curvature_xx_per_nm, gap_nm;
   * strains are dimensionless), and the MPI rank. Point coordinates are in nm, the unit of w_nm, so
   * that warping by the deflection needs no scale factor. Each file is written
   * under a temporary name and renamed when complete. Returns the path of the .pvtu record.
   */
  std::string write_fields(const SheetSystem &system, const Vector &state, const LoadLevel &level,
                           const std::string &directory, const std::string &name);
} // namespace nappe
