#pragma once

#include <nappe/solvers/energy_minimizer.h>

namespace nappe
{
  /// The factor of a LoadLevel a path varies.
  enum class PathParameter
  {
    load,    ///< the load factor λ
    adhesion ///< the adhesion factor c = Γ/Γ_case
  };

  /**
   * The tangent dU/dp of a path of minima U(p) at a certified state, from the implicit function
   * theorem applied to R(U(p), p) = 0:
   *
   *     H dU/dp = −∂R/∂p,
   *
   * solved with the factorisation of H that @p minimizer prepared at @p state in its last,
   * converged minimize() (one solve, no new factorisation). The residual is affine in both factors
   * (λ scales every load and the mean strain, c scales the substrate potential; sheet_model.h), so
   * the central difference ∂R/∂p = (R(p + 1) − R(p − 1))/2 is exact. Constrained entries satisfy the
   * (homogeneous) constraints. [m or 1 per unit of the factor]
   */
  Vector path_tangent(EnergyMinimizer &minimizer, const Vector &state, const LoadLevel &level, PathParameter parameter);

  /// The locally owned deflection (w) unknowns of @p system.
  dealii::IndexSet deflection_dofs(const SheetSystem &system);

  /// The largest |entry| of @p v over @p dofs (locally owned ones, e.g. deflection_dofs()), the same
  /// on every rank.
  double largest_entry(const Vector &v, const dealii::IndexSet &dofs, MPI_Comm comm);
} // namespace nappe
