#include <nappe/physics/adhesion_law.h>

namespace nappe
{
  double AdhesionLaw::energy(const double gap) const
  {
    double phi, dphi, d2phi;
    evaluate(gap, phi, dphi, d2phi);
    return phi;
  }

  double AdhesionLaw::attractive_traction(const double gap) const
  {
    double phi, dphi, d2phi;
    evaluate(gap, phi, dphi, d2phi);
    return dphi;
  }

  double AdhesionLaw::peak_traction() const
  {
    return attractive_traction(peak_traction_gap());
  }
} // namespace nappe
