#include <deal.II/base/exceptions.h>

#include <nappe/geometry/linear_features.h>

#include <cmath>

#include "format.h"

namespace nappe
{
  RoundedLinearFeature::RoundedLinearFeature(RoundedProfile profile)
    : profile(std::move(profile))
  {}

  double RoundedLinearFeature::height(const dealii::Point<2> &p) const { return profile.value(p[0]); }

  dealii::Tensor<1, 2> RoundedLinearFeature::gradient(const dealii::Point<2> &p) const
  {
    dealii::Tensor<1, 2> g;
    g[0] = profile.derivative(p[0]);
    return g;
  }

  namespace
  {
    void require(bool condition, const std::string &owner, const std::string &parameter, const std::string &what,
                 double found)
    {
      AssertThrow(condition, dealii::ExcMessage(owner + ": '" + parameter + "' must be " + what + ", found " +
                                                internal::nm(found)));
    }

    void require_angle(const double alpha, const std::string &owner)
    {
      AssertThrow(std::isfinite(alpha) && alpha > 0.0 && alpha < 0.5 * M_PI,
                  dealii::ExcMessage(owner + ": 'Sidewall angle' must lie strictly between 0 and 90 degrees "
                                             "(a height field cannot have a vertical wall), found " +
                                     internal::num(alpha * 180.0 / M_PI) + " degrees"));
    }

    RoundedProfile trench_profile(double d, double w, double re, double alpha)
    {
      const std::string owner = "Trench";
      require(std::isfinite(d) && d > 0.0, owner, "Depth", "positive", d);
      require(std::isfinite(w) && w > 0.0, owner, "Width", "positive", w);
      require(std::isfinite(re) && re > 0.0, owner, "Edge radius", "positive", re);
      require_angle(alpha, owner);
      const double dx = 0.5 * d / std::tan(alpha);
      AssertThrow(0.5 * w > dx, dealii::ExcMessage("Trench: the flanks meet before the bottom: half the 'Width' " +
                                                   internal::nm(0.5 * w) + " must exceed " + internal::nm(dx) +
                                                   " = (Depth/2)/tan(Sidewall angle)"));
      return RoundedProfile({{-0.5 * w - dx, 0.0}, {-0.5 * w + dx, -d}, {0.5 * w - dx, -d}, {0.5 * w + dx, 0.0}},
                            {re, re, re, re}, owner);
    }

    RoundedProfile step_profile(double h, double re, double alpha)
    {
      const std::string owner = "Step";
      require(std::isfinite(h) && h != 0.0, owner, "Height", "finite and non-zero", h);
      require(std::isfinite(re) && re > 0.0, owner, "Edge radius", "positive", re);
      require_angle(alpha, owner);
      const double dx = 0.5 * std::abs(h) / std::tan(alpha);
      return RoundedProfile({{-dx, 0.0}, {dx, h}}, {re, re}, owner);
    }
  } // namespace


  Trench::Trench(double depth, double width, double edge_radius, double sidewall_angle)
    : RoundedLinearFeature(trench_profile(depth, width, edge_radius, sidewall_angle))
    , d(depth)
    , w(width)
    , r_edge(edge_radius)
    , alpha(sidewall_angle)
  {}

  std::string Trench::description() const
  {
    return "trench along y, depth " + internal::nm(d) + ", width " + internal::nm(w) + " at half depth, edge radius " +
           internal::nm(r_edge) + ", sidewall angle " + internal::num(alpha * 180.0 / M_PI) + " deg";
  }


  Step::Step(double height, double edge_radius, double sidewall_angle)
    : RoundedLinearFeature(step_profile(height, edge_radius, sidewall_angle))
    , h(height)
    , r_edge(edge_radius)
    , alpha(sidewall_angle)
  {}

  std::string Step::description() const
  {
    return "step along y at x = 0, height " + internal::nm(h) + ", edge radius " + internal::nm(r_edge) +
           ", sidewall angle " + internal::num(alpha * 180.0 / M_PI) + " deg";
  }

  std::vector<TopographyFeature> Trench::features() const
  {
    return {{"edge radius", r_edge, 1.0}, {"trench width", w, 4.0}};
  }

  std::vector<TopographyFeature> Step::features() const { return {{"edge radius", r_edge, 1.0}}; }
} // namespace nappe
