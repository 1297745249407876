#pragma once

#include <nappe/solvers/hessian_solver.h>
#include <nappe/solvers/sheet_system.h>

#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  struct MinimizerSettings
  {
    unsigned int max_iterations = 80;
    /// Converged when ‖R‖ ≤ relative_tolerance · (force scale) + absolute_tolerance.
    double relative_tolerance = 1e-9;
    double absolute_tolerance = 0.0; ///< [N]
    double armijo_slope       = 1e-4; ///< sufficient decrease constant of the energy line search
    unsigned int max_backtracks     = 40;
    unsigned int max_saddle_escapes = 8;
  };

  /// One Newton iteration as printed in the convergence history.
  struct IterationRecord
  {
    unsigned int iteration       = 0;
    double       energy          = 0.0; ///< [J]
    double       residual        = 0.0; ///< ‖R‖ [N]
    double       step_length     = 0.0; ///< line-search factor α
    double       shift           = 0.0; ///< Hessian shift μ (relative to its diagonal)
    unsigned int negative_pivots = 0;   ///< negative eigenvalues of the unshifted Hessian
  };

  struct MinimizerReport
  {
    bool         converged       = false;
    std::string  message;
    unsigned int iterations      = 0;
    double       residual        = 0.0; ///< final ‖R‖ [N]
    double       tolerance       = 0.0; ///< the residual the solve had to reach [N]
    double       energy          = 0.0; ///< [J]
    EnergyParts  parts;
    /// Negative eigenvalues of the Hessian at the returned state, from the stability certificate
    /// (for LDLᵀ: its negative pivots, Sylvester's law of inertia); 0 certifies a strict local minimum.
    unsigned int negative_pivots = 0;
    unsigned int saddle_escapes  = 0;
    std::vector<IterationRecord> history;
  };

  /**
   * Finds a stable equilibrium (a local minimum of the energy) by Newton's method with
   * safeguards for non-convex energies:
   *  - inertia control: the stability certificate counts the Hessian's negative eigenvalues; if
   *    there are any it is shifted, H + μ·diag|H|, with μ increased until the count is zero, so
   *    that the step is a descent direction (Nocedal & Wright, Numerical Optimization, 2nd ed.,
   *    2006, §3.4, "modified Newton with a shift");
   *  - a backtracking line search on the energy itself (Armijo condition), never on ‖R‖;
   *  - negative-curvature escape: a state with a small residual whose Hessian still has negative
   *    pivots is a saddle, never reported; the solver moves along the eigenvector of the most
   *    negative curvature (inverse iteration with the shifted factorisation) to lower energy.
   * On return the state is a certified local minimum, or the report says why not. The linear solves
   * and the certificate come through the solver seam (hessian_solver.h).
   */
  class EnergyMinimizer
  {
  public:
    /// With @p solvers empty, the defaults of SolverSettings (MUMPS LDLᵀ and its inertia).
    EnergyMinimizer(SheetSystem &system, const MinimizerSettings &settings, std::ostream *log = nullptr,
                    HessianSolvers solvers = {});

    /// Minimises from @p state (owned vector, satisfying the constraints) at the load level (λ, c).
    /// @p force_scale sets the residual tolerance [N].
    MinimizerReport minimize(Vector &state, const LoadLevel &level, double force_scale);

    const SheetSystem &system() const { return system_; }

  private:
    unsigned int factorize_positive_definite(double &shift);
    bool         line_search(Vector &state, const Vector &direction, double energy, double slope,
                             const LoadLevel &level, double &step);
    bool         escape_saddle(Vector &state, double energy, const LoadLevel &level, double shift);
    double       energy_at(const Vector &owned_state, const LoadLevel &level) const;

    SheetSystem          &system_;
    MinimizerSettings     settings_;
    std::ostream         *log_;
    HessianSolvers        solvers_;
    Vector                residual_;
    Vector                diagonal_;
    double                last_shift_ = 1e-4; ///< the last shift that made the Hessian positive definite
  };
} // namespace nappe
