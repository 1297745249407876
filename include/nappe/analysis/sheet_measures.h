#pragma once

#include <deal.II/base/point.h>

#include <nappe/solvers/sheet_system.h>

namespace nappe
{
  /// A value and where it occurs (on the reference sheet) [m].
  struct LocatedValue
  {
    double           value = 0.0;
    dealii::Point<2> location;
  };

  /**
   * Pointwise extremes of a solved sheet, sampled at the quadrature points. Strains are the
   * membrane (mid-surface) strains ε = E + sym∇ũ + ½∇w⊗∇w − ε₀ measured from the stress-free state.
   */
  struct SheetMeasures
  {
    LocatedValue max_deflection;        ///< largest |w| [m] (signed value)
    LocatedValue max_principal_strain;  ///< largest ε₁ [-]
    LocatedValue min_principal_strain;  ///< smallest ε₂ [-]
    LocatedValue max_areal_strain;      ///< largest |tr ε| (biaxial part) [-] (signed value)
    LocatedValue max_shear_strain;      ///< largest (ε₁ − ε₂)/2 [-]
    LocatedValue max_curvature;         ///< largest |principal curvature| [1/m]
  };

  SheetMeasures measure_sheet(const SheetSystem &system, const Vector &state, double load_factor);

  /// The membrane strain at a quadrature point from the field values (shared with the field output).
  dealii::SymmetricTensor<2, 2> membrane_strain(const SheetModel &model, double load_factor,
                                                const dealii::Tensor<2, 2> &grad_u, const dealii::Tensor<1, 2> &grad_w);
} // namespace nappe
