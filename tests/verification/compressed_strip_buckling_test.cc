// A compressive start in a periodic cell: a flat free sheet on a periodic cell Lx × Ly (Ly ≪ Lx) held at the
// mean strain ε̄_xx = −ε, ε̄_yy = ε̄_xy = 0 buckles into w = A sin(k(x − x₀)), k = 2π/Lx. This is an exact solution
// of the Föppl–von Kármán equations (derived here; substitute to check): with u_x = −½ w_x² + ¼ A²k², the membrane
// strain ε_xx = −ε + ¼ A²k² is uniform, ε_yy = 0, so N_xx is uniform and D w'''' + N_xx w'' = 0 holds for
// N_xx = −D k²: the buckled strip carries exactly the critical force. With a = ¼ A²k² the energy per area,
//
//     Π/(Lx Ly) = Y (a − ε)² / (2 (1 − ν²)) + D k² a,
//
// is least at a = ε − ε_c, ε_c = (1 − ν²) D k² / Y (the flat state's critical strain), so
//
//     A = (2/k) √(ε − ε_c),   N_xx = −D k²,   Π/(Lx Ly) = Y ε_c² / (2 (1 − ν²)) + D k² (ε − ε_c).
//
// (The same result as the post-buckling of a column under imposed end shortening, Timoshenko & Gere, Theory of
// Elastic Stability, 2nd ed., 1961, §2.7 — from memory.) Modes across the cell (k_y ≥ 2π/Ly) are not excited: the
// transverse force ν N_xx stays far below their critical value. The flat start is a stationary point (R = 0 by
// symmetry) whose Hessian has negative curvature: the minimiser must leave it, with either globalisation.
// The buckle is free to slide along x (the cell is periodic), so the Hessian at it has a zero eigenvalue:
// the minimisers must accept a positive semi-definite Hessian (null pivots) as a neutrally stable minimum.
#include <nappe/physics/sheet_material.h>

#include "common/sheet_solve.h"

#include <algorithm>
#include <cmath>

using namespace nappe;

namespace
{
  constexpr double nm  = 1e-9;
  constexpr double Lx  = 20.0 * nm, Ly = 2.5 * nm;
  constexpr double Y   = 340.0;      // 2D Young's modulus [N/m] (graphene-like)
  constexpr double nu  = 0.16;       // [-]
  constexpr double D   = 2.24e-19;   // bending rigidity [J] (1.4 eV)
  constexpr double eps = 2e-3;       // imposed compressive mean strain [-]
  const double     k   = 2.0 * M_PI / Lx;
  const double     eps_c = (1.0 - nu * nu) * D * k * k / Y;

  SheetModel compressed_strip()
  {
    SheetModel model;
    model.material.youngs_modulus_2d = Y;
    model.material.poisson_ratio     = nu;
    model.material.bending_rigidity  = D;
    model.loads.mean_strain[0][0]    = -eps;
    return model;
  }

  SheetDomain periodic_strip()
  {
    SheetDomain d;
    d.length_x           = Lx;
    d.length_y           = Ly;
    d.coarse_cells_x     = 8;
    d.coarse_cells_y     = 1;
    d.global_refinements = 2; // 32 × 4 Q2 cells, 32 per wavelength
    d.periodic           = true;
    return d;
  }

  struct Buckle : test_support::SolvedSheet
  {
    LowestEigenpair slide; ///< the lowest eigenpair of the Hessian pencil at the buckle
  };

