#pragma once

#include <nappe/solvers/sheet_system.h>

#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

namespace nappe
{
  /**
   * The solver seam: the linear algebra a Newton step needs from the Hessian H of the sheet energy,
   * behind two small interfaces, so that the minimiser and the continuation do not depend on how H
   * is solved or how its stability is certified.
   *
   * HessianSolver: prepare(H) (a factorisation, or a preconditioner set-up), then any number of
   * solve(b, x) for x = H⁻¹b. The minimiser only solves with a positive definite H (it shifts an
   * indefinite one first). Collective over the matrix's communicator.
   */
  class HessianSolver
  {
  public:
    virtual ~HessianSolver() = default;

    /**
     * The state (ghosted) and load level at which the next prepare()'s H is assembled. A solver that
     * builds its own coarser operators (multilevel) assembles them here; the default ignores it.
     */
    virtual void linearize(const Vector &state, const LoadLevel &level);

    /**
     * The next prepare()'s H is the linearised Hessian H₀ shifted by @p mu·diag|H₀| (the minimiser's
     * shift of an indefinite H₀; 0 after linearize()). A solver with its own coarser operators shifts
     * them alike, so that they stay an approximation of H; the default ignores it.
     */
    virtual void set_diagonal_shift(double mu);

    /// Prepares solves with @p H (assembled, compressed). H must stay alive and unmodified until the next prepare().
    virtual void prepare(const SparseMatrix &H) = 0;

    /**
     * @p solution = H⁻¹ @p rhs with the prepared H (owned vectors with H's row partition). An iterative
     * solver that does not reach its tolerance throws HessianSolveError.
     */
    virtual void solve(const Vector &rhs, Vector &solution) const = 0;

    /// The name it is chosen by in the case file (Solver/Linear solver).
    virtual std::string name() const = 0;
  };

  /**
   * Thrown on every rank by an iterative HessianSolver::solve() that diverged or did not reach its
   * tolerance: H may be singular there (a sliding or rotation mode at a buckled state, with a
   * right-hand side at round-off that is not in H's range), so a caller may shift H and retry.
   */
  class HessianSolveError : public std::runtime_error
  {
  public:
    using std::runtime_error::runtime_error;
  };

  /// The lowest eigenvalue of a Hessian pencil and its vector (StabilityCertificate::lowest_eigenpair).
  struct LowestEigenpair
  {
    bool         available = false; ///< the certificate offers it
    double       value     = 0.0;   ///< Rayleigh quotient μ = vᵀHv/vᵀSv, an upper bound of μ₁ [-]
    double       error     = 0.0;   ///< residual bound ‖Hv − μSv‖_{S⁻¹}: some eigenvalue lies within it [-]
    unsigned int iterations = 0;
    Vector       vector; ///< v, vᵀSv = 1
  };

  /**
   * StabilityCertificate: the number of negative eigenvalues of H. Zero certifies that a stationary
   * state is a strict local minimum (second-order sufficient condition, Nocedal & Wright, Numerical
   * Optimization, 2nd ed., 2006, Theorem 2.4); a change of the count along a path marks a fold or a
   * bifurcation. Constrained rows carry a positive diagonal in H and never count.
   */
  class StabilityCertificate
  {
  public:
    virtual ~StabilityCertificate() = default;

    /**
     * Number of negative eigenvalues of @p H, the same on every rank. A certificate that shares its
     * work with a HessianSolver reuses that solver's last prepare(H) of the same, unmodified matrix.
     */
    virtual unsigned int negative_eigenvalues(const SparseMatrix &H) = 0;

    /**
     * The lowest eigenpair of the pencil H v = μ S v, S = diag(@p weights) with positive weights, for
     * a positive definite @p H (negative_eigenvalues(H) = 0): μ₁ and its vector, S-normalised
     * (vᵀSv = 1). @p start is a guess of v (zero on constrained rows, not zero). μ₁ tending to zero
     * along a path of minima marks a fold; its vector is the direction in which the branch turns.
     * The result states an error bound: |μ − μ_j| ≤ ‖Hv − μSv‖_{S⁻¹} for some eigenvalue μ_j
     * (residual bound for symmetric pencils, B. N. Parlett, The Symmetric Eigenvalue Problem, SIAM
     * 1998, Theorem 4.5.1 applied to S^{-1/2}HS^{-1/2}). For an indefinite H the pair is only an
     * estimate (inverse iteration with an LDLᵀ factorisation tends to the eigenvalue nearest zero),
     * but its Rayleigh quotient still bounds μ₁ from above. Collective. A certificate that cannot
     * offer it returns available = false (the default).
     */
    virtual LowestEigenpair lowest_eigenpair(const SparseMatrix &H, const Vector &weights, const Vector &start);

