// nappe-limits: the works of adhesion that decide whether a sheet stays on a topography —
// Γ_hold, Γ_eq and Γ_snap with their brackets and the Γ–fraction/energy curves — and, if the
// case asks for it, a fabrication check over an interface's range of Γ.
//
// Sample runs:
//   nappe-limits --demo                                  built-in demo: graphene on a 1D grating
//   nappe-limits case.prm --set "Adhesion limits/Lowest work of adhesion=0.05"
//   mpirun -np 2 nappe-limits case.prm                   distributed (each path on all ranks)
//   nappe-limits --print-defaults                        every parameter, documented, with its unit
#include <deal.II/base/mpi.h>
#include <deal.II/base/parameter_handler.h>

#include <nappe/analysis/fabrication_check.h>
#include <nappe/io/atomic_file.h>
#include <nappe/io/command_line.h>
#include <nappe/io/limits_report.h>
#include <nappe/io/sheet_case.h>

#include <iostream>
#include <sstream>

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

  const char *usage = "usage: nappe-limits CASE.prm [--set Section/Entry=value]...\n"
                      "       nappe-limits --demo [--set …] | --print-defaults | --validate CASE.prm\n";

  /// The case with the feature height set to @p height [m] through its case-file entry.
  nappe::SheetCase case_with_height(dealii::ParameterHandler &prm, const std::string &entry, double height)
  {
    std::ostringstream value;
    value << std::setprecision(12) << height * 1e9;
    nappe::apply_override(prm, entry + "=" + value.str());
    return nappe::parse_sheet_case(prm);
  }

  int run(dealii::ParameterHandler &prm, const nappe::SheetCase &c, bool root)
  {
    std::ostream *log = root ? &std::cout : nullptr;
    AssertThrow(c.adhesion, dealii::ExcMessage("Substrate/Enabled: nappe-limits needs a substrate (true)."));
    nappe::AdhesionPathSettings settings = c.limits;
    if (c.fabrication.enabled)
      {
        settings.stops = nappe::verdict_work_of_adhesion_values(c.fabrication);
        settings.lowest_work_of_adhesion  = std::min(settings.lowest_work_of_adhesion, settings.stops.front());
        settings.highest_work_of_adhesion = std::max(settings.highest_work_of_adhesion, settings.stops.back());
      }
    const nappe::AdhesionLimits limits = nappe::find_adhesion_limits(c, settings, MPI_COMM_WORLD, log);
    std::optional<nappe::FabricationCheck> check;
    if (c.fabrication.enabled)
      {
        check = nappe::fabrication_verdicts(limits, c.fabrication, c.model.material.fracture_strain);
        if (!c.fabrication.feature_height_entry.empty())
          {
            if (log)
              *log << "Scanning the feature height (" << c.fabrication.feature_height_entry << ")\n";
            dealii::ParameterHandler &handler = prm;
            nappe::scan_aspect_ratio(
              *check, c.fabrication, c.limits,
              [&](double h) { return case_with_height(handler, c.fabrication.feature_height_entry, h); },
              MPI_COMM_WORLD, 6, log);
          }
      }
    const std::string base = c.output_directory + "/" + c.output_name;
    if (root)
      {
        nappe::write_adhesion_paths_csv(base + "_adhesion_paths.csv", limits);
        nappe::write_limits_json(base + "_limits.json", c, limits, check ? &*check : nullptr);
        nappe::print_limits_summary(c, limits, std::cout);
        if (check)
          nappe::print_fabrication_check(c, *check, std::cout);
        std::cout << "Results: " << base << "_limits.json, " << base << "_adhesion_paths.csv\n";
      }
    const bool complete = limits.lowering.complete && limits.raising.complete;
    return complete ? 0 : 2;
  }
} // namespace

int main(int argc, char **argv)
{
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  dealii::deal_II_exceptions::suppress_stacktrace_in_exceptions();
  const bool root = dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0;
  try
    {
      std::vector<std::string> args(argv + 1, argv + argc);
      dealii::ParameterHandler prm;
      nappe::declare_sheet_case_parameters(prm);
      if (args.empty() || args[0] == "--help" || args[0] == "-h")
        {
          if (root)
            std::cout << usage;
          return args.empty() ? 1 : 0;
        }
      if (args[0] == "--print-defaults")
        {
          if (root)
            prm.print_parameters(std::cout, dealii::ParameterHandler::PRM);
          return 0;
        }
      const bool validate_only = args[0] == "--validate";
      if (validate_only)
        args.erase(args.begin());
      nappe::read_case_arguments(prm, args, demo_case, usage);
      const nappe::SheetCase c = nappe::parse_sheet_case(prm);
      if (validate_only)
        {
          if (root)
            std::cout << "case file is valid: " << c.title << "\n";
          return 0;
        }
      if (root)
        nappe::write_atomically(c.output_directory + "/" + c.output_name + ".used.prm",
                                [&](std::ostream &s) { prm.print_parameters(s, dealii::ParameterHandler::PRM); });
      return run(prm, c, root);
    }
  catch (const std::exception &e)
    {
      if (root)
        std::cerr << "nappe-limits: error: " << nappe::user_message(e) << "\n";
      return 1;
    }
}
