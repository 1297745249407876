#include <deal.II/base/exceptions.h>

#include <nappe/analysis/adhesion_limits.h>
#include <nappe/analysis/state_summary.h>

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <sstream>

namespace nappe
{
  namespace
  {
    std::string in_jm2(double gamma)
    {
      std::ostringstream s;
      s << std::setprecision(4) << gamma << " J/m²";
      return s.str();
    }

    AdhesionThreshold not_found(const std::string &why)
    {
      AdhesionThreshold t;
      t.how = why;
      return t;
    }

    AdhesionThreshold bracket(double a, double b, const std::string &how)
    {
      AdhesionThreshold t;
      t.found = true;
      t.lower = std::min(a, b);
      t.upper = std::max(a, b);
      t.how   = how;
      return t;
    }

    /// One branch as (Γ, E, dE/dΓ) samples in increasing Γ, up to the path's first jump.
    struct EnergySample
    {
      double gamma, energy, slope;
    };

    /// The states of a path before its first jump whose fraction is on the given side of the
    /// target, as (Γ, E, dE/dΓ) samples in increasing Γ.
    std::vector<EnergySample> branch(const AdhesionPath &path, double target, bool conformed)
    {
      std::vector<EnergySample> samples;
      for (const auto &p : path.points)
        {
          if (p.after_jump || (p.conformed_fraction >= target) != conformed)
            break;
          samples.push_back({p.work_of_adhesion, p.energy_per_area.total(),
                             p.energy_per_area.substrate / p.work_of_adhesion});
        }
      std::sort(samples.begin(), samples.end(), [](const auto &a, const auto &b) { return a.gamma < b.gamma; });
      return samples;
    }

    /// Cubic Hermite interpolation of the branch energy at Γ (inside the sampled range).
    double interpolate(const std::vector<EnergySample> &b, double gamma)
    {
      auto upper = std::lower_bound(b.begin(), b.end(), gamma, [](const auto &s, double g) { return s.gamma < g; });
      if (upper == b.begin())
        upper = std::next(upper);
      if (upper == b.end())
        upper = std::prev(upper);
      const EnergySample &p = *std::prev(upper), &q = *upper;
      const double        h = q.gamma - p.gamma, t = (gamma - p.gamma) / h;
      const double h00 = (1 + 2 * t) * (1 - t) * (1 - t), h10 = t * (1 - t) * (1 - t);
      const double h01 = t * t * (3 - 2 * t), h11 = t * t * (t - 1);
      return h00 * p.energy + h10 * h * p.slope + h01 * q.energy + h11 * h * q.slope;
    }
  } // namespace

  AdhesionThreshold hold_threshold(const AdhesionPath &lowering, double target)
  {
    const auto &pts = lowering.points;
    if (pts.empty())
      return not_found("the lowering path has no certified state: " + lowering.message);
    if (pts.front().conformed_fraction < target)
      return not_found("the sheet is not conformed even at the highest Γ (" + in_jm2(pts.front().work_of_adhesion) +
                       "): Γ_hold is above the range; raise Adhesion limits/Highest work of adhesion");
    for (std::size_t i = 1; i < pts.size(); ++i)
      if (pts[i].conformed_fraction < target)
        return bracket(pts[i].work_of_adhesion, pts[i - 1].work_of_adhesion,
                       pts[i].after_jump ? "fold: the conformed branch ends and the sheet snaps off"
                                         : "the conformed fraction falls below the target continuously");
    if (!lowering.complete)
      return not_found("the lowering path stopped early: " + lowering.message);
    return not_found("the sheet stays conformed down to the lowest Γ (" + in_jm2(pts.back().work_of_adhesion) +
                     "): Γ_hold is below the range; lower Adhesion limits/Lowest work of adhesion");
  }

  AdhesionThreshold snap_threshold(const AdhesionPath &raising, double target)
  {
    const auto &pts = raising.points;
    if (pts.empty())
      return not_found("the raising path has no certified state: " + raising.message);
    if (pts.front().conformed_fraction >= target)
      return not_found("the laid-down sheet conforms already at the lowest Γ (" +
                       in_jm2(pts.front().work_of_adhesion) +
                       "): Γ_snap is below the range; lower Adhesion limits/Lowest work of adhesion");
    for (std::size_t i = 1; i < pts.size(); ++i)
      if (pts[i].conformed_fraction >= target)
        return bracket(pts[i - 1].work_of_adhesion, pts[i].work_of_adhesion,
                       pts[i].after_jump ? "fold: the laid-down branch ends and the sheet snaps into conformation"
                                         : "the conformed fraction reaches the target continuously");
    if (!raising.complete)
      return not_found("the raising path stopped early: " + raising.message);
    return not_found("the laid-down sheet does not conform up to the highest Γ (" +
                     in_jm2(pts.back().work_of_adhesion) +
                     "): Γ_snap is above the range; raise Adhesion limits/Highest work of adhesion");
  }

