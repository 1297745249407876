#pragma once

#include <nappe/geometry/topography.h>

#include <memory>

namespace nappe
{
  /**
   * A Bravais-lattice array of one localised feature: s(x) = Σ_{n,m} f(x − n·a₁ − m·a₂), the sum running
   * over every image whose disc of radius f.support_radius() contains x (so overlapping features add
   * up; for well separated ones it is the nearest image). Periodic with periods a₁ and a₂, and as
   * smooth as the feature. The origin is a lattice point.
   *
   * The feature must be localised (finite support_radius(); a Gaussian counts, cut at 10σ).
   * The feature is shared, not copied.
   */
  class LatticeArray : public Topography
  {
  public:
    /// @param feature localised feature centred at the origin; @param a1, @param a2 lattice vectors [m], independent.
    LatticeArray(std::shared_ptr<const Topography> feature, const dealii::Tensor<1, 2> &a1,
                 const dealii::Tensor<1, 2> &a2, const std::string &lattice_name = "oblique");

    /// Square lattice a₁ = (a, 0), a₂ = (0, a) of pitch a [m].
    static std::unique_ptr<LatticeArray> square(std::shared_ptr<const Topography> feature, double pitch);

    /// Hexagonal (triangular) lattice a₁ = (a, 0), a₂ = (a/2, a√3/2) of nearest-neighbour distance a [m].
    static std::unique_ptr<LatticeArray> hexagonal(std::shared_ptr<const Topography> feature, double pitch);

    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return lattice_name + " array"; }
    std::string          description() const override;
    std::optional<TopographyLattice> lattice() const override;
    std::vector<TopographyFeature>   features() const override { return feature->features(); }

    /// Number of images within the support of one point, per lattice direction (for diagnostics).
    unsigned int n_images_per_direction() const { return 2 * range[0] + 1; }

  private:
    template <typename Op>
    void for_each_image(const dealii::Point<2> &p, const Op &op) const;

    std::shared_ptr<const Topography> feature;
    dealii::Tensor<1, 2>              a1, a2, b1, b2; // lattice vectors and their duals, b_i·a_j = δ_ij
    double                            reach;
    int                               range[2];
    std::string                       lattice_name;
  };
} // namespace nappe
