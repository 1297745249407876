#include <deal.II/base/mpi.h>
#include <deal.II/base/numbers.h>

#include <nappe/solvers/symmetric_direct_solver.h>
#include <nappe/solvers/trust_region_step.h>

#include "matrix_diagonal.h"
#include "reduced_trust_region.h"

#include <algorithm>
#include <cmath>

namespace nappe
{
  namespace
  {
    /// σ₁ of Moré & Sorensen (1983): accept ‖p‖_S within (1 ± σ₁)Δ; their experiments use 0.1.
    const double boundary_accuracy = 0.1;
    /// Factorisations one step may use before it settles for the best positive definite solution
    /// (common practice, no source; most steps need one to three).
    const unsigned int max_factorizations = 10;

    /// The safeguarded next λ inside (lower, upper) when the Newton update of λ is not usable
    /// (Moré & Sorensen 1983, §3: λ = max(√(λ_L λ_U), 10⁻³λ_U); here with a floor a little above λ_L).
    double safeguarded(double lower, double upper)
    {
      return std::max(std::sqrt(std::max(lower, 0.0) * upper), lower + 0.05 * (upper - lower));
    }
  } // namespace

  MoreSorensenSubproblem::MoreSorensenSubproblem(HessianSolvers solvers, const Vector &seed)
    : solvers_(std::move(solvers))
    , seed_(seed)
    , newton_step_(seed)
    , eigenvector_(seed)
  {
  }

  void MoreSorensenSubproblem::shift_to(double lambda)
  {
    if (lambda == shift_)
      return;
    internal::add_to_diagonal(*H_, *weights_, lambda - shift_);
    solvers_.solver->set_diagonal_shift(lambda);
    shift_    = lambda;
    prepared_ = false;
  }

  // A singular H + λS (MUMPS error −10, e.g. exactly at a fold or along a symmetry) counts as not
  // positive definite: λ is then a lower bound of λ*.
  bool MoreSorensenSubproblem::factorize_at(double lambda, unsigned int &count)
  {
    shift_to(lambda);
    ++factorizations_;
    try
      {
        solvers_.solver->prepare(*H_);
        count = solvers_.certificate->negative_eigenvalues(*H_);
      }
    catch (const DirectSolverError &e)
      {
        if (e.mumps_error() != -10)
          throw;
        last_null_pivots_ = std::max(e.mumps_detail(), 1);
        count             = dealii::numbers::invalid_unsigned_int;
        return false;
      }
    prepared_ = true;
    return count == 0;
  }

  double MoreSorensenSubproblem::scaled_norm(const Vector &v) const
  {
    Vector Sv = v;
    Sv.scale(*weights_);
    return std::sqrt(std::max(0.0, v * Sv));
  }

  void MoreSorensenSubproblem::solve_shifted(const Vector &rhs, Vector &x) const { solvers_.solver->solve(rhs, x); }

  LowestEigenpair MoreSorensenSubproblem::lowest_shifted_eigenpair()
  {
    LowestEigenpair z = solvers_.certificate->lowest_eigenpair(*H_, *weights_, eigenvector_);
    if (z.available)
      {
        // A rank-independent orientation (the seed is built from coordinates).
        if (z.vector * seed_ < 0)
          z.vector *= -1.0;
        eigenvector_ = z.vector;
      }
    return z;
  }

  double MoreSorensenSubproblem::model_decrease(const Vector &p) const
  {
    Vector Hp = p, Sp = p;
    H_->vmult(Hp, p); // (H + shift·S) p
    Sp.scale(*weights_);
    const double pHp = p * Hp - shift_ * (p * Sp);
    return -((*gradient_) * p + 0.5 * pHp);
  }