    /// The name it is chosen by in the case file (Solver/Stability certificate).
    virtual std::string name() const = 0;
  };

  /// Settings of the multilevel solve (case file subsection "Solver").
  struct MultilevelSettings
  {
    /// Coarsen the mesh hierarchy until a level has at most this many cells; that level is solved
    /// directly (MUMPS). ≈ 12 unknowns per Q2 cell.
    unsigned int coarsest_cells = 256;
    /// Stop CG when ‖r‖ ≤ relative_tolerance·‖b‖ [-].
    double relative_tolerance = 1e-8;
    /// The same for a shifted Hessian (HessianSolver::set_diagonal_shift), an inexact Newton step's
    /// forcing term (common practice, no source: the step is damped by the shift anyway) [-].
    double shifted_relative_tolerance = 1e-3;
    /// More iterations than this is a failure (reported with the last residual) [-]. A shifted step at
    /// the start of a laid-down solve needs the most (225 on the demo cell at 50k unknowns).
    unsigned int max_iterations = 1000;
    /// Degree of the Chebyshev smoother (matrix-vector products per smoothing step) [-]. 6 rather than
    /// 4: a Newton step costs about the same and CG needs a fifth fewer iterations, growing less with
    /// refinement (benchmarks/README.md, "one Newton step").
    unsigned int smoother_degree = 6;
  };

  /// Choice of the solver seam's implementations (case file subsection "Solver").
  struct SolverSettings
  {
    /// A name of hessian_solver_names(); "automatic" chooses by the number of unknowns (resolved()).
    std::string linear_solver = "automatic";
    /// A name of stability_certificate_names(); "automatic" is the one that goes with the linear solver.
    std::string certificate = "automatic";
    MultilevelSettings multilevel; ///< used by "multilevel CG" and "multilevel LOBPCG"
  };

  /// The linear solver and the certificate one minimiser uses; they may be one object.
  struct HessianSolvers
  {
    std::shared_ptr<HessianSolver>        solver;
    std::shared_ptr<StabilityCertificate> certificate;
  };

  /// Names accepted for SolverSettings::linear_solver.
  std::vector<std::string> hessian_solver_names();
  /// Names accepted for SolverSettings::certificate.
  std::vector<std::string> stability_certificate_names();

  /**
   * From this many unknowns on, "automatic" chooses the multilevel solver. Below it the direct solver
   * was faster end to end in every case measured (benchmarks/README.md, "Crossover": the demo cell
   * from 12.7k to 198k unknowns, where the multilevel run took 1.2 to 2 times as long, its LOBPCG
   * certificate costing about half a solve per Newton step); above it the direct solver's memory
   * (≈ 10 GB estimated at 10⁶ unknowns, N^1.2) outgrows a workstation while the multilevel solver's
   * (≈ 2 GB, N^0.8) does not.
   */
  constexpr unsigned long long multilevel_crossover_unknowns = 1000000;

  /**
   * @p settings with both names resolved for a problem of @p unknowns: an "automatic" linear solver is
   * "multilevel CG" from multilevel_crossover_unknowns on (or when the certificate is "multilevel
   * LOBPCG"), else "direct LDLT"; an "automatic" certificate is "LDLT inertia" with the direct solver
   * and "multilevel LOBPCG" with the multilevel one. On an adapted mesh (@p adapted_mesh) "automatic"
   * is always the direct solver: the multilevel one coarsens by whole uniform refinements.
   */
  SolverSettings resolved(const SolverSettings &settings, unsigned long long unknowns, bool adapted_mesh = false);

  /// Throws, naming the entry, if a name is unknown or the certificate does not go with the linear solver.
  void check_solver_settings(const SolverSettings &settings);

  /**
   * Builds the chosen implementations for the Hessians of @p system, resolved() for its number of
   * unknowns. "direct LDLT" is MUMPS' symmetric
   * indefinite factorisation (SymmetricDirectSolver); "LDLT inertia" counts its negative pivots
   * (Sylvester's law of inertia) and shares the factorisation when both are chosen. "multilevel CG"
   * is MultilevelHessianSolver; "multilevel LOBPCG" (MultilevelCertificate) needs it as the linear
   * solver. Throws naming the entry if a name is unknown or the pair does not go together.
   */
  HessianSolvers make_hessian_solvers(const SolverSettings &settings, const SheetSystem &system);

  /// The same for matrices on @p comm that come from no sheet: only the direct solver and its inertia
  /// ("automatic" is the direct solver).
  HessianSolvers make_hessian_solvers(const SolverSettings &settings, MPI_Comm comm);
} // namespace nappe
