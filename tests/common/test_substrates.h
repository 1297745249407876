#pragma once

// Test helper: surface potentials shared by several suites.
#include <nappe/geometry/sheet_domain.h>
#include <nappe/physics/surface_potential.h>

#include <cmath>
#include <utility>

namespace nappe::test_support
{
  /// The reciprocal vectors b_i of a cell's lattice vectors a_j, a_i·b_j = δ_ij [1/m].
  inline std::pair<dealii::Tensor<1, 2>, dealii::Tensor<1, 2>> reciprocal_vectors(const SheetDomain &domain)
  {
    const auto [a1, a2] = domain.lattice_vectors();
    const double         det = a1[0] * a2[1] - a1[1] * a2[0];
    dealii::Tensor<1, 2> b1, b2;
    b1[0] = a2[1] / det;
    b1[1] = -a2[0] / det;
    b2[0] = -a1[1] / det;
    b2[1] = a1[0] / det;
    return {b1, b2};
  }

  /// ψ(x, w) = k·d²/2 + c·d⁴ with d = w − s(x), s(x) = s0·sin(2πb1·x)·cos(2πb2·x) for the cell's
  /// reciprocal vectors b_i [J/m²]: a nonlinear spring to a corrugated substrate.
  class SpringToTopography : public SurfacePotential
  {
  public:
    SpringToTopography(const SheetDomain &domain, double k, double c, double s0) : k_(k), c_(c), s0_(s0)
    {
      std::tie(b1_, b2_) = reciprocal_vectors(domain);
    }
    void evaluate(const dealii::Point<2> &x, double w, double &psi, double &dpsi_dw, double &d2psi_dw2) const override
    {
      const double d = w - s0_ * std::sin(2.0 * M_PI * (b1_ * x)) * std::cos(2.0 * M_PI * (b2_ * x));
      psi            = 0.5 * k_ * d * d + c_ * d * d * d * d;
      dpsi_dw        = k_ * d + 4.0 * c_ * d * d * d;
      d2psi_dw2      = k_ + 12.0 * c_ * d * d;
    }

  private:
    double               k_, c_, s0_;
    dealii::Tensor<1, 2> b1_, b2_;
  };
} // namespace nappe::test_support