  unsigned int MoreSorensenSubproblem::set_point(SparseMatrix &H, const Vector &gradient, const Vector &weights)
  {
    H_        = &H;
    gradient_ = &gradient;
    weights_  = &weights;
    shift_    = 0.0;
    lower_    = 0.0;
    gershgorin_ = -1.0;
    negative_direction_.reset();
    Vector scaled = gradient;
    for (const auto i : scaled.locally_owned_elements())
      scaled(i) /= weights(i);
    scaled.compress(dealii::VectorOperation::insert);
    gradient_length_ = std::sqrt(std::max(0.0, scaled * gradient));
    unsigned int count = 0;
    newton_length_     = -1.0;
    newton_decrement_  = -1.0;
    bool definite      = factorize_at(0.0, count);
    zero_eigenvalues_  = count == dealii::numbers::invalid_unsigned_int ? last_null_pivots_ : 0;
    if (zero_eigenvalues_ > 0)
      definite = factorize_at(internal::null_space_shift, count);
    if (definite && !solved_newton_step())
      {
        // An iterative solve failed at an H the certificate finds positive semi-definite: H is
        // singular to working precision, as a null pivot says for a factorisation.
        zero_eigenvalues_ = 1;
        definite          = factorize_at(internal::null_space_shift, count) && solved_newton_step();
      }
    if (!definite)
      lower_ = std::max(lower_, -curvature_along(eigenvector_));
    inertia_ = count;
    return count;
  }

  bool MoreSorensenSubproblem::solved_newton_step()
  {
    try
      {
        solve_shifted(*gradient_, newton_step_);
      }
    catch (const HessianSolveError &)
      {
        if (shift_ > 0.0)
          throw;
        return false;
      }
    newton_step_ *= -1.0;
    newton_length_    = scaled_norm(newton_step_);
    newton_decrement_ = -(*gradient_ * newton_step_);
    return true;
  }

  // zᵀHz/zᵀSz for the unshifted H: its negative bounds λ* from below, since λ* ≥ −μ₁ ≥ −zᵀHz/zᵀSz.
  // Along a Newton path the last lowest eigenvector is a close guess of the new one, so the bound is
  // nearly sharp for the price of one product with H.
  double MoreSorensenSubproblem::curvature_along(const Vector &z) const
  {
    Vector Hz = z;
    H_->vmult(Hz, z); // (H + shift·S) z
    const double zSz = std::pow(scaled_norm(z), 2);
    return zSz > 0.0 ? (z * Hz) / zSz - shift_ : 0.0;
  }

  // The eigenpair that inverse iteration with the factorisation of H finds is the one nearest zero, a
  // positive one where H has small positive eigenvalues too; the last lowest eigenvector, that of the
  // previous point (found with a shift near −μ₁), then often still has negative curvature here.
  LowestEigenpair MoreSorensenSubproblem::negative_curvature_direction()
  {
    LowestEigenpair last;
    last.value              = curvature_along(eigenvector_);
    last.vector             = eigenvector_;
    last.available          = true;
    const LowestEigenpair z = lowest_shifted_eigenpair();
    if (z.available && z.value < 0.0)
      return z;
    eigenvector_ = last.vector; // the better start for the inverse iterations of the shifted H
    return last;
  }

  // H + λS is indefinite: a direction of negative curvature z, zᵀ(H + λS)z < 0 with ‖z‖_S = 1, raises
  // the lower bound to λ − zᵀ(H + λS)z (Moré & Sorensen 1983, §3, where z comes from the incomplete
  // Cholesky factor; here from inverse iteration with the indefinite factorisation, which tends to the
  // eigenvalue nearest zero, the negative one when λ is close to −μ₁). λ* usually lies just above that
  // bound (near the hard case), so the next trial is 10 % above it (common practice, no source);
  // without such a direction, the safeguarded guess between the bounds.
  double MoreSorensenSubproblem::past_indefinite(double lambda, double &lower, double upper)
  {
    lower = lower_ = std::max(lower, lambda);
    if (prepared_)
      {
        const LowestEigenpair z = lowest_shifted_eigenpair();
        if (z.available && z.value < 0.0)
          {
            lower = lower_ = std::max(lower, lambda - z.value);
            return std::min(1.1 * lower, 0.5 * (lower + upper));
          }
      }
    return safeguarded(lower, upper);
  }

