#include <deal.II/base/exceptions.h>

#include <nappe/physics/scaled_potential.h>

#include <cmath>
#include <string>

namespace nappe
{
  ScaledPotential::ScaledPotential(std::shared_ptr<const SurfacePotential> base, double factor)
    : base_(std::move(base))
    , factor_(1.0)
  {
    AssertThrow(base_, dealii::ExcMessage("ScaledPotential: no potential to scale."));
    set_factor(factor);
  }

  void ScaledPotential::set_factor(double factor)
  {
    AssertThrow(std::isfinite(factor) && factor > 0.0,
                dealii::ExcMessage("ScaledPotential: the factor must be a positive number, found " +
                                   std::to_string(factor) + "."));
    factor_ = factor;
  }

  void ScaledPotential::evaluate(const dealii::Point<2> &x, double w, double &psi, double &dpsi_dw,
                                 double &d2psi_dw2) const
  {
    base_->evaluate(x, w, psi, dpsi_dw, d2psi_dw2);
    psi *= factor_;
    dpsi_dw *= factor_;
    d2psi_dw2 *= factor_;
  }
} // namespace nappe
