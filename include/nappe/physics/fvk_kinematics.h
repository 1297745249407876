#pragma once

#include <deal.II/base/symmetric_tensor.h>
#include <deal.II/base/tensor.h>

#include <nappe/physics/sheet_material.h>

/**
 * @file Pointwise constitutive relations of the Föppl–von Kármán sheet.
 *
 * Membrane strain ε (Green–Lagrange, moderate rotations): ε = E + sym∇ũ + ½∇w⊗∇w − ε₀, with E the
 * prescribed mean strain, ũ the in-plane displacement fluctuation, w the deflection and ε₀ the
 * eigenstrain (thermal or lattice mismatch). Membrane energy per area ½ N:ε with
 * N = Y/(1−ν²)[(1−ν)ε + ν tr(ε) I] (plane stress). Bending energy per area ½ M:κ with κ = ∇∇w and
 * M = D[(1−ν)κ + ν tr(κ) I], i.e. D/2[(1−ν)|∇∇w|² + ν(Δw)²] — the full-Hessian form whose natural
 * boundary conditions are the Kirchhoff free-edge conditions (Timoshenko & Woinowsky-Krieger 1959,
 * §10; Ventsel & Krauthammer, Thin Plates and Shells, 2001, §2.5).
 * Here M is the derivative of the energy density with respect to κ; the engineering bending moment
 * has the opposite sign convention for w pointing down.
 */
namespace nappe
{
  using SymTensor = dealii::SymmetricTensor<2, 2>;

  /// Membrane stress resultant N = Y/(1−ν²)[(1−ν)ε + ν tr(ε) I] [N/m] for strain ε.
  inline SymTensor membrane_stress(const SymTensor &strain, const SheetMaterial &m)
  {
    const double nu = m.poisson_ratio;
    return m.membrane_stiffness() *
           ((1.0 - nu) * strain + nu * dealii::trace(strain) * dealii::unit_symmetric_tensor<2>());
  }

  /// Bending moment resultant M = D[(1−ν)κ + ν tr(κ) I] [N] for curvature κ = ∇∇w [1/m].
  inline SymTensor bending_moment(const SymTensor &curvature, const SheetMaterial &m)
  {
    const double nu = m.poisson_ratio;
    return m.bending_rigidity *
           ((1.0 - nu) * curvature + nu * dealii::trace(curvature) * dealii::unit_symmetric_tensor<2>());
  }

  /// The symmetric part of a⊗b.
  inline SymTensor symmetric_outer(const dealii::Tensor<1, 2> &a, const dealii::Tensor<1, 2> &b)
  {
    SymTensor s;
    s[0][0] = a[0] * b[0];
    s[1][1] = a[1] * b[1];
    s[0][1] = 0.5 * (a[0] * b[1] + a[1] * b[0]);
    return s;
  }

  /**
   * Membrane strain ε = ε_b + sym∇ũ + ½∇w⊗∇w, with ε_b = λ(E − ε₀) the uniform part
   * (SheetModel::base_strain); the quadratic term only with geometric nonlinearity. The one
   * definition used by the assembly, the measures and the fields.
   */
  inline SymTensor membrane_strain(const SymTensor &base_strain, const dealii::Tensor<2, 2> &grad_u,
                                   const dealii::Tensor<1, 2> &grad_w, bool nonlinear)
  {
    SymTensor strain = base_strain + dealii::symmetrize(grad_u);
    if (nonlinear)
      strain += 0.5 * symmetric_outer(grad_w, grad_w);
    return strain;
  }

  /// Principal values (λ_max, λ_min) of a symmetric 2×2 tensor.
  inline std::pair<double, double> principal_values(const SymTensor &t)
  {
    const double mean   = 0.5 * (t[0][0] + t[1][1]);
    const double radius = std::sqrt(0.25 * (t[0][0] - t[1][1]) * (t[0][0] - t[1][1]) + t[0][1] * t[0][1]);
    return {mean + radius, mean - radius};
  }
} // namespace nappe
