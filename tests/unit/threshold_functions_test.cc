// The threshold functions of analysis/adhesion_limits.h and the height bracketing of the fabrication
// check, on synthetic paths whose answers are known in closed form (no solves).
//
// Synthetic branches (our own): a conformed branch with energy per area E_c(Γ) = −Γ + B and a
// laid-down branch with E_l(Γ) = −Γ·f₀ (f₀ the contact share of the laid-down state), so that
// dE/dΓ = E_adhesion/Γ holds exactly on both (E_adhesion = −Γ and −Γf₀), as on a real path. They cross
// at Γ_eq = B/(1 − f₀), which the Hermite interpolation with exact slopes must find to its tolerance.
#include <nappe/analysis/adhesion_limits.h>
#include <nappe/analysis/fabrication_check.h>

#include <gtest/gtest.h>

#include <cmath>

using namespace nappe;

namespace
{
  const double B = 0.12, f0 = 0.2; // J/m², -

  AdhesionPathPoint state(double gamma, double fraction, bool conformed_branch, bool after_jump = false)
  {
    AdhesionPathPoint p;
    p.work_of_adhesion                = gamma;
    p.conformed_fraction              = fraction;
    p.energy_per_area.substrate       = conformed_branch ? -gamma : -gamma * f0;
    p.energy_per_area.bending         = conformed_branch ? B : 0.0;
    p.after_jump                      = after_jump;
    return p;
  }

  /// Γ lowered geometrically from 1 J/m² with the conformed branch folding below @p fold.
  AdhesionPath lowering(double fold)
  {
    AdhesionPath path;
    path.lowering = true;
    path.complete = true;
    bool jumped   = false;
    for (double g = 1.0; g > 0.011; g *= 0.9)
      {
        const bool conformed = g >= fold;
        path.points.push_back(state(g, conformed ? 1.0 : f0, conformed, !conformed && !jumped));
        jumped |= !conformed;
      }
    return path;
  }

  /// Γ raised geometrically from 0.01 J/m² with the laid-down branch snapping in above @p snap.
  AdhesionPath raising(double snap)
  {
    AdhesionPath path;
    path.lowering = false;
    path.complete = true;
    bool jumped   = false;
    for (double g = 0.01; g < 1.01; g *= 1.1)
      {
        const bool conformed = g > snap;
        path.points.push_back(state(g, conformed ? 1.0 : f0, conformed, conformed && !jumped));
        jumped |= conformed;
      }
    return path;
  }
} // namespace

TEST(ThresholdFunctions, HoldIsBracketedWhereTheConformedBranchLetsGo)
{
  const AdhesionThreshold t = hold_threshold(lowering(0.1), 0.99);
  ASSERT_TRUE(t.found) << t.how;
  EXPECT_LT(t.lower, 0.1);
  EXPECT_GE(t.upper, 0.1);
  EXPECT_NEAR(t.upper / t.lower, 1 / 0.9, 1e-12); // adjacent path states
  EXPECT_NE(t.how.find("fold"), std::string::npos) << t.how;
}

TEST(ThresholdFunctions, SnapIsBracketedWhereTheLaidDownBranchSnapsIn)
{
  const AdhesionThreshold t = snap_threshold(raising(0.5), 0.99);
  ASSERT_TRUE(t.found) << t.how;
  EXPECT_LE(t.lower, 0.5);
  EXPECT_GT(t.upper, 0.5);
  EXPECT_NEAR(t.upper / t.lower, 1.1, 1e-12);
}

TEST(ThresholdFunctions, EqualEnergyPointMatchesTheClosedFormCrossing)
{
  const double            tolerance = 1e-3;
  const AdhesionThreshold t         = equal_energy_threshold(lowering(0.1), raising(0.5), 0.99, tolerance);
  ASSERT_TRUE(t.found) << t.how;
  const double exact = B / (1 - f0); // E_c = E_l
  EXPECT_LE(std::log(t.upper / t.lower), tolerance * 1.0001);
  EXPECT_LE(t.lower, exact * (1 + 1e-9));
  EXPECT_GE(t.upper, exact * (1 - 1e-9));
}

TEST(ThresholdFunctions, ThresholdsOutsideTheRangeSayWhichEndToMove)
{
  const AdhesionThreshold above = hold_threshold(lowering(2.0), 0.99); // never conformed
  EXPECT_FALSE(above.found);
  EXPECT_NE(above.how.find("Highest work of adhesion"), std::string::npos) << above.how;
  const AdhesionThreshold below = hold_threshold(lowering(0.001), 0.99); // conformed down to the end
  EXPECT_FALSE(below.found);
  EXPECT_NE(below.how.find("Lowest work of adhesion"), std::string::npos) << below.how;
  const AdhesionThreshold no_snap = snap_threshold(raising(5.0), 0.99);
  EXPECT_FALSE(no_snap.found);
  EXPECT_NE(no_snap.how.find("Highest work of adhesion"), std::string::npos) << no_snap.how;
}

