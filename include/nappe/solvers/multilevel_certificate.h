#pragma once

#include <nappe/solvers/hessian_solver.h>
#include <nappe/solvers/multilevel_hessian_solver.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include <memory>

namespace nappe
{
  /**
   * A stability certificate without a factorisation of the fine Hessian: the lowest eigenpair of the
   * pencil H v = μ S v by the locally optimal block preconditioned conjugate gradient method with
   * block size one (A. V. Knyazev, SIAM J. Sci. Comput. 23, 517–541, 2001, Algorithm 4.1), its
   * preconditioner one V-cycle of the MultilevelHessianSolver prepared with H. Each iteration is a
   * Rayleigh–Ritz step on span{x, T r, p} (x the iterate, r = Hx − μSx, p the previous update),
   * S-orthonormalised before the 3×3 eigenproblem is solved.
   *
   * negative_eigenvalues(H) uses S = diag|H| and returns 1 if H has a negative eigenvalue, 0 if not:
   * a Rayleigh quotient μ < 0 proves one (μ ≥ μ₁); μ > 0 with a residual bound ‖Hv − μSv‖_{S⁻¹}
   * below a tenth of μ places an eigenvalue within 10 % of μ, and LOBPCG from a generic start converges
   * to the lowest one (Knyazev 2001, §4) — a strong indication, not the proof Sylvester's law of
   * inertia gives the LDLᵀ factorisation. It counts at most one negative eigenvalue (block size one).
   * Each call starts from the last call's vector, so along a Newton iteration it needs few steps.
   * If LOBPCG does not settle the sign in its iteration budget (a cluster of near-zero eigenvalues,
   * e.g. a sheet hovering above the substrate), a matrix the minimiser has shifted
   * (MultilevelHessianSolver::diagonal_shift() > 0) counts as not positive definite, so that it is
   * shifted further; an unshifted one is decided by the inertia of one LDLᵀ factorisation (counted by
   * fallbacks()). lowest_eigenpair() then returns available = false.
   */
  class MultilevelCertificate : public StabilityCertificate
  {
  public:
    explicit MultilevelCertificate(std::shared_ptr<MultilevelHessianSolver> preconditioner);

    unsigned int negative_eigenvalues(const SparseMatrix &H) override;

    LowestEigenpair lowest_eigenpair(const SparseMatrix &H, const Vector &weights, const Vector &start) override;

    std::string name() const override { return "multilevel LOBPCG"; }

    /// Calls of negative_eigenvalues() decided by a factorisation because LOBPCG did not settle the sign.
    unsigned int fallbacks() const { return fallbacks_; }

  private:
    /// LOBPCG to a residual bound of @p tolerance·|μ|, or until μ < −bound if @p sign_only.
    LowestEigenpair lobpcg(const SparseMatrix &H, const Vector &weights, const Vector &start, double tolerance,
                           bool sign_only) const;

    std::shared_ptr<MultilevelHessianSolver> preconditioner_;
    Vector                                   last_vector_; ///< warm start of negative_eigenvalues()
    std::unique_ptr<SymmetricDirectSolver>   direct_;      ///< the fallback, created when first needed
    unsigned int                             fallbacks_ = 0;
  };
} // namespace nappe
