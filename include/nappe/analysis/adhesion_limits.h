#pragma once

#include <nappe/analysis/adhesion_transitions.h>
#include <nappe/solvers/adhesion_path.h>

#include <cmath>
#include <string>
#include <vector>

namespace nappe
{
  /// A threshold in Γ located to a bracket [lower, upper] (J/m²), or why it was not found.
  struct AdhesionThreshold
  {
    bool        found = false;
    double      lower = 0.0; ///< [J/m²]
    double      upper = 0.0; ///< [J/m²]
    std::string how;         ///< how it was located, or why it was not found
    /// The geometric mean of the bracket [J/m²].
    double value() const { return std::sqrt(lower * upper); }
  };

  /**
   * The three works of adhesion that decide whether a sheet stays on a topography, never to be
   * confused:
   *  - hold:  Γ_hold, the smallest Γ at which the conformed sheet stays conformed while Γ is
   *           lowered (the conformed branch folds or its conformed fraction falls below the target);
   *  - snap:  Γ_snap, the smallest Γ at which a laid-down sheet is pulled into conformation while Γ
   *           is raised (its branch folds and it snaps in, or its fraction reaches the target);
   *  - equal_energy: Γ_eq, the Maxwell point where the conformed branch and the least-conformed
   *           branch (the laid-down path before its first jump) have equal energy: above it the
   *           conformed state is the ground state.
   * Where both branches exist, Γ_hold ≤ Γ_eq ≤ Γ_snap; Γ_snap − Γ_hold is the hysteresis.
   */
  struct AdhesionLimits
  {
    AdhesionThreshold hold;
    AdhesionThreshold snap;
    AdhesionThreshold equal_energy;
    AdhesionPath      lowering; ///< from the conformed state, Γ decreasing
    AdhesionPath      raising;  ///< from the laid-down state, Γ increasing
    /// Every jump along the lowering path, then along the raising path (find_transitions()).
    std::vector<AdhesionTransition> transitions;
    /// The largest conformed fraction met on either path: where the target is out of reach, the
    /// fraction that can be had, and the transitions tell how the sheet gets there.
    FractionPeak largest;
  };

  /// Γ_hold from a lowering path: the bracket where the fraction first falls below @p target.
  AdhesionThreshold hold_threshold(const AdhesionPath &lowering, double target);

  /// Γ_snap from a raising path: the bracket where the fraction first reaches @p target.
  AdhesionThreshold snap_threshold(const AdhesionPath &raising, double target);

  /**
   * Γ_eq from the two paths: the root of E_conformed(Γ) − E_least(Γ) on the Γ interval where both
   * branches were followed. The conformed branch is the lowering path up to its first jump or
   * target crossing (fraction ≥ @p target); the least-conformed branch is the raising path up to
   * its first jump or target crossing (fraction < target). Restricted so, Γ_hold ≤ Γ_eq ≤ Γ_snap
   * whenever Γ_eq is found. Each branch's energy per area is interpolated by cubic Hermite
   * polynomials with the exact slope dE/dΓ = E_adhesion/Γ (the energy is stationary in the state,
   * so only its explicit Γ dependence remains), and the root is bisected to @p relative_tolerance
   * in ln Γ.
   */
  AdhesionThreshold equal_energy_threshold(const AdhesionPath &lowering, const AdhesionPath &raising, double target,
                                           double relative_tolerance);

  /// Follows both paths over the settings' range (states measured by summary_path_measure()),
  /// locates the three thresholds and lists the transitions. A threshold whose target fraction no
  /// state reaches says so, with the largest fraction reached.
  AdhesionLimits find_adhesion_limits(const SheetProblem &problem, const AdhesionPathSettings &settings,
                                      MPI_Comm comm, std::ostream *log = nullptr);

  /**
   * Where no certified state of either path reaches @p target (limits.largest, set), replaces the
   * "not found" reason of each unfound threshold by one that says so and gives the largest fraction
   * reached; if a path has no state or stopped early, it says that reachability is unknown (the
   * path's own message says why it stopped), instead of advice to widen the Γ range. Leaves the limits alone when the
   * target is reached or neither path has a state.
   */
  void explain_unreached_target(AdhesionLimits &limits, double target);

  /// The settings with @p stops added and the Γ range widened to contain them (stops sorted).
  AdhesionPathSettings with_stops(AdhesionPathSettings settings, std::vector<double> stops);

  /// The state a path holds at exactly Γ (a stop of the path), or null if it never landed there.
  const AdhesionPathPoint *point_at(const AdhesionPath &path, double work_of_adhesion);
} // namespace nappe
