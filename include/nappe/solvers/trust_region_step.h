#pragma once

#include <nappe/solvers/hessian_solver.h>
#include <nappe/solvers/sheet_system.h>

#include <optional>

namespace nappe
{
  /// A step of the trust-region subproblem and what it cost.
  struct TrustRegionStep
  {
    Vector       step;                      ///< p (constrained entries zero)
    double       predicted_decrease = 0.0;  ///< m(0) − m(p) = −gᵀp − ½pᵀHp [J]
    double       length             = 0.0;  ///< ‖p‖_S [√J]
    double       multiplier         = 0.0;  ///< λ ≥ 0 with (H + λS)p = −g, up to the hard-case term [-]
    bool         negative_curvature = false; ///< H is indefinite: the step uses its negative curvature
    unsigned int factorizations     = 0;    ///< factorisations of H + λS this step needed
  };

  /**
   * The trust-region subproblem of a Newton iteration on the energy Π,
   *
   *     min m(p) = gᵀp + ½ pᵀHp   subject to   ‖p‖_S = √(pᵀSp) ≤ Δ,
   *
   * with g the gradient, H the (possibly indefinite) Hessian and S = diag(w) a positive scaling. With
   * S = diag|H| the norm is the energy norm of the Jacobi approximation of H, so Δ² measures energy
   * [J] and the scaling follows the stiffness of each unknown (membrane, bending, adhesion).
   *
   * Solved by the method of J. J. Moré & D. C. Sorensen, "Computing a trust region step", SIAM J.
   * Sci. Stat. Comput. 4, 553–572 (1983): p solves (H + λS)p = −g with H + λS positive semidefinite
   * and λ(Δ − ‖p‖_S) = 0. λ is found by Newton's method on the secular equation 1/‖p(λ)‖_S = 1/Δ
   * (their eq. 3.6: λ⁺ = λ + (‖p‖/‖q‖)²(‖p‖ − Δ)/Δ, with ‖q‖² = (Sp)ᵀ(H + λS)⁻¹(Sp)), safeguarded by
   * bounds λ_L ≤ λ* ≤ λ_U; every trial λ is one factorisation of H + λS, and the stability certificate
   * (its inertia) tells whether H + λS is positive definite. Where it is not, a direction z of negative
   * curvature raises λ_L to λ − zᵀ(H + λS)z/‖z‖²_S (their §3, with z from their Cholesky factor; here
   * from inverse iteration with the indefinite factorisation, or at a new point the last eigenvector). In the hard case (g nearly orthogonal to
   * the lowest eigenvector, e.g. at a saddle where g = 0) a multiple of the lowest eigenvector z of
   * (H + λS, S) is added to reach the boundary; z comes from the certificate (inverse iteration with
   * the factorisation for LDLᵀ). A step is accepted when |‖p‖_S − Δ| ≤ σ₁Δ (σ₁ = 0.1, Moré & Sorensen's
   * value), or in the hard case when τ²zᵀ(H + λS)z ≤ σ₁(2 − σ₁)(pᵀ(H + λS)p + λΔ²) (their eq. 3.12),
   * which guarantees a model decrease within a factor (1 − σ₁)² of the optimum.
   *
   * Where H itself is indefinite, each factorisation of H + λS costs as much as a Newton iteration,
   * and the steps there only have to lead the iterate away from where H is indefinite; so, cheaper
   * than solving the subproblem to σ₁:
   *  - with a direction z of negative curvature of H known (from inverse iteration with H's own
   *    factorisation, the last lowest eigenvector, or that of a shifted factorisation), the exact
   *    minimum of the model in the plane of z and the scaled steepest descent direction (the
   *    two-dimensional subspace method; Shultz, Schnabel & Byrd, SIAM J. Numer. Anal. 22, 47–67, 1985,
   *    from memory): at least the decrease of the Cauchy step and of the step along z, no further
   *    factorisation;
   *  - otherwise the first positive definite H + λS (λ warm-started from the last multiplier scaled by
   *    the ratio of the radii, since λ ≈ ‖g‖_S/Δ where the shift dominates H) whose solution p(λ)
   *    reaches the boundary: the dogleg of the model with H + λS if ‖p(λ)‖_S ≥ Δ, else p(λ) stretched
   *    to the boundary where the model of H falls all the way along it; at least the Cauchy decrease of
   *    the model with H + λS, which is below that of H. Moré–Sorensen's iteration goes on where
   *    neither applies (near the hard case).
   * Measured on the threshold trio of benchmarks/adhesion_limits (128 cells per period): 202 → 151
   * factorisations, 18 % less time, the same thresholds.
   *
   * Where H is positive definite and its Newton step leaves the region, the step is Powell's dogleg
   * instead (Nocedal & Wright, Numerical Optimization, 2nd ed., 2006, §4.1): the path from the scaled
   * Cauchy point to the Newton step, cut at ‖p‖_S = Δ, which needs no further factorisation and
   * decreases the model at least as much as the Cauchy point (enough for global convergence, N&W
   * Theorem 4.5).
   *
   * Everything goes through the solver seam (HessianSolver, StabilityCertificate); the hard case needs
   * a certificate that offers lowest_eigenpair() (without one the step falls back to the positive
   * definite solution scaled to the boundary). H is shifted in place while a step is computed; after
   * set_point() and before the first solve() the prepared factorisation is that of H itself.
   */
  class MoreSorensenSubproblem
  {
  public:
    /// @p seed: a rank-independent start for the eigenvector (constrained entries zero).
    MoreSorensenSubproblem(HessianSolvers solvers, const Vector &seed);

