#include <deal.II/base/exceptions.h>

#include <nappe/geometry/radial_features.h>

#include <cmath>

#include "format.h"

namespace nappe
{
  namespace
  {
    void require_positive(const double value, const std::string &owner, const std::string &parameter)
    {
      AssertThrow(std::isfinite(value) && value > 0.0,
                  dealii::ExcMessage(owner + ": '" + parameter + "' must be positive, found " +
                                     internal::nm(value)));
    }

    void require_angle(const double alpha, const std::string &owner)
    {
      AssertThrow(std::isfinite(alpha) && alpha > 0.0 && alpha < 0.5 * M_PI,
                  dealii::ExcMessage(owner + ": 'Sidewall angle' must lie strictly between 0 and 90 degrees "
                                             "(a height field cannot have a vertical wall), found " +
                                     internal::num(alpha * 180.0 / M_PI) + " degrees"));
    }

    /// Mirror the vertices/radii given for t ≥ 0 to an even profile.
    RoundedProfile even_profile(const std::vector<std::pair<double, double>> &half_vertices,
                                const std::vector<double> &half_radii, const std::string &owner, bool has_axis_vertex)
    {
      std::vector<std::pair<double, double>> v;
      std::vector<double>                    r;
      const std::size_t                      n = half_vertices.size();
      for (std::size_t i = n; i-- > (has_axis_vertex ? 1u : 0u);)
        {
          v.emplace_back(-half_vertices[i].first, half_vertices[i].second);
          r.push_back(half_radii[i]);
        }
      for (std::size_t i = 0; i < n; ++i)
        {
          v.push_back(half_vertices[i]);
          r.push_back(half_radii[i]);
        }
      AssertThrow(has_axis_vertex || half_vertices.front().first > 0.0,
                  dealii::ExcMessage(owner + ": the feature reaches the axis; its inner flank must stay at "
                                             "positive radius (enlarge the ring radius or reduce the width)"));
      return RoundedProfile(v, r, owner);
    }
  } // namespace


  GaussianBump::GaussianBump(const double height, const double sigma)
    : peak(height)
    , sigma(sigma)
  {
    AssertThrow(std::isfinite(height), dealii::ExcMessage("Gaussian bump: 'Height' must be finite"));
    require_positive(sigma, "Gaussian bump", "Width");
  }

  double GaussianBump::height(const dealii::Point<2> &p) const
  {
    return peak * std::exp(-p.square() / (2.0 * sigma * sigma));
  }

  dealii::Tensor<1, 2> GaussianBump::gradient(const dealii::Point<2> &p) const
  {
    dealii::Tensor<1, 2> g;
    const double         f = -height(p) / (sigma * sigma);
    g[0]                   = f * p[0];
    g[1]                   = f * p[1];
    return g;
  }

  std::string GaussianBump::description() const
  {
    return "gaussian bump H exp(-r^2 / (2 sigma^2)), H = " + internal::nm(peak) + ", sigma = " + internal::nm(sigma);
  }


  RoundedRadialFeature::RoundedRadialFeature(RoundedProfile profile)
    : profile(std::move(profile))
  {}

  double RoundedRadialFeature::height(const dealii::Point<2> &p) const { return profile.value(p.norm()); }

  dealii::Tensor<1, 2> RoundedRadialFeature::gradient(const dealii::Point<2> &p) const
  {
    const double         rho = p.norm();
    dealii::Tensor<1, 2> g;
    if (rho == 0.0)
      return g; // every profile is flat on the axis (even in ρ)
    const double f = profile.derivative(rho) / rho;
    g[0]           = f * p[0];
    g[1]           = f * p[1];
    return g;
  }


  namespace
  {
    RoundedProfile pillar_profile(double h, double r, double re, double rf, double alpha)
    {
      const std::string owner = "Pillar";
      require_positive(h, owner, "Height");
      require_positive(r, owner, "Radius");
      require_positive(re, owner, "Edge radius");
      require_positive(rf, owner, "Foot radius");
      require_angle(alpha, owner);
      const double dx = 0.5 * h / std::tan(alpha);
      AssertThrow(r > dx, dealii::ExcMessage("Pillar: the sidewalls meet before the top: 'Radius' " +
                                             internal::nm(r) + " must exceed half the flank width " +
                                             internal::nm(dx) + " = (Height/2)/tan(Sidewall angle)"));
      return even_profile({{r - dx, h}, {r + dx, 0.0}}, {re, rf}, owner, false);
    }

