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
#include <vector>

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
      double rate;      ///< max |dw/d ln Γ| [m]: grows like 1/μ of the fold's mode as a fold nears
    };

    /// What the fold estimates need of the previous state on the branch.
    struct Previous
    {
      double ln_gamma, curvature, rate;
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
      /// The corrector was stopped once its iterate had clearly left the branch: no state, and the
      /// bracket it closes must be confirmed by a full minimisation.
      bool              abandoned  = false;
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
      Vector tangent = path_tangent(*minimizer_, u, level(g), PathParameter::adhesion);
      tangent /= problem_gamma(); // dU/dΓ = (dU/dc)/Γ_problem
      const LowestEigenpair mu = minimizer_->lowest_curvature();
      point.lowest_curvature   = mu.available ? mu.value : -1.0;
      const double rate = largest_entry(tangent, w_dofs_, system_.communicator()) * g;
      return Anchor{g, u, tangent, point.conformed_fraction, point.lowest_curvature, rate};
    };

    Anchor lo = anchor_at(state, gamma, path.points.back());
    std::optional<Previous> before; // the previous state on this branch
    std::optional<Trial>    hi;     // the nearest trial beyond lo that did not continue it
    std::vector<Trial>      beyond; // farther such trials, nearest last: the next bracket if hi continues it
    // A fold ahead is extrapolated from μ₁ and from the rate 1/max|dw/d ln Γ|, which vanishes like
    // the square root of the distance too (dU/dt is dominated by the fold's mode over its
    // eigenvalue); μ₁ need not belong to the fold's mode (it does not where the adhesion front lets
    // go, and it drops where the lowest mode changes). Inside a bracket the branch is known to end:
    // the nearer estimate counts. Outside one a fold is announced only where both see it coming:
    // far from a fold the rate alone underestimates its distance and would shorten every step, and
    // μ₁ alone announces folds that are only a change of its mode.
    const auto fold_ahead = [&](bool in_bracket) {
      if (!before)
        return -1.0;
      const double by_curvature =
        continuation::fold_distance(before->ln_gamma, before->curvature, std::log(lo.gamma), lo.curvature);
      const double by_rate = before->rate > 0.0 && lo.rate > 0.0 ?
                               continuation::fold_distance(before->ln_gamma, 1.0 / before->rate, std::log(lo.gamma),
                                                           1.0 / lo.rate) :
                               -1.0;
      if (!in_bracket)
        return by_rate >= 0.0 ? by_curvature : -1.0;
      if (by_curvature < 0.0 || by_rate < 0.0)
        return std::max(by_curvature, by_rate);
      return std::min(by_curvature, by_rate);
    };
    const auto next_beyond = [&]() -> std::optional<Trial> {
      if (beyond.empty())
        return std::nullopt;
      Trial t = std::move(beyond.back());
      beyond.pop_back();
      return t;
    };
    // The first step on a branch: the one over which the tangent predicts a change of w of a quarter
    // of what counts as leaving the branch, within [initial step, largest step].
    const auto first_step = [&](const Anchor &a) {
      const double quarter = 0.25 * settings_.largest_deflection_change * h0;
      return a.rate > 0.0 ? std::clamp(quarter / a.rate, settings_.initial_step, settings_.largest_step) :
                            settings_.initial_step;
    };
    double step = first_step(lo), last_width = std::numeric_limits<double>::max();
    bool   bisect = false;
    Vector predicted = state, corrected = state;
    // On an adaptive mesh, refine where the front and the strain peaks of the new anchor lie, once no
    // bracket holds states of the present mesh; false if the path must stop.
    const auto refine_at_anchor = [&]() {
      if (hi || !beyond.empty())
        return true;
      Vector          u = lo.state;
      const Remeshing r = refine_and_resolve(path, u, lo.gamma, false);
      if (!r.changed || !r.stayed)
        return r.stayed;
      AdhesionPathPoint point = measure(u, lo.gamma, path.points.back().newton_iterations + r.newton_iterations);
      point.after_jump        = path.points.back().after_jump;
      path.points.back()      = point;
      lo                      = anchor_at(u, lo.gamma, path.points.back());
      predicted = corrected = lo.state;
      return true;
    };
    if (!refine_at_anchor())
      return;

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
        bool   confirming  = false;
        if (hi)
          {
            const double width = ln_distance(lo.gamma, hi->gamma);
            if (width <= tolerance * 1.000001 && hi->from_gamma == lo.gamma && !hi->abandoned)
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
                const bool crossing = hi->on_branch;
                if (crossing)
                  before = Previous{std::log(lo.gamma), lo.curvature, lo.rate};
                else
                  before.reset(); // a new branch
                path.points.push_back(hi->point);
                lo = anchor_at(hi->state, hi->gamma, path.points.back());
                if (!crossing)
                  {
                    step = first_step(lo);
                    beyond.clear();
                  }
                hi = next_beyond(); // past a crossing, the branch may still end where a farther trial left it
                last_width = std::numeric_limits<double>::max();
                bisect     = false;
                if (!refine_at_anchor())
                  break;
                progress(path, lo.gamma);
                continue;
              }
            if (width <= tolerance * 1.000001)
              {
                trial_gamma = hi->gamma; // confirm the jump from the last state on the branch
                confirming  = true;
              }
            else
              {
                double estimate = -1.0;
                if (hi->crosses)
                  estimate = width * (target - lo.fraction) / (hi->point.conformed_fraction - lo.fraction);
                else
                  estimate = fold_ahead(true);
                bisect      = bisect || width > 0.5 * last_width;
                last_width  = width;
                trial_gamma = next_gamma(lo.gamma, continuation::bracket_trial(width, estimate, tolerance, bisect),
                                         path.lowering);
              }
          }
        else
          {
            double distance = step;
            const double fold = fold_ahead(false);
            if (fold >= 0.0 && fold < distance)
              distance = std::max(fold - 0.45 * tolerance, 0.9 * tolerance);
            trial_gamma = next_gamma(lo.gamma, distance, path.lowering);
          }

        // Predictor and corrector.
        predicted = lo.state;
        predicted.add(trial_gamma - lo.gamma, lo.tangent);
        system_.constraints().distribute(predicted);
        corrected = predicted;
        // A trial that is not the confirmation of a jump only has to tell whether it stays on the
        // branch: the corrector stops once an iterate is four times farther from the prediction (in
        // w or in share of contact) than what counts as leaving it, once it met an indefinite
        // Hessian (the certified states of a branch and their neighbourhood have none), or after
        // twice the iterations a step should cost (common practice, no source: a corrector that slow
        // is rejected and the step shortened). A wrong call only costs the confirmation's solve.
        const double predicted_fraction = fraction_of(predicted, trial_gamma);
        unsigned int corrector_steps    = 0;
        const EnergyMinimizer::IterateCheck near_branch = [&](const Vector &u, const IterationRecord &iteration) {
          corrector_steps += iteration.chord ? 0 : 1; // chord steps are bounded by the minimiser
          return corrector_steps <= 2 * continuation::target_iterations && iteration.negative_pivots == 0 &&
                 max_deflection_change(u, predicted) <= 4.0 * settings_.largest_deflection_change * h0 &&
                 std::abs(fraction_of(u, trial_gamma) - predicted_fraction) <=
                   4.0 * settings_.largest_fraction_change;
        };
        MinimizerReport report = minimizer_->minimize(corrected, level(trial_gamma), 0.0,
                                                      confirming ? EnergyMinimizer::IterateCheck() : near_branch);
        ++path.solves;
        // A confirmation crosses the whole snap-through, which can take longer than the iteration
        // budget of a step: where the budget ran out, it goes on from where it stopped, up to three times.
        for (unsigned int more = 0; confirming && report.out_of_iterations && more < 3; ++more, ++path.solves)
          {
            const unsigned int spent = report.iterations;
            report                   = minimizer_->minimize(corrected, level(trial_gamma), 0.0);
            report.iterations += spent;
          }
        Trial t;
        t.gamma      = trial_gamma;
        t.from_gamma = lo.gamma;
        double share = 0.0; // corrector distance as a share of what counts as leaving the branch
        const auto off_branch = [&](const Vector &u) {
          return max_deflection_change(u, predicted) > settings_.largest_deflection_change * h0 ||
                 std::abs(fraction_of(u, trial_gamma) - predicted_fraction) > settings_.largest_fraction_change;
        };
        if (confirming && !report.converged && !report.stopped && problem_.adaptation.cycles > 0 &&
            off_branch(corrected))
          {
            // A jump whose end the mesh does not resolve: on an adaptive mesh, finish it on a mesh
            // adapted to where the sheet is going (the states of the old mesh are not needed past it).
            report = finish_on_adapted_meshes(path, corrected, trial_gamma, report);
            if (report.converged)
              {
                t.failed  = false;
                t.point   = measure(corrected, trial_gamma, report.iterations);
                t.state   = corrected;
                beyond.clear();
                hi = std::move(t);
                continue;
              }
          }
        if (report.converged)
          {
            t.failed = false;
            t.point  = measure(corrected, trial_gamma, report.iterations);
            share    = std::max(max_deflection_change(corrected, predicted) / (settings_.largest_deflection_change * h0),
                             std::abs(fraction_of(corrected, trial_gamma) - predicted_fraction) /
                               settings_.largest_fraction_change);
            t.on_branch = share <= 1.0;
            t.crosses   = t.on_branch && (t.point.conformed_fraction >= target) != (lo.fraction >= target);
          }
        else if (report.stopped)
          {
            t.failed    = false;
            t.abandoned = true;
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
            before = Previous{std::log(lo.gamma), lo.curvature, lo.rate};
            lo     = anchor_at(corrected, trial_gamma, path.points.back());
            if (hi && ln_distance(lo.gamma, hi->gamma) < 1e-12 * tolerance)
              hi = next_beyond(); // the confirmation found the branch continuing
            if (!hi)
              step = std::clamp(step * continuation::step_factor(report.iterations, share), tolerance,
                                settings_.largest_step);
            if (!refine_at_anchor())
              break;
            progress(path, lo.gamma);
            continue;
          }
        t.state = corrected;
        if (!hi)
          {
            last_width = std::numeric_limits<double>::max(); // a new bracket
            bisect     = false;
            // Where the branch continues past it, the next free step starts from half this one.
            step = std::max(tolerance, 0.5 * ln_distance(lo.gamma, t.gamma));
          }
        else if (!hi->on_branch && ln_distance(hi->gamma, t.gamma) > 1e-12 * tolerance)
          beyond.push_back(std::move(*hi)); // a crossing trial is superseded; a departure is kept
        hi = std::move(t);
      }
    state = lo.state;
  }
} // namespace nappe::internal
