// nappe-limits: the works of adhesion that decide whether a sheet stays on a topography —
// Γ_hold, Γ_eq and Γ_snap with their brackets and the Γ–fraction/energy curves — and, if the
// case asks for it, a fabrication check over an interface's range of Γ.
//
// Sample runs:
//   nappe-limits --demo                                  built-in demo: graphene on a 1D grating
//   nappe-limits case.prm --set "Adhesion limits/Lowest work of adhesion=0.05"
//   mpirun -np 2 nappe-limits case.prm                   distributed (each path on all ranks)
//   nappe-limits --print-defaults                        every parameter, documented, with its unit
#include <nappe/runs/app_driver.h>
#include <nappe/runs/limits_run.h>

#include <deal.II/base/mpi.h>

#include <iostream>

namespace
{
  // Demo scenario (our own): graphene transferred onto a SiO2 grating of period 20 nm and
  // amplitude 2 nm; which works of adhesion hold it down, and is there hysteresis?
  const char *demo_case = R"(
subsection Case
  set Title = demo: graphene on a 20 nm SiO2 grating, adhesion thresholds
end
subsection Sheet
  set Material = graphene
end
subsection Domain
  set Shape = rectangle
  set Length x = 20
  set Length y = 1.25
  set Periodic = true
  set Coarse cells x = 16
  set Coarse cells y = 1
  set Global refinements = 2
end
subsection Edges
  set Conditions =
end
subsection Substrate
  set Enabled = true
end
subsection Topography
  set Type = sinusoidal grating
  subsection Sinusoidal grating
    set Amplitude = 2
    set Wavelength = 20
  end
end
subsection Adhesion
  set Work of adhesion = 0.45
  set Equilibrium separation = 0.5
end
subsection Adhesion limits
  set Lowest work of adhesion = 0.02
  set Highest work of adhesion = 2
end
subsection Fabrication check
  set Enabled = true
  set Work of adhesion range = 0.2, 0.6
  set Table rows = 4
end
subsection Solver
  set Load steps = 1
end
subsection Output
  set Base name = demo-grating
end
)";
} // namespace

int main(int argc, char **argv)
{
  nappe::CaseApp app;
  app.name        = "nappe-limits";
  app.description = "follows the equilibrium while the work of adhesion is lowered from the conformed state and "
                    "raised from the laid-down state, and reports Gamma_hold, Gamma_eq and Gamma_snap with their "
                    "brackets (and, if the case asks, a fabrication check); writes <stem>_limits.json and "
                    "<stem>_adhesion_paths.csv.";
  app.demo_case       = demo_case;
  app.result_suffixes = {"_limits.json", "_adhesion_paths.csv"};
  app.plot_script = "plot_limits.py";
  app.run = [](dealii::ParameterHandler &prm, const nappe::SheetCase &c, MPI_Comm comm, bool quiet) {
    std::ostream *const    out = dealii::Utilities::MPI::this_mpi_process(comm) == 0 ? &std::cout : nullptr;
    const nappe::LimitsRun run = nappe::run_adhesion_limits(prm, c, comm, out, quiet ? nullptr : out);
    return nappe::CaseOutcome{run.complete() ? 0 : 2, true};
  };
  return nappe::run_case_app(argc, argv, app);
}
