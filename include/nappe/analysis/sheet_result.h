#pragma once

#include <nappe/analysis/conformation.h>
#include <nappe/analysis/sheet_measures.h>
#include <nappe/solvers/sheet_problem.h>

#include <optional>
#include <string>
#include <vector>

namespace nappe
{
  /// The measured outcome of one solve of a problem; the measures exist only if it converged.
  struct SheetResult
  {
    bool           converged = false;
    std::string    message; ///< why the solve stopped, with the last residual and what to try
    LoadPathReport path;
    EnergyParts    energy; ///< [J]
    SheetMeasures  measures;
    /// Present when the problem has an adhesion substrate.
    std::optional<ConformationMeasures> conformation;
    /// Warnings for the reader (e.g. peak strain above the material's fracture strain).
    std::vector<std::string> warnings;
    unsigned long long       cells = 0, unknowns = 0;
    unsigned int             ranks = 1;
    /// The meshes of the solve (more than one when the mesh was adapted), the last the result's.
    std::vector<MeshCycle> meshes;
  };

  /// Measures a solution (energy, extremes, conformation, warnings) at full load. Collective.
  SheetResult analyse_solution(const SheetSolution &solution, const SheetProblem &problem);
} // namespace nappe
