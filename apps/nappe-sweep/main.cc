// nappe-sweep: a design sweep over one or two case parameters — a table (CSV, JSON) of every
// point and plots (regime map, peak strain, Γ_hold contours, Γ–fraction curves, PNG and SVG).
// Finished points are kept while their inputs are unchanged, so an interrupted sweep resumes when it
// is run again. MPI ranks share out the points (each point runs on one rank).
//
// Sample runs:
//   nappe-sweep benchmarks/sweeps/grating_family.prm
//   mpirun -np 2 nappe-sweep sweep.prm               two points at a time
//   nappe-sweep sweep.prm --max-points 3             compute at most 3 new points, then stop
//   nappe-sweep --print-defaults                     the sweep file's entries, documented
#include <deal.II/base/mpi.h>

#include <nappe/io/caution.h>
#include <nappe/runs/app_driver.h>
#include <nappe/runs/plotter.h>
#include <nappe/runs/sweep_run.h>

#include <iostream>
#include <limits>
#include <sstream>

namespace
{
  const char *usage = "usage: nappe-sweep SWEEP.prm [--max-points N] [--no-plots]\n"
                      "       nappe-sweep --print-defaults | --help\n";
  const char *description =
    "nappe-sweep: runs a case over one or two parameters (numbers or names such as materials), one solve or a "
    "threshold search per point, and writes sweep.csv, sweep.json and plots; rerun to resume.\n\n";

  /// A whole number ≥ 1 from the argument of --max-points.
  unsigned int count_argument(const std::string &text)
  {
    std::size_t used  = 0;
    long long   value = -1;
    try
      {
        value = std::stoll(text, &used);
      }
    catch (...)
      {
        used = 0;
      }
    AssertThrow(used == text.size() && value >= 1 && value <= std::numeric_limits<unsigned int>::max(),
                dealii::ExcMessage("--max-points: expected a whole number of points >= 1, found '" + text + "'"));
    return static_cast<unsigned int>(value);
  }

  int run(const std::vector<std::string> &args, MPI_Comm comm)
  {
    const bool         root = dealii::Utilities::MPI::this_mpi_process(comm) == 0;
    std::ostringstream silent;
    std::ostream      &out = root ? std::cout : silent;
    if (args.empty() || args[0] == "--help" || args[0] == "-h")
      {
        out << description << usage;
        return args.empty() ? 1 : 0;
      }
    if (args[0] == "--print-defaults")
      {
        dealii::ParameterHandler prm;
        nappe::declare_sweep_parameters(prm);
        prm.print_parameters(out, dealii::ParameterHandler::PRM);
        return 0;
      }
    AssertThrow(args[0].rfind("--", 0) != 0, dealii::ExcMessage("unknown option '" + args[0] + "'\n" + usage));
    unsigned int max_points = std::numeric_limits<unsigned int>::max();
    bool         plots      = true;
    for (std::size_t i = 1; i < args.size(); ++i)
      if (args[i] == "--max-points" && i + 1 < args.size())
        max_points = count_argument(args[++i]);
      else if (args[i] == "--no-plots")
        plots = false;
      else
        AssertThrow(false, dealii::ExcMessage("unexpected argument '" + args[i] + "'\n" + usage));

    const nappe::SweepSpec spec = nappe::read_sweep(args[0]);
    out << "Sweep '" << spec.title << "': " << spec.n_points() << " points"
        << (spec.thresholds ? " with Γ thresholds" : "") << ", output in " << spec.output_directory << "\n";
    const nappe::SweepProgress progress = nappe::run_sweep(spec, comm, max_points, &std::cout);
    out << progress.computed << " points computed now, " << progress.kept << " kept from an earlier run, of "
        << progress.total << "\n";
    if (!progress.complete)
      {
        out << "Sweep incomplete: run the same command again to resume.\n";
        return 3;
      }
    out << progress.failed << " of " << progress.total << " points failed (see the message column)\n";
    out << "Table: " << spec.output_directory << "/sweep.csv, " << spec.output_directory << "/sweep.json\n";
    if (plots && root && !nappe::run_plot_script("plot_sweep.py", {spec.output_directory}, out))
      return 4;
    out << nappe::model_caution() << "\n";
    return progress.failed > 0 ? 2 : 0;
  }
} // namespace

int main(int argc, char **argv)
{
  return nappe::run_guarded(argc, argv, "nappe-sweep", run);
}
