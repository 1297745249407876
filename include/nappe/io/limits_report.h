#pragma once

#include <nappe/analysis/adhesion_limits.h>
#include <nappe/analysis/fabrication_check.h>
#include <nappe/io/sheet_case.h>

#include <ostream>
#include <string>

namespace nappe
{
  /// Γ–energy curves and the paths' measured values (the state summary columns, e.g. Γ–fraction and
  /// Γ–strain) of both paths as CSV, one row per certified state; a state reached by a jump also
  /// names the transition and the energy it released.
  void write_adhesion_paths_csv(const std::string &path, const AdhesionLimits &limits);

  /// The thresholds with their brackets, the hysteresis, the largest conformed fraction, the
  /// transitions, the paths' statistics and (if given) the fabrication check, as JSON with units.
  void write_limits_json(const std::string &path, const SheetCase &sheet_case, const AdhesionLimits &limits,
                         const FabricationCheck *check);

  /// The transitions of both paths as a short table (bracket, kind, fractions, energy released).
  void print_transitions(const AdhesionLimits &limits, std::ostream &out);

  /// A short human summary of the thresholds and the transitions, every number with its unit.
  void print_limits_summary(const SheetCase &sheet_case, const AdhesionLimits &limits, std::ostream &out);

  /// The verdict table of a fabrication check.
  void print_fabrication_check(const SheetCase &sheet_case, const AdhesionLimits &limits, const FabricationCheck &check,
                               std::ostream &out);
} // namespace nappe
