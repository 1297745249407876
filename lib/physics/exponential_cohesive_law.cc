#include <deal.II/base/exceptions.h>

#include <nappe/base/units.h>
#include <nappe/physics/exponential_cohesive_law.h>

#include <cmath>
#include <sstream>

namespace nappe
{
  ExponentialCohesiveLaw::ExponentialCohesiveLaw(const double work_of_adhesion, const double equilibrium_gap,
                                                 const double characteristic_length,
                                                 const double penalty_stiffness_factor)
    : gamma(work_of_adhesion)
    , h0(equilibrium_gap)
    , delta(characteristic_length)
    , k_penalty(penalty_stiffness_factor * work_of_adhesion / (characteristic_length * characteristic_length))
  {
    internal::require_positive("exponential-cohesive", "work of adhesion", "J/m^2", work_of_adhesion);
    internal::require_positive("exponential-cohesive", "equilibrium gap", "m", equilibrium_gap);
    internal::require_positive("exponential-cohesive", "characteristic length", "m", characteristic_length);
    internal::require_positive("exponential-cohesive", "penalty stiffness factor", "-", penalty_stiffness_factor);
  }

  void ExponentialCohesiveLaw::evaluate(const double gap, double &phi, double &dphi, double &d2phi) const
  {
    Assert(std::isfinite(gap),
           dealii::ExcMessage("exponential-cohesive adhesion law evaluated at a non-finite gap."));
    const double opening = gap - h0;
    if (opening >= 0.0)
      {
        const double s = opening / delta;
        const double e = std::exp(-s);
        phi            = -gamma * (1.0 + s) * e;
        dphi           = gamma / delta * s * e;
        d2phi          = gamma / (delta * delta) * (1.0 - s) * e;
      }
    else
      {
        phi   = -gamma + 0.5 * k_penalty * opening * opening;
        dphi  = k_penalty * opening;
        d2phi = k_penalty;
      }
  }

  void ExponentialCohesiveLaw::declare_parameters(dealii::ParameterHandler &prm)
  {
    prm.declare_entry("Characteristic length", "0.1", dealii::Patterns::Double(0.0),
                      "Distance delta from the equilibrium separation to the gap of peak attractive "
                      "traction, Gamma/(e*delta). Unit: nm. Must be positive.");
    prm.declare_entry("Penalty stiffness factor", "1", dealii::Patterns::Double(0.0),
                      "Factor kappa of the penetration stiffness k = kappa*Gamma/delta^2 used for gaps "
                      "below the equilibrium separation. Dimensionless, positive; 1 makes the law C2.");
  }

  std::unique_ptr<AdhesionLaw> ExponentialCohesiveLaw::parse_parameters(const double work_of_adhesion,
                                                                        const double equilibrium_gap,
                                                                        const dealii::ParameterHandler &prm)
  {
    const double delta_nm = prm.get_double("Characteristic length");
    AssertThrow(delta_nm > 0.0,
                dealii::ExcMessage("Adhesion/exponential-cohesive/Characteristic length: expected a positive "
                                   "length in nm, found " +
                                   prm.get("Characteristic length") + "."));
    const double kappa = prm.get_double("Penalty stiffness factor");
    AssertThrow(kappa > 0.0,
                dealii::ExcMessage("Adhesion/exponential-cohesive/Penalty stiffness factor: expected a positive "
                                   "number (dimensionless), found " +
                                   prm.get("Penalty stiffness factor") + "."));
    return std::make_unique<ExponentialCohesiveLaw>(work_of_adhesion, equilibrium_gap,
                                                    delta_nm * units::nanometer, kappa);
  }
} // namespace nappe
