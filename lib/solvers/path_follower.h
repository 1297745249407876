#pragma once

// Private to lib/solvers: the state of one adhesion path (adhesion_path.cc: set-up, the shared
// pieces and the earlier bisection stepping; adhesion_continuation.cc: predictor–corrector).
#include <deal.II/base/timer.h>

#include <nappe/physics/adhesion_potential.h>
#include <nappe/solvers/adhesion_path.h>
#include <nappe/solvers/energy_minimizer.h>

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

    void follow_by_bisection(AdhesionPath &path, Vector &state, double gamma);
    void follow_by_continuation(AdhesionPath &path, Vector &state, double gamma);

    const SheetProblem      &problem_;
    const AdhesionPotential &adhesion_;
    AdhesionPathSettings     settings_;
    const PathMeasure       &measure_;
    SheetSystem              system_;
    EnergyMinimizer          minimizer_;
    std::ostream            *log_;
    dealii::IndexSet         w_dofs_;
    dealii::Timer            timer_;
    double                   range_start_   = 0.0; ///< Γ at the start of the path [J/m²]
    double                   range_end_     = 0.0; ///< Γ at its end [J/m²]
    unsigned int             next_quarter_  = 1;
  };
} // namespace nappe::internal
