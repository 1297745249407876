#pragma once

#include <nappe/geometry/topography.h>

namespace nappe
{
  /// One-dimensional sinusoidal grating s = A·cos(2πx/λ); ridges run along y. C∞.
  class SinusoidalGrating : public Topography
  {
  public:
    /// @param amplitude A [m] (any sign), @param wavelength λ > 0 [m].
    SinusoidalGrating(double amplitude, double wavelength);
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "sinusoidal grating"; }
    std::string          description() const override;
    std::optional<TopographyLattice> lattice() const override;
    std::vector<TopographyFeature>   features() const override;

  private:
    double amplitude, wavelength, k;
  };

  /// Egg-carton surface s = A·cos(kx)·cos(ky), k = 2π/λ: a square array of bumps and dimples. C∞.
  class EggCarton : public Topography
  {
  public:
    /// @param amplitude A [m] (any sign), @param wavelength λ > 0 [m] (period along x and y).
    EggCarton(double amplitude, double wavelength);
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "egg carton"; }
    std::string          description() const override;
    std::optional<TopographyLattice> lattice() const override;
    std::vector<TopographyFeature>   features() const override;

  private:
    double amplitude, wavelength, k;
  };
} // namespace nappe
