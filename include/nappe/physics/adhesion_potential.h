#pragma once

#include <nappe/geometry/topography.h>
#include <nappe/physics/adhesion_law.h>
#include <nappe/physics/surface_potential.h>

#include <memory>
#include <string>

namespace nappe
{
  /// How the gap between sheet and substrate is measured.
  enum class GapMeasure
  {
    vertical, ///< g = w − s(x)
    normal    ///< g = (w − s(x)) / √(1 + |∇s|²): along the substrate normal, to first order in the gap
  };

  GapMeasure parse_gap_measure(const std::string &name);

  /**
   * The adhesion of the sheet to a substrate of height s(x): ψ(x, w) = φ(g(x, w)) with φ a
   * traction–separation law. The energy is counted per unit reference (projected, flat) area of the
   * sheet, the area the FvK energy is integrated over; on a conformed sheet it is −Γ per projected
   * area whatever the local slope.
   */
  class AdhesionPotential : public SurfacePotential
  {
  public:
    AdhesionPotential(std::shared_ptr<const Topography> topography, std::shared_ptr<const AdhesionLaw> law,
                      GapMeasure measure);

    void evaluate(const dealii::Point<2> &x, double w, double &psi, double &dpsi_dw, double &d2psi_dw2) const override;

    /// The gap at x for height w [m].
    double gap(const dealii::Point<2> &x, double w) const;
    /// True where the sheet is conformed: gap ≤ the gap of peak attractive traction.
    bool conformed(double gap) const { return gap <= law_->peak_traction_gap(); }

    const Topography  &topography() const { return *topography_; }
    const AdhesionLaw &law() const { return *law_; }
    GapMeasure         gap_measure() const { return measure_; }

  private:
    /// dg/dw: 1 for the vertical gap, 1/√(1 + |∇s|²) for the normal gap.
    double gap_factor(const dealii::Point<2> &x) const;

    std::shared_ptr<const Topography>  topography_;
    std::shared_ptr<const AdhesionLaw> law_;
    GapMeasure                         measure_;
  };
} // namespace nappe
