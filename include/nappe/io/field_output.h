#pragma once

#include <nappe/solvers/sheet_system.h>

#include <string>

namespace nappe
{
  /**
   * Writes the sheet's fields for ParaView as <directory>/<name>.pvtu with one <name>_<rank>.vtu
   * piece per rank: deflection w, total in-plane displacement u = λE·x + ũ, membrane strain
   * components and principal strains, stress resultants N [N/m], curvatures ∇∇w [1/m] and the
   * MPI rank, and the substrate's fields (gap, contact indicator, traction) when there is one.
   * Point coordinates are in m; each field states its unit in its name (w_nm, u_x_nm,
   * N_xx_N_per_m, curvature_xx_per_nm; strains are dimensionless). Each file is written
   * under a temporary name and renamed when complete. Returns the path of the .pvtu record.
   */
  std::string write_fields(const SheetSystem &system, const Vector &state, double load_factor,
                           const std::string &directory, const std::string &name);
} // namespace nappe
