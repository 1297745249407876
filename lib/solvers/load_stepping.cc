#include <deal.II/base/timer.h>

#include <nappe/solvers/load_stepping.h>

#include <iomanip>
#include <sstream>

namespace nappe
{
  LoadPathReport follow_load_path(EnergyMinimizer &minimizer, Vector &state, const LoadSteppingSettings &settings,
                                  std::ostream *log, double adhesion_factor)
  {
    dealii::Timer  timer;
    LoadPathReport path;
    AssertThrow(settings.load_steps > 0, dealii::ExcMessage("Solver/Load steps must be at least 1."));
    const double increment = 1.0 / settings.load_steps;
    double       lambda    = 0.0;
    double       step      = increment;
    Vector       last      = state;
    while (lambda < 1.0 - 1e-12)
      {
        const double target = std::min(1.0, lambda + step);
        if (log)
          *log << "  load step " << path.steps.size() + 1 << ": λ = " << std::setprecision(4) << target << " ("
               << std::setprecision(3) << timer.wall_time() << " s elapsed)\n";
        MinimizerReport report = minimizer.minimize(state, LoadLevel(target, adhesion_factor), 0.0);
        path.newton_iterations += report.iterations;
        if (report.converged)
          {
            lambda = target;
            last   = state;
            path.steps.push_back({lambda, report});
            continue;
          }
        state = last;
        if (path.step_cuts++ >= settings.max_step_cuts)
          {
            std::ostringstream s;
            s << "Newton did not reach a stable state at load factor " << target << " (" << report.message
              << "). Try more load steps (Solver/Load steps), a finer mesh, or check that the case is supported.";
            path.message   = s.str();
            path.wall_time = timer.wall_time();
            return path;
          }
        step *= 0.5;
        if (log)
          *log << "  step failed (" << report.message << "); halving the increment\n";
      }
    path.converged = true;
    path.message   = "stable equilibrium reached at full load";
    path.wall_time = timer.wall_time();
    return path;
  }
} // namespace nappe
