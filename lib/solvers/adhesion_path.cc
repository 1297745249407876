#include <deal.II/base/timer.h>

#include <nappe/base/message_number.h>
#include <nappe/solvers/load_stepping.h>
#include <nappe/solvers/mesh_adaptation.h>
#include <nappe/solvers/path_tangent.h>

#include "path_follower.h"

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace internal
  {
    namespace
    {
      // The predictor–corrector paths use the trust-region corrector; the earlier bisection keeps the
      // problem's own minimiser (the line search by default), as before.
      MinimizerSettings corrector_settings(const SheetProblem &p, const AdhesionPathSettings &s)
      {
        MinimizerSettings m = p.newton;
        if (s.method == ContinuationMethod::predictor_corrector)
          {
            m.method          = MinimizerMethod::trust_region;
            m.max_chord_steps = 8;
          }
        return m;
      }

      const AdhesionPotential &adhesion_of(const SheetProblem &p)
      {
        AssertThrow(p.model.adhesion(),
                    dealii::ExcMessage("Adhesion limits need a substrate: set Substrate/Enabled = true."));
        return *p.model.adhesion();
      }
    } // namespace

    PathFollower::PathFollower(const SheetProblem &p, const AdhesionPathSettings &s, const PathMeasure &measure,
                               MPI_Comm comm, std::ostream *log)
      : problem_(p)
      , adhesion_(adhesion_of(p))
      , settings_(s)
      , measure_(measure)
      , system_(p.model, p.domain, comm)
      , minimizer_(make_minimizer())
      , log_(log)
      , w_dofs_(deflection_dofs(system_))
    {
    }

    std::unique_ptr<EnergyMinimizer> PathFollower::make_minimizer()
    {
      return std::make_unique<EnergyMinimizer>(system_, corrector_settings(problem_, settings_), nullptr,
                                               make_hessian_solvers(problem_.solver, system_));
    }

    bool PathFollower::adapt_mesh(AdhesionPath &path, Vector &state, double gamma, bool whole)
    {
      const unsigned int cycles = problem_.adaptation.cycles, uniform = problem_.domain.global_refinements;
      if (cycles == 0)
        return false;
      Vector ghosted = system_.make_ghosted_vector();
      ghosted        = state;
      const CellErrorIndicators indicators = estimate_cell_errors(system_, ghosted, level(gamma));
      mark_cells(system_, indicators, problem_.adaptation, uniform, uniform + cycles, whole);
      // Along the path, coarsening alone is not worth a new minimisation.
      if (!any_cell_marked(system_, !whole))
        {
          for (const auto &cell : system_.mesh().active_cell_iterators())
            cell->clear_coarsen_flag();
          return false;
        }
      system_.adapt(state);
      minimizer_ = make_minimizer();
      w_dofs_    = deflection_dofs(system_);
      ++path.mesh_adaptations;
      path.largest_unknowns = std::max<unsigned long long>(path.largest_unknowns, system_.n_dofs());
      std::ostringstream line;
      line << std::setprecision(4) << "  mesh adapted at Γ = " << gamma << " J/m²: "
           << system_.dof_handler().get_triangulation().n_global_active_cells() << " cells, " << system_.n_dofs()
           << " unknowns\n";
      say(line.str());
      return true;
    }

    MinimizerReport PathFollower::finish_on_adapted_meshes(AdhesionPath &path, Vector &state, double gamma,
                                                           MinimizerReport report)
    {
      for (unsigned int cycle = 0; cycle < problem_.adaptation.cycles && !report.converged; ++cycle)
        {
          if (!adapt_mesh(path, state, gamma, false))
            break;
          ++path.solves;
          report = minimizer_->minimize(state, level(gamma), 0.0);
        }
      return report;
    }

    PathFollower::Remeshing PathFollower::refine_and_resolve(AdhesionPath &path, Vector &state, double gamma,
                                                             bool whole)
    {
      Remeshing r;
      const double before = fraction_of(state, gamma);
      r.changed           = adapt_mesh(path, state, gamma, whole);
      if (!r.changed)
        return r;
      ++path.solves;
      const Vector          carried = state;
      const MinimizerReport report  = minimizer_->minimize(state, level(gamma), 0.0);
      r.newton_iterations           = report.iterations;
      std::ostringstream s;
      s << std::setprecision(4) << "on the mesh refined at Γ = " << gamma << " J/m² ("
        << system_.dof_handler().get_triangulation().n_global_active_cells() << " cells, " << system_.n_dofs()
        << " unknowns) ";
      if (!report.converged)
        s << "no stable state was found again (last residual " << std::scientific << std::setprecision(3)
          << report.residual << " N: " << report.message << ")";
      else if (whole)
        return r; // the start: there is no branch yet to stay on
      else
        {
          const double after = fraction_of(state, gamma);
          if (std::abs(after - before) <= settings_.largest_fraction_change &&
              max_deflection_change(state, carried) <= settings_.largest_deflection_change *
                                                         adhesion_.law().equilibrium_gap())
            return r;
          s << "the state left the branch it was on (conformed fraction " << before << " → " << after << ")";
        }
      r.stayed     = false;
      path.message = s.str() + "; the coarser mesh did not resolve it: start from a finer mesh (Domain/Global "
                               "refinements) or with more Mesh adaptation/Cycles";
      return r;
    }

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

    double PathFollower::fraction_of(const Vector &owned, double gamma) const
    {
      Vector ghosted = system_.make_ghosted_vector();
      ghosted        = owned;
      return measure_.fraction ? measure_.fraction(system_, ghosted, level(gamma)) :
                                 measure_.measure(system_, ghosted, level(gamma)).conformed_fraction;
    }

    double PathFollower::max_deflection_change(const Vector &a, const Vector &b) const
    {
      Vector difference = a;
      difference -= b;
      return largest_entry(difference, w_dofs_, system_.communicator());
    }

    double PathFollower::next_gamma(double gamma, double step, bool lowering) const
    {
      double next = lowering ? std::max(settings_.lowest_work_of_adhesion, gamma * std::exp(-step))
                             : std::min(settings_.highest_work_of_adhesion, gamma * std::exp(step));
      for (const double stop : settings_.stops)
        if (lowering ? (stop < gamma * (1 - 1e-12) && stop > next) : (stop > gamma * (1 + 1e-12) && stop < next))
          next = stop;
      return next;
    }

    void PathFollower::progress(const AdhesionPath &path, double gamma)
    {
      const double covered = std::log(gamma / range_start_) / std::log(range_end_ / range_start_);
      if (covered < 0.25 * next_quarter_ - 1e-9 || next_quarter_ > 3)
        return;
      while (next_quarter_ <= 3 && covered >= 0.25 * next_quarter_ - 1e-9)
        ++next_quarter_;
      const double elapsed = timer_.wall_time();
      std::ostringstream s;
      s << "  " << (path.lowering ? "lowering" : "raising") << " Γ: " << std::lround(100 * covered)
        << " % of the range done (Γ = " << std::setprecision(3) << gamma << " J/m², " << path.solves
        << " minimisations, " << std::lround(elapsed) << " s; about " << std::lround(elapsed * (1 - covered) / covered)
        << " s left on this path)\n";
      say(s.str());
    }

    AdhesionPath PathFollower::run(StartProtocol start)
    {
      timer_.restart();
      AdhesionPath path;
      path.value_names = measure_.names;
      path.lowering    = start == StartProtocol::grown_conformal;
      path.largest_unknowns = system_.n_dofs();
      range_start_ = path.lowering ? settings_.highest_work_of_adhesion : settings_.lowest_work_of_adhesion;
      range_end_   = path.lowering ? settings_.lowest_work_of_adhesion : settings_.highest_work_of_adhesion;
      double gamma = range_start_;
      std::ostringstream head;
      head << std::setprecision(3) << (path.lowering ? "Lowering Γ from the conformed state" :
                                                       "Raising Γ from the laid-down state")
           << " (" << range_start_ << " → " << range_end_ << " J/m²)\n";
      say(head.str());

      SheetProblem start_problem = problem_;
      start_problem.start        = start;
      Vector state               = initial_state(system_, start_problem);
      const LoadPathReport load =
        follow_load_path(*minimizer_, state, problem_.stepping, nullptr, level(gamma).adhesion);
      path.solves += load.steps.size();
      if (!load.converged)
        {
          path.message = "no stable starting state at Γ = " + std::to_string(gamma) + " J/m²: " + load.message;
          path.wall_time = timer_.wall_time();
          return path;
        }
      unsigned int newton = load.newton_iterations;
      for (unsigned int cycle = 0; cycle < problem_.adaptation.cycles; ++cycle)
        {
          const Remeshing r = refine_and_resolve(path, state, gamma, true);
          newton += r.newton_iterations;
          if (!r.stayed)
            {
              path.wall_time = timer_.wall_time();
              return path;
            }
          if (!r.changed)
            break;
        }
      path.points.push_back(measure(state, gamma, newton));
      if (settings_.method == ContinuationMethod::predictor_corrector)
        follow_by_continuation(path, state, gamma);
      else
        follow_by_bisection(path, state, gamma);
      path.complete  = path.message.empty();
      path.wall_time = timer_.wall_time();

      return path;
    }

    // The earlier stepping (ContinuationMethod::bisection): warm start from the last certified state;
    // a step that leaves the branch, or crosses the target fraction, is halved until it is within the
    // tolerance, then the jump (or crossing) is accepted.
    void PathFollower::follow_by_bisection(AdhesionPath &path, Vector &state, double gamma)
    {
      const double end   = range_end_;
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
          const MinimizerReport report = minimizer_->minimize(trial, level(next), 0.0);
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
          progress(path, gamma);
          step = continuous ? std::min(settings_.largest_step, 1.5 * step) : settings_.initial_step;
        }
    }
  } // namespace internal

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
                                   "expected 0 < lowest < highest, found " +
                                   message_number(s.lowest_work_of_adhesion) + " and " +
                                   message_number(s.highest_work_of_adhesion) + " J/m^2."));
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
    AssertThrow(problem.adaptation.cycles == 0 || settings.method == ContinuationMethod::predictor_corrector,
                dealii::ExcMessage("Mesh adaptation/Cycles = " + std::to_string(problem.adaptation.cycles) +
                                   ": the bisection continuation runs on a fixed mesh; use the predictor-corrector "
                                   "method or no mesh adaptation."));
    check_adhesion_path_settings(settings);
    internal::PathFollower follower(problem, settings, measure, comm, log);
    return follower.run(start);
  }
} // namespace nappe
