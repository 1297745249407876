#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/analysis/adhesion_limits.h>
#include <nappe/analysis/fabrication_check.h>
#include <nappe/io/sheet_case.h>

#include <optional>
#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  /// A threshold search (and, if the case asks for it, a fabrication check) run and reported.
  struct LimitsRun
  {
    AdhesionLimits                  limits;
    std::optional<FabricationCheck> check;
    std::vector<std::string>        files;
    /// Both paths covered the whole Γ range (otherwise their messages say why not).
    bool complete() const { return limits.lowering.complete && limits.raising.complete; }
  };

  /**
   * Γ_hold, Γ_eq and Γ_snap of a case, then the fabrication check over the interface's Γ range and,
   * with a feature-height entry, the aspect-ratio scan (which re-reads the case from @p prm with the
   * height changed). Writes <stem>_limits.json and <stem>_adhesion_paths.csv on rank 0, prints the
   * summary to @p report and the progress along the paths to @p log (either may be null). Collective.
   */
  LimitsRun run_adhesion_limits(dealii::ParameterHandler &prm, const SheetCase &sheet_case, MPI_Comm comm,
                                std::ostream *report, std::ostream *log);
} // namespace nappe