  // The boundary point p + τz, ‖p + τz‖_S = Δ, of the two that gives the lower model value
  // (Moré & Sorensen 1983, §3, the hard case).
  Vector MoreSorensenSubproblem::to_boundary(const Vector &p, const LowestEigenpair &z, double radius) const
  {
    Vector Sz = z.vector;
    Sz.scale(*weights_);
    const double b = p * Sz, np = scaled_norm(p);
    const double root = std::sqrt(std::max(0.0, b * b + radius * radius - np * np));
    Vector       best = p, trial = p;
    best.add(-b + root, z.vector);
    trial.add(-b - root, z.vector);
    return model_decrease(trial) > model_decrease(best) ? trial : best;
  }

  // From p = −(H + λS)⁻¹g, H + λS positive definite: if ‖p‖_S ≥ Δ, the dogleg of the model with H + λS,
  // which lies on the boundary; else p stretched to the boundary if the model of H keeps falling along it.
  // An empty vector where it does not (the minimum along p is inside: the hard case is near).
  Vector MoreSorensenSubproblem::to_boundary_along(const Vector &p, double radius) const
  {
    const double np = scaled_norm(p);
    if (np >= radius)
      return dogleg(radius, p);
    Vector Hp = p, Sp = p;
    H_->vmult(Hp, p);
    Sp.scale(*weights_);
    const double pHp = p * Hp - shift_ * (p * Sp), gp = *gradient_ * p, tau = radius / std::max(np, 1e-300);
    if (!(gp < 0.0) || (pHp > 0.0 && -gp / pHp < tau))
      return Vector();
    Vector q = p;
    q *= tau;
    return q;
  }

  Vector MoreSorensenSubproblem::scaled_descent() const
  {
    Vector d = *gradient_;
    for (const auto i : d.locally_owned_elements())
      d(i) /= -(*weights_)(i);
    d.compress(dealii::VectorOperation::insert);
    return d;
  }

  // The minimum of the model in the plane spanned by the S-orthonormal u₁ (the scaled steepest descent
  // direction) and u₂ (the negative curvature direction z made S-orthogonal to it), within the region:
  // the two-dimensional subspace minimisation (Nocedal & Wright 2006, §4.1; with a direction of
  // negative curvature in the plane: G. A. Shultz, R. B. Schnabel & R. H. Byrd, SIAM J. Numer. Anal. 22,
  // 47–67, 1985, from memory), solved exactly in the plane. The plane holds the Cauchy step and the
  // step along z, so the step decreases the model at least as much as either, which is what the
  // convergence to points with H positive semidefinite needs; it costs two products with H and no
  // factorisation.
  Vector MoreSorensenSubproblem::two_dimensional(double radius, const Vector &z, double &multiplier) const
  {
    Vector u1 = scaled_descent(), u2 = z;
    double n1 = scaled_norm(u1);
    if (!(n1 > 0.0)) // at a stationary point: along z alone
      {
        u1 = z;
        n1 = scaled_norm(z);
        u2 = 0.0;
      }
    u1 /= n1;
    Vector Su1 = u1;
    Su1.scale(*weights_);
    u2.add(-(u2 * Su1), u1);
    const double n2    = scaled_norm(u2);
    const bool   plane = n2 > 1e-8;
    if (plane)
      u2 /= n2;
    // H u = (H + shift·S) u − shift·S u, with S u orthonormal: u_iᵀHu_j = u_iᵀ(H + shift·S)u_j − shift·δ_ij.
    Vector Hu1 = u1, Hu2 = u2;
    H_->vmult(Hu1, u1);
    const double g1 = *gradient_ * u1, h11 = u1 * Hu1 - shift_;
    double       g2 = 0.0, h12 = 0.0, h22 = 0.0;
    if (plane)
      {
        H_->vmult(Hu2, u2);
        g2 = *gradient_ * u2, h12 = u1 * Hu2, h22 = u2 * Hu2 - shift_;
      }
    if (!plane) // one direction: a second one that the solution leaves alone
      h22 = std::abs(h11) + 1.0;
    const internal::ReducedStep c = internal::reduced_trust_region(g1, g2, h11, h12, h22, radius);
    const double      a = c.a, b = plane ? c.b : 0.0;
    multiplier          = c.multiplier;
    Vector p = u1;
    p *= a;
    if (plane)
      p.add(b, u2);
    return p;
  }

