#include <deal.II/base/function.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/trust_region_step.h>

#include "matrix_diagonal.h"

#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// A smooth, rank-independent pseudo-random field (used to seed the curvature search, so that
    /// 1 and N ranks take the same path).
    class SeedField : public Function<2>
    {
    public:
      SeedField() : Function<2>(3) {}
      double value(const Point<2> &p, const unsigned int component) const override
      {
        const double s = std::sin(12.9898 * p[0] * 1e9 + 78.233 * p[1] * 1e9 + 3.1 * component) * 43758.5453;
        return component == 2 ? s - std::floor(s) - 0.5 : 0.0;
      }
    };

    /// Radius update of the trust region from ρ = actual/predicted decrease (Nocedal & Wright 2006,
    /// Algorithm 4.1): shrink to ¼ of the step when the model was poor, double it when the model was
    /// good and the step reached the boundary.
    double updated_radius(double radius, double ratio, double length)
    {
      if (ratio < 0.25)
        return 0.25 * length;
      if (ratio > 0.75 && length >= 0.9 * radius)
        return 2.0 * radius;
      return radius;
    }
  } // namespace

  EnergyMinimizer::EnergyMinimizer(SheetSystem &system, const MinimizerSettings &settings, std::ostream *log,
                                   HessianSolvers solvers)
    : system_(system)
    , settings_(settings)
    , log_(log)
    , solvers_(solvers.solver ? std::move(solvers) : make_hessian_solvers(SolverSettings(), system.communicator()))
    , residual_(system.make_owned_vector())
    , diagonal_(system.make_owned_vector())
    , magnitude_(system.make_owned_vector())
    , seed_(system.make_owned_vector())
  {
    VectorTools::interpolate(system_.mapping(), system_.dof_handler(), SeedField(), seed_);
    system_.constraints().set_zero(seed_);
    eigenvector_ = seed_;
  }

  double EnergyMinimizer::energy_scale(const EnergyParts &e)
  {
    return std::abs(e.stretching) + std::abs(e.bending) + std::abs(e.substrate) + std::abs(e.external_work);
  }

  // A very successful step that the trust region cut short (a snap through, a long way along negative
  // curvature): while the energy keeps falling, double the step along the same direction, which costs
  // energy evaluations only, where growing the region costs a Newton iteration per doubling (common
  // practice, no source). Returns the factor by which the step grew.
  double EnergyMinimizer::extend_step(Vector &state, const Vector &step, double energy, const LoadLevel &level) const
  {
    const unsigned int max_doublings = 10; // at most 2¹⁰ times the step (common practice, no source)
    Vector             increment = step, candidate = state;
    double             growth    = 1.0; // the state is x + growth·step
    for (unsigned int k = 0; k < max_doublings; ++k)
      {
        candidate = state;
        candidate += increment;
        system_.constraints().distribute(candidate);
        const double e = energy_at(candidate, level);
        if (!(e < energy))
          break;
        state  = candidate;
        energy = e;
        growth *= 2.0;
        increment *= 2.0;
      }
    return growth;
  }

  double EnergyMinimizer::energy_at(const Vector &owned_state, const LoadLevel &level) const
  {
    Vector ghosted = system_.make_ghosted_vector();
    ghosted        = owned_state;
    return system_.energy(ghosted, level).total();
  }

  // The tolerance is relative to the internal force magnitude (never zero at equilibrium), the
  // initial imbalance, the problem's physical force scale and the caller's scale, whichever is
  // largest. magnitude_ holds the force magnitude of the first assembly.
  double EnergyMinimizer::residual_tolerance(const LoadLevel &level, double force_scale, double first_residual) const
  {
    const double physical = system_.physical_force_scale(level); // infinite: not known
    const double physical_known = std::isfinite(physical) ? physical : 0.0;
    return settings_.relative_tolerance * std::max({force_scale, first_residual, magnitude_.l2_norm(), physical_known}) +
           settings_.absolute_tolerance;
  }

  std::string EnergyMinimizer::stalled_message(double residual, double physical) const
  {
    std::ostringstream why;
    why << "the residual stalled at " << std::scientific << std::setprecision(3) << residual
        << " N, above a millionth of the forces this problem exerts (" << physical
        << " N): either the case is badly scaled (check the units of its entries) or the mesh is too coarse for "
           "the stiffness of the adhesion law where the sheet touches (refine it)";
    return why.str();
  }

  void EnergyMinimizer::report_out_of_iterations(MinimizerReport &report) const
  {
    std::ostringstream s;
    s << "no convergence in " << settings_.max_iterations << " Newton iterations; last residual "
      << std::scientific << std::setprecision(3) << report.residual << " N against a tolerance of "
      << report.tolerance << " N";
    report.message           = s.str();
    report.out_of_iterations = true;
  }

  std::string EnergyMinimizer::converged_line(const MinimizerReport &report)
  {
    std::ostringstream s;
    s << "    Newton " << std::setw(2) << report.iterations << ": E = " << std::scientific << std::setprecision(6)
      << report.energy << " J, |R| = " << std::setprecision(2) << report.residual << " N, ";
    if (report.zero_pivots == 0)
      s << "stable (0 negative pivots)\n";
    else
      s << "neutrally stable (0 negative, " << report.zero_pivots << " zero pivot(s): the energy is constant along "
        << "a symmetry of the cell)\n";
    return s.str();
  }

  // S = diag|H|, floored at 1e-12 of its largest entry so that the scaled norm stays a norm.
  void EnergyMinimizer::set_scaling(const SparseMatrix &H)
  {
    internal::extract_diagonal(H, diagonal_);
    const double largest = diagonal_.linfty_norm();
    for (const auto i : diagonal_.locally_owned_elements())
      diagonal_(i) = std::max(std::abs(diagonal_(i)), 1e-12 * largest);
    diagonal_.compress(VectorOperation::insert);
  }

  MinimizerReport EnergyMinimizer::minimize(Vector &state, const LoadLevel &level, double force_scale,
                                            const IterateCheck &keep_going)
  {
    const bool reusable = hessian_current_ && regular_minimum_;
    hessian_current_    = false;
    return settings_.method == MinimizerMethod::trust_region ?
             minimize_trust_region(state, level, force_scale, keep_going, reusable) :
             minimize_line_search(state, level, force_scale, keep_going);
  }

  void EnergyMinimizer::solve_with_hessian(const Vector &rhs, Vector &solution) const
  {
    AssertThrow(hessian_current_, ExcMessage("EnergyMinimizer::solve_with_hessian needs a converged minimisation "
                                             "(the factorisation of the Hessian at its result)."));
    solvers_.solver->solve(rhs, solution);
  }

  LowestEigenpair EnergyMinimizer::lowest_curvature()
  {
    AssertThrow(hessian_current_, ExcMessage("EnergyMinimizer::lowest_curvature needs a converged minimisation."));
    set_scaling(system_.hessian_matrix());
    LowestEigenpair e = solvers_.certificate->lowest_eigenpair(system_.hessian_matrix(), diagonal_, eigenvector_);
    if (e.available)
      eigenvector_ = e.vector;
    return e;
  }

  MinimizerReport EnergyMinimizer::stopped_by_caller(MinimizerReport &report, unsigned int steps,
                                                     unsigned int factorizations)
  {
    report.stopped        = true;
    report.message        = "stopped by the caller after " + std::to_string(steps) + " iterations";
    report.factorizations = factorizations;
    return report;
  }

  double EnergyMinimizer::scaled_norm(const Vector &v) const
  {
    Vector weighted = v;
    weighted.scale(diagonal_);
    return std::sqrt(std::max(0.0, weighted * v));
  }

  bool EnergyMinimizer::chord_steps(Vector &state, const LoadLevel &level, double force_scale,
                                    const IterateCheck &keep_going, MinimizerReport &report, double &tolerance)
  {
    Vector     ghosted = system_.make_ghosted_vector();
    Vector     trial = system_.make_owned_vector(), correction = system_.make_owned_vector();
    const auto correction_at = [&](Vector &c) { // c = −H₀⁻¹R, with the factorisation of H₀
      solvers_.solver->solve(residual_, c);
      c *= -1.0;
      system_.constraints().set_zero(c);
      return scaled_norm(c);
    };
    ghosted       = state;
    EnergyParts e = system_.assemble(ghosted, level, residual_, nullptr, tolerance < 0.0 ? &magnitude_ : nullptr);
    double      r = residual_.l2_norm();
    if (tolerance < 0.0)
      tolerance = residual_tolerance(level, force_scale, r);
    double length = r <= tolerance ? 0.0 : correction_at(correction);
    for (unsigned int k = 0; k < settings_.max_chord_steps && r > tolerance; ++k)
      {
        trial = state;
        trial += correction;
        system_.constraints().distribute(trial);
        ghosted                 = trial;
        const EnergyParts after = system_.assemble(ghosted, level, residual_, nullptr, nullptr);
        // A minimiser, not a root finder: the energy must not rise beyond round-off (as for trust-region steps).
        if (!(after.total() <= e.total() + 1e-12 * energy_scale(e)))
          break;
        state = trial;
        e     = after;
        r     = residual_.l2_norm();
        ++report.chord_steps;
        IterationRecord rec{k, e.total(), r, length, 0.0, 0, 0.0, 0};
        rec.chord = true;
        report.history.push_back(rec);
        if (keep_going && !keep_going(state, rec))
          return false;
        if (log_)
          *log_ << "    chord " << std::setw(2) << k << ": E = " << std::scientific << std::setprecision(6) << e.total()
                << " J, |R| = " << std::setprecision(2) << r << " N\n"
                << std::flush;
        if (r <= tolerance)
          break;
        const double previous = length;
        length                = correction_at(correction);
        if (!(length < 0.5 * previous)) // the contraction θ ≥ ½: that Hessian no longer serves
          break;
      }
    return true;
  }

  MinimizerReport EnergyMinimizer::minimize_trust_region(Vector &state, const LoadLevel &level, double force_scale,
                                                         const IterateCheck &keep_going, bool reuse_factorization)
  {
    MinimizerReport        report;
    Vector                 ghosted = system_.make_ghosted_vector();
    Vector                 trial   = system_.make_owned_vector();
    SparseMatrix          &H       = system_.hessian_matrix();
    MoreSorensenSubproblem subproblem(solvers_, seed_);
    double                 tolerance = -1.0, radius = -1.0;
    const double           physical  = system_.physical_force_scale(level);
    const auto             say       = [&](const std::string &s) {
      if (log_)
        *log_ << s << std::flush;
    };
    if (reuse_factorization && settings_.max_chord_steps > 0 &&
        !chord_steps(state, level, force_scale, keep_going, report, tolerance))
      return stopped_by_caller(report, report.chord_steps, 0);
    for (unsigned int it = 0; it <= settings_.max_iterations; ++it)
      {
        ghosted             = state;
        const EnergyParts e = system_.assemble(ghosted, level, residual_, &H, tolerance < 0.0 ? &magnitude_ : nullptr);
        solvers_.solver->linearize(ghosted, level);
        const double      r = residual_.l2_norm();
        if (tolerance < 0.0)
          tolerance = residual_tolerance(level, force_scale, r);
        set_scaling(H);
        const unsigned int negative = subproblem.set_point(H, residual_, diagonal_);
        report.iterations           = it;
        report.residual             = r;
        report.energy               = e.total();
        report.parts                = e;
        report.negative_pivots      = negative;
        report.zero_pivots          = subproblem.zero_eigenvalues();
        report.tolerance            = tolerance;
        report.factorizations       = subproblem.factorizations();
        IterationRecord rec{it, e.total(), r, 0.0, 0.0, negative, radius, 0};
        // At the round-off floor of the residual the Newton decrement gᵀH⁻¹g (twice the predicted
        // energy decrease) vanishes against the energy: the state is stationary to working precision.
        const bool at_round_off = negative == 0 && r <= 1e-6 * tolerance / settings_.relative_tolerance &&
                                  subproblem.newton_decrement() <= 1e-14 * energy_scale(e);
        if (r <= tolerance || at_round_off)
          {
            if (r > 1e-6 * physical)
              {
                report.history.push_back(rec);
                report.message = stalled_message(r, physical);
                return report;
              }
            if (negative == 0)
              {
                report.history.push_back(rec);
                report.converged = true;
                hessian_current_ = true;
                regular_minimum_ = report.zero_pivots == 0;
                say(converged_line(report));
                return report;
              }
            if (report.saddle_escapes++ >= settings_.max_saddle_escapes)
              {
                report.history.push_back(rec);
                report.message = "converged to a saddle point (" + std::to_string(negative) +
                                 " negative pivots) and could not leave it";
                return report;
              }
            say("    Newton: saddle point (" + std::to_string(negative) +
                " negative pivots), stepping along negative curvature\n");
          }
        if (it == settings_.max_iterations)
          break;
        // A step at an indefinite Hessian costs several factorisations: ask the caller first.
        if (negative > 0 && keep_going && !keep_going(state, rec))
          {
            report.history.push_back(rec);
            return stopped_by_caller(report, it, subproblem.factorizations());
          }
        // The first radius: the Newton step where H is positive definite, else the scaled gradient
        // step (or, at a saddle where g = 0, a step whose energy norm is a thousandth of the energy).
        if (radius < 0.0)
          radius = negative == 0 ? subproblem.newton_length() :
                                   std::max(subproblem.gradient_length(), 1e-3 * std::sqrt(energy_scale(e)));
        const double round_off = 1e-13 * energy_scale(e);
        bool         chord_ready = false; // the factorisation is of H, and the model predicted the accepted step well
        while (true)
          {
            const TrustRegionStep step = subproblem.solve(radius);
            trial                      = state;
            trial += step.step;
            system_.constraints().distribute(trial);
            const double actual = e.total() - energy_at(trial, level);
            // Below round-off of the energy the ratio means nothing: accept a step that does not raise it.
            const double ratio = step.predicted_decrease > round_off ? actual / step.predicted_decrease :
                                 actual >= -10.0 * round_off     ? 1.0 :
                                                                   -1.0;
            rec.radius      = radius;
            rec.shift       = step.multiplier;
            rec.step_length = step.length;
            radius          = updated_radius(radius, ratio, step.length);
            if (ratio >= settings_.acceptance_ratio)
              {
                state = trial;
                if (ratio > 0.75 && step.length >= 0.9 * rec.radius)
                  radius *= extend_step(state, step.step, e.total() - actual, level);
                // |ρ − 1| ≤ 0.1: H hardly changed along the step (common practice, no source).
                chord_ready = negative == 0 && subproblem.zero_eigenvalues() == 0 && std::abs(ratio - 1.0) <= 0.1;
                break;
              }
            if (++rec.rejected_steps > 60 || !(radius > 0.0))
              {
                report.history.push_back(rec);
                std::ostringstream s;
                s << "the trust region shrank to " << std::scientific << std::setprecision(3) << radius
                  << " √J without an energy decrease (last residual " << r
                  << " N): the energy is not smooth at this accuracy";
                report.message        = s.str();
                report.factorizations = subproblem.factorizations();
                return report;
              }
          }
        report.history.push_back(rec);
        std::ostringstream s;
        s << "    Newton " << std::setw(2) << it << ": E = " << std::scientific << std::setprecision(6) << e.total()
          << " J, |R| = " << std::setprecision(2) << r << " N, |p| = " << rec.step_length << ", radius " << radius
          << ", λ = " << std::defaultfloat << std::setprecision(3) << rec.shift
          << (rec.rejected_steps ? ", rejected " + std::to_string(rec.rejected_steps) : std::string())
          << (negative ? ", negative pivots " + std::to_string(negative) : std::string()) << "\n";
        say(s.str());
        if (keep_going && !keep_going(state, rec))
          return stopped_by_caller(report, it + 1, subproblem.factorizations());
        if (chord_ready && settings_.max_chord_steps > 0 &&
            !chord_steps(state, level, force_scale, keep_going, report, tolerance))
          return stopped_by_caller(report, it + 1, subproblem.factorizations());
      }
    report_out_of_iterations(report);
    report.factorizations = subproblem.factorizations();
    return report;
  }
} // namespace nappe
