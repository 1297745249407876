// The earlier globalisation of EnergyMinimizer (MinimizerMethod::line_search): a shifted Newton step
// and an energy line search, kept for side-by-side comparison with the trust region.
#include <deal.II/numerics/vector_tools.h>

#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include "matrix_diagonal.h"

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// Times one minimisation may raise the shift after a step without decrease (common practice, no source;
    /// the failure seen with multilevel CG needed five tenfold raises spread over step cuts).
    const unsigned int max_shift_raises = 6;
  } // namespace

  // Prepares the solver and the certificate for the Hessian held in the system; false, with the null
  // pivots in @p zeros, if it is singular (MUMPS error −10; INFOG(28), at least one).
  bool EnergyMinimizer::prepare_unless_singular(unsigned int &negative, unsigned int &zeros)
  {
    const SparseMatrix &H = system_.hessian_matrix();
    try
      {
        solvers_.solver->prepare(H);
        negative = solvers_.certificate->negative_eigenvalues(H);
        return true;
      }
    catch (const DirectSolverError &e)
      {
        if (e.mumps_error() != -10)
          throw;
        zeros = std::max(e.mumps_detail(), 1);
        return false;
      }
  }

  // x = H⁻¹b with the prepared H; false if an iterative solve fails at the unshifted H (@p shift = 0),
  // which is then singular to working precision.
  bool EnergyMinimizer::solved_unless_singular(const Vector &b, Vector &x, double shift) const
  {
    try
      {
        solvers_.solver->solve(b, x);
        return true;
      }
    catch (const HessianSolveError &)
      {
        if (shift > 0.0)
          throw;
        return false;
      }
  }

  // Prepares the Hessian held in the system; if it is indefinite or singular, or @p minimum_shift > 0,
  // adds μ·diag|H| with μ ≥ minimum_shift grown until the certificate finds no negative eigenvalue.
  // Returns the count of the unshifted matrix and, in @p zeros, its null pivots. The search starts a
  // little below the last shift that worked: a shift much larger than needed damps the soft modes (a
  // moving adhesion front) and makes the iteration crawl. A singular H is probed first with the tiny
  // internal::null_space_shift: positive definite there, H is positive semi-definite and that is the
  // step's factorisation.
  unsigned int EnergyMinimizer::factorize_positive_definite(double minimum_shift, double &shift, unsigned int &zeros,
                                                            unsigned int &factorizations)
  {
    SparseMatrix &H       = system_.hessian_matrix();
    unsigned int negative = 0;
    factorizations        = 1;
    shift                 = 0.0;
    zeros                 = 0;
    const bool regular    = prepare_unless_singular(negative, zeros);
    if (regular && negative == 0 && minimum_shift == 0.0)
      return 0;
    internal::extract_diagonal(H, diagonal_);
    for (const auto i : diagonal_.locally_owned_elements())
      diagonal_(i) = std::abs(diagonal_(i));
    diagonal_.compress(VectorOperation::insert);
    double     added         = 0.0;
    const auto definite_with = [&](double mu, unsigned int &count) {
      internal::add_to_diagonal(H, diagonal_, mu - added);
      solvers_.solver->set_diagonal_shift(mu);
      added = mu;
      ++factorizations;
      unsigned int ignored = 0;
      return prepare_unless_singular(count, ignored) && count == 0;
    };
    if (!regular && definite_with(internal::null_space_shift, negative) && minimum_shift == 0.0)
      {
        shift = internal::null_space_shift;
        return 0;
      }
    for (double mu = std::max({1e-12, 1e-2 * last_shift_, minimum_shift}); mu < 1e6; mu *= 10.0)
      {
        unsigned int count = 0;
        if (definite_with(mu, count))
          {
            shift       = mu;
            last_shift_ = mu;
            return negative;
          }
      }
    shift = -1.0;
    return negative;
  }

  bool EnergyMinimizer::line_search(Vector &state, const Vector &direction, double energy, double slope,
                                    const LoadLevel &level, double &step)
  {
    const auto &constraints = system_.constraints();
    Vector      trial       = system_.make_owned_vector();
    const double round_off  = 1e-13 * (std::abs(energy) + 1e-300);
    step                    = 1.0;
    for (unsigned int k = 0; k < settings_.max_backtracks; ++k, step *= 0.5)
      {
        trial = state;
        trial.add(step, direction);
        constraints.distribute(trial);
        const double trial_energy = energy_at(trial, level);
        // Near convergence the decrease drops below round-off of the energy: accept the full step.
        if (trial_energy <= energy + settings_.armijo_slope * step * slope ||
            (k == 0 && std::abs(slope) < round_off && trial_energy <= energy + 10.0 * round_off))
          {
            state = trial;
            return true;
          }
      }
    return false;
  }

  // Moves from a saddle along the direction of most negative curvature (generalised eigenvector
  // of H v = λ·diag|H| v with the smallest λ, by inverse iteration with the shifted factorisation).
  bool EnergyMinimizer::escape_saddle(Vector &state, double energy, const LoadLevel &level, double shift)
  {
    const auto   &constraints = system_.constraints();
    SparseMatrix &H           = system_.hessian_matrix();
    Vector        d           = system_.make_owned_vector();
    Vector        tmp         = system_.make_owned_vector();
    d = seed_;
    for (unsigned int it = 0; it < 30; ++it)
      {
        tmp = d;
        tmp.scale(diagonal_);
        solvers_.solver->solve(tmp, d);
        constraints.set_zero(d);
        d /= d.l2_norm();
      }
    // Rayleigh quotient of the unshifted Hessian: H d = (H + μS) d − μ S d.
    H.vmult(tmp, d);
    Vector Sd = d;
    Sd.scale(diagonal_);
    const double curvature = (tmp * d - shift * (Sd * d)) / (Sd * d);
    if (curvature >= 0.0)
      return false;
    constraints.distribute(d);
    system_.assemble(
      [&] {
        Vector g = system_.make_ghosted_vector();
        g        = state;
        return g;
      }(),
      level, residual_, nullptr);
    if (residual_ * d > 0.0)
      d *= -1.0;
    // Scale the direction so that its largest entry is a tenth of the domain's diameter.
    const auto   box  = system_.domain().bounding_box();
    const double size = box.first.distance(box.second);
    d *= 0.1 * size / d.linfty_norm();
    Vector trial = system_.make_owned_vector();
    for (double step = 1.0; step > 1e-8; step *= 0.5)
      {
        trial = state;
        trial.add(step, d);
        constraints.distribute(trial);
        if (energy_at(trial, level) < energy - 1e-12 * std::abs(energy))
          {
            state = trial;
            return true;
          }
      }
    return false;
  }

  MinimizerReport EnergyMinimizer::minimize_line_search(Vector &state, const LoadLevel &level, double force_scale,
                                                        const IterateCheck &keep_going)
  {
    MinimizerReport report;
    Vector          ghosted   = system_.make_ghosted_vector();
    Vector          direction = system_.make_owned_vector();
    SparseMatrix   &H         = system_.hessian_matrix();
    double          tolerance = -1.0;
    auto            say       = [&](const std::string &s) {
      if (log_)
        *log_ << s << std::flush;
    };

    const double physical      = system_.physical_force_scale(level);
    double       minimum_shift = 0.0; // raised after a step without decrease
    unsigned int shift_raises  = 0;
    for (unsigned int it = 0; it <= settings_.max_iterations; ++it)
      {
        ghosted            = state;
        const EnergyParts e = system_.assemble(ghosted, level, residual_, &H, tolerance < 0.0 ? &magnitude_ : nullptr);
        solvers_.solver->linearize(ghosted, level);
        const double      r = residual_.l2_norm();
        if (tolerance < 0.0)
          tolerance = residual_tolerance(level, force_scale, r);
        double       shift          = 0.0;
        unsigned int factorizations = 0, zeros = 0;
        unsigned int negative       = factorize_positive_definite(minimum_shift, shift, zeros, factorizations);
        report.factorizations += factorizations;
        direction = residual_;
        if (shift >= 0.0 && !solved_unless_singular(residual_, direction, shift))
          {
            // An iterative solve failed at an H found positive semi-definite: H is singular to
            // working precision, as a null pivot says for a factorisation.
            negative = factorize_positive_definite(internal::null_space_shift, shift, zeros, factorizations);
            zeros    = std::max(zeros, 1u);
            report.factorizations += factorizations;
            if (shift >= 0.0)
              solvers_.solver->solve(residual_, direction);
          }
        if (shift < 0.0)
          {
            report.message = "the Hessian stays indefinite under a shift of 1e5·diag|H| (last residual " +
                             std::to_string(r) + " N); the model is probably unstable: check supports and loads";
            return report;
          }

        IterationRecord rec{it, e.total(), r, 0.0, shift, negative};
        report.iterations = it;
        report.residual   = r;
        report.energy     = e.total();
        report.parts      = e;
        report.negative_pivots = negative;
        report.zero_pivots     = zeros;
        report.tolerance  = tolerance;

        direction *= -1.0;
        const double slope = residual_ * direction;
        // At the round-off floor of the residual the Newton decrement −R·δ (twice the predicted
        // energy decrease) vanishes against the energy: the state is stationary to working precision.
        const bool at_round_off = r <= 1e-6 * tolerance / settings_.relative_tolerance &&
                                  std::abs(slope) <= 1e-14 * energy_scale(e);
        if (r <= tolerance || at_round_off)
          {
            report.history.push_back(rec);
            if (r > 1e-6 * physical)
              {
                report.message = stalled_message(r, physical);
                return report;
              }
            if (negative == 0)
              {
                report.converged = true;
                hessian_current_ = true;
                regular_minimum_ = report.zero_pivots == 0;
                say(converged_line(report));
                return report;
              }
            if (report.saddle_escapes++ >= settings_.max_saddle_escapes ||
                !escape_saddle(state, e.total(), level, shift))
              {
                report.message = "converged to a saddle point (" + std::to_string(negative) +
                                 " negative pivots) and could not leave it";
                return report;
              }
            say("    Newton: saddle point (" + std::to_string(negative) +
                " negative pivots) left along negative curvature\n");
            continue;
          }
        if (it == settings_.max_iterations)
          break;

        double       step  = 0.0;
        const bool   ok    = line_search(state, direction, e.total(), slope, level, step);
        rec.step_length    = step;
        report.history.push_back(rec);
        std::ostringstream s;
        s << "    Newton " << std::setw(2) << it << ": E = " << std::scientific << std::setprecision(6) << e.total()
          << " J, |R| = " << std::setprecision(2) << r << " N, step " << std::defaultfloat << std::setprecision(3)
          << step << (shift > 0 ? ", shift " : "") << (shift > 0 ? std::to_string(shift) : std::string()) << "\n";
        say(s.str());
        if (!ok && shift_raises < max_shift_raises)
          {
            // An inexact solve (multilevel CG stops at 1e-3 of a shifted step) or round-off can give a direction
            // that does not descend; a larger shift makes the step shorter and better conditioned.
            ++shift_raises;
            minimum_shift = std::max(10.0 * shift, 1e-6);
            say("    Newton: no decrease along the step; shift raised to " + std::to_string(minimum_shift) + "\n");
            continue;
          }
        if (!ok)
          {
            report.message = "the energy line search found no decrease (the Newton direction is not a descent "
                             "direction at this accuracy, even with the Hessian shift raised " +
                             std::to_string(max_shift_raises) + " times)";
            return report;
          }
        minimum_shift = 0.0;
        if (keep_going && !keep_going(state, rec))
          return stopped_by_caller(report, it + 1, report.factorizations);
      }
    report_out_of_iterations(report);
    return report;
  }
} // namespace nappe
