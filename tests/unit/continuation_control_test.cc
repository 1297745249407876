// The step control of natural-parameter continuation (solvers/continuation_control.h), on numbers
// whose answers follow in closed form.
//
// Fold: the saddle-node normal form Π(x; t) = x³/3 − (t_f − t)x (R. Seydel, Practical Bifurcation and
// Stability Analysis, 3rd ed., Springer 2010, ch. 2; chapter from memory) has the branch of minima x = √(t_f − t) with
// curvature Π'' = 2x, so μ² = 4(t_f − t) is exactly linear in t and two states on the branch give the
// distance to the fold t_f exactly.
#include <nappe/solvers/continuation_control.h>

#include <gtest/gtest.h>

#include <cmath>

using namespace nappe::continuation;

TEST(ContinuationControl, KeepsTheStepWhenTheCorrectorDidTheTargetWork)
{
  EXPECT_DOUBLE_EQ(step_factor(target_iterations, 0.25), 1.0);
}

TEST(ContinuationControl, ScalesTheStepInverselyWithTheCorrectorIterations)
{
  // Seydel's iteration-count rule (from memory): twice the target iterations halve the step, half of
  // them double it.
  EXPECT_DOUBLE_EQ(step_factor(2 * target_iterations, 1e-9), 0.5);
  EXPECT_DOUBLE_EQ(step_factor(target_iterations / 2, 1e-9), 2.0);
  EXPECT_DOUBLE_EQ(step_factor(target_iterations + 1, 1e-9), double(target_iterations) / (target_iterations + 1));
}

TEST(ContinuationControl, ScalesTheStepWithTheSquareRootOfTheCorrectorDistance)
{
  // The predictor error grows like the step squared: a corrector distance of 4× the target share
  // asks for half the step, one of 1/4 for twice the step.
  EXPECT_DOUBLE_EQ(step_factor(target_iterations, 1.0), 0.5);
  EXPECT_DOUBLE_EQ(step_factor(1, 0.25 / 4), 2.0); // the smaller of the two factors counts
  EXPECT_DOUBLE_EQ(step_factor(1, 1e-9), 2.0);   // clamped
  EXPECT_DOUBLE_EQ(step_factor(400, 1e-9), 0.5); // many iterations: clamped at one half
  EXPECT_DOUBLE_EQ(step_factor(target_iterations * 4, 0.25 / 4), 0.5);
}

TEST(ContinuationControl, ExtrapolatesTheFoldOfTheSaddleNodeNormalFormExactly)
{
  const double t_fold = 1.3;
  const auto   mu     = [&](double t) { return 2.0 * std::sqrt(t_fold - t); };
  for (const double t_b : {0.5, 1.0, 1.29})
    {
      const double t_a = t_b - 0.2;
      EXPECT_NEAR(fold_distance(t_a, mu(t_a), t_b, mu(t_b)), t_fold - t_b, 1e-12) << "t_b = " << t_b;
    }
  // Decreasing t towards a fold at t_f' = −0.4: the distance is measured along the path.
  const auto mu_down = [](double t) { return 2.0 * std::sqrt(t + 0.4); };
  EXPECT_NEAR(fold_distance(0.3, mu_down(0.3), 0.1, mu_down(0.1)), 0.5, 1e-12);
}

TEST(ContinuationControl, ReportsNoFoldWhenTheCurvatureDoesNotFall)
{
  EXPECT_LT(fold_distance(0.0, 1.0, 0.1, 1.0), 0.0);
  EXPECT_LT(fold_distance(0.0, 1.0, 0.1, 1.5), 0.0);
  EXPECT_LT(fold_distance(0.0, -1.0, 0.1, 0.5), 0.0); // unknown curvature
}

TEST(ContinuationControl, BisectsABracketWithoutAnEstimate)
{
  EXPECT_DOUBLE_EQ(bracket_trial(0.1, -1.0, 0.002, false), 0.05);
  EXPECT_DOUBLE_EQ(bracket_trial(0.1, 0.03, 0.002, true), 0.05); // the estimate did not halve it
  EXPECT_DOUBLE_EQ(bracket_trial(0.1, 0.2, 0.002, false), 0.05); // the estimate lies outside
}

TEST(ContinuationControl, PlacesTheTrialJustShortOfAnEstimatedEventSoOneMoreTrialClosesTheBracket)
{
  const double tolerance = 0.002, width = 0.1, estimate = 0.03;
  const double trial     = bracket_trial(width, estimate, tolerance, false);
  EXPECT_DOUBLE_EQ(trial, estimate - 0.45 * tolerance);
  EXPECT_LE(estimate - trial + 0.45 * tolerance, tolerance); // the next trial 0.9·tol on closes it
  // Near either end the trial stays inside by at least 0.45·tolerance.
  for (const double e : {0.0, 1e-4, 0.0995, 0.09999})
    {
      const double t = bracket_trial(width, e, tolerance, false);
      EXPECT_GE(t, 0.45 * tolerance) << "estimate " << e;
      EXPECT_LE(t, width - 0.45 * tolerance) << "estimate " << e;
    }
}
