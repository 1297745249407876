#pragma once

#include <deal.II/base/tensor.h>

/**
 * @file The spatial gradient of the membrane strain, from the second derivatives of the solved fields.
 *
 * With ε = ε_b + sym∇ũ + ½∇w⊗∇w (fvk_kinematics.h; ε_b uniform), the gradient is
 *   ∂_k ε_ij = ½(∂_j∂_k ũ_i + ∂_i∂_k ũ_j) + ½(∂_i∂_k w ∂_j w + ∂_i w ∂_j∂_k w),
 * the quadratic part only with geometric nonlinearity. It needs exactly what a point state holds
 * (∇∇ũ, ∇w, ∇∇w), so quantities built on it (the pseudo-magnetic field, electronic_fields.h) are
 * evaluated pointwise from the finite element solution without a recovery step. With elements of
 * degree p the second derivatives, and so this gradient, converge at order p − 1 (Ciarlet, The Finite
 * Element Method for Elliptic Problems, 1978, Thm 3.1.6, interpolation error in W^{2,∞}; from memory).
 */
namespace nappe
{
  /**
   * ∂ε_ij/∂x_k as g[i][j][k] [1/m]. @p hess_u[i][j][k] = ∂²ũ_i/∂x_j∂x_k [1/m], @p grad_w [-],
   * @p hess_w [1/m]; @p nonlinear adds the von Kármán term.
   */
  inline dealii::Tensor<3, 2> membrane_strain_gradient(const dealii::Tensor<3, 2> &hess_u,
                                                       const dealii::Tensor<1, 2> &grad_w,
                                                       const dealii::Tensor<2, 2> &hess_w, bool nonlinear)
  {
    dealii::Tensor<3, 2> g;
    for (unsigned int i = 0; i < 2; ++i)
      for (unsigned int j = 0; j < 2; ++j)
        for (unsigned int k = 0; k < 2; ++k)
          {
            g[i][j][k] = 0.5 * (hess_u[i][j][k] + hess_u[j][i][k]);
            if (nonlinear)
              g[i][j][k] += 0.5 * (hess_w[i][k] * grad_w[j] + grad_w[i] * hess_w[j][k]);
          }
    return g;
  }
} // namespace nappe
