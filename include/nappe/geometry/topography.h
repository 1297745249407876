#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/tensor.h>

#include <limits>
#include <string>

namespace nappe
{
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
