#pragma once

#include <nappe/analysis/sheet_result.h>
#include <nappe/io/sheet_case.h>

#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  /// One case solved and reported.
  struct CaseRun
  {
    SheetResult              result;
    std::vector<std::string> files; ///< "what: path" lines for the report, in the order written
  };

  /**
   * Solves a case end to end — mesh, load path, certification, measures — and, if the final state is
   * a certified stable minimum and @p write_results is set, writes the JSON summary <stem>.json, the
   * substrate tables, the fields <stem>.pvtu and, if the case asks for it (Electronics/Lattice export), the
   * strained lattice <stem>_lattice.xyz/.cif. Progress goes to @p log (pass it on rank 0 only).
   * Collective; an error on any rank is raised on all.
   */
  CaseRun run_sheet_case(const SheetCase &sheet_case, MPI_Comm comm, std::ostream *log, bool write_results = true);
} // namespace nappe
