#pragma once

#include <nappe/analysis/state_summary.h>
#include <nappe/solvers/adhesion_path.h>

#include <string>
#include <vector>

namespace nappe
{
  /**
   * A discontinuity of an adhesion path: the branch it followed ended (a fold of the equilibrium)
   * somewhere in the bracket [gamma_lower, gamma_upper], and the sheet jumped to another state. The
   * bracket is the located position of the fold; its width (ln Γ₂/Γ₁ ≤ the path's relative tolerance)
   * is the error of that location.
   */
  struct AdhesionTransition
  {
    bool        lowering    = true; ///< on the path along which Γ decreases
    double      gamma_lower = 0.0;  ///< [J/m²]
    double      gamma_upper = 0.0;  ///< [J/m²]
    double      fraction_before = 0.0, fraction_after = 0.0; ///< conformed fraction [-]
    /// Contact over raised parts and over the floor, as shares of the sheet (state_summary.h) [-].
    double      raised_before = 0.0, raised_after = 0.0, floor_before = 0.0, floor_after = 0.0;
    /**
     * Energy per projected area released by the jump [J/m²]: the energy of the branch that ended,
     * carried to the Γ after the jump with its exact slope dE/dΓ = E_adhesion/Γ (envelope theorem),
     * minus the energy of the state after it. First order in the bracket width.
     */
    double      energy_released = 0.0;
    Regime      regime_before = Regime::suspended, regime_after = Regime::suspended;
    std::string kind; ///< transition_kind()

    /// The Γ before and after the jump, in path order [J/m²].
    double gamma_before() const { return lowering ? gamma_upper : gamma_lower; }
    double gamma_after() const { return lowering ? gamma_lower : gamma_upper; }
  };

  /**
   * The name of a transition from the regimes before and after it (our definitions): raising Γ,
   * "touch-down" (suspended → in contact), "tents → floor contact", "snap into conformation" (→ conforms);
   * lowering Γ, "detachment" (→ suspended), "partial detachment" (conforms → partly conformed),
   * "lift-off from the floor" (touches the floor → tents); within one regime, "partial depinning"
   * (the contact front jumps: contact gained raising, lost lowering); otherwise "<before> → <after>".
   */
  std::string transition_kind(bool lowering, Regime before, Regime after);

  /// Every jump of @p path (a path measured with summary_path_measure()), in path order.
  std::vector<AdhesionTransition> find_transitions(const AdhesionPath &path, double target_fraction);

  /// The largest conformed fraction met on a path and where [-, J/m²].
  struct FractionPeak
  {
    double fraction         = 0.0;
    double work_of_adhesion = 0.0;
    bool   lowering         = true;
  };

  /// The largest conformed fraction over the states of @p paths.
  FractionPeak largest_fraction(const std::vector<const AdhesionPath *> &paths);
} // namespace nappe