  /**
   * The test's linear solver, failing like an iterative solver that does not converge (HessianSolveError)
   * while the Hessian's diagonal shift μ is below @p failing_below: with 1e-12 at every unshifted H, as
   * CG with an inexact preconditioner can at a singular H and a right-hand side at round-off.
   */
  class FailingBelowShift : public HessianSolver
  {
  public:
    FailingBelowShift(std::shared_ptr<HessianSolver> solver, double failing_below)
      : solver_(std::move(solver)), failing_below_(failing_below)
    {}
    void linearize(const Vector &state, const LoadLevel &level) override
    {
      shift_ = 0.0;
      solver_->linearize(state, level);
    }
    void set_diagonal_shift(double mu) override
    {
      shift_ = mu;
      solver_->set_diagonal_shift(mu);
    }
    void prepare(const SparseMatrix &H) override { solver_->prepare(H); }
    void solve(const Vector &rhs, Vector &solution) const override
    {
      if (shift_ < failing_below_)
        throw HessianSolveError("no convergence (made to fail by the test)");
      solver_->solve(rhs, solution);
    }
    std::string name() const override { return "failing " + solver_->name(); }

  private:
    std::shared_ptr<HessianSolver> solver_;
    double                         failing_below_;
    double                         shift_ = 0.0;
  };

  /// The test's solvers, their linear solve failing below the shift @p failing_below (0: never).
  HessianSolvers solvers_failing_below(const SheetSystem &system, double failing_below)
  {
    HessianSolvers solvers = test_support::test_solvers(system);
    if (failing_below > 0.0)
      solvers.solver = std::make_shared<FailingBelowShift>(solvers.solver, failing_below);
    return solvers;
  }

  /// Minimises from the flat state with the globalisation @p method; fails the test unless certified.
  /// @p failing_below: see solvers_failing_below().
  Buckle buckle(MinimizerMethod method, double failing_below = 0.0)
  {
    Buckle out;
    out.system = std::make_unique<SheetSystem>(compressed_strip(), periodic_strip(), MPI_COMM_WORLD);
    MinimizerSettings settings;
    settings.method = method;
    EnergyMinimizer minimizer(*out.system, settings, std::getenv("NAPPE_TEST_LOG") ? &std::cout : nullptr,
                              solvers_failing_below(*out.system, failing_below));
    Vector owned = out.system->make_owned_vector();
    out.report   = minimizer.minimize(owned, 1.0, 0.0);
    EXPECT_TRUE(out.report.converged) << out.report.message;
    EXPECT_EQ(out.report.negative_pivots, 0u);
    EXPECT_LE(out.report.zero_pivots, 1u);
    out.state = out.system->make_ghosted_vector();
    out.state = owned;
    if (out.report.converged)
      out.slide = minimizer.lowest_curvature();
    return out;
  }

  /// Half the peak-to-peak deflection along the middle line y = Ly/2 [m].
  double amplitude(const test_support::SolvedSheet &s)
  {
    double lowest = 0.0, highest = 0.0;
    for (unsigned int i = 0; i < 400; ++i)
      {
        const double w = s.system->deflection_at(s.state, dealii::Point<2>((i + 0.5) * Lx / 400, 0.5 * Ly));
        lowest         = std::min(lowest, w);
        highest        = std::max(highest, w);
      }
    return 0.5 * (highest - lowest);
  }

  void expect_exact_buckle(const Buckle &s)
  {
    const double A_exact = 2.0 / k * std::sqrt(eps - eps_c);
    const double energy_exact =
      Lx * Ly * (Y * eps_c * eps_c / (2.0 * (1.0 - nu * nu)) + D * k * k * (eps - eps_c));
    EXPECT_NEAR(amplitude(s) / A_exact, 1.0, 0.01);
    EXPECT_NEAR(s.report.energy / energy_exact, 1.0, 0.01);
    // The flat state's energy Y ε² Lx Ly / (2(1 − ν²)) is 16× the buckled one (ratio ε/(2ε_c)): a flat answer fails.
    EXPECT_LT(s.report.energy, 0.1 * Lx * Ly * Y * eps * eps / (2.0 * (1.0 - nu * nu)));
    // Sliding costs no energy: the lowest eigenvalue of H v = μ diag|H| v is zero to round-off (with the
    // null-space shift of 1e-10, if the factorisation found the null pivot).
    ASSERT_TRUE(s.slide.available);
    EXPECT_LT(std::abs(s.slide.value), 1e-6);
  }
} // namespace

