#pragma once

#include <nappe/analysis/conformation.h>
#include <nappe/analysis/sheet_measures.h>
#include <nappe/io/sheet_case.h>

#include <ostream>
#include <optional>
#include <string>
#include <vector>

namespace nappe
{
  struct SheetRunResult
  {
    bool           converged = false;
    std::string    message;
    LoadPathReport path;
    SheetMeasures  measures;
    EnergyParts    energy;
    /// Present when the case has a substrate.
    std::optional<ConformationMeasures> conformation;
    /// Warnings for the reader (e.g. peak strain above the material's fracture strain).
    std::vector<std::string> warnings;
    std::string    summary_file; ///< JSON summary (written only for a converged run)
    std::string    fields_file;  ///< PVTU record, if written
  };

  /**
   * Runs a case end to end: mesh, load path, certification, measures, then (only if the final state
   * is a certified stable minimum) the JSON summary <name>.json and the fields <name>.pvtu.
   * Progress goes to @p log (rank 0 only should pass a real stream).
   */
  SheetRunResult run_sheet_case(const SheetCase &sheet_case, MPI_Comm comm, std::ostream *log);

  /// The flat (laid-down) or conformal (grown) starting state of the case's protocol (owned vector).
  Vector initial_state(const SheetSystem &system, const SheetCase &sheet_case);

  /// "conforms", "partially conformed" or "suspended", from the conformed fraction (thresholds 0.99
  /// and 0.05 of the sheet area; our definitions).
  std::string conformation_verdict(double conformed_fraction);

  /// A short human summary of a run, every number with its unit.
  void print_summary(const SheetCase &sheet_case, const SheetRunResult &result, std::ostream &out);
} // namespace nappe
