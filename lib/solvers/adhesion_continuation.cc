// Predictor–corrector continuation of an adhesion path in ln Γ (ContinuationMethod::predictor_corrector;
// the method is described at follow_adhesion_path() and in docs/theory.md, "Adhesion limits").
#include <nappe/solvers/continuation_control.h>
#include <nappe/solvers/path_tangent.h>

#include "path_follower.h"

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <limits>
#include <optional>
#include <sstream>

namespace nappe::internal
{
  namespace
  {
    /// The last certified state on the branch, with what the predictor and the fold watch need.
    struct Anchor
    {
      double gamma;     ///< [J/m²]
      Vector state;     ///< owned
      Vector tangent;   ///< dU/dΓ [m per J/m²]
      double fraction;  ///< conformed fraction [-]
      double curvature; ///< lowest curvature μ₁ (negative: unknown) [-]
    };

    /// A trial beyond the anchor that did not continue the branch: it left it, crossed the target
    /// fraction, or failed. It closes the bracket on the far side.
    struct Trial
    {
      double            gamma      = 0.0;
      double            from_gamma = 0.0; ///< Γ of the anchor it was predicted from
      bool              failed     = true;
      bool              on_branch  = false;
      bool              crosses    = false;
      Vector            state;
      AdhesionPathPoint point;
      std::string       message;
    };
  } // namespace

  void PathFollower::follow_by_continuation(AdhesionPath &path, Vector &state, double gamma)
  {
    const double tolerance = settings_.relative_tolerance, h0 = adhesion_.law().equilibrium_gap();
    const double target    = settings_.target_fraction;
    const auto   ln_distance = [](double a, double b) { return std::abs(std::log(b / a)); };
    const auto   anchor_at   = [&](const Vector &u, double g, AdhesionPathPoint &point) {
      Vector tangent = path_tangent(minimizer_, u, level(g), PathParameter::adhesion);
      tangent /= problem_gamma(); // dU/dΓ = (dU/dc)/Γ_problem
      const LowestEigenpair mu = minimizer_.lowest_curvature();
      point.lowest_curvature   = mu.available ? mu.value : -1.0;
      return Anchor{g, u, tangent, point.conformed_fraction, point.lowest_curvature};
    };

    Anchor lo = anchor_at(state, gamma, path.points.back());
    std::optional<std::pair<double, double>> before; // (ln Γ, μ₁) of the previous state on this branch
    std::optional<Trial>                     hi;     // the nearest trial beyond lo that did not continue it
    double step = settings_.initial_step, last_width = std::numeric_limits<double>::max();
    bool   bisect = false;
    Vector predicted = state, corrected = state;

    while (ln_distance(lo.gamma, range_end_) > 1e-12)
      {
        if (path.solves >= settings_.max_solves)
          {
            path.message = "gave up after " + std::to_string(settings_.max_solves) + " minimisations at Γ = " +
                           std::to_string(lo.gamma) +
                           " J/m²; raise Adhesion limits/Maximum solves or loosen Adhesion limits/Relative tolerance";
            break;
          }
        // Where to try: inside the bracket if there is one, else one step on, short of an announced fold.
        double trial_gamma = 0.0;
        if (hi)
          {
            const double width = ln_distance(lo.gamma, hi->gamma);
            if (width <= tolerance * 1.000001 && hi->from_gamma == lo.gamma)
              {
                // The bracket is closed by a trial predicted from lo itself: the jump or crossing.
                if (hi->failed)
                  {
                    std::ostringstream s;
                    s << "no stable state at Γ = " << hi->gamma << " J/m² next to the certified state at Γ = "
                      << lo.gamma << " J/m² (" << hi->message
                      << "); try a finer mesh or a smaller Adhesion limits/Relative tolerance";
                    path.message = s.str();
                    break;
                  }
                hi->point.after_jump = !hi->on_branch;
                if (hi->on_branch)
                  before = std::make_pair(std::log(lo.gamma), lo.curvature);
                else
                  before.reset(); // a new branch
                path.points.push_back(hi->point);
                lo = anchor_at(hi->state, hi->gamma, path.points.back());
                if (!hi->on_branch)
                  step = settings_.initial_step;
                hi.reset();
                last_width = std::numeric_limits<double>::max();
                bisect     = false;
                progress(path, lo.gamma);
                continue;
              }
            if (width <= tolerance * 1.000001)
              trial_gamma = hi->gamma; // confirm the jump from the last state on the branch
            else
              {
                double estimate = -1.0;
                if (hi->crosses)
                  estimate = width * (target - lo.fraction) / (hi->point.conformed_fraction - lo.fraction);
                else if (before)
                  estimate = continuation::fold_distance(before->first, before->second, std::log(lo.gamma),
                                                         lo.curvature);
                bisect      = bisect || width > 0.5 * last_width;
                last_width  = width;
                trial_gamma = next_gamma(lo.gamma, continuation::bracket_trial(width, estimate, tolerance, bisect),
                                         path.lowering);
              }
          }
        else
          {
            double distance = step;
            if (before)
              {
                const double fold =
                  continuation::fold_distance(before->first, before->second, std::log(lo.gamma), lo.curvature);
                if (fold >= 0.0 && fold < distance)
                  distance = std::max(fold - 0.45 * tolerance, 0.9 * tolerance);
              }
            trial_gamma = next_gamma(lo.gamma, distance, path.lowering);
          }

        // Predictor and corrector.
        predicted = lo.state;
        predicted.add(trial_gamma - lo.gamma, lo.tangent);
        system_.constraints().distribute(predicted);
        corrected = predicted;
        const MinimizerReport report = minimizer_.minimize(corrected, level(trial_gamma), 0.0);
        ++path.solves;
        Trial t;
        t.gamma      = trial_gamma;
        t.from_gamma = lo.gamma;
        double share = 0.0; // corrector distance as a share of what counts as leaving the branch
        if (report.converged)
          {
            t.failed = false;
            t.point  = measure(corrected, trial_gamma, report.iterations);
            share    = std::max(max_deflection_change(corrected, predicted) / (settings_.largest_deflection_change * h0),
                             std::abs(t.point.conformed_fraction - fraction_of(predicted, trial_gamma)) /
                               settings_.largest_fraction_change);
            t.on_branch = share <= 1.0;
            t.crosses   = t.on_branch && (t.point.conformed_fraction >= target) != (lo.fraction >= target);
          }
        else
          {
            std::ostringstream s;
            s << "last residual " << std::scientific << std::setprecision(3) << report.residual << " N: "
              << report.message;
            t.message = s.str();
          }

        if (t.on_branch && !t.crosses)
          {
            path.points.push_back(t.point);
            before = std::make_pair(std::log(lo.gamma), lo.curvature);
            lo     = anchor_at(corrected, trial_gamma, path.points.back());
            if (hi && ln_distance(lo.gamma, hi->gamma) < 1e-12 * tolerance)
              hi.reset(); // the confirmation found the branch continuing
            if (!hi)
              step = std::clamp(step * continuation::step_factor(report.iterations, share), tolerance,
                                settings_.largest_step);
            progress(path, lo.gamma);
            continue;
          }
        t.state = corrected;
        if (!hi)
          {
            last_width = std::numeric_limits<double>::max(); // a new bracket
            bisect     = false;
          }
        hi = std::move(t);
      }
    state = lo.state;
  }
} // namespace nappe::internal
