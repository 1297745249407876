#pragma once

#include <nappe/geometry/rounded_profile.h>
#include <nappe/geometry/topography.h>

namespace nappe
{
  /**
   * Axisymmetric features centred at the origin: s(x) = f(ρ), ρ = |x|, ∇s = f'(ρ)·x/ρ (zero at ρ = 0,
   * where every profile here is flat). Place them with OffsetTopography, repeat them with LatticeArray.
   *
   * Angles are in radians, lengths in meters. Sharp edges are rounded by circular fillets
   * (RoundedProfile), so every feature is C1; its sidewalls have a finite slope tan(α).
   */

  /// Gaussian bump s = H·exp(−ρ²/(2σ²)). C∞. support_radius() = 10σ (height there < 2e-22·H).
  class GaussianBump : public Topography
  {
  public:
    /// @param height H [m] (any sign), @param sigma standard deviation σ > 0 [m].
    GaussianBump(double height, double sigma);
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    std::string          name() const override { return "gaussian bump"; }
    std::string          description() const override;
    std::vector<TopographyFeature> features() const override;
    double               support_radius() const override { return 10.0 * sigma; }

  private:
    double peak, sigma;
  };

  /// Base of the fillet-rounded axisymmetric features: evaluates a RoundedProfile even in ρ.
  class RoundedRadialFeature : public Topography
  {
  public:
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;
    double               support_radius() const override { return profile.last_non_constant(); }

  protected:
    explicit RoundedRadialFeature(RoundedProfile profile);
    RoundedProfile profile;
  };

  /**
   * Cylindrical pillar of height H with a flat top and sloped sidewalls: a trapezoid in the (ρ, z)
   * plane whose flank passes through (R, H/2) at angle α to the substrate, with the top edge rounded
   * by radius r_e and the foot by r_f (a real lithographic pillar has both; r_f > 0 keeps the
   * profile C1 where the flank meets the substrate). α → 90° approaches a vertical cylinder.
   */
  class Pillar : public RoundedRadialFeature
  {
  public:
    /**
     * @param height H > 0 [m]; @param radius R at half height [m]; @param edge_radius r_e > 0 [m];
     * @param foot_radius r_f > 0 [m]; @param sidewall_angle α ∈ (0, π/2) [rad].
     */
    Pillar(double height, double radius, double edge_radius, double foot_radius, double sidewall_angle);
    std::string name() const override { return "pillar"; }
    std::string description() const override;
    std::vector<TopographyFeature> features() const override;

  private:
    double h, r, r_edge, r_foot, alpha;
  };

  /// Cone of height H and base radius R with a tip rounded by radius r_t and a foot rounded by r_f.
  class Cone : public RoundedRadialFeature
  {
  public:
    /// @param height H > 0 [m]; @param base_radius R > 0 [m]; @param tip_radius, @param foot_radius > 0 [m].
    Cone(double height, double base_radius, double tip_radius, double foot_radius);
    std::string name() const override { return "cone"; }
    std::string description() const override;
    std::vector<TopographyFeature> features() const override;

  private:
    double h, r, r_tip, r_foot;
  };

  /**
   * Ring-shaped ridge: a trapezoidal cross-section of height H and width w (at half height) whose
   * centre line is the circle ρ = R, sidewall angle α, every edge rounded by radius r_e. The inner
   * foot must stay clear of the axis (the disc inside the ring is flat, s = 0).
   */
  class RingRidge : public RoundedRadialFeature
  {
  public:
    /**
     * @param height H > 0 [m]; @param ring_radius R [m]; @param width w > 0 [m];
     * @param edge_radius r_e > 0 [m]; @param sidewall_angle α ∈ (0, π/2) [rad].
     */
    RingRidge(double height, double ring_radius, double width, double edge_radius, double sidewall_angle);
    std::string name() const override { return "ring ridge"; }
    std::string description() const override;
    std::vector<TopographyFeature> features() const override;

  private:
    double h, r, w, r_edge, alpha;
  };
} // namespace nappe
