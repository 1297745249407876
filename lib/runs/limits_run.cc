#include <deal.II/base/mpi.h>

#include <nappe/base/collective.h>
#include <nappe/io/limits_report.h>
#include <nappe/io/parameter_override.h>
#include <nappe/runs/limits_run.h>

#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace
  {
    /// The case's problem with the feature height set to @p height [m] through its case-file entry.
    SheetProblem problem_with_height(dealii::ParameterHandler &prm, const std::string &entry, double height)
    {
      std::ostringstream value;
      value << std::setprecision(12) << height * 1e9;
      apply_override(prm, entry + "=" + value.str());
      return parse_sheet_case(prm).problem;
    }
  } // namespace

  LimitsRun run_adhesion_limits(dealii::ParameterHandler &prm, const SheetCase &c, MPI_Comm comm, std::ostream *report,
                                std::ostream *log)
  {
    AssertThrow(c.problem.model.adhesion(),
                dealii::ExcMessage("Substrate/Enabled: nappe-limits needs a substrate (true)."));
    const AdhesionPathSettings settings =
      c.fabrication.enabled ? with_stops(c.limits, verdict_work_of_adhesion_values(c.fabrication)) : c.limits;
    LimitsRun run;
    run.limits = find_adhesion_limits(c.problem, settings, comm, log);
    if (c.fabrication.enabled)
      {
        run.check = fabrication_verdicts(run.limits, c.fabrication, c.problem.model.material.fracture_strain);
        if (!c.fabrication.feature_height_entry.empty())
          {
            if (log)
              *log << "Scanning the feature height (" << c.fabrication.feature_height_entry << ")\n";
            scan_aspect_ratio(
              *run.check, c.fabrication, c.limits,
              [&](double h) { return problem_with_height(prm, c.fabrication.feature_height_entry, h); }, comm, 6,
              log);
          }
      }
    const std::string stem = c.output.stem();
    run_collectively(comm, [&] {
      if (dealii::Utilities::MPI::this_mpi_process(comm) != 0)
        return;
      write_adhesion_paths_csv(stem + "_adhesion_paths.csv", run.limits);
      write_limits_json(stem + "_limits.json", c, run.limits, run.check ? &*run.check : nullptr);
    });
    run.files = {stem + "_limits.json", stem + "_adhesion_paths.csv"};
    if (report)
      {
        print_limits_summary(c, run.limits, *report);
        if (run.check)
          print_fabrication_check(c, run.limits, *run.check, *report);
        *report << "Results: " << run.files[0] << ", " << run.files[1] << "\n";
      }
    return run;
  }
} // namespace nappe
