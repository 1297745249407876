// nappe-sweep: a design sweep over one or two case parameters — a table (CSV, JSON) of every
// point and plots (regime map, peak strain, Γ_hold contours, Γ–fraction curves, PNG and SVG).
// Finished points are kept, so an interrupted sweep resumes when it is run again. MPI ranks share
// out the points (each point runs on one rank).
//
// Sample runs:
//   nappe-sweep benchmarks/sweeps/grating_family.prm
//   mpirun -np 2 nappe-sweep sweep.prm               two points at a time
//   nappe-sweep sweep.prm --max-points 3             compute at most 3 new points, then stop
//   nappe-sweep --print-defaults                     the sweep file's entries, documented
#include <deal.II/base/mpi.h>

#include <nappe/analysis/design_sweep.h>
#include <nappe/io/command_line.h>

#include <iostream>

namespace
{
  const char *usage = "usage: nappe-sweep SWEEP.prm [--max-points N] [--no-plots]\n"
                      "       nappe-sweep --print-defaults\n";

  /// Runs the plotting script on the finished sweep; returns false if it could not.
  bool plot(const std::string &directory)
  {
    const auto [python, script] = nappe::sweep_plotter();
    if (python.empty() || script.empty())
      {
        std::cerr << "nappe-sweep: warning: no plots: python3 or plot_sweep.py not found (set NAPPE_PYTHON)\n";
        return false;
      }
    const std::string command = "'" + python + "' '" + script + "' '" + directory + "'";
    std::cout << "Plotting: " << command << "\n" << std::flush;
    return std::system(command.c_str()) == 0;
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
      if (args.empty() || args[0] == "--help" || args[0] == "-h")
        {
          if (root)
            std::cout << usage;
          return args.empty() ? 1 : 0;
        }
      if (args[0] == "--print-defaults")
        {
          dealii::ParameterHandler prm;
          nappe::declare_sweep_parameters(prm);
          if (root)
            prm.print_parameters(std::cout, dealii::ParameterHandler::PRM);
          return 0;
        }
      unsigned int max_points = std::numeric_limits<unsigned int>::max();
      bool         plots      = true;
      for (std::size_t i = 1; i < args.size(); ++i)
        if (args[i] == "--max-points" && i + 1 < args.size())
          max_points = std::stoul(args[++i]);
        else if (args[i] == "--no-plots")
          plots = false;
        else
          throw std::runtime_error("unexpected argument '" + args[i] + "'\n" + usage);

      const nappe::SweepSpec spec = nappe::read_sweep(args[0]);
      if (root)
        std::cout << "Sweep '" << spec.title << "': " << spec.n_points() << " points"
                  << (spec.thresholds ? " with Γ thresholds" : "") << ", output in " << spec.output_directory << "\n";
      const nappe::SweepProgress progress = nappe::run_sweep(spec, MPI_COMM_WORLD, max_points, &std::cout);
      if (!root)
        return 0;
      std::cout << progress.computed << " points computed now (" << progress.failed << " failed), "
                << progress.already_done << " kept from an earlier run, of " << progress.total << "\n";
      if (!progress.complete)
        {
          std::cout << "Sweep incomplete: run the same command again to resume.\n";
          return 3;
        }
      std::cout << "Table: " << spec.output_directory << "/sweep.csv, " << spec.output_directory << "/sweep.json\n";
      if (plots && !plot(spec.output_directory))
        return 4;
      std::cout << "Model estimates: confirm by measurement before fabrication decisions.\n";
      return progress.failed > 0 ? 2 : 0;
    }
  catch (const std::exception &e)
    {
      if (root)
        std::cerr << "nappe-sweep: error: " << nappe::user_message(e) << "\n";
      return 1;
    }
}
