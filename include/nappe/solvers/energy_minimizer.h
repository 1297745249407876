#pragma once

#include <nappe/solvers/hessian_solver.h>
#include <nappe/solvers/sheet_system.h>

#include <functional>
#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  /// How a Newton iteration is globalised.
  enum class MinimizerMethod
  {
    /// Trust region with the Moré–Sorensen step (trust_region_step.h): follows negative curvature.
    /// The corrector of the adhesion paths (predictor–corrector continuation), where a front sweeping
    /// across the substrate stalls the line search.
    trust_region,
    /// Shift H + μ·diag|H| until positive definite, then an energy line search: the default of single
    /// solves, whose tests and timings it keeps (the trust region starts from a small radius where H
    /// is indefinite and needs many iterations to grow it, e.g. on the adhesive elastica).
    line_search
  };

  struct MinimizerSettings
  {
    MinimizerMethod method = MinimizerMethod::line_search;
    unsigned int max_iterations = 80;
    /// Converged when ‖R‖ ≤ relative_tolerance · (force scale) + absolute_tolerance.
    double relative_tolerance = 1e-9;
    double absolute_tolerance = 0.0; ///< [N]
    double armijo_slope       = 1e-4; ///< sufficient decrease constant of the energy line search
    unsigned int max_backtracks     = 40;
    unsigned int max_saddle_escapes = 8;
    /// Trust region: a step is accepted when the energy decrease is at least this share of the
    /// decrease the quadratic model predicts (η of Nocedal & Wright 2006, Algorithm 4.1) [-].
    double acceptance_ratio = 1e-4;
    /// Trust region: at most this many chord steps in a row, with a factorisation already made (the class
    /// comment of EnergyMinimizer says when); 0: none [-].
    unsigned int max_chord_steps = 0;
  };

  /// One Newton iteration as printed in the convergence history.
  struct IterationRecord
  {
    unsigned int iteration       = 0;
    double       energy          = 0.0; ///< [J]
    double       residual        = 0.0; ///< ‖R‖ [N]
    double       step_length     = 0.0; ///< line-search factor α; trust region: ‖p‖_S of the accepted step [√J]
    double       shift           = 0.0; ///< Hessian shift μ, or the multiplier λ of the step (relative to diag|H|)
    unsigned int negative_pivots = 0;   ///< negative eigenvalues of the unshifted Hessian
    double       radius          = 0.0; ///< trust radius Δ the step was taken with [√J]
    unsigned int rejected_steps  = 0;   ///< trust-region steps tried and rejected before the accepted one
    bool         chord           = false; ///< a chord step: the factorisation of an earlier Hessian, no new one
  };

  struct MinimizerReport
  {
    bool         converged       = false;
    std::string  message;
    unsigned int iterations      = 0;   ///< Newton iterations (each with a factorisation)
    unsigned int chord_steps     = 0;   ///< chord steps between them (MinimizerSettings::max_chord_steps)
    double       residual        = 0.0; ///< final ‖R‖ [N]
    double       tolerance       = 0.0; ///< the residual the solve had to reach [N]
    double       energy          = 0.0; ///< [J]
    EnergyParts  parts;
    /// Negative eigenvalues of the Hessian at the returned state, from the stability certificate
    /// (for LDLᵀ: its negative pivots, Sylvester's law of inertia); 0 certifies a strict local minimum.
    unsigned int negative_pivots = 0;
    /// Eigenvalues of that Hessian that are zero to round-off (null pivots of LDLᵀ). With negative_pivots = 0
    /// and zero_pivots > 0 the state is a neutrally stable minimum: the energy is constant along that many
    /// directions (a symmetry, e.g. a wrinkle free to slide along a periodic cell), not a strict one.
    unsigned int zero_pivots     = 0;
    unsigned int saddle_escapes  = 0;
    unsigned int factorizations  = 0; ///< factorisations (HessianSolver::prepare) this minimisation used
    /// Stopped early because the caller's IterateCheck returned false (not converged, not a failure).
    bool         stopped         = false;
    /// Not converged because the iteration budget (MinimizerSettings::max_iterations) ran out.
    bool         out_of_iterations = false;
    std::vector<IterationRecord> history;
  };

  /**
   * Finds a stable equilibrium (a local minimum of the energy) by Newton's method globalised for
   * non-convex energies (MinimizerSettings::method):
   *  - trust region (adhesion paths): each iteration minimises the quadratic model within ‖p‖_S ≤ Δ,
   *    S = diag|H|, by the Moré–Sorensen method (MoreSorensenSubproblem; Powell's dogleg where H is positive
   *    definite), which takes the direction
   *    of negative curvature where H is indefinite (an adhesion front, a buckle, a saddle); the
   *    step is accepted if the energy falls by at least acceptance_ratio times the predicted
   *    decrease, and Δ is updated from that ratio ρ (ρ < ¼: Δ = ¼‖p‖; ρ > ¾ on the boundary: Δ = 2Δ;
   *    Nocedal & Wright, Numerical Optimization, 2nd ed., 2006, Algorithm 4.1); such a step, cut
   *    short by the region, is then doubled along its direction while the energy falls, and Δ grows
   *    with it (energy evaluations instead of a Newton iteration per doubling). A state whose
   *    residual is small but whose Hessian is indefinite is a saddle; the step there is the
   *    hard case of the subproblem, along the lowest eigenvector (counted as a saddle escape).
   *    With MinimizerSettings::max_chord_steps > 0 (the corrector of a path), a factorisation is
   *    reused by chord steps x ← x − H₀⁻¹R(x), each costing a residual assembly and a back
   *    substitution instead of an assembly of H and a factorisation (the chord and Shamanskii methods:
   *    C. T. Kelley, Iterative Methods for Linear and Nonlinear Equations, SIAM 1995, §5.4; P.
   *    Deuflhard, Newton Methods for Nonlinear Problems, Springer 2004, §2.1; section numbers from
   *    memory): H₀ is the Hessian of the previous minimisation's result, if that was a regular minimum,
   *    before the first Newton iteration, and the positive definite Hessian of an iteration whose
   *    step the quadratic model predicted well (|ρ − 1| ≤ 0.1) after it. They go on while the energy
   *    does not rise and the corrections contract by at least half (Deuflhard's monitor
   *    θ = ‖Δx_{k+1}‖_S/‖Δx_k‖_S < ½); the next Newton iteration then takes over, and certifies the
   *    result at once if the chord steps reached the tolerance.
   *  - line search (default): shift H + μ·diag|H| until the certificate finds no negative
   *    eigenvalue (N&W §3.4), backtrack on the energy (Armijo), escape saddles along the eigenvector
   *    of most negative curvature.
   * On return the state is a certified local minimum (the certificate finds no negative eigenvalue
   * of the unshifted Hessian at it), or the report says why not. The linear solves and the
   * certificate come through the solver seam (hessian_solver.h).
   */
  class EnergyMinimizer
  {
  public:
    /// Called with each accepted iterate (owned vector) and the record of the iteration that reached
    /// it (its negative pivots are those of the Hessian the step was computed with); returning false
    /// stops the minimisation (MinimizerReport::stopped). Lets a caller give up on an iterate that
    /// has already told it what it needs, e.g. that it left the branch a continuation follows.
    using IterateCheck = std::function<bool(const Vector &state, const IterationRecord &step)>;

    /// With @p solvers empty, the defaults of SolverSettings (MUMPS LDLᵀ and its inertia).
    EnergyMinimizer(SheetSystem &system, const MinimizerSettings &settings, std::ostream *log = nullptr,
                    HessianSolvers solvers = {});

    /// Minimises from @p state (owned vector, satisfying the constraints) at the load level (λ, c).
    /// @p force_scale sets the residual tolerance [N]; @p keep_going, if set, is asked after each step (the
    /// trust-region method asks before a step at an indefinite Hessian too, as that step costs several factorisations).
    MinimizerReport minimize(Vector &state, const LoadLevel &level, double force_scale,
                             const IterateCheck &keep_going = {});

    const SheetSystem &system() const { return system_; }
    const MinimizerSettings &settings() const { return settings_; }

    /**
     * After a minimize() that converged: @p solution = H⁻¹ @p rhs with the Hessian H at the returned
     * state, whose factorisation the last iteration prepared (no new factorisation). For tangents of
     * a path: dU/dp = −H⁻¹ ∂R/∂p. Throws if the last minimize() did not converge.
     */
    void solve_with_hessian(const Vector &rhs, Vector &solution) const;

    /**
     * After a minimize() that converged: the lowest eigenpair of H v = μ S v at the returned state,
     * S = diag|H| (μ ∈ (0, 1]; μ → 0 at a fold), from the stability certificate, warm-started from the
     * previous vector. available = false if the certificate does not offer it.
     */
    LowestEigenpair lowest_curvature();

  private:
    MinimizerReport minimize_trust_region(Vector &state, const LoadLevel &level, double force_scale,
                                          const IterateCheck &keep_going, bool reuse_factorization);
    MinimizerReport minimize_line_search(Vector &state, const LoadLevel &level, double force_scale,
                                         const IterateCheck &keep_going);
    void         set_scaling(const SparseMatrix &H);
    unsigned int factorize_positive_definite(double minimum_shift, double &shift, unsigned int &zeros,
                                             unsigned int &factorizations);
    bool         prepare_unless_singular(unsigned int &negative, unsigned int &zeros);
    bool         solved_unless_singular(const Vector &b, Vector &x, double shift) const;
    bool         line_search(Vector &state, const Vector &direction, double energy, double slope,
                             const LoadLevel &level, double &step);
    bool         escape_saddle(Vector &state, double energy, const LoadLevel &level, double shift);
    double       energy_at(const Vector &owned_state, const LoadLevel &level) const;
    double       extend_step(Vector &state, const Vector &step, double energy, const LoadLevel &level) const;
    /// Chord steps from @p state with the prepared factorisation (see the class comment); a negative
    /// @p tolerance is set from the first residual and magnitude_. False if @p keep_going stopped it.
    bool         chord_steps(Vector &state, const LoadLevel &level, double force_scale, const IterateCheck &keep_going,
                             MinimizerReport &report, double &tolerance);
    double       scaled_norm(const Vector &v) const; ///< ‖v‖_S with S = diagonal_ [√J]
    /// Σ|energy parts|: the scale of round-off in the total energy [J].
    static double energy_scale(const EnergyParts &e);
    double       residual_tolerance(const LoadLevel &level, double force_scale, double first_residual) const;
    std::string  stalled_message(double residual, double physical) const;
    void         report_out_of_iterations(MinimizerReport &report) const;
    static MinimizerReport stopped_by_caller(MinimizerReport &report, unsigned int steps, unsigned int factorizations);
    /// The log line of a converged minimisation: energy, residual and the certificate's verdict.
    static std::string converged_line(const MinimizerReport &report);

    SheetSystem          &system_;
    MinimizerSettings     settings_;
    std::ostream         *log_;
    HessianSolvers        solvers_;
    Vector                residual_;
    Vector                diagonal_;
    Vector                magnitude_;
    Vector                seed_;     ///< smooth, rank-independent field (starts of eigenvector searches)
    Vector                eigenvector_; ///< the last lowest eigenvector (warm start)
    double                last_shift_ = 1e-4; ///< the last shift that made the Hessian positive definite
    bool                  hessian_current_ = false; ///< the prepared factorisation is H at the last result
    bool                  regular_minimum_ = false; ///< ... and that result had no zero pivot
  };
} // namespace nappe
