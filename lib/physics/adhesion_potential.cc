#include <deal.II/base/exceptions.h>

#include <nappe/physics/adhesion_potential.h>

#include <cmath>

namespace nappe
{
  GapMeasure parse_gap_measure(const std::string &name)
  {
    if (name == "vertical")
      return GapMeasure::vertical;
    if (name == "normal")
      return GapMeasure::normal;
    AssertThrow(false, dealii::ExcMessage("Substrate/Gap measure = '" + name + "': expected vertical or normal."));
    return GapMeasure::vertical;
  }

  AdhesionPotential::AdhesionPotential(std::shared_ptr<const Topography> topography,
                                       std::shared_ptr<const AdhesionLaw> law, GapMeasure measure)
    : topography_(std::move(topography))
    , law_(std::move(law))
    , measure_(measure)
  {
    AssertThrow(topography_ && law_, dealii::ExcMessage("An adhesion potential needs a topography and a law."));
  }

  double AdhesionPotential::gap_factor(const dealii::Point<2> &x) const
  {
    if (measure_ == GapMeasure::vertical)
      return 1.0;
    return 1.0 / std::sqrt(1.0 + topography_->gradient(x).norm_square());
  }

  double AdhesionPotential::gap(const dealii::Point<2> &x, double w) const
  {
    return (w - topography_->height(x)) * gap_factor(x);
  }

  void AdhesionPotential::evaluate(const dealii::Point<2> &x, double w, double &psi, double &dpsi_dw,
                                   double &d2psi_dw2) const
  {
    const double c = gap_factor(x);
    double       phi, dphi, d2phi;
    law_->evaluate((w - topography_->height(x)) * c, phi, dphi, d2phi);
    psi       = phi;
    dpsi_dw   = dphi * c;
    d2psi_dw2 = d2phi * c * c;
  }
} // namespace nappe
