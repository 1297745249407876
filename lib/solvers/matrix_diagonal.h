#pragma once

// Private to lib/solvers: the diagonal of the Hessian read and shifted through Epetra's row views.
// TrilinosWrappers::SparseMatrix::diag_element(), add(i, i, ·) and its row iterators look up or copy
// a whole row per call; done for every row in every Newton iteration, that cost more than the
// factorisation itself on the cells of the adhesion paths (measured with benchmarks/adhesion_limits).
#include <nappe/solvers/sheet_system.h>

namespace nappe::internal
{
  /**
   * A Hessian with null pivots (eigenvalues zero to round-off, e.g. a wrinkle that can slide along a periodic
   * cell) is factorised shifted by this multiple of diag|H| instead. It is far above the pivots' round-off and far
   * below any physical curvature, so the shifted inertia counts H's negative eigenvalues and its zero ones as
   * positive (common practice, no source) [-].
   */
  constexpr double null_space_shift = 1e-10;

  /// @p diagonal (owned) = H_ii of the locally owned rows.
  void extract_diagonal(const SparseMatrix &H, Vector &diagonal);

  /// H_ii += factor · weights_i on the locally owned rows (in place; H keeps its sparsity pattern).
  void add_to_diagonal(SparseMatrix &H, const Vector &weights, double factor);

  /**
   * For the matrix H₀ = H − shift·diag(weights) (H holds H₀ shifted by @p shift): the smallest λ ≥ 0
   * beyond which H₀ + λ·diag(weights) is strictly diagonally dominant with a positive diagonal, hence
   * positive definite (Gershgorin's theorem): max over rows of (Σ_{j≠i}|H_ij| − H₀_ii)/weights_i, at
   * least 0; the maximum over all ranks.
   */
  double gershgorin_shift(const SparseMatrix &H, const Vector &weights, double shift);
} // namespace nappe::internal
