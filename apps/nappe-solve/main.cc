// nappe-solve: runs a sheet case file end to end and writes a JSON summary and VTU fields.
//
// Sample runs:
//   nappe-solve --demo                                 built-in demo: MoS2 on a nanopillar array
//   nappe-solve case.prm --set "Loads/Pressure=50"     a case file with an override
//   mpirun -np 2 nappe-solve case.prm                  distributed
//   nappe-solve --print-defaults > case.prm            every parameter, documented, with its unit
//   nappe-solve --validate case.prm                    check a case file without running it
//   nappe-solve --list-materials                       the material and interface catalogue
#include <deal.II/base/mpi.h>
#include <deal.II/base/parameter_handler.h>

#include <nappe/io/atomic_file.h>
#include <nappe/io/command_line.h>
#include <nappe/io/sheet_run.h>
#include <nappe/physics/material_catalogue.h>

#include <iostream>
#include <sstream>

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

  const char *usage = "usage: nappe-solve CASE.prm [--set Section/Entry=value]...\n"
                      "       nappe-solve --demo | --print-defaults | --validate CASE.prm | --list-materials\n";

} // namespace

int main(int argc, char **argv)
{
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  dealii::deal_II_exceptions::suppress_stacktrace_in_exceptions();
  const bool   root = dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0;
  std::ostream &out = root ? std::cout : *new std::ostringstream;
  try
    {
      std::vector<std::string> args(argv + 1, argv + argc);
      dealii::ParameterHandler prm;
      nappe::declare_sheet_case_parameters(prm);
      if (args.empty() || args[0] == "--help" || args[0] == "-h")
        {
          out << usage;
          return args.empty() ? 1 : 0;
        }
      if (args[0] == "--print-defaults")
        {
          prm.print_parameters(out, dealii::ParameterHandler::PRM);
          return 0;
        }
      if (args[0] == "--list-materials")
        {
          nappe::MaterialCatalogue().print(out);
          return 0;
        }
      const bool validate_only = args[0] == "--validate";
      if (validate_only)
        args.erase(args.begin());
      nappe::read_case_arguments(prm, args, demo_case, usage);
      const nappe::SheetCase sheet_case = nappe::parse_sheet_case(prm);
      if (validate_only)
        {
          out << "case file is valid: " << sheet_case.title << "\n";
          return 0;
        }
      if (root)
        nappe::write_atomically(sheet_case.output_directory + "/" + sheet_case.output_name + ".used.prm",
                                [&](std::ostream &s) { prm.print_parameters(s, dealii::ParameterHandler::PRM); });
      const auto result = nappe::run_sheet_case(sheet_case, MPI_COMM_WORLD, root ? &std::cout : nullptr);
      if (root)
        nappe::print_summary(sheet_case, result, out);
      return result.converged ? 0 : 2;
    }
  catch (const std::exception &e)
    {
      if (root)
        std::cerr << "nappe-solve: error: " << nappe::user_message(e) << "\n";
      return 1;
    }
}
