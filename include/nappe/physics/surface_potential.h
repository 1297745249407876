#pragma once

#include <deal.II/base/point.h>

#include <string>
#include <vector>

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

    /// ψ [J/m²], ∂ψ/∂w [N/m³] and ∂²ψ/∂w² [N/m⁴] at position x [m] and height w [m].
    virtual void evaluate(const dealii::Point<2> &x, double w, double &psi, double &dpsi_dw,
                          double &d2psi_dw2) const = 0;

    /// Names of extra output fields this potential describes (e.g. the gap), with units in the name.
    virtual std::vector<std::string> field_names() const { return {}; }
    /// Values of those fields at x for height w, in the units their names state.
    virtual void fields(const dealii::Point<2> &x, double w, std::vector<double> &values) const
    {
      (void)x;
      (void)w;
      values.clear();
    }
  };
} // namespace nappe