namespace
{
  /// The limits of two paths with their thresholds and largest fraction, as find_adhesion_limits sets them.
  AdhesionLimits limits_of(AdhesionPath down, AdhesionPath up, double target)
  {
    AdhesionLimits limits;
    limits.lowering     = std::move(down);
    limits.raising      = std::move(up);
    limits.hold         = hold_threshold(limits.lowering, target);
    limits.snap         = snap_threshold(limits.raising, target);
    limits.equal_energy = equal_energy_threshold(limits.lowering, limits.raising, target, 1e-3);
    limits.largest      = largest_fraction({&limits.lowering, &limits.raising});
    explain_unreached_target(limits, target);
    return limits;
  }
} // namespace

// A target above every state's fraction (a pillar array's 99 %, here 1.5 on paths that reach 1.0): each
// threshold names the largest fraction instead of advice to widen the range.
TEST(ThresholdFunctions, UnreachableTargetGivesTheLargestFraction)
{
  const AdhesionLimits limits = limits_of(lowering(0.1), raising(0.5), 1.5);
  for (const AdhesionThreshold *t : {&limits.hold, &limits.snap, &limits.equal_energy})
    {
      EXPECT_FALSE(t->found);
      EXPECT_NE(t->how.find("the largest is 100 %"), std::string::npos) << t->how;
      EXPECT_NE(t->how.find("transitions"), std::string::npos) << t->how;
      EXPECT_EQ(t->how.find("work of adhesion"), std::string::npos) << t->how; // no range advice
    }
}

// The lowering path found no stable start: the raising path alone cannot tell whether the target is out
// of reach, so Γ_snap must not send the user to raise the Γ range (raising(5.0) never conforms).
TEST(ThresholdFunctions, FailedPathMakesReachabilityUnknownNotARangeProblem)
{
  AdhesionPath failed;
  failed.lowering = true;
  failed.message  = "no stable start: refine the mesh";
  const AdhesionLimits limits = limits_of(failed, raising(5.0), 0.99);
  for (const AdhesionThreshold *t : {&limits.hold, &limits.snap, &limits.equal_energy})
    {
      EXPECT_FALSE(t->found);
      EXPECT_NE(t->how.find("the largest is 20 %"), std::string::npos) << t->how; // f0
      EXPECT_NE(t->how.find("lowering path has no certified state"), std::string::npos) << t->how;
      EXPECT_NE(t->how.find("unknown"), std::string::npos) << t->how;
      EXPECT_EQ(t->how.find("Highest work of adhesion"), std::string::npos) << t->how;
    }
}

TEST(ThresholdFunctions, ReachedTargetKeepsTheRangeAdvice)
{
  const AdhesionLimits limits = limits_of(lowering(0.001), raising(0.5), 0.99); // hold below the range
  EXPECT_FALSE(limits.hold.found);
  EXPECT_NE(limits.hold.how.find("Lowest work of adhesion"), std::string::npos) << limits.hold.how;
}

TEST(ThresholdFunctions, StopsWidenTheRangeAndAreSorted)
{
  AdhesionPathSettings s;
  s.lowest_work_of_adhesion  = 0.1;
  s.highest_work_of_adhesion = 1.0;
  const AdhesionPathSettings w = with_stops(s, {2.0, 0.05, 0.3});
  EXPECT_DOUBLE_EQ(w.lowest_work_of_adhesion, 0.05);
  EXPECT_DOUBLE_EQ(w.highest_work_of_adhesion, 2.0);
  EXPECT_EQ(w.stops, (std::vector<double>{0.05, 0.3, 2.0}));
}

// The aspect-ratio scan's bracketing: with "safe below 3.7 nm" it must bracket 3.7 nm from either side
// of the start, to a width halved by each bisection.
TEST(ThresholdFunctions, SafeHeightIsBracketedFromEitherSide)
{
  const double limit = 3.7e-9;
  const auto   safe  = [&](double h) { return h < limit; };
  for (const double start : {1e-9, 20e-9})
    {
      const HeightBracket b = bracket_safe_height(safe, start, 6);
      ASSERT_TRUE(b.found()) << "start " << start;
      EXPECT_LT(b.safe, limit);
      EXPECT_GE(b.unsafe, limit);
      EXPECT_LE(b.unsafe - b.safe, 2 * limit / 64 + 1e-18) << "start " << start;
    }
  EXPECT_FALSE(bracket_safe_height([](double) { return true; }, 1e-9, 6).found());
  EXPECT_FALSE(bracket_safe_height([](double) { return false; }, 1e-9, 6).found());
}
