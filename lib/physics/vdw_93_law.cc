#include <deal.II/base/exceptions.h>

#include <nappe/physics/vdw_93_law.h>

#include <cmath>
#include <sstream>

namespace nappe
{
  Vdw93Law::Vdw93Law(const double work_of_adhesion, const double equilibrium_gap,
                     const double regularization_gap_fraction)
    : gamma(work_of_adhesion)
    , h0(equilibrium_gap)
    , g_min(regularization_gap_fraction * equilibrium_gap)
  {
    internal::require_positive("vdw-9-3", "work of adhesion", "J/m^2", work_of_adhesion);
    internal::require_positive("vdw-9-3", "equilibrium gap", "m", equilibrium_gap);
    AssertThrow(regularization_gap_fraction > 0.0 && regularization_gap_fraction < 1.0,
                dealii::ExcMessage("vdw-9-3 adhesion law: the regularization gap fraction must lie strictly "
                                   "between 0 and 1, but " +
                                   std::to_string(regularization_gap_fraction) + " was given."));
    evaluate_exact(g_min, phi_min, dphi_min, d2phi_min);
  }

  void Vdw93Law::evaluate_exact(const double gap, double &phi, double &dphi, double &d2phi) const
  {
    const double x  = h0 / gap;
    const double x3 = x * x * x;
    const double x9 = x3 * x3 * x3;
    phi             = -gamma * (1.5 * x3 - 0.5 * x9);
    dphi            = 4.5 * gamma / gap * (x3 - x9);
    d2phi           = 4.5 * gamma / (gap * gap) * (10.0 * x9 - 4.0 * x3);
  }

  void Vdw93Law::evaluate(const double gap, double &phi, double &dphi, double &d2phi) const
  {
    Assert(std::isfinite(gap), dealii::ExcMessage("vdw-9-3 adhesion law evaluated at a non-finite gap."));
    if (gap >= g_min)
      evaluate_exact(gap, phi, dphi, d2phi);
    else
      {
        const double dg = gap - g_min;
        phi             = phi_min + dg * (dphi_min + 0.5 * d2phi_min * dg);
        dphi            = dphi_min + d2phi_min * dg;
        d2phi           = d2phi_min;
      }
  }

  double Vdw93Law::peak_traction_gap() const
  {
    return std::pow(2.5, 1.0 / 6.0) * h0;
  }

  void Vdw93Law::declare_parameters(dealii::ParameterHandler &prm)
  {
    prm.declare_entry("Regularization gap fraction", "0.5", dealii::Patterns::Double(0.0, 1.0),
                      "Fraction f of the equilibrium separation below which the 9-3 law is continued "
                      "by its quadratic Taylor expansion about f*h0, so that it stays finite, C1 and "
                      "repulsive for small and negative gaps. Dimensionless, strictly between 0 and 1.");
  }

  std::unique_ptr<AdhesionLaw> Vdw93Law::parse_parameters(const double work_of_adhesion,
                                                          const double equilibrium_gap,
                                                          const dealii::ParameterHandler &prm)
  {
    const double f = prm.get_double("Regularization gap fraction");
    AssertThrow(f > 0.0 && f < 1.0,
                dealii::ExcMessage("Adhesion/vdw-9-3/Regularization gap fraction: expected a number strictly "
                                   "between 0 and 1 (dimensionless), found " +
                                   prm.get("Regularization gap fraction") + "."));
    return std::make_unique<Vdw93Law>(work_of_adhesion, equilibrium_gap, f);
  }
} // namespace nappe