    RoundedProfile cone_profile(double h, double r, double rt, double rf)
    {
      const std::string owner = "Cone";
      require_positive(h, owner, "Height");
      require_positive(r, owner, "Base radius");
      require_positive(rt, owner, "Tip radius");
      require_positive(rf, owner, "Foot radius");
      return even_profile({{0.0, h}, {r, 0.0}}, {rt, rf}, owner, true);
    }

    RoundedProfile ring_profile(double h, double rc, double w, double re, double alpha)
    {
      const std::string owner = "Ring ridge";
      require_positive(h, owner, "Height");
      require_positive(rc, owner, "Ring radius");
      require_positive(w, owner, "Width");
      require_positive(re, owner, "Edge radius");
      require_angle(alpha, owner);
      const double dx = 0.5 * h / std::tan(alpha);
      AssertThrow(0.5 * w > dx, dealii::ExcMessage("Ring ridge: the flanks meet before the top: half the 'Width' " +
                                                   internal::nm(0.5 * w) + " must exceed " + internal::nm(dx) +
                                                   " = (Height/2)/tan(Sidewall angle)"));
      const double inner = rc - 0.5 * w, outer = rc + 0.5 * w;
      return even_profile({{inner - dx, 0.0}, {inner + dx, h}, {outer - dx, h}, {outer + dx, 0.0}},
                          {re, re, re, re}, owner, false);
    }
  } // namespace


  Pillar::Pillar(double height, double radius, double edge_radius, double foot_radius, double sidewall_angle)
    : RoundedRadialFeature(pillar_profile(height, radius, edge_radius, foot_radius, sidewall_angle))
    , h(height)
    , r(radius)
    , r_edge(edge_radius)
    , r_foot(foot_radius)
    , alpha(sidewall_angle)
  {}

  std::string Pillar::description() const
  {
    return "pillar, height " + internal::nm(h) + ", radius " + internal::nm(r) + " at half height, edge radius " +
           internal::nm(r_edge) + ", foot radius " + internal::nm(r_foot) + ", sidewall angle " +
           internal::num(alpha * 180.0 / M_PI) + " deg";
  }


  Cone::Cone(double height, double base_radius, double tip_radius, double foot_radius)
    : RoundedRadialFeature(cone_profile(height, base_radius, tip_radius, foot_radius))
    , h(height)
    , r(base_radius)
    , r_tip(tip_radius)
    , r_foot(foot_radius)
  {}

  std::string Cone::description() const
  {
    return "cone, height " + internal::nm(h) + ", base radius " + internal::nm(r) + ", tip radius " +
           internal::nm(r_tip) + ", foot radius " + internal::nm(r_foot);
  }


  RingRidge::RingRidge(double height, double ring_radius, double width, double edge_radius, double sidewall_angle)
    : RoundedRadialFeature(ring_profile(height, ring_radius, width, edge_radius, sidewall_angle))
    , h(height)
    , r(ring_radius)
    , w(width)
    , r_edge(edge_radius)
    , alpha(sidewall_angle)
  {}

  std::string RingRidge::description() const
  {
    return "ring ridge, height " + internal::nm(h) + ", ring radius " + internal::nm(r) + ", width " +
           internal::nm(w) + " at half height, edge radius " + internal::nm(r_edge) + ", sidewall angle " +
           internal::num(alpha * 180.0 / M_PI) + " deg";
  }

  std::vector<TopographyFeature> GaussianBump::features() const { return {{"width sigma", sigma, 4.0}}; }

  std::vector<TopographyFeature> Pillar::features() const
  {
    return {{"edge radius", r_edge, 1.0}, {"foot radius", r_foot, 1.0}};
  }

  std::vector<TopographyFeature> Cone::features() const
  {
    return {{"tip radius", r_tip, 1.0}, {"foot radius", r_foot, 1.0}};
  }

  std::vector<TopographyFeature> RingRidge::features() const
  {
    return {{"edge radius", r_edge, 1.0}, {"ridge width", w, 4.0}};
  }
} // namespace nappe