    /**
     * A new point: factorises @p H and returns its number of negative eigenvalues (the certificate).
     * A singular H (null pivots, or an iterative solve failing where the certificate finds no
     * negative eigenvalue) is factorised shifted by internal::null_space_shift·S, whose inertia
     * is H's with the zero eigenvalues counted positive; numbers::invalid_unsigned_int if that is
     * singular too. @p H, @p gradient and @p weights (S, positive) must stay alive and unchanged
     * (except through this class) until the next set_point().
     */
    unsigned int set_point(SparseMatrix &H, const Vector &gradient, const Vector &weights);

    /// Null pivots (eigenvalues zero to round-off) of the H of the last set_point(); 0 if it was regular.
    unsigned int zero_eigenvalues() const { return zero_eigenvalues_; }

    /// The step for the radius @p radius [√J] at the current point.
    TrustRegionStep solve(double radius);

    /// ‖H⁻¹g‖_S, the length of the Newton step, if H is positive definite; otherwise a negative number.
    double newton_length() const { return newton_length_; }

    /// gᵀH⁻¹g, twice the decrease the Newton step predicts, if H is positive definite; else −1 [J].
    double newton_decrement() const { return newton_decrement_; }

    /// √(gᵀS⁻¹g), the length of the scaled steepest-descent step of unit multiplier [√J].
    double gradient_length() const { return gradient_length_; }

    /// Factorisations since construction.
    unsigned int factorizations() const { return factorizations_; }

  private:
    bool   factorize_at(double lambda, unsigned int &count);
    void   shift_to(double lambda);
    double scaled_norm(const Vector &v) const;
    void   solve_shifted(const Vector &rhs, Vector &x) const;
    /// newton_step_ = −(H + shift_·S)⁻¹g, with its length and decrement; false if an iterative solve
    /// fails at the unshifted H (HessianSolveError; rethrown at a shifted one).
    bool   solved_newton_step();
    LowestEigenpair lowest_shifted_eigenpair();
    LowestEigenpair negative_curvature_direction();
    double          curvature_along(const Vector &z) const;
    double          past_indefinite(double lambda, double &lower, double upper);
    double model_decrease(const Vector &p) const;
    Vector to_boundary(const Vector &p, const LowestEigenpair &z, double radius) const;
    Vector dogleg(double radius, const Vector &full_step) const;
    Vector to_boundary_along(const Vector &p, double radius) const;
    Vector scaled_descent() const;
    Vector two_dimensional(double radius, const Vector &z, double &multiplier) const;

    HessianSolvers solvers_;
    Vector         seed_;
    SparseMatrix  *H_        = nullptr;
    const Vector  *gradient_ = nullptr;
    const Vector  *weights_  = nullptr;
    double         shift_    = 0.0; ///< λ currently added to H
    bool           prepared_ = false; ///< the factorisation is of H + shift_·S
    unsigned int   inertia_  = 0;     ///< negative eigenvalues of the unshifted H
    unsigned int   zero_eigenvalues_ = 0; ///< its null pivots
    unsigned int   last_null_pivots_ = 0; ///< the null pivots of the last singular factorisation
    double         lower_    = 0.0;   ///< λ_L from positive definiteness: λ* ≥ lower_ for every radius
    double         gershgorin_ = -1.0; ///< H + λS is positive definite for λ > this (Gershgorin); < 0: not yet known
    Vector         newton_step_;           ///< −H⁻¹g if H is positive definite
    double         newton_length_   = -1.0;
    double         newton_decrement_ = -1.0;
    double         gradient_length_ = 0.0;
    double         last_multiplier_ = 0.0; ///< warm start of λ
    double         last_radius_     = 0.0; ///< the radius last_multiplier_ was found for [√J]
    Vector         eigenvector_;           ///< the last lowest eigenvector (warm start of the inverse iteration)
    /// At an indefinite H: the eigenpair from its own factorisation, once computed at this point.
    std::optional<LowestEigenpair> negative_direction_;
    unsigned int   factorizations_ = 0;
  };
} // namespace nappe
