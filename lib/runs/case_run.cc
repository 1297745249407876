#include <deal.II/base/mpi.h>

#include <nappe/base/collective.h>
#include <nappe/io/field_output.h>
#include <nappe/io/sheet_report.h>
#include <nappe/io/strained_lattice.h>
#include <nappe/runs/case_run.h>

namespace nappe
{
  CaseRun run_sheet_case(const SheetCase &c, MPI_Comm comm, std::ostream *log, bool write_results)
  {
    const SheetSolution solution = solve_sheet_problem(c.problem, comm, log);
    CaseRun             run;
    run.result = analyse_solution(solution, c.problem);
    if (!run.result.converged || !write_results)
      return run;

    const std::string stem    = c.output.stem();
    const bool        on_root = dealii::Utilities::MPI::this_mpi_process(comm) == 0;
    Vector            ghosted = solution.system->make_ghosted_vector();
    ghosted                   = solution.state;
    if (c.output.write_fields)
      {
        const std::string fields =
          write_fields(*solution.system, ghosted, 1.0, c.output.directory, c.output.base_name);
        run.files.push_back("Fields (ParaView): " + fields);
      }
    std::optional<LatticeExportReport> lattice;
    if (c.electronics.export_lattice)
      {
        lattice = export_strained_lattice(*solution.system, ghosted, 1.0, c.electronics.lattice_export,
                                          stem + "_lattice");
        run.files.push_back(describe_lattice_export(*lattice));
      }
    const auto [nx, ny]       = map_grid_size(*solution.system);
    const GridSamples map     = sample_on_grid(*solution.system, ghosted, 1.0, nx, ny);
    run_collectively(comm, [&] {
      if (!on_root)
        return;
      if (run.result.conformation)
        write_substrate_tables(stem, *run.result.conformation);
      write_field_map(stem + "_map.csv", map);
      write_sheet_summary(stem + ".json", c, run.result, lattice ? &*lattice : nullptr);
    });
    run.files.insert(run.files.begin(), "Summary: " + stem + ".json, maps: " + stem + "_map.csv");
    return run;
  }
} // namespace nappe
