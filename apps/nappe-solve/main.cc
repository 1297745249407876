// nappe-solve: runs a sheet case file end to end and writes a JSON summary and VTU fields.
//
// Sample runs:
//   nappe-solve --demo                                 built-in demo: MoS2 on a nanopillar array
//   nappe-solve case.prm --set "Loads/Pressure=50"     a case file with an override
//   mpirun -np 2 nappe-solve case.prm                  distributed
//   nappe-solve --print-defaults > case.prm            every parameter, documented, with its unit
//   nappe-solve --validate case.prm                    check a case file without running it
//   nappe-solve --list-materials                       the material and interface catalogue
#include <nappe/io/sheet_report.h>
#include <nappe/physics/catalogue_sources.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/runs/app_driver.h>
#include <nappe/runs/case_run.h>
#include <nappe/runs/pillar_demo.h>

#include <deal.II/base/mpi.h>

#include <iostream>

int main(int argc, char **argv)
{
  nappe::CaseApp app;
  app.name        = "nappe-solve";
  app.description = "solves a sheet case (a monolayer on a substrate topography, or a loaded sheet) to a certified "
                    "stable equilibrium and reports the conformation, strains and energies; writes <stem>.json, CSV "
                    "tables and VTU fields.";
  app.demo_case   = nappe::pillar_demo_case();
  app.commands["--list-materials"] = [](std::ostream &out) {
    const nappe::MaterialCatalogue catalogue;
    catalogue.print(out);
    out << "\nSources (\"verified\": checked against the paper; \"from memory\": to be confirmed before "
           "quantitative use)\n";
    nappe::print_catalogue_sources(nappe::read_catalogue_sources(catalogue.path()), out);
  };
  app.result_suffixes = {".json", ".pvtu", "_NNNN.vtu", "_strain_histogram.csv", "_suspended_regions.csv",
                         "_topography.csv", "_map.csv"};
  app.plot_script = "plot_case.py";
  app.run = [](dealii::ParameterHandler &, const nappe::SheetCase &c, MPI_Comm comm, bool quiet) {
    const bool            root = dealii::Utilities::MPI::this_mpi_process(comm) == 0;
    const nappe::CaseRun run  = nappe::run_sheet_case(c, comm, root && !quiet ? &std::cout : nullptr);
    if (root)
      nappe::print_sheet_summary(c, run.result, run.files, std::cout);
    return nappe::CaseOutcome{run.result.converged ? 0 : 2, run.result.converged};
  };
  return nappe::run_case_app(argc, argv, app);
}
