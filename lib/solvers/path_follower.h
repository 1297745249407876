#pragma once

// Private to lib/solvers: the state of one adhesion path (adhesion_path.cc: set-up, the shared
// pieces and the earlier bisection stepping; adhesion_continuation.cc: predictor–corrector).
#include <deal.II/base/timer.h>

#include <nappe/physics/adhesion_potential.h>
#include <nappe/solvers/adhesion_path.h>
#include <nappe/solvers/energy_minimizer.h>

#include <memory>
#include <ostream>
#include <string>

namespace nappe::internal
{
  /// One path: the system, the minimiser and the last certified state; Γ enters as the adhesion
  /// factor c = Γ/Γ_problem.
  class PathFollower
  {
  public:
    PathFollower(const SheetProblem &p, const AdhesionPathSettings &s, const PathMeasure &measure, MPI_Comm comm,
                 std::ostream *log);

    AdhesionPath run(StartProtocol start);

  private:
    double    problem_gamma() const { return adhesion_.law().work_of_adhesion(); }
    LoadLevel level(double gamma) const { return LoadLevel(1.0, gamma / problem_gamma()); }
    AdhesionPathPoint measure(const Vector &owned, double gamma, unsigned int iterations) const;
    double            fraction_of(const Vector &owned, double gamma) const;
    double            max_deflection_change(const Vector &a, const Vector &b) const;
    /// The next Γ: one step in ln Γ, not past the range's end nor past the next stop.
    double next_gamma(double gamma, double step, bool lowering) const;
    /// A brief progress line each time another quarter of the range is covered.
    void   progress(const AdhesionPath &path, double gamma);
    void   say(const std::string &s) const
    {
      if (log_)
        *log_ << s << std::flush;
    }

    /// Adapts the mesh to the certified @p state at Γ and carries the state over (whole: the marking
    /// of a solve's cycles; otherwise refinement only where the adhesion front and the strain
    /// concentrations moved, with coarsening where the sheet is smooth, and only if some cell is
    /// refined). False, with the mesh unchanged, if nothing was to be refined.
    bool adapt_mesh(AdhesionPath &path, Vector &state, double gamma, bool whole);
    struct Remeshing
    {
      bool         changed = false;   ///< the mesh was adapted
      bool         stayed  = true;    ///< the state was found again on the new mesh, on its branch
      unsigned int newton_iterations = 0;
    };
    /// adapt_mesh(), then the state minimised again on the new mesh; if that fails or leaves the
    /// branch the state was on, path.message says so (stayed = false).
    Remeshing refine_and_resolve(AdhesionPath &path, Vector &state, double gamma, bool whole);
    /// After a minimisation that did not converge (@p report), its iterate @p state having left the
    /// branch: the sheet is going where the mesh is coarse. Adapts the mesh to the iterate and goes
    /// on minimising, at most Cycles times. The last report; the state on the last mesh.
    MinimizerReport finish_on_adapted_meshes(AdhesionPath &path, Vector &state, double gamma,
                                             MinimizerReport report);
    std::unique_ptr<EnergyMinimizer> make_minimizer();

    void follow_by_bisection(AdhesionPath &path, Vector &state, double gamma);
    void follow_by_continuation(AdhesionPath &path, Vector &state, double gamma);

    const SheetProblem      &problem_;
    const AdhesionPotential &adhesion_;
    AdhesionPathSettings     settings_;
    const PathMeasure       &measure_;
    SheetSystem              system_;
    std::unique_ptr<EnergyMinimizer> minimizer_; ///< rebuilt when the mesh changes
    std::ostream            *log_;
    dealii::IndexSet         w_dofs_;
    dealii::Timer            timer_;
    double                   range_start_   = 0.0; ///< Γ at the start of the path [J/m²]
    double                   range_end_     = 0.0; ///< Γ at its end [J/m²]
    unsigned int             next_quarter_  = 1;
  };
} // namespace nappe::internal