  // Powell's dogleg (Nocedal & Wright 2006, §4.1): along the scaled steepest descent d = −S⁻¹g to the
  // Cauchy point p_U = (gᵀd/dᵀHd)·d, then towards @p full_step p_B, the minimiser of the model with the
  // matrix factorised now (H, or a positive definite H + λS), cut where ‖p‖_S = Δ. It costs one product
  // with that matrix and no factorisation.
  Vector MoreSorensenSubproblem::dogleg(double radius, const Vector &full_step) const
  {
    Vector d = scaled_descent();
    Vector Hd = d;
    H_->vmult(Hd, d);
    const double gd = -((*gradient_) * d), dHd = d * Hd, nd = scaled_norm(d);
    if (!(dHd > 0.0) || gd / dHd * nd >= radius)
      {
        d *= radius / std::max(nd, 1e-300);
        return d;
      }
    d *= gd / dHd; // p_U, inside the region
    Vector between = full_step;
    between -= d; // p_B − p_U
    Vector Sd = d;
    Sd.scale(*weights_);
    const double a = std::pow(scaled_norm(between), 2), b = 2.0 * (between * Sd), c = d * Sd - radius * radius;
    const double tau = a > 0.0 ? (-b + std::sqrt(std::max(0.0, b * b - 4.0 * a * c))) / (2.0 * a) : 0.0;
    d.add(std::clamp(tau, 0.0, 1.0), between);
    return d;
  }

