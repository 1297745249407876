#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/tensor.h>

#include <nappe/solvers/sheet_system.h>

#include <array>
#include <vector>

namespace nappe
{
  /**
   * The solved fields (ũ_x, ũ_y, w) at one point with their gradients and Hessians: what a point state
   * needs (strain from the gradients, strain gradient from the Hessians, strain_gradient.h).
   */
  struct PointJet
  {
    std::array<double, 3>               values{};   ///< ũ_x, ũ_y [m], w [m]
    std::array<dealii::Tensor<1, 2>, 3> gradients;  ///< [-]
    std::array<dealii::Tensor<2, 2>, 3> hessians;   ///< [1/m]

    /// ∇ũ with rows i = component: (∇ũ)[i][j] = ∂ũ_i/∂x_j [-].
    dealii::Tensor<2, 2> grad_u() const;
    /// ∇∇ũ as hess_u[i][j][k] = ∂²ũ_i/∂x_j∂x_k [1/m].
    dealii::Tensor<3, 2> hess_u() const;
  };

  /**
   * The jets of @p state (ghosted) at arbitrary points of the reference plane [m], evaluated on the rank
   * that owns each point (Utilities::MPI::RemotePointEvaluation, FEValues on the points' reference
   * coordinates) and returned to the rank that asked. A point on a cell edge gets the mean over the cells
   * that share it (values and gradients agree there; Hessians are averaged). found[i] is false for a
   * point not on the sheet (its jet is zero). Collective; each rank passes its own points.
   */
  std::vector<PointJet> evaluate_point_jets(const SheetSystem &system, const Vector &state,
                                            const std::vector<dealii::Point<2>> &points, std::vector<bool> &found);
} // namespace nappe
