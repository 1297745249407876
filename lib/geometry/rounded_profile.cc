#include <deal.II/base/exceptions.h>

#include <nappe/geometry/rounded_profile.h>

#include <algorithm>
#include <limits>
#include <cmath>
#include <sstream>

namespace nappe
{
  RoundedProfile::RoundedProfile(std::vector<std::pair<double, double>> vertices,
                                 std::vector<double>                    radii,
                                 const std::string &                    owner)
  {
    const std::size_t n = vertices.size();
    AssertThrow(n >= 1 && radii.size() == n,
                dealii::ExcMessage(owner + ": a rounded profile needs at least one vertex and one fillet "
                                           "radius per vertex"));
    for (std::size_t i = 0; i < n; ++i)
      {
        AssertThrow(std::isfinite(vertices[i].first) && std::isfinite(vertices[i].second) &&
                      std::isfinite(radii[i]) && radii[i] > 0.0,
                    dealii::ExcMessage(owner + ": profile vertices must be finite and fillet radii positive"));
        if (i > 0)
          AssertThrow(vertices[i].first > vertices[i - 1].first,
                      dealii::ExcMessage(owner + ": profile vertices must have strictly increasing abscissae "
                                                 "(is a sidewall vertical or are widths inconsistent?)"));
      }
    z_left  = vertices.front().second;
    z_right = vertices.back().second;

    // Direction angle of segment k: 0 and n are the horizontal extensions, k = 1..n-1 join
    // vertex k-1 to vertex k.
    std::vector<double> theta(n + 1, 0.0), length(n + 1, std::numeric_limits<double>::infinity());
    for (std::size_t k = 1; k < n; ++k)
      {
        const double dt = vertices[k].first - vertices[k - 1].first;
        const double dz = vertices[k].second - vertices[k - 1].second;
        theta[k]        = std::atan2(dz, dt);
        length[k]       = std::hypot(dt, dz);
      }

    // Cut-back of corner i along its two segments.
    std::vector<double> cut(n);
    for (std::size_t i = 0; i < n; ++i)
      cut[i] = radii[i] * std::tan(0.5 * std::abs(theta[i + 1] - theta[i]));
    for (std::size_t k = 1; k < n; ++k)
      if (cut[k - 1] + cut[k] > length[k] * (1.0 + 1e-12))
        {
          std::ostringstream msg;
          msg << owner << ": the edge radii are too large for the feature: the roundings of two neighbouring "
              << "edges need " << (cut[k - 1] + cut[k]) * 1e9 << " nm of a straight flank or plateau that is only "
              << length[k] * 1e9 << " nm long; reduce the edge/foot/tip radius or enlarge the feature";
          AssertThrow(false, dealii::ExcMessage(msg.str()));
        }

    double t_prev = -std::numeric_limits<double>::infinity();
    double z_prev = z_left;
    for (std::size_t i = 0; i < n; ++i)
      {
        const double ti = vertices[i].first, zi = vertices[i].second;
        const double ci = std::cos(theta[i]), si = std::sin(theta[i]);
        const double co = std::cos(theta[i + 1]), so = std::sin(theta[i + 1]);
        const double t1 = ti - cut[i] * ci, z1 = zi - cut[i] * si;
        const double t2 = ti + cut[i] * co, z2 = zi + cut[i] * so;
        // Straight piece up to the arc (the left extension is represented by z_left).
        if (i > 0 && t1 > t_prev)
          pieces.push_back({t_prev, t1, false, z_prev, std::tan(theta[i]), 0.0, 0.0});
        const double turn = theta[i + 1] - theta[i];
        if (std::abs(turn) > 1e-14 && t2 > t1)
          {
            // Left turn (slope increases): centre on the left normal, arc below the centre.
            const double sign = turn > 0.0 ? -1.0 : 1.0;
            const double ct   = t1 + (turn > 0.0 ? -si : si) * radii[i];
            const double cz   = z1 + (turn > 0.0 ? ci : -ci) * radii[i];
            pieces.push_back({t1, t2, true, ct, cz, radii[i], sign});
          }
        t_prev = t2;
        z_prev = z2;
      }
    if (pieces.empty()) // a single vertex with no turn: constant profile
      pieces.push_back({vertices.front().first, vertices.front().first, false, z_left, 0.0, 0.0, 0.0});
  }


  std::pair<double, double> RoundedProfile::value_and_derivative(const double t) const
  {
    if (t <= pieces.front().t_begin)
      return {z_left, 0.0};
    if (t >= pieces.back().t_end)
      return {z_right, 0.0};
    // Last piece whose start is ≤ t.
    auto it = std::upper_bound(pieces.begin(), pieces.end(), t,
                               [](double value, const Piece &p) { return value < p.t_begin; });
    const Piece &p = *(it - 1);
    if (!p.is_arc)
      return {p.a + p.b * (t - p.t_begin), p.b};
    const double dt = t - p.a;
    const double q  = std::sqrt(std::max(p.radius * p.radius - dt * dt, 0.0));
    return {p.b + p.sign * q, -p.sign * dt / q};
  }

  double RoundedProfile::value(const double t) const { return value_and_derivative(t).first; }

  double RoundedProfile::derivative(const double t) const { return value_and_derivative(t).second; }
} // namespace nappe
