#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/symmetric_tensor.h>
#include <deal.II/base/tensor.h>

#include <nappe/physics/sheet_model.h>
#include <nappe/solvers/sheet_system.h>

#include <functional>
#include <vector>

namespace nappe
{
  /**
   * What is known of a solved sheet at one point of the reference plane, in SI: the deflection w and
   * its derivatives, the periodic in-plane displacement ũ and its derivatives, the membrane strain
   * (fvk_kinematics.h), the model and the load level. Every derived quantity (sheet_quantities.h)
   * is a function of this.
   */
  struct PointState
  {
    dealii::Point<2>             x;      ///< [m]
    double                       w = 0;  ///< deflection [m]
    dealii::Tensor<1, 2>         grad_w; ///< [-]
    dealii::Tensor<2, 2>         hess_w; ///< [1/m]
    dealii::Tensor<1, 2>         u_periodic; ///< ũ [m]
    dealii::Tensor<2, 2>         grad_u;     ///< ∇ũ [-]
    dealii::Tensor<3, 2>         hess_u;     ///< ∇∇ũ, hess_u[i][j][k] = ∂²ũ_i/∂x_j∂x_k [1/m]
    dealii::SymmetricTensor<2, 2> strain;    ///< membrane strain ε [-]
    const SheetModel            *model = nullptr;
    LoadLevel                    level;

    /// The total in-plane displacement u = λE·x + ũ [m].
    dealii::Tensor<1, 2> displacement() const;
  };

  /**
   * A point state from the field values at @p x: @p values, @p gradients and @p hessians hold the
   * three components (ũ_x, ũ_y, w) in this order. Used by the quadrature loop below and by the field
   * output, so that both derive the same quantities from the same state.
   */
  PointState make_point_state(const SheetModel &model, const LoadLevel &level, const dealii::Point<2> &x,
                              const std::vector<double> &values, const std::vector<dealii::Tensor<1, 2>> &gradients,
                              const std::vector<dealii::Tensor<2, 2>> &hessians);

  /// The points of one locally owned cell with their weights dA [m²].
  struct CellPoints
  {
    dealii::DoFHandler<2>::active_cell_iterator cell;
    std::vector<PointState>                     points;
    std::vector<double>                         weights;
  };

  /**
   * The one evaluation loop of the analysis floor: calls @p visit for every locally owned cell with
   * the point states at its Gauss points (p + 1 per direction, as the assembly). Not collective;
   * callers combine their results over the system's communicator.
   */
  void for_each_cell(const SheetSystem &system, const Vector &ghosted_state, const LoadLevel &level,
                     const std::function<void(const CellPoints &)> &visit);
} // namespace nappe
