// Chord steps (EnergyMinimizer, MinimizerSettings::max_chord_steps): a continuation step of a nonlinear
// plate reuses the factorisation of the previous minimum instead of factorising anew, and ends at the
// same certified minimum as Newton's method with a factorisation per iteration. The reference is the
// trust-region Newton iteration itself (quadratic convergence to the same tolerance); the chord method
// converges to the same root, only linearly (C. T. Kelley, Iterative Methods for Linear and Nonlinear
// Equations, SIAM 1995, §5.4, from memory).
#include <nappe/physics/sheet_material.h>

#include "common/sheet_solve.h"

#include <cmath>

using namespace nappe;

namespace
{
  /// A clamped rectangle (unit-size material) under a pressure that bends it well into the membrane
  /// regime: w ≈ 0.1 × the width, some hundred times √(D/Y), so that H changes along the load path.
  SheetModel pressed_plate()
  {
    SheetModel model;
    model.material.youngs_modulus_2d = 1.0;
    model.material.poisson_ratio     = 0.3;
    model.material.bending_rigidity  = 1e-5;
    for (const unsigned int id : {0u, 1u, 2u, 3u})
      model.edges[id] = {DeflectionCondition::clamped, InPlaneCondition::fixed};
    model.loads.pressure = 0.02;
    return model;
  }

  SheetDomain rectangle()
  {
    SheetDomain d;
    d.length_x           = 1.0;
    d.length_y           = 0.8;
    d.coarse_cells_x     = 2;
    d.coarse_cells_y     = 2;
    d.global_refinements = 2;
    return d;
  }

  struct Step
  {
    MinimizerReport report; ///< of the second load level
    Vector          state;  ///< owned
  };

  /// Minimises at the load levels 1 and then 1.15, from the flat state, with or without chord steps.
  Step continuation_step(SheetSystem &system, unsigned int max_chord_steps)
  {
    MinimizerSettings settings;
    settings.method          = MinimizerMethod::trust_region;
    settings.max_chord_steps = max_chord_steps;
    EnergyMinimizer minimizer(system, settings, std::getenv("NAPPE_TEST_LOG") ? &std::cout : nullptr,
                              test_support::test_solvers(system));
    Step out{{}, system.make_owned_vector()};
    const MinimizerReport first = minimizer.minimize(out.state, 1.0, 0.0);
    EXPECT_TRUE(first.converged) << first.message;
    out.report = minimizer.minimize(out.state, 1.15, 0.0);
    EXPECT_TRUE(out.report.converged) << out.report.message;
    EXPECT_EQ(out.report.negative_pivots, 0u);
    return out;
  }
} // namespace

TEST(ChordSteps, AContinuationStepReusesTheLastFactorisationAndEndsAtTheSameCertifiedMinimum)
{
  SheetSystem system(pressed_plate(), rectangle(), MPI_COMM_WORLD);
  const Step  newton = continuation_step(system, 0);
  const Step  chord  = continuation_step(system, 8);
  EXPECT_EQ(newton.report.chord_steps, 0u);
  EXPECT_GT(chord.report.chord_steps, 0u);
  // Fewer factorisations, at least the one that certifies the result.
  EXPECT_GE(chord.report.factorizations, 1u);
  EXPECT_LT(chord.report.factorizations, newton.report.factorizations);
  // The same minimum: both residuals are below the tolerance, whose relative size is 1e-9.
  EXPECT_LE(chord.report.residual, chord.report.tolerance);
  EXPECT_NEAR(chord.report.energy / newton.report.energy, 1.0, 1e-9);
  Vector difference = chord.state;
  difference -= newton.state;
  EXPECT_LE(difference.linfty_norm(), 1e-6 * newton.state.linfty_norm());
  EXPECT_GT(newton.state.linfty_norm(), 0.05); // the plate did bend into the nonlinear regime
}
