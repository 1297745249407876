// Adaptive meshes (solvers/mesh_adaptation.h, solvers/sheet_error_estimator.h).
//
// 1. Exactness on an adapted mesh: a quadratic deflection w = a x² + b y² is in the Q2 space on any
//    mesh, with no slope jumps, so the C0 interior penalty bending energy must equal the Kirchhoff
//    plate energy ½∫M:κ dA = ½ D [(1−ν)(κ_xx² + κ_yy²) + ν (κ_xx + κ_yy)²]·A exactly (Timoshenko &
//    Woinowsky-Krieger, Theory of Plates and Shells, 2nd ed. 1959, §11 eq. (112) with κ constant),
//    after the state has been carried to the adapted mesh by the solution transfer.
// 2. Adaptive vs uniform: for a sheet laid on a pillar array and on an egg-carton corrugation, the
//    adaptive solve started on a coarse uniform mesh gives the conformed fraction within 0.01 and
//    the peak principal strain within 1 % of the uniform mesh at its finest level, with at least
//    four times fewer unknowns (the acceptance criterion of the adaptive-mesh work; the uniform mesh
//    is the reference, there is no closed form for these states).
//
// Scenarios (our own): MoS2 (catalogue) laid on a square array of rounded SiO2 pillars (height 5 nm,
// radius 12 nm, pitch 60 nm) and on an egg carton (amplitude 5 nm, wavelength 30 nm), Γ = 0.22 J/m²,
// h₀ = 0.5 nm.
#include <deal.II/base/function.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/geometry/sinusoidal_topography.h>

#include <gtest/gtest.h>

#include "common/mos2_cells.h"
#include "common/sheet_solve.h"

#include <cmath>
#include <cstdlib>
#include <iostream>

using namespace nappe;

namespace
{
  const double nm = 1e-9;

  class QuadraticDeflection : public dealii::Function<2>
  {
  public:
    QuadraticDeflection(double a, double b) : dealii::Function<2>(3), a_(a), b_(b) {}
    double value(const dealii::Point<2> &p, const unsigned int c) const override
    {
      // Zero at the centre of the unit square, where the vertical rigid mode is pinned.
      const double x = p[0] - 0.5, y = p[1] - 0.5;
      return c == 2 ? a_ * x * x + b_ * y * y : 0.0;
    }

  private:
    double a_, b_;
  };

  bool logging() { return std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0; }

  SheetProblem pillar_cell() { return test_support::mos2_on_pillar_array(); }

  SheetProblem egg_carton_cell()
  {
    // Deep enough that the laid-down sheet rests on the crests only (about 4 % contact).
    const double wavelength = 30 * nm;
    SheetProblem p = test_support::mos2_periodic_cell(std::make_shared<EggCarton>(5 * nm, wavelength), wavelength);
    p.start        = StartProtocol::laid_down;
    return p;
  }

  struct Outcome
  {
    double             fraction = 0.0, peak_strain = 0.0;
    unsigned long long unknowns = 0;
  };

  Outcome solve(SheetProblem problem, unsigned int refinements, unsigned int cycles)
  {
    problem.domain.global_refinements = refinements;
    problem.adaptation.cycles         = cycles;
    const SheetResult r = test_support::solve_and_measure(problem, MPI_COMM_WORLD, logging() ? &std::cout : nullptr);
    EXPECT_TRUE(r.converged) << r.message;
    if (!r.converged)
      return {};
    EXPECT_EQ(r.meshes.size(), cycles + 1);
    const Outcome o{r.conformation->conformed_fraction, r.measures.at("max_principal_strain").value, r.unknowns};
    if (logging())
      std::cout << "    refinements " << refinements << ", cycles " << cycles << ": " << o.unknowns
                << " unknowns, fraction " << o.fraction << ", peak strain " << o.peak_strain << "\n";
    return o;
  }

  void expect_adaptive_matches_uniform(const SheetProblem &problem, unsigned int start, unsigned int cycles)
  {
    const Outcome uniform  = solve(problem, start + cycles, 0);
    const Outcome adaptive = solve(problem, start, cycles);
    EXPECT_NEAR(adaptive.fraction, uniform.fraction, 0.01);
    EXPECT_NEAR(adaptive.peak_strain, uniform.peak_strain, 0.01 * uniform.peak_strain);
    EXPECT_LE(4 * adaptive.unknowns, uniform.unknowns);
  }
} // namespace

TEST(MeshAdaptation, QuadraticDeflectionKeepsItsExactBendingEnergyOnAnAdaptedMesh)
{
  SheetModel model;
  model.material               = SheetMaterial::from_plate(70e9, 1e-3, 0.3);
  model.geometric_nonlinearity = false;
  SheetDomain domain;
  domain.length_x = domain.length_y = 1.0;
  domain.coarse_cells_x = domain.coarse_cells_y = 2;
  domain.global_refinements                     = 1;
  SheetSystem  system(model, domain, MPI_COMM_WORLD);
  const double a = 0.3, b = -0.7; // κ_xx = 2a, κ_yy = 2b
  Vector       state = system.make_owned_vector();
  dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), QuadraticDeflection(a, b), state);
  for (unsigned int pass = 0; pass < 3; ++pass)
    {
      for (const auto &cell : system.mesh().active_cell_iterators())
        if (cell->is_locally_owned() && cell->center().distance(dealii::Point<2>(0.2, 0.3)) < 0.3)
          cell->set_refine_flag();
      system.adapt(state);
    }
  ASSERT_FALSE(system.uniform_mesh());
  Vector ghosted = system.make_ghosted_vector();
  ghosted        = state;
  const double D = model.material.bending_rigidity, nu = model.material.poisson_ratio;
  const double kxx = 2 * a, kyy = 2 * b;
  const double exact = 0.5 * D * ((1 - nu) * (kxx * kxx + kyy * kyy) + nu * (kxx + kyy) * (kxx + kyy));
  EXPECT_NEAR(system.energy(ghosted, 1.0).bending, exact, 1e-10 * exact);
}

TEST(MeshAdaptation, PillarCellMatchesTheUniformMeshWithAQuarterOfTheUnknowns)
{
  expect_adaptive_matches_uniform(pillar_cell(), 1, 3);
}

TEST(MeshAdaptation, EggCartonCellMatchesTheUniformMeshWithAQuarterOfTheUnknowns)
{
  expect_adaptive_matches_uniform(egg_carton_cell(), 2, 2);
}
