#pragma once

namespace nappe
{
  /**
   * Step control of natural-parameter continuation along a path parameter t (ln Γ for adhesion
   * paths): pure functions of numbers, so that they can be tested alone.
   */
  namespace continuation
  {
    /// Corrector iterations a step should cost (common practice, no source: two to five Newton
    /// iterations mean the predictor was close without the step being needlessly short).
    constexpr unsigned int target_iterations = 4;

    /**
     * The factor by which to scale the next step after an accepted one, from the corrector's work:
     * its iterations n against target_iterations, and its distance from the prediction as a share θ
     * of the distance that counts as leaving the branch. The predictor error grows with the step
     * squared (E. L. Allgower & K. Georg, Numerical Continuation Methods, Springer 1990, §6.1), so
     * θ → ¼ needs the factor √(¼/θ); for the iterations the factor n_target/n (the iteration-count
     * rule of R. Seydel, Practical Bifurcation and Stability Analysis, 3rd ed., Springer 2010, §4.6,
     * from memory: a quadratically converging corrector needs few more iterations for a much larger
     * predictor error, so the square root grew the step too slowly). The smaller of the two, clamped
     * to [½, 2].
     */
    double step_factor(unsigned int corrector_iterations, double distance_share);

    /**
     * The distance ahead (in t, ≥ 0) to a fold of the branch through two states t_a → t_b (b the
     * later one, |t_b − t_a| > 0) with lowest curvatures μ_a, μ_b > 0: near a saddle-node the lowest
     * eigenvalue of the Hessian vanishes like the square root of the distance to the fold, so μ² is
     * linear in t (H. B. Keller, in Applications of Bifurcation Theory, Academic Press 1977; R.
     * Seydel, Practical Bifurcation and Stability Analysis, 3rd ed., Springer 2010, §5.4), and
     * d = μ_b²|t_b − t_a|/(μ_a² − μ_b²). The error of d is of the order d² (the next term of the normal
     * form). Returns a negative number if μ does not decrease (no fold ahead).
     */
    double fold_distance(double t_a, double mu_a, double t_b, double mu_b);

    /**
     * The distance from the near end of a bracket (0, width) at which to try next, given an estimate
     * of where the event (fold or crossing) lies (negative: none). Trusting the estimate, the trial
     * goes 0.45·tolerance before it, so that one more trial 0.9·tolerance further closes the bracket
     * to ≤ tolerance; trials stay at least 0.45·tolerance inside both ends. Without an estimate, or
     * with @p bisect (the last estimate did not halve the bracket), the trial is the midpoint (in
     * t). @p width > @p tolerance > 0.
     */
    double bracket_trial(double width, double estimate, double tolerance, bool bisect);
  } // namespace continuation
} // namespace nappe
