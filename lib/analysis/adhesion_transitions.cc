#include <nappe/analysis/adhesion_transitions.h>

#include <algorithm>

namespace nappe
{
  std::string transition_kind(bool lowering, Regime before, Regime after)
  {
    if (before == after)
      return "partial depinning";
    if (!lowering)
      {
        if (before == Regime::suspended)
          return "touch-down";
        if (after == Regime::conforms)
          return "snap into conformation";
        if (before == Regime::tents && after == Regime::touches_floor)
          return "tents → floor contact";
      }
    else
      {
        if (after == Regime::suspended)
          return "detachment";
        if (before == Regime::conforms)
          return "partial detachment";
        if (before == Regime::touches_floor && after == Regime::tents)
          return "lift-off from the floor";
      }
    return regime_name(before) + " → " + regime_name(after);
  }

  std::vector<AdhesionTransition> find_transitions(const AdhesionPath &path, double target)
  {
    std::vector<AdhesionTransition> found;
    for (std::size_t i = 1; i < path.points.size(); ++i)
      {
        const AdhesionPathPoint &a = path.points[i - 1], &b = path.points[i];
        if (!b.after_jump)
          continue;
        AdhesionTransition t;
        t.lowering        = path.lowering;
        t.gamma_lower     = std::min(a.work_of_adhesion, b.work_of_adhesion);
        t.gamma_upper     = std::max(a.work_of_adhesion, b.work_of_adhesion);
        t.fraction_before = a.conformed_fraction;
        t.fraction_after  = b.conformed_fraction;
        t.raised_before   = path.value(a, "raised_contact_fraction");
        t.raised_after    = path.value(b, "raised_contact_fraction");
        t.floor_before    = path.value(a, "floor_contact_fraction");
        t.floor_after     = path.value(b, "floor_contact_fraction");
        const double carried = a.energy_per_area.total() + (b.work_of_adhesion - a.work_of_adhesion) *
                                                             a.energy_per_area.substrate / a.work_of_adhesion;
        t.energy_released = carried - b.energy_per_area.total();
        t.regime_before   = classify_regime(path, a, target);
        t.regime_after    = classify_regime(path, b, target);
        t.kind            = transition_kind(path.lowering, t.regime_before, t.regime_after);
        found.push_back(t);
      }
    return found;
  }

  FractionPeak largest_fraction(const std::vector<const AdhesionPath *> &paths)
  {
    FractionPeak peak;
    peak.fraction = -1.0;
    for (const AdhesionPath *path : paths)
      for (const auto &p : path->points)
        if (p.conformed_fraction > peak.fraction)
          peak = {p.conformed_fraction, p.work_of_adhesion, path->lowering};
    peak.fraction = std::max(peak.fraction, 0.0);
    return peak;
  }
} // namespace nappe
