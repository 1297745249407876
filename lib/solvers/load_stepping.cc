#include <deal.II/base/timer.h>

#include <nappe/solvers/load_stepping.h>
#include <nappe/solvers/path_tangent.h>

#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace
  {
    /// Whether a minimisation that ran out of iterations was still lowering the energy by more than 1e-4 of
    /// its scale over its last 10 iterations (common practice, no source): on its way, not stalled.
    bool still_descending(const MinimizerReport &report)
    {
      const auto &h = report.history;
      if (!report.out_of_iterations || h.size() < 11)
        return false;
      const EnergyParts &e     = report.parts;
      const double       scale = std::abs(e.stretching) + std::abs(e.bending) + std::abs(e.substrate) +
                           std::abs(e.external_work);
      return h[h.size() - 11].energy - h.back().energy > 1e-4 * scale;
    }

    /// What to try after a failed load path, from its cause.
    std::string advice(const SheetModel &model, const MinimizerReport &report)
    {
      if (still_descending(report))
        return "The sheet was still on its way (the energy still falling): raise Solver/Max Newton iterations; an "
               "adhesion front that sweeps across the substrate takes a few iterations per element it crosses.";
      if (report.message.find("indefinite") != std::string::npos)
        return "Check the supports (Edges/Conditions) and the loads: the sheet has no stable state as modelled.";
      if (report.message.find("badly scaled") != std::string::npos)
        return "Check the units of the entries, then refine the mesh where the sheet touches.";
      if (!model.loads.any())
        return "This case has no loads, so load steps change nothing: the sheet must find its way onto the substrate "
               "in one minimisation. Try Substrate/Protocol = grown conformal, follow the work of adhesion with "
               "nappe-limits (its paths reach such states by continuation), or refine the mesh at the contact front "
               "(Domain/Global refinements).";
      return "Try more load steps (Solver/Load steps) or a finer mesh (Domain/Global refinements).";
    }
  } // namespace

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
    Vector       tangent; // dU/dλ at the last certified state, once there is one
    while (lambda < 1.0 - 1e-12)
      {
        const double target = std::min(1.0, lambda + step);
        if (log)
          *log << "  load step " << path.steps.size() + 1 << ": λ = " << std::setprecision(4) << target << " ("
               << std::setprecision(3) << timer.wall_time() << " s elapsed)\n";
        if (tangent.size() > 0)
          {
            state.add(target - lambda, tangent);
            minimizer.system().constraints().distribute(state);
          }
        MinimizerReport report = minimizer.minimize(state, LoadLevel(target, adhesion_factor), 0.0);
        path.newton_iterations += report.iterations;
        unsigned int continued = 0;
        for (; continued < settings.max_continuations && still_descending(report); ++continued)
          {
            if (log)
              *log << "  still descending after " << report.iterations
                   << " Newton iterations (the energy keeps falling): continuing from there\n";
            report = minimizer.minimize(state, LoadLevel(target, adhesion_factor), 0.0);
            path.newton_iterations += report.iterations;
          }
        if (report.converged)
          {
            lambda = target;
            last   = state;
            path.steps.push_back({lambda, report});
            if (settings.tangent_predictor && lambda < 1.0 - 1e-12)
              tangent = path_tangent(minimizer, state, LoadLevel(lambda, adhesion_factor), PathParameter::load);
            continue;
          }
        state = last;
        if (path.step_cuts++ >= settings.max_step_cuts)
          {
            std::ostringstream s;
            s << "Newton did not reach a stable state at load factor " << target << " ("
              << (continued ? std::to_string(continued) + " continuation(s), then " : std::string()) << report.message
              << "). " << advice(minimizer.system().model(), report);
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