  TrustRegionStep MoreSorensenSubproblem::solve(double radius)
  {
    TrustRegionStep out;
    out.negative_curvature    = inertia_ != 0;
    const unsigned int start  = factorizations_;
    const auto         finish = [&](const Vector &p, double lambda) {
      out.step               = p;
      out.multiplier         = lambda;
      out.length             = scaled_norm(p);
      out.predicted_decrease = model_decrease(p);
      out.factorizations     = factorizations_ - start;
      if (lambda > 0)
        {
          last_multiplier_ = lambda;
          last_radius_     = radius;
        }
      return out;
    };
    if (inertia_ == 0 && newton_length_ <= (1 + boundary_accuracy) * radius)
      return finish(newton_step_, 0.0);
    // H unshifted (or shifted by internal::null_space_shift·S if it is singular) holds the Newton step's matrix.
    const bool at_newton_shift = inertia_ == 0 && shift_ <= internal::null_space_shift;
    if (at_newton_shift)
      return finish(dogleg(radius, newton_step_), 0.0);

    // H itself indefinite with a known direction of negative curvature: the plane of it and the
    // steepest descent, without (further) factorisations of H + λS.
    if (inertia_ != 0 && !negative_direction_ && prepared_ && shift_ == 0.0)
      negative_direction_ = negative_curvature_direction();
    const auto along_negative_curvature = [&]() {
      double       lambda = 0.0;
      const Vector p      = two_dimensional(radius, negative_direction_->vector, lambda);
      return finish(p, lambda);
    };
    if (inertia_ != 0 && negative_direction_ && negative_direction_->available && negative_direction_->value < 0.0)
      return along_negative_curvature();
    // Gershgorin's bound, needed only here (not by the Newton step nor the dogleg).
    if (gershgorin_ < 0.0)
      gershgorin_ = internal::gershgorin_shift(*H_, *weights_, shift_);
    double lower = lower_, upper = gershgorin_ + gradient_length_ / radius;
    Vector p = newton_step_, w = newton_step_, Sp = newton_step_;
    double lambda   = 0.0;
    bool   have_p   = at_newton_shift && prepared_; // the Newton step at λ = 0
    bool   eigen_known = false;
    Vector best_p;
    double best_lambda = -1.0;
    if (!have_p)
      {
        // λ ≈ ‖g‖_S/Δ where the shift dominates H: the last multiplier scaled to the new radius.
        const double warm = last_radius_ > 0.0 ? last_multiplier_ * last_radius_ / radius : 0.0;
        lambda            = std::min(std::max(warm, 1.1 * lower), upper);
        if (lambda <= lower) // H + λS is not positive definite for any λ ≤ λ_L
          lambda = safeguarded(lower, upper);
      }
    while (factorizations_ - start < max_factorizations)
      {
        if (!have_p)
          {
            unsigned int count = 0;
            if (!factorize_at(lambda, count))
              {
                lambda = past_indefinite(lambda, lower, upper);
                // The inverse iteration with H + λS, λ closer to −μ₁, may have found H's negative curvature.
                if (inertia_ != 0 && prepared_)
                  if (const double mu = curvature_along(eigenvector_); mu < 0.0)
                    {
                      LowestEigenpair z;
                      z.available = true;
                      z.value     = mu;
                      z.vector    = eigenvector_;
                      negative_direction_ = z;
                      return along_negative_curvature();
                    }
                continue;
              }
            solve_shifted(*gradient_, p);
            p *= -1.0;
            // H indefinite: the first positive definite H + λS whose step p(λ) leads to the boundary is
            // enough (see the class comment).
            if (inertia_ != 0)
              if (const Vector q = to_boundary_along(p, radius); q.size() > 0)
                return finish(q, lambda);
          }
        have_p          = false;
        const double np = scaled_norm(p);
        best_p          = p;
        best_lambda     = lambda;
        if (np <= (1 + boundary_accuracy) * radius && (lambda == 0.0 || np >= (1 - boundary_accuracy) * radius))
          return finish(p, lambda);
        // An indefinite H: the lowest eigenvalue of H + λS bounds λ* from below (λ* ≥ −μ₁ ≥ λ − μ(z)).
        LowestEigenpair z;
        if (np < radius || (inertia_ != 0 && !eigen_known))
          {
            z           = lowest_shifted_eigenpair();
            eigen_known = z.available;
            if (z.available)
              lower = lower_ = std::max(lower, lambda - z.value);
          }
        const bool interior = np < radius;
        if (interior)
          {
            upper = std::min(upper, lambda);
            if (z.available)
              {
                const Vector q    = to_boundary(p, z, radius);
                Vector       taus = q;
                taus -= p; // τz, and ‖z‖_S = 1
                const double tau = scaled_norm(taus);
                // Moré & Sorensen (1983), eq. 3.12, with pᵀ(H + λS)p = −gᵀp.
                if (tau * tau * z.value <=
                    boundary_accuracy * (2 - boundary_accuracy) * (-((*gradient_) * p) + lambda * radius * radius))
                  return finish(q, lambda);
              }
          }
        else
          lower = std::max(lower, lambda);
        // Newton's method on 1/‖p(λ)‖_S = 1/Δ.
        Sp = p;
        Sp.scale(*weights_);
        solve_shifted(Sp, w);
        const double q2   = Sp * w;
        const double next = q2 > 0 ? lambda + (np * np / q2) * (np - radius) / radius : -1.0;
        if (next > lower && next < upper)
          lambda = next;
        else if (interior && eigen_known)
          lambda = lower + 0.1 * (upper - lower); // the hard case: λ_L ≈ −μ₁ is sharp, approach it
        else
          lambda = safeguarded(lower, upper);
      }
    // Out of factorisations: the last positive definite solution, cut back to the region; failing
    // that, the scaled steepest descent step to the boundary (a descent direction either way).
    if (best_lambda >= 0.0)
      {
        const double np = scaled_norm(best_p);
        if (np > radius)
          best_p *= radius / np;
        return finish(best_p, best_lambda);
      }
    Vector d = scaled_descent();
    d *= radius / std::max(gradient_length_, 1e-300);
    return finish(d, upper);
  }
} // namespace nappe
