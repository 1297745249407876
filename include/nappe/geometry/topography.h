#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/tensor.h>

#include <limits>
#include <optional>
#include <vector>
#include <string>

namespace nappe
{
  /// The periods of a periodic topography: s(x + a₁) = s(x) and, unless stripes, s(x + a₂) = s(x).
  struct TopographyLattice
  {
    enum class Kind
    {
      stripes,     ///< periodic along a₁ only, constant along the stripes (a grating)
      square,      ///< |a₁| = |a₂|, a₁ ⟂ a₂
      hexagonal,   ///< |a₁| = |a₂|, 60° apart
      rectangular, ///< a₁ ⟂ a₂
      oblique
    };
    Kind                 kind = Kind::oblique;
    dealii::Tensor<1, 2> a1;  ///< [m]
    dealii::Tensor<1, 2> a2;  ///< [m]; for stripes the direction along them (unit length)
  };

  /// A length of a topography that the mesh must resolve, and how many elements it needs.
  struct TopographyFeature
  {
    std::string name;   ///< e.g. "edge radius", "wavelength", "pixel"
    double      length; ///< [m]
    /// Elements of the sheet's mesh the feature needs (common practice, no source: 8 per wavelength
    /// of a smooth corrugation, 1 per rounding radius or data pixel).
    double elements_needed;
  };

  /**
   * Substrate topography: the height s(x, y) of the substrate surface above the reference plane z = 0,
   * seen as a single-valued height field over the plane.
   *
   * All quantities are SI: points and heights in meters, the gradient ∇s dimensionless [m/m].
   * Implementations are at least C1 (height and gradient continuous) unless their documentation says
   * otherwise; sharp CAD features are rounded with a documented radius. Evaluation is const and
   * thread-safe for every member of the family.
   *
   * The family is an extension point: one header per concept in include/nappe/geometry/, chosen by
   * name through TopographyFactory (topography_factory.h).
   */
  class Topography
  {
  public:
    virtual ~Topography() = default;

    /// Substrate height s(p) [m] at the in-plane point p [m].
    virtual double height(const dealii::Point<2> &p) const = 0;

    /// Height gradient ∇s(p) = (∂s/∂x, ∂s/∂y) [-] at p [m].
    virtual dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const = 0;

    /// Short type name, e.g. "pillar" (the registry name where there is one).
    virtual std::string name() const = 0;

    /// One-line human-readable description with the parameters in nm, for logs and reports.
    virtual std::string description() const = 0;

    /**
     * Radius [m] of a disc around the origin outside which the height is zero (or, for a Gaussian,
     * below 1e-20 of its peak), or +∞ when the topography is not localised. Lattice arrays
     * (lattice_array.h) need a finite value.
     */
    virtual double support_radius() const { return std::numeric_limits<double>::infinity(); }

    /// The lattice the topography repeats on, if it is periodic by construction (gratings, egg
    /// cartons, arrays, tilings); none otherwise (a formula or a height map may still be periodic).
    virtual std::optional<TopographyLattice> lattice() const { return std::nullopt; }

    /// The lengths the sheet's mesh must resolve (wavelengths, rounding radii, data spacing).
    virtual std::vector<TopographyFeature> features() const { return {}; }
  };

  /// The flat substrate s = 0; a reference case and the neutral element of sums.
  class FlatTopography : public Topography
  {
  public:
    double height(const dealii::Point<2> &) const override { return 0.0; }
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &) const override { return {}; }
    std::string name() const override { return "flat"; }
    std::string description() const override { return "flat substrate, s = 0"; }
    double support_radius() const override { return 0.0; }
  };
} // namespace nappe