  AdhesionThreshold equal_energy_threshold(const AdhesionPath &lowering, const AdhesionPath &raising, double target,
                                           double relative_tolerance)
  {
    const auto conformed = branch(lowering, target, true);
    const auto least     = branch(raising, target, false);
    if (conformed.size() < 2 || least.size() < 2)
      return not_found("no coexisting conformed and laid-down branches were followed (each needs two states before "
                       "its first jump or target crossing)");
    double lo = std::max(conformed.front().gamma, least.front().gamma);
    double hi = std::min(conformed.back().gamma, least.back().gamma);
    if (!(lo < hi))
      return not_found("the conformed branch (down to " + in_jm2(conformed.front().gamma) +
                       ") and the laid-down branch (up to " + in_jm2(least.back().gamma) + ") do not coexist");
    const auto difference = [&](double g) { return interpolate(conformed, g) - interpolate(least, g); };
    const double d_lo = difference(lo), d_hi = difference(hi);
    if ((d_lo < 0) == (d_hi < 0))
      return not_found(std::string("the conformed state has the ") + (d_lo < 0 ? "lower" : "higher") +
                       " energy wherever both branches exist (" + in_jm2(lo) + " to " + in_jm2(hi) + ")");
    while (std::log(hi / lo) > relative_tolerance)
      {
        const double mid = std::sqrt(lo * hi);
        ((difference(mid) < 0) == (d_lo < 0) ? lo : hi) = mid;
      }
    return bracket(lo, hi, "equal energy of the conformed and the laid-down branch (Hermite interpolation between "
                           "path states, exact slopes dE/dΓ)");
  }

  AdhesionLimits find_adhesion_limits(const SheetProblem &problem, const AdhesionPathSettings &s, MPI_Comm comm,
                                      std::ostream *log)
  {
    AdhesionLimits    limits;
    const PathMeasure measure = summary_path_measure(problem.model);
    limits.lowering = follow_adhesion_path(problem, StartProtocol::grown_conformal, s, measure, comm, log);
    limits.raising  = follow_adhesion_path(problem, StartProtocol::laid_down, s, measure, comm, log);
    limits.hold         = hold_threshold(limits.lowering, s.target_fraction);
    limits.snap         = snap_threshold(limits.raising, s.target_fraction);
    limits.equal_energy = equal_energy_threshold(limits.lowering, limits.raising, s.target_fraction, s.relative_tolerance);
    for (const AdhesionPath *path : {&limits.lowering, &limits.raising})
      for (const auto &t : find_transitions(*path, s.target_fraction))
        limits.transitions.push_back(t);
    limits.largest = largest_fraction({&limits.lowering, &limits.raising});
    explain_unreached_target(limits, s.target_fraction);
    return limits;
  }

  void explain_unreached_target(AdhesionLimits &limits, double target)
  {
    const AdhesionPath &down = limits.lowering, &up = limits.raising;
    if (limits.largest.fraction >= target || (down.points.empty() && up.points.empty()))
      return;
    std::ostringstream why;
    why << std::setprecision(3) << "no certified state reaches the target conformed fraction " << 100 * target
        << " %: the largest is " << 100 * limits.largest.fraction << " % ("
        << (limits.largest.lowering ? "lowering" : "raising") << " path, Γ = " << limits.largest.work_of_adhesion
        << " J/m²)";
    const AdhesionPath *unfinished = !down.complete ? &down : !up.complete ? &up : nullptr;
    if (unfinished == nullptr)
      why << "; the transitions tell how the sheet gets there";
    else
      why << "; the " << (unfinished->lowering ? "lowering" : "raising") << " path "
          << (unfinished->points.empty() ? "has no certified state" : "stopped early")
          << " (its message says why), so whether any Γ in the range reaches the target is unknown; widening the "
             "range will not tell";
    for (AdhesionThreshold *t : {&limits.hold, &limits.snap, &limits.equal_energy})
      if (!t->found)
        t->how = why.str();
  }

  AdhesionPathSettings with_stops(AdhesionPathSettings s, std::vector<double> stops)
  {
    std::sort(stops.begin(), stops.end());
    if (!stops.empty())
      {
        s.lowest_work_of_adhesion  = std::min(s.lowest_work_of_adhesion, stops.front());
        s.highest_work_of_adhesion = std::max(s.highest_work_of_adhesion, stops.back());
      }
    s.stops = std::move(stops);
    return s;
  }

  const AdhesionPathPoint *point_at(const AdhesionPath &path, double gamma)
  {
    for (const auto &p : path.points)
      if (std::abs(p.work_of_adhesion - gamma) <= 1e-9 * gamma)
        return &p;
    return nullptr;
  }
} // namespace nappe
