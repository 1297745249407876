#pragma once

#include <string>
#include <utility>
#include <vector>

namespace nappe
{
  /**
   * A C1 one-dimensional profile z(t): a polyline through vertices (t_i, z_i), t strictly increasing,
   * extended by constants z_0 for t < t_0 and z_{n-1} for t > t_{n-1}, whose every corner (including
   * the two where the constant extensions meet the polyline) is replaced by a circular arc of radius
   * r_i tangent to both adjacent segments (a fillet, as a machinist would round an edge).
   *
   * A corner turning the direction by Δθ is cut back by r·tan(Δθ/2) along both segments; the
   * constructor throws if the cut-backs of neighbouring corners overlap on a segment. All segment
   * slopes are finite, so the arcs never reach a vertical tangent and z(t) is C1 with
   * |z'| ≤ max segment slope. Units are whatever the caller uses (nappe passes meters).
   *
   * This is the building block of pillars, cones, ridges, trenches and steps (radial_features.h,
   * linear_features.h).
   */
  class RoundedProfile
  {
  public:
    /**
     * @param vertices  (t_i, z_i) with t strictly increasing, at least one vertex.
     * @param radii     fillet radius r_i > 0 at each vertex (same length as vertices).
     * @param owner     name used in error messages, e.g. "Pillar".
     */
    RoundedProfile(std::vector<std::pair<double, double>> vertices,
                   std::vector<double>                    radii,
                   const std::string &                    owner);

    /// z(t).
    double value(double t) const;

    /// z'(t).
    double derivative(double t) const;

    /// z(t) and z'(t) at once.
    std::pair<double, double> value_and_derivative(double t) const;

    /// Lowest and highest t at which the profile is not constant.
    double first_non_constant() const { return pieces.front().t_begin; }
    double last_non_constant() const { return pieces.back().t_end; }

  private:
    /// A straight piece z = z0 + m (t - t0), or an arc z = cz + sign·sqrt(r² - (t - ct)²).
    struct Piece
    {
      double t_begin, t_end;
      bool   is_arc;
      double a, b;      // line: z0 at t_begin, slope; arc: centre (ct, cz)
      double radius;    // arc only
      double sign;      // arc only: +1 arc above its centre (convex corner), −1 below (concave)
    };
    std::vector<Piece> pieces;
    double             z_left = 0.0, z_right = 0.0;
  };
} // namespace nappe
