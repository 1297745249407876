#pragma once

#include <nappe/geometry/topography.h>

#include <memory>
#include <vector>

namespace nappe
{
  /**
   * Transformations and combinations of topographies. Each wraps shared, immutable members (the same
   * feature may appear in several wrappers) and is exactly as smooth as what it wraps, except
   * PeriodicTiling (see there).
   */

  /// s(x) = v·b(x/l): lateral scale l > 0 and vertical scale v (any finite value) of b.
  class ScaledTopography : public Topography
  {
  public:
    ScaledTopography(std::shared_ptr<const Topography> base, double lateral_scale, double vertical_scale);
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "scaled"; }
    std::string          description() const override;
    std::optional<TopographyLattice> lattice() const override;
    std::vector<TopographyFeature>   features() const override;
    double               support_radius() const override { return lateral * base->support_radius(); }

  private:
    std::shared_ptr<const Topography> base;
    double                            lateral, vertical;
  };

  /// s(x) = b(R(−θ)x): b rotated counter-clockwise by θ [rad] about the origin; ∇s = R(θ)∇b.
  class RotatedTopography : public Topography
  {
  public:
    RotatedTopography(std::shared_ptr<const Topography> base, double angle);
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "rotated"; }
    std::string          description() const override;
    std::optional<TopographyLattice> lattice() const override;
    std::vector<TopographyFeature>   features() const override { return base->features(); }
    double               support_radius() const override { return base->support_radius(); }

  private:
    std::shared_ptr<const Topography> base;
    double                            angle, c, s;
  };

  /// s(x) = b(x − x₀) + z₀: b moved laterally by x₀ [m] and raised by z₀ [m].
  class OffsetTopography : public Topography
  {
  public:
    OffsetTopography(std::shared_ptr<const Topography> base, const dealii::Point<2> &shift, double vertical_offset = 0.0);
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "offset"; }
    std::string          description() const override;
    std::optional<TopographyLattice> lattice() const override;
    std::vector<TopographyFeature>   features() const override { return base->features(); }
    double               support_radius() const override;

  private:
    std::shared_ptr<const Topography> base;
    dealii::Point<2>                  shift;
    double                            dz;
  };

  /**
   * Periodic tiling of one rectangular cell: s(x) = b(c + ((x − c) mod L)) with the cell
   * [c₀, c₀ + L₀) × [c₁, c₁ + L₁). Continuous and C1 only if b matches itself (value and gradient)
   * across opposite cell edges — true for a localised feature that vanishes near the cell boundary,
   * or for a b that is already L-periodic; otherwise the seams are real kinks of the tiled surface.
   */
  class PeriodicTiling : public Topography
  {
  public:
    PeriodicTiling(std::shared_ptr<const Topography> base, const dealii::Point<2> &cell_origin,
                   const dealii::Tensor<1, 2> &period);
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "periodic tiling"; }
    std::string          description() const override;
    std::optional<TopographyLattice> lattice() const override;
    std::vector<TopographyFeature>   features() const override { return base->features(); }

    /// The point of the base cell that p maps to.
    dealii::Point<2> wrap(const dealii::Point<2> &p) const;

  private:
    std::shared_ptr<const Topography> base;
    dealii::Point<2>                  origin;
    dealii::Tensor<1, 2>              period;
  };

  /// s = Σ bᵢ: superposition, e.g. a pillar array on a long-wavelength grating.
  class SumTopography : public Topography
  {
  public:
    explicit SumTopography(std::vector<std::shared_ptr<const Topography>> terms);
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "sum"; }
    std::string          description() const override;
    std::vector<TopographyFeature> features() const override;
    double               support_radius() const override;

  private:
    std::vector<std::shared_ptr<const Topography>> terms;
  };
} // namespace nappe
