#pragma once

#include <nappe/solvers/sheet_system.h>

#include <string>

namespace nappe
{
  /**
   * Writes the sheet's fields for ParaView as <directory>/<name>.pvtu with one <name>_<rank>.vtu
   * piece per rank: deflection w, total in-plane displacement u = λE·x + ũ, membrane strain
   * components and principal strains, stress resultants N [N/m], curvatures ∇∇w [1/m] and the
   * MPI rank. Lengths in the files are in nm (coordinates and displacements). Each file is written
   * under a temporary name and renamed when complete. Returns the path of the .pvtu record.
   */
  std::string write_fields(const SheetSystem &system, const Vector &state, double load_factor,
                           const std::string &directory, const std::string &name);
} // namespace nappe
