#include <deal.II/base/exceptions.h>

#include <nappe/geometry/sinusoidal_topography.h>

#include <cmath>

#include "format.h"

namespace nappe
{
  namespace
  {
    void check(const double amplitude, const double wavelength, const std::string &owner)
    {
      AssertThrow(std::isfinite(amplitude), dealii::ExcMessage(owner + ": 'Amplitude' must be finite"));
      AssertThrow(std::isfinite(wavelength) && wavelength > 0.0,
                  dealii::ExcMessage(owner + ": 'Wavelength' must be positive, found " + internal::nm(wavelength)));
    }
  } // namespace

  SinusoidalGrating::SinusoidalGrating(const double amplitude, const double wavelength)
    : amplitude(amplitude)
    , wavelength(wavelength)
    , k(2.0 * M_PI / wavelength)
  {
    check(amplitude, wavelength, "Sinusoidal grating");
  }

  double SinusoidalGrating::height(const dealii::Point<2> &p) const { return amplitude * std::cos(k * p[0]); }

  dealii::Tensor<1, 2> SinusoidalGrating::gradient(const dealii::Point<2> &p) const
  {
    dealii::Tensor<1, 2> g;
    g[0] = -amplitude * k * std::sin(k * p[0]);
    return g;
  }

  std::string SinusoidalGrating::description() const
  {
    return "sinusoidal grating A cos(2 pi x / lambda), A = " + internal::nm(amplitude) +
           ", lambda = " + internal::nm(wavelength);
  }


  EggCarton::EggCarton(const double amplitude, const double wavelength)
    : amplitude(amplitude)
    , wavelength(wavelength)
    , k(2.0 * M_PI / wavelength)
  {
    check(amplitude, wavelength, "Egg carton");
  }

  double EggCarton::height(const dealii::Point<2> &p) const
  {
    return amplitude * std::cos(k * p[0]) * std::cos(k * p[1]);
  }

  dealii::Tensor<1, 2> EggCarton::gradient(const dealii::Point<2> &p) const
  {
    dealii::Tensor<1, 2> g;
    g[0] = -amplitude * k * std::sin(k * p[0]) * std::cos(k * p[1]);
    g[1] = -amplitude * k * std::cos(k * p[0]) * std::sin(k * p[1]);
    return g;
  }

  std::string EggCarton::description() const
  {
    return "egg carton A cos(kx) cos(ky), k = 2 pi / lambda, A = " + internal::nm(amplitude) +
           ", lambda = " + internal::nm(wavelength);
  }
  std::optional<TopographyLattice> SinusoidalGrating::lattice() const
  {
    TopographyLattice l;
    l.kind  = TopographyLattice::Kind::stripes;
    l.a1[0] = wavelength;
    l.a2[1] = 1.0;
    return l;
  }

  std::optional<TopographyLattice> EggCarton::lattice() const
  {
    TopographyLattice l;
    l.kind  = TopographyLattice::Kind::square;
    l.a1[0] = wavelength;
    l.a2[1] = wavelength;
    return l;
  }

  std::vector<TopographyFeature> SinusoidalGrating::features() const { return {{"wavelength", wavelength, 8.0}}; }

  std::vector<TopographyFeature> EggCarton::features() const { return {{"wavelength", wavelength, 8.0}}; }
} // namespace nappe
