#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/io/sheet_case.h>

#include <mpi.h>

#include <functional>
#include <map>
#include <string>
#include <vector>

namespace nappe
{
  /**
   * Runs an app's body with MPI initialised and every error handled the same way: an error raised on
   * all ranks (a CollectiveError, or the same bad input read everywhere) is printed once by rank 0;
   * an error on some ranks only is printed by the rank that has it, which then aborts the job, so
   * that no rank is left waiting. Returns the body's exit code, 1 after an error.
   */
  int run_guarded(int argc, char **argv, const std::string &app_name,
                  const std::function<int(const std::vector<std::string> &args, MPI_Comm comm)> &body);

  /// How a case run ended: the exit code, and whether it wrote results (then the parameters used are
  /// written beside them).
  struct CaseOutcome
  {
    int  exit_code       = 0;
    bool results_written = false;
  };

  /// What an app that runs a case file is, for the shared argument handling of run_case_app().
  struct CaseApp
  {
    std::string name;        ///< e.g. "nappe-solve"
    std::string description; ///< a few lines for --help: what it computes and writes
    std::string demo_case;   ///< the built-in demo case file (text)
    /// Extra commands without a case, e.g. {"--list-materials", prints the catalogue}.
    std::map<std::string, std::function<void(std::ostream &)>> commands;
    /// The endings of the files a run writes after the stem "<directory>/<base name>" (e.g. ".json",
    /// "_limits.json"); "_NNNN.vtu" stands for the numbered field pieces.
    std::vector<std::string> result_suffixes;
    /// The plotting script run on "<stem>" after a run that wrote results (unless --no-plots).
    std::string plot_script;
    /// Runs a parsed case. @p prm holds the case's parameters.
    /// Runs the case; with @p quiet (--quiet) only the summary is printed, not the solver's progress.
    std::function<CaseOutcome(dealii::ParameterHandler &prm, const SheetCase &sheet_case, MPI_Comm comm, bool quiet)>
      run;
  };

  /**
   * The shared main of nappe-solve and nappe-limits: "CASE.prm | --demo" followed by
   * "--set Section/Entry=value" pairs, --no-plots and --quiet, or --help, --print-defaults, --validate CASE.prm
   * and the app's own commands. --validate and every run print the plausibility warnings and the
   * resolution report of the case (io/case_checks.h). Before a run, the results of an earlier run with the same stem (the app's
   * result_suffixes and <stem>.used.prm) are removed, so that a failed run leaves no stale result
   * beside its parameters; <stem>.used.prm is written only together with results. Output/Base name
   * left empty takes the case file's name.
   */
  int run_case_app(int argc, char **argv, const CaseApp &app);
} // namespace nappe