TEST(CompressedPeriodicStrip, LineSearchLeavesTheFlatStartForTheExactBuckle)
{
  const auto solved = buckle(MinimizerMethod::line_search);
  EXPECT_GE(solved.report.saddle_escapes, 1u);
  expect_exact_buckle(solved);
}

TEST(CompressedPeriodicStrip, TrustRegionLeavesTheFlatStartForTheExactBuckle)
{
  expect_exact_buckle(buckle(MinimizerMethod::trust_region));
}

// An iterative solve that fails at an unshifted Hessian the certificate finds positive semi-definite means a
// singular H (here: at the buckle, whose sliding mode is a null vector). Both globalisations then shift H
// by the null-space shift, as for a null pivot, and still reach the exact buckle.
TEST(CompressedPeriodicStrip, BothMinimisersShiftPastALinearSolveThatFailsAtTheUnshiftedHessian)
{
  for (const auto method : {MinimizerMethod::line_search, MinimizerMethod::trust_region})
    {
      const auto solved = buckle(method, 1e-12);
      EXPECT_GE(solved.report.zero_pivots, 1u);
      expect_exact_buckle(solved);
    }
}

// A solve that fails after the shift too is reported to the caller, not taken as a step.
TEST(CompressedPeriodicStrip, ALinearSolveThatFailsAfterTheShiftStopsTheMinimiser)
{
  for (const auto method : {MinimizerMethod::line_search, MinimizerMethod::trust_region})
    {
      SheetSystem       system(compressed_strip(), periodic_strip(), MPI_COMM_WORLD);
      MinimizerSettings settings;
      settings.method = method;
      EnergyMinimizer minimizer(system, settings, nullptr, solvers_failing_below(system, 1e300));
      Vector          owned = system.make_owned_vector();
      EXPECT_THROW(minimizer.minimize(owned, 1.0, 0.0), HessianSolveError);
    }
}

// The flat start is a saddle (negative pivots): a caller that only wants stable iterates is asked
// before the trust-region step there, which costs further factorisations where the certificate does not
// show a direction of negative curvature (trust_region_step_test checks the step that needs none);
// stopping leaves the state untouched.
TEST(CompressedPeriodicStrip, TrustRegionAsksTheCallerBeforeAStepAtTheIndefiniteFlatStart)
{
  SheetSystem       system(compressed_strip(), periodic_strip(), MPI_COMM_WORLD);
  MinimizerSettings settings;
  settings.method = MinimizerMethod::trust_region;
  // Stops at the given call of the check and counts the calls and the negative pivots seen.
  const auto run = [&](unsigned int stop_at, unsigned int &asked, unsigned int &negative_seen, Vector &owned) {
    EnergyMinimizer minimizer(system, settings, nullptr, test_support::test_solvers(system));
    owned = system.make_owned_vector();
    asked = negative_seen = 0;
    return minimizer.minimize(owned, 1.0, 0.0, [&](const Vector &, const IterationRecord &record) {
      negative_seen = std::max(negative_seen, record.negative_pivots);
      return ++asked < stop_at;
    });
  };
  unsigned int          asked = 0, negative_seen = 0;
  Vector                before_step, after_step;
  const MinimizerReport stopped_before = run(1, asked, negative_seen, before_step);
  EXPECT_TRUE(stopped_before.stopped);
  EXPECT_FALSE(stopped_before.converged);
  EXPECT_EQ(asked, 1u);
  EXPECT_GE(negative_seen, 1u); // ε = 2e-3 lies above several modes' buckling strains
  EXPECT_EQ(stopped_before.iterations, 0u);
  EXPECT_EQ(before_step.linfty_norm(), 0.0);

  const MinimizerReport stopped_after = run(2, asked, negative_seen, after_step);
  EXPECT_TRUE(stopped_after.stopped);
  EXPECT_EQ(asked, 2u); // before the step and after it
  EXPECT_GT(after_step.linfty_norm(), 0.0);
}
