#pragma once

#include <nappe/solvers/sheet_problem.h>

#include <functional>
#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  /// Step control of a path in the work of adhesion Γ (all Γ in J/m²).
  struct AdhesionPathSettings
  {
    double lowest_work_of_adhesion  = 0.01; ///< lower end of the Γ range [J/m²]
    double highest_work_of_adhesion = 1.0;  ///< upper end of the Γ range [J/m²]
    /// A state is "conformed" when its conformed fraction is at least this [-].
    double target_fraction = 0.99;
    /// Jumps and crossings of the target are located to a bracket [Γ₁, Γ₂] with ln(Γ₂/Γ₁) ≤ this [-].
    double relative_tolerance = 2e-3;
    double initial_step       = 0.05; ///< first step in ln Γ [-]
    double largest_step       = 0.1;  ///< largest step in ln Γ [-]
    /// A step stays on the branch only if the conformed fraction changes by at most this [-] ...
    double largest_fraction_change = 0.02;
    /// ... and the deflection by at most this times the equilibrium gap h₀ of the law [-].
    double largest_deflection_change = 1.0;
    /// Γ values every path lands on exactly (for tables at given Γ) [J/m²].
    std::vector<double> stops;
    /// Minimisations one path may spend before it gives up [-].
    unsigned int max_solves = 600;
  };

  /// Throws, naming the "Adhesion limits/…" entry, if the settings are inconsistent.
  void check_adhesion_path_settings(const AdhesionPathSettings &settings);

  /// What the caller measures of a certified state (the solver floor knows no measures).
  struct StateSummary
  {
    /// Share of the sheet in contact with the substrate [-]; steers the step control.
    double              conformed_fraction = 0.0;
    std::vector<double> values; ///< further values, in the order of PathMeasure::names
  };

  /// How a path measures each certified state: supplied by the caller (the analysis floor).
  struct PathMeasure
  {
    std::vector<std::string> names; ///< the names of StateSummary::values, with their units
    std::function<StateSummary(const SheetSystem &system, const Vector &ghosted_state, const LoadLevel &level)>
      measure;
  };

  /// A certified stable state on a path, per unit projected area of the sheet.
  struct AdhesionPathPoint
  {
    double              work_of_adhesion   = 0.0; ///< Γ [J/m²]
    double              conformed_fraction = 0.0; ///< [-]
    EnergyParts         energy_per_area;          ///< [J/m²]
    std::vector<double> values;                   ///< the PathMeasure's values, in the order of its names
    unsigned int        newton_iterations = 0;
    /// Reached from the previous point by a jump (snap-through): the branch ended between them.
    bool after_jump = false;
  };

  /**
   * The equilibrium states met while Γ is lowered or raised, in path order. Between consecutive
   * points the state changes continuously, except where after_jump is set: there the branch the
   * path was on ended (a fold) within the bracket of the two Γ values.
   */
  struct AdhesionPath
  {
    bool                           lowering = true; ///< Γ decreases along the path
    std::vector<AdhesionPathPoint> points;
    std::vector<std::string>       value_names; ///< names of AdhesionPathPoint::values
    bool                           complete = false; ///< reached the end of the Γ range
    std::string                    message;          ///< why it stopped early, with what to try
    unsigned int                   solves = 0;
    double                         wall_time = 0.0; ///< [s]

    /// The value named @p name of @p point (one of value_names); throws if there is none.
    double value(const AdhesionPathPoint &point, const std::string &name) const;
  };

  /**
   * Follows the equilibrium of a sheet on its substrate while Γ varies over the settings' range,
   * warm-starting every minimisation from the last certified state.
   *
   * @p start = grown_conformal: the sheet starts on the surface at the highest Γ and Γ is lowered
   * (the conformed branch and what follows when it lets go); laid_down: the sheet starts flat above
   * the substrate at the lowest Γ and Γ is raised (the suspended branch and how it snaps in). The
   * problem's other loads are applied first along its load path. Γ varies through the adhesion
   * factor c = Γ/Γ_problem of the LoadLevel, so the law keeps its shape (AdhesionLaw's Γ-linearity).
   * Every certified state is measured by @p measure.
   *
   * Step control: a step is accepted when the minimiser certifies a stable minimum and the state
   * stayed on the branch (fraction change ≤ largest_fraction_change, max |Δw| ≤
   * largest_deflection_change·h₀). A step that leaves the branch, or crosses the target fraction,
   * is halved until it is within relative_tolerance; then the jump (or crossing) is accepted and
   * recorded. Small steps near a fold keep Newton on the branch up to the fold, where large steps
   * followed by bisection would let it leave early.
   */
  AdhesionPath follow_adhesion_path(const SheetProblem &problem, StartProtocol start,
                                    const AdhesionPathSettings &settings, const PathMeasure &measure, MPI_Comm comm,
                                    std::ostream *log = nullptr);
} // namespace nappe
