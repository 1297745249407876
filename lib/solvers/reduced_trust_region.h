#pragma once

// Private to lib/solvers: the exact trust-region step in a plane, for MoreSorensenSubproblem's
// two-dimensional subspace step (J. J. Moré & D. C. Sorensen, SIAM J. Sci. Stat. Comput. 4, 553, 1983).
namespace nappe::internal
{
  /// The solution (a, b) of a trust-region problem in two dimensions and its multiplier λ.
  struct ReducedStep
  {
    double a = 0.0, b = 0.0, multiplier = 0.0;
  };

  /// min g·c + ½cᵀHc subject to |c| ≤ Δ for H = [[h11, h12], [h12, h22]], exactly: in H's eigenbasis
  /// c(λ) = −(H + λI)⁻¹g, λ ≥ max(0, −μ_min), the root of |c(λ)| = Δ by bisection (|c| falls
  /// monotonically in λ), or, where g has no component along the lowest eigenvector (the hard case),
  /// c(−μ_min) plus the multiple of that eigenvector that reaches the boundary (Moré & Sorensen 1983).
  ReducedStep reduced_trust_region(double g1, double g2, double h11, double h12, double h22, double radius);
} // namespace nappe::internal
