#pragma once

#include <nappe/geometry/rounded_profile.h>
#include <nappe/geometry/topography.h>

namespace nappe
{
  /**
   * Straight features running along y, centred on x = 0: s(x, y) = f(x), ∇s = (f'(x), 0). Turn them
   * with RotatedTopography, move them with OffsetTopography. Edges are rounded by circular fillets
   * (RoundedProfile) so the features are C1; angles in radians, lengths in meters.
   */
  class RoundedLinearFeature : public Topography
  {
  public:
    double               height(const dealii::Point<2> &p) const override;
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override;

  protected:
    explicit RoundedLinearFeature(RoundedProfile profile);
    RoundedProfile profile;
  };

  /**
   * Trench of depth D (s goes down to −D) and width w at half depth, sidewall angle α, all four edges
   * (the two rims and the two bottom corners) rounded by radius r_e.
   */
  class Trench : public RoundedLinearFeature
  {
  public:
    /// @param depth D > 0 [m]; @param width w > 0 [m]; @param edge_radius r_e > 0 [m]; @param sidewall_angle α ∈ (0, π/2).
    Trench(double depth, double width, double edge_radius, double sidewall_angle);
    std::string name() const override { return "trench"; }
    std::string description() const override;
    std::vector<TopographyFeature> features() const override;

  private:
    double d, w, r_edge, alpha;
  };

  /**
   * Step from s = 0 (x ≪ 0) to s = H (x ≫ 0) whose flank crosses H/2 at x = 0 at angle α, both edges
   * rounded by radius r_e. A negative H is a step down.
   */
  class Step : public RoundedLinearFeature
  {
  public:
    /// @param height H ≠ 0 [m]; @param edge_radius r_e > 0 [m]; @param sidewall_angle α ∈ (0, π/2).
    Step(double height, double edge_radius, double sidewall_angle);
    std::string name() const override { return "step"; }
    std::string description() const override;
    std::vector<TopographyFeature> features() const override;

  private:
    double h, r_edge, alpha;
  };
} // namespace nappe
