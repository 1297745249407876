#pragma once

#include <deal.II/base/point.h>


namespace nappe
{
  /**
   * An energy per unit (projected) area ψ(x, w) [J/m²] that depends on the position x and the
   * sheet height w only: the interaction with a substrate (adhesion), or a conservative load.
   * The sheet energy adds ∫ψ(x, w) dA over the reference (projected) area.
   */
  class SurfacePotential
  {
  public:
    virtual ~SurfacePotential() = default;

    /// ψ [J/m²], ∂ψ/∂w [Pa] and ∂²ψ/∂w² [Pa/m] at position x [m] and height w [m].
    virtual void evaluate(const dealii::Point<2> &x, double w, double &psi, double &dpsi_dw,
                          double &d2psi_dw2) const = 0;
  };
} // namespace nappe
