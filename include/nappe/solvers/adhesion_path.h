#pragma once

#include <nappe/solvers/sheet_problem.h>

#include <functional>
#include <ostream>
#include <string>
#include <vector>

namespace nappe
{
  /// How a path in Γ steps from one state to the next.
  enum class ContinuationMethod
  {
    /// Tangent predictor, trust-region corrector, steps adapted from the corrector's work, folds
    /// announced by the lowest curvature of the Hessian (follow_adhesion_path below).
    predictor_corrector,
    /// The earlier method: warm start from the last state, a step halved whenever the state changes
    /// by more than the limits (kept for side-by-side comparison in benchmarks/adhesion_limits.cc).
    bisection
  };

  /// Step control of a path in the work of adhesion Γ (all Γ in J/m²).
  struct AdhesionPathSettings
  {
    ContinuationMethod method = ContinuationMethod::predictor_corrector;
    double lowest_work_of_adhesion  = 0.01; ///< lower end of the Γ range [J/m²]
    double highest_work_of_adhesion = 1.0;  ///< upper end of the Γ range [J/m²]
    /// A state is "conformed" when its conformed fraction is at least this [-].
    double target_fraction = 0.99;
    /// Jumps and crossings of the target are located to a bracket [Γ₁, Γ₂] with ln(Γ₂/Γ₁) ≤ this [-].
    double relative_tolerance = 2e-3;
    double initial_step       = 0.05; ///< first step in ln Γ [-]
    double largest_step       = 0.5;  ///< largest step in ln Γ [-]
    /// A step stays on the branch only if its share of contact (PathMeasure::fraction) differs from
    /// that of the predicted state (bisection: its conformed fraction from the previous state's) by at
    /// most this [-] ...
    double largest_fraction_change = 0.02;
    /// ... and the deflection nowhere by more than this times the equilibrium gap h₀ of the law [-].
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
    /// The share of contact the predictor–corrector's branch test compares (of predicted states,
    /// corrector iterates and corrected states): it should change continuously with the state, so that
    /// a front moving past a quadrature point is not taken for a jump. If empty, the conformed fraction
    /// of measure() is compared.
    std::function<double(const SheetSystem &system, const Vector &ghosted_state, const LoadLevel &level)> fraction;
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
    /// Lowest eigenvalue μ₁ of H v = μ diag|H| v at this state (predictor–corrector paths; 0 < μ₁ ≤ 1,
    /// tending to 0 at a fold); negative if not computed [-].
    double lowest_curvature = -1.0;
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
    unsigned int                   mesh_adaptations = 0; ///< meshes adapted along the path (start included)
    unsigned long long             largest_unknowns = 0; ///< of the largest mesh the path used [-]

    /// The value named @p name of @p point (one of value_names); throws if there is none.
    double value(const AdhesionPathPoint &point, const std::string &name) const;
  };

  /**
   * Follows the equilibrium of a sheet on its substrate while Γ varies over the settings' range.
   *
   * @p start = grown_conformal: the sheet starts on the surface at the highest Γ and Γ is lowered
   * (the conformed branch and what follows when it lets go); laid_down: the sheet starts flat above
   * the substrate at the lowest Γ and Γ is raised (the suspended branch and how it snaps in). The
   * problem's other loads are applied first along its load path. Γ varies through the adhesion
   * factor c = Γ/Γ_problem of the LoadLevel, so the law keeps its shape (AdhesionLaw's Γ-linearity).
   * Every certified state is measured by @p measure.
   *
   * Predictor–corrector (default; docs/theory.md, "Adhesion limits"): from a certified state U at Γ,
   * the predictor is U + ΔΓ·dU/dΓ (path_tangent(), one solve with the factorisation the corrector
   * already has) and the corrector is the trust-region minimiser at Γ + ΔΓ. The trial stays on the
   * branch if it is certified and differs from the prediction by at most largest_deflection_change·h₀
   * in w and largest_fraction_change in share of contact (PathMeasure::fraction). The first step on a
   * branch is the one over which the tangent predicts a change of w of a quarter of that limit; the next
   * step is scaled from the corrector's work (its iterations and its distance, which grows with the step
   * squared).
   * Each accepted state's lowest curvature μ₁ (StabilityCertificate::lowest_eigenpair) and its rate
   * 1/max|dw/d ln Γ| announce a fold: both vanish like the square root of the distance to a
   * saddle-node, so two states extrapolate the fold's position, and the steps are placed to bracket
   * it. A trial that leaves the branch or crosses the target fraction opens a bracket, refined (by
   * the fold or crossing estimate, else by bisection) until its width in ln Γ is at most
   * relative_tolerance; the jump is then confirmed from the last state on the branch by a full
   * minimisation and recorded (after_jump). The fold lies inside the recorded bracket: that width is
   * the error of its location. Other trials stop their corrector once it has clearly left the branch
   * (EnergyMinimizer::IterateCheck); such a trial is never recorded.
   *
   * Bisection (the earlier method): warm starts from the last state, a step is halved whenever the
   * state changes by more than the limits, until it is within relative_tolerance.
   *
   * Adaptive meshes (problem.adaptation.cycles > 0, predictor–corrector only): the starting state is
   * solved on meshes adapted as a solve adapts them (mark_cells()); then, at every state accepted on
   * a branch while no bracket is open, if the adhesion front or a strain concentration has moved into
   * cells coarser than the finest level, those cells are refined and smooth ones coarsened
   * (mark_cells() without bulk refinement), the state is carried over and minimised again. A state
   * that leaves its branch on the new mesh ends the path with a message. Brackets and jumps are thus
   * always located between states on one mesh, with the front resolved at the finest level.
   */
  AdhesionPath follow_adhesion_path(const SheetProblem &problem, StartProtocol start,
                                    const AdhesionPathSettings &settings, const PathMeasure &measure, MPI_Comm comm,
                                    std::ostream *log = nullptr);

} // namespace nappe
