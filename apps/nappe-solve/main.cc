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

#include <deal.II/base/mpi.h>

#include <iostream>

namespace
{
  // Demo scenario (our own): a MoS2 monolayer transferred onto a square array of rounded SiO2
  // nanopillars (pitch 100 nm, height 8 nm, radius 20 nm): does it tent between the pillars?
  const char *demo_case = R"(
subsection Case
  set Title = demo: MoS2 monolayer laid on a square array of rounded SiO2 nanopillars
end
subsection Sheet
  set Material = MoS2
end
subsection Domain
  set Shape = rectangle
  set Length x = 100
  set Length y = 100
  set Periodic = true
  set Coarse cells x = 4
  set Coarse cells y = 4
  set Global refinements = 3
end
subsection Edges
  set Conditions =
end
subsection Substrate
  set Enabled = true
  set Protocol = laid down
end
subsection Topography
  set Type = pillar
  set Array = square
  set Array pitch = 100
  subsection Pillar
    set Height = 8
    set Radius = 20
    set Edge radius = 4
    set Foot radius = 4
    set Sidewall angle = 70
  end
end
subsection Adhesion
  set Work of adhesion = 0.22
  set Equilibrium separation = 0.5
end
subsection Solver
  set Load steps = 1
end
subsection Output
  set Base name = demo-pillars
end
)";
} // namespace

int main(int argc, char **argv)
{
  nappe::CaseApp app;
  app.name        = "nappe-solve";
  app.description = "solves a sheet case (a monolayer on a substrate topography, or a loaded sheet) to a certified "
                    "stable equilibrium and reports the conformation, strains and energies; writes <stem>.json, CSV "
                    "tables and VTU fields.";
  app.demo_case   = demo_case;
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
