#pragma once

#include <nappe/analysis/sheet_measures.h>
#include <nappe/io/sheet_case.h>

#include <ostream>
#include <string>

namespace nappe
{
  struct SheetRunResult
  {
    bool           converged = false;
    std::string    message;
    LoadPathReport path;
    SheetMeasures  measures;
    EnergyParts    energy;
    std::string    summary_file; ///< JSON summary (written only for a converged run)
    std::string    fields_file;  ///< PVTU record, if written
  };

  /**
   * Runs a case end to end: mesh, load path, certification, measures, then (only if the final state
   * is a certified stable minimum) the JSON summary <name>.json and the fields <name>.pvtu.
   * Progress goes to @p log (rank 0 only should pass a real stream).
   */
  SheetRunResult run_sheet_case(const SheetCase &sheet_case, MPI_Comm comm, std::ostream *log);

  /// A short human summary of a run, every number with its unit.
  void print_summary(const SheetCase &sheet_case, const SheetRunResult &result, std::ostream &out);
} // namespace nappe
