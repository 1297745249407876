#include <deal.II/base/exceptions.h>

#include <nappe/physics/adhesion_law.h>

#include <cmath>
#include <sstream>

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

  namespace internal
  {
    void require_positive(const std::string &law, const std::string &quantity, const std::string &unit,
                          const double value)
    {
      std::ostringstream given;
      given << value;
      AssertThrow(std::isfinite(value) && value > 0.0,
                  dealii::ExcMessage(law + " adhesion law: the " + quantity + " must be a positive number [" + unit +
                                     "], but " + given.str() + " was given."));
    }
  } // namespace internal
} // namespace nappe
