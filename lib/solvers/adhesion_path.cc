#include <deal.II/base/timer.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/component_mask.h>

#include <nappe/physics/adhesion_potential.h>
#include <nappe/solvers/adhesion_path.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/load_stepping.h>

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace
  {
    const AdhesionPotential &adhesion_of(const SheetProblem &p)
    {
      AssertThrow(p.model.adhesion(),
                  dealii::ExcMessage("Adhesion limits need a substrate: set Substrate/Enabled = true."));
      return *p.model.adhesion();
    }

    /// One path: the system, the minimiser and the last certified state; Γ enters as the adhesion
    /// factor c = Γ/Γ_problem.
    class PathFollower
    {
    public:
      PathFollower(const SheetProblem &p, const AdhesionPathSettings &s, const PathMeasure &measure, MPI_Comm comm,
                   std::ostream *log)
        : problem_(p)
        , adhesion_(adhesion_of(p))
        , settings_(s)
        , measure_(measure)
        , system_(p.model, p.domain, comm)
        , minimizer_(system_, p.newton, nullptr, make_hessian_solvers(p.solver, comm))
        , log_(log)
        , w_dofs_(dealii::DoFTools::extract_dofs(system_.dof_handler(), dealii::ComponentMask({false, false, true})))
      {
      }

      AdhesionPath run(StartProtocol start);

    private:
      double    problem_gamma() const { return adhesion_.law().work_of_adhesion(); }
      LoadLevel level(double gamma) const { return LoadLevel(1.0, gamma / problem_gamma()); }
      AdhesionPathPoint measure(const Vector &owned, double gamma, unsigned int iterations) const;
      double            max_deflection_change(const Vector &a, const Vector &b) const;
      double            next_gamma(double gamma, double step, bool lowering) const;
      void              say(const std::string &s) const
      {
        if (log_)
          *log_ << s << std::flush;
      }

      const SheetProblem      &problem_;
      const AdhesionPotential &adhesion_;
      AdhesionPathSettings     settings_;
      const PathMeasure       &measure_;
      SheetSystem              system_;
      EnergyMinimizer          minimizer_;
      std::ostream            *log_;
      dealii::IndexSet         w_dofs_;
    };

    AdhesionPathPoint PathFollower::measure(const Vector &owned, double gamma, unsigned int iterations) const
    {
      Vector ghosted = system_.make_ghosted_vector();
      ghosted        = owned;
      const double      area = system_.domain().area();
      const EnergyParts e    = system_.energy(ghosted, level(gamma));
      AdhesionPathPoint p;
      p.work_of_adhesion              = gamma;
      p.energy_per_area.stretching    = e.stretching / area;
      p.energy_per_area.bending       = e.bending / area;
      p.energy_per_area.substrate     = e.substrate / area;
      p.energy_per_area.external_work = e.external_work / area;
      StateSummary summary            = measure_.measure(system_, ghosted, level(gamma));
      p.conformed_fraction            = summary.conformed_fraction;
      p.values                        = std::move(summary.values);
      p.newton_iterations             = iterations;
      return p;
    }

    double PathFollower::max_deflection_change(const Vector &a, const Vector &b) const
    {
      double change = 0.0;
      for (const auto i : w_dofs_)
        change = std::max(change, std::abs(a(i) - b(i)));
      return dealii::Utilities::MPI::max(change, system_.communicator());
    }

    /// The next Γ: one step in ln Γ, not past the range's end nor past the next stop.
    double PathFollower::next_gamma(double gamma, double step, bool lowering) const
    {
      double next = lowering ? std::max(settings_.lowest_work_of_adhesion, gamma * std::exp(-step))
                             : std::min(settings_.highest_work_of_adhesion, gamma * std::exp(step));
      for (const double stop : settings_.stops)
        if (lowering ? (stop < gamma * (1 - 1e-12) && stop > next) : (stop > gamma * (1 + 1e-12) && stop < next))
          next = stop;
      return next;
    }

    /// How far a path has come through its Γ range (in ln Γ, the way it steps) and, from the time spent,
    /// about how long the rest takes.
    struct PathProgress
    {
      double start, end;

      std::string at(const double gamma, const double elapsed) const
      {
        const double done = std::clamp(std::log(gamma / start) / std::log(end / start), 0.0, 1.0);
        std::ostringstream s;
        s << "; " << std::lround(100 * done) << " % of the range done";
        if (done > 0.0 && done < 1.0)
          s << ", about " << std::lround(elapsed * (1 - done) / done) << " s left on this path";
        return s.str();
      }
    };

    std::string describe(const AdhesionPathPoint &p, const std::string &progress)
    {
      std::ostringstream s;
      s << std::setprecision(5) << "  Γ = " << p.work_of_adhesion << " J/m²: conformed " << std::setprecision(4)
        << 100 * p.conformed_fraction << " %, energy " << std::setprecision(5) << p.energy_per_area.total()
        << " J/m² (" << p.newton_iterations << " Newton iterations" << (p.after_jump ? ", after a jump" : "")
        << progress << ")\n";
      return s.str();
    }

    AdhesionPath PathFollower::run(StartProtocol start)
    {
      dealii::Timer timer;
      AdhesionPath  path;
      path.value_names = measure_.names;
      path.lowering    = start == StartProtocol::grown_conformal;
      double gamma  = path.lowering ? settings_.highest_work_of_adhesion : settings_.lowest_work_of_adhesion;
      const double end = path.lowering ? settings_.lowest_work_of_adhesion : settings_.highest_work_of_adhesion;
      say(std::string(path.lowering ? "Lowering Γ from the conformed state" : "Raising Γ from the laid-down state") +
          "\n");

      SheetProblem start_problem = problem_;
      start_problem.start        = start;
      Vector state               = initial_state(system_, start_problem);
      const LoadPathReport load =
        follow_load_path(minimizer_, state, problem_.stepping, nullptr, level(gamma).adhesion);
      path.solves += load.steps.size();
      if (!load.converged)
        {
          path.message = "no stable starting state at Γ = " + std::to_string(gamma) + " J/m²: " + load.message;
          return path;
        }
      path.points.push_back(measure(state, gamma, load.newton_iterations));
      const PathProgress progress{gamma, end};
      say(describe(path.points.back(), progress.at(gamma, timer.wall_time())));

      const double h0    = adhesion_.law().equilibrium_gap();
      double       step  = settings_.initial_step;
      Vector       trial = state;
      while (std::abs(gamma - end) > 1e-12 * end)
        {
          if (path.solves++ >= settings_.max_solves)
            {
              path.message = "gave up after " + std::to_string(settings_.max_solves) +
                             " minimisations at Γ = " + std::to_string(gamma) +
                             " J/m²; raise the solve budget or loosen Adhesion limits/Relative tolerance";
              break;
            }
          const double next = next_gamma(gamma, step, path.lowering);
          const bool   at_tolerance = std::abs(std::log(next / gamma)) <= settings_.relative_tolerance * 1.000001;
          trial                        = state;
          const MinimizerReport report = minimizer_.minimize(trial, level(next), 0.0);
          if (!report.converged)
            {
              if (at_tolerance)
                {
                  std::ostringstream s;
                  s << "no stable state at Γ = " << next << " J/m² next to the certified state at Γ = " << gamma
                    << " J/m² (last residual " << std::scientific << std::setprecision(3) << report.residual
                    << " N: " << report.message << "); try a finer mesh or a smaller Adhesion limits/Relative tolerance";
                  path.message = s.str();
                  break;
                }
              step *= 0.5;
              continue;
            }
          AdhesionPathPoint  point = measure(trial, next, report.iterations);
          const auto        &last  = path.points.back();
          const bool continuous    = std::abs(point.conformed_fraction - last.conformed_fraction) <=
                                    settings_.largest_fraction_change &&
                                  max_deflection_change(trial, state) <= settings_.largest_deflection_change * h0;
          const bool crosses = (point.conformed_fraction >= settings_.target_fraction) !=
                               (last.conformed_fraction >= settings_.target_fraction);
          if ((!continuous || crosses) && !at_tolerance)
            {
              step *= 0.5;
              continue;
            }
          point.after_jump = !continuous;
          state            = trial;
          gamma            = next;
          path.points.push_back(point);
          say(describe(point, progress.at(point.work_of_adhesion, timer.wall_time())));
          step = continuous ? std::min(settings_.largest_step, 1.5 * step) : settings_.initial_step;
        }
      path.complete  = path.message.empty();
      path.wall_time = timer.wall_time();
      return path;
    }
  } // namespace

  double AdhesionPath::value(const AdhesionPathPoint &point, const std::string &name) const
  {
    const auto it = std::find(value_names.begin(), value_names.end(), name);
    AssertThrow(it != value_names.end() && point.values.size() == value_names.size(),
                dealii::ExcMessage("The adhesion path has no value '" + name + "'."));
    return point.values[it - value_names.begin()];
  }

  void check_adhesion_path_settings(const AdhesionPathSettings &s)
  {
    AssertThrow(s.lowest_work_of_adhesion > 0 && s.highest_work_of_adhesion > s.lowest_work_of_adhesion,
                dealii::ExcMessage("Adhesion limits/Lowest work of adhesion, Highest work of adhesion: "
                                   "expected 0 < lowest < highest, found " + std::to_string(s.lowest_work_of_adhesion) + " and " +
                                   std::to_string(s.highest_work_of_adhesion) + " J/m^2."));
    AssertThrow(s.target_fraction > 0 && s.target_fraction <= 1,
                dealii::ExcMessage("Adhesion limits/Target conformed fraction: expected a number in (0, 1]."));
    AssertThrow(s.relative_tolerance > 0 && s.initial_step >= s.relative_tolerance &&
                  s.largest_step >= s.initial_step,
                dealii::ExcMessage("Adhesion limits: expected 0 < Relative tolerance <= Initial step <= "
                                   "Largest step."));
  }

  AdhesionPath follow_adhesion_path(const SheetProblem &problem, StartProtocol start,
                                    const AdhesionPathSettings &settings, const PathMeasure &measure, MPI_Comm comm,
                                    std::ostream *log)
  {
    check_adhesion_path_settings(settings);
    PathFollower follower(problem, settings, measure, comm, log);
    return follower.run(start);
  }
} // namespace nappe
