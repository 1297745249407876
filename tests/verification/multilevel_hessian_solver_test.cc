// The multilevel solver against the sparse direct one (MUMPS LDLᵀ): the same Newton step on a clamped
// drum with a deflected state, and on a periodic egg-carton cell grown conformal (adhesion stiffness at
// the well), in a bounded number of CG iterations whose growth with refinement is bounded too.
#include <deal.II/base/mpi.h>

#include <nappe/geometry/sinusoidal_topography.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/vdw_93_law.h>
#include <nappe/solvers/multilevel_hessian_solver.h>
#include <nappe/solvers/sheet_problem.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include <common/interpolated_state.h>
#include <common/sheet_solve.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <iostream>

using namespace nappe;

namespace
{
  const double nm = 1e-9;

  bool logging() { return std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0; }

  /// A graphene drum of radius 500 nm, clamped, deflected 20 nm in the clamped-plate shape w₀(1 − r²/R²)².
  struct DrumCase
  {
    SheetModel  model;
    SheetDomain domain;
    explicit DrumCase(unsigned int refinements)
    {
      model.material = MaterialCatalogue().material("graphene");
      model.edges[0] = {DeflectionCondition::clamped, InPlaneCondition::fixed};
      model.loads.pressure = 1e5;
      domain.shape              = SheetDomain::Shape::disk;
      domain.radius             = 500 * nm;
      domain.global_refinements = refinements;
    }
    Vector state(const SheetSystem &system) const
    {
      const double R = domain.radius;
      return test_support::interpolated_state(system, [R](const dealii::Point<2> &p) {
        const double s = 1.0 - p.square() / (R * R);
        return std::array<double, 3>{0.0, 0.0, 20 * nm * s * s};
      });
    }
  };

  /// Graphene grown conformal on a 2 nm / 20 nm egg carton in a periodic cell (2×2 coarse cells).
  SheetProblem egg_carton_cell(unsigned int refinements)
  {
    const MaterialCatalogue catalogue;
    SheetProblem            p;
    p.model.material      = catalogue.material("graphene");
    p.domain.length_x     = p.domain.length_y = 20 * nm;
    p.domain.coarse_cells_x = p.domain.coarse_cells_y = 2;
    p.domain.global_refinements                       = refinements;
    p.domain.periodic                                 = true;
    p.model.substrate = std::make_shared<AdhesionPotential>(
      std::make_shared<EggCarton>(2 * nm, 20 * nm),
      std::make_shared<Vdw93Law>(catalogue.work_of_adhesion("graphene", "SiO2"), 0.6 * nm), GapMeasure::normal);
    p.start = StartProtocol::grown_conformal;
    return p;
  }

  struct Comparison
  {
    double       relative_difference = 0.0; ///< ‖x_multilevel − x_direct‖ / ‖x_direct‖
    unsigned int iterations          = 0;
    unsigned int levels              = 0;
  };

  /// One Newton step H x = −R at @p ghosted_state, by both solvers.
  Comparison compare_step(SheetSystem &system, const Vector &ghosted_state, const LoadLevel &level)
  {
    Vector residual = system.make_owned_vector();
    system.assemble(ghosted_state, level, residual, &system.hessian_matrix());
    residual *= -1.0;

    SymmetricDirectSolver direct(MPI_COMM_WORLD);
    direct.factorize(system.hessian_matrix());
    Vector x_direct = system.make_owned_vector();
    direct.solve(residual, x_direct);

    MultilevelSettings settings;
    settings.coarsest_cells     = 20;    // several levels even on the small test meshes
    settings.relative_tolerance = 1e-10; // well below the compared difference
    MultilevelHessianSolver multilevel(system, settings);
    multilevel.linearize(ghosted_state, level);
    multilevel.prepare(system.hessian_matrix());
    Vector x = system.make_owned_vector();
    multilevel.solve(residual, x);

    Comparison c;
    c.iterations = multilevel.last_iterations();
    c.levels     = multilevel.n_levels();
    x -= x_direct;
    c.relative_difference = x.l2_norm() / x_direct.l2_norm();
    if (logging())
      std::cout << "    " << system.n_dofs() << " unknowns, " << c.levels << " levels: " << c.iterations
                << " CG iterations, relative difference " << c.relative_difference << "\n";
    return c;
  }

  Comparison drum_step(unsigned int refinements)
  {
    const DrumCase drum(refinements);
    SheetSystem    system(drum.model, drum.domain, MPI_COMM_WORLD);
    return compare_step(system, drum.state(system), LoadLevel(1.0));
  }

  Comparison egg_carton_step(unsigned int refinements)
  {
    const SheetProblem p = egg_carton_cell(refinements);
    SheetSystem        system(p.model, p.domain, MPI_COMM_WORLD);
    const Vector       owned   = initial_state(system, p);
    Vector             ghosted = system.make_ghosted_vector();
    ghosted                    = owned; // a copy fills the ghosts; a moved-in temporary would replace the layout
    return compare_step(system, ghosted, LoadLevel(1.0));
  }

  void expect_bounded(const std::vector<Comparison> &steps)
  {
    unsigned int fewest = steps.front().iterations, most = fewest;
    for (const auto &s : steps)
      {
        EXPECT_LT(s.relative_difference, 1e-7);
        EXPECT_GE(s.levels, 2u);
        fewest = std::min(fewest, s.iterations);
        most   = std::max(most, s.iterations);
      }
    EXPECT_LE(most, 30u);
    // Not yet mesh-independent: measured 18/23/27 (drum) and 7/9/12 (egg carton) over three
    // refinements, about 5 more per added level. This bounds that growth; it does not meet the
    // ±20 % band a mesh-independent V-cycle would give.
    EXPECT_LE(most - fewest, 5u * (steps.size() - 1));
  }
} // namespace

TEST(MultilevelHessianSolver, DrumNewtonStepMatchesTheDirectSolveInAtMost30Iterations)
{
  expect_bounded({drum_step(2), drum_step(3), drum_step(4)});
}

TEST(MultilevelHessianSolver, ConformedEggCartonStepMatchesTheDirectSolveInAtMost30Iterations)
{
  expect_bounded({egg_carton_step(2), egg_carton_step(3), egg_carton_step(4)});
}

// The whole solve, direct against multilevel (CG with the V-cycle, LOBPCG certificate): graphene grown
// conformal on the egg carton relaxes to the same certified minimum.
TEST(MultilevelHessianSolver, ConformedEggCartonSolvesToTheSameMinimumAsTheDirectSolver)
{
  SheetProblem direct = egg_carton_cell(3), multilevel = direct;
  multilevel.solver.linear_solver             = "multilevel CG";
  multilevel.solver.multilevel.coarsest_cells = 20;
  std::ostream     *log = logging() ? &std::cout : nullptr;
  const SheetResult a   = test_support::solve_and_measure(direct, MPI_COMM_WORLD, log);
  const SheetResult b   = test_support::solve_and_measure(multilevel, MPI_COMM_WORLD, log);
  ASSERT_TRUE(a.converged) << a.message;
  ASSERT_TRUE(b.converged) << b.message;
  EXPECT_NEAR(b.energy.total(), a.energy.total(), 1e-8 * std::abs(a.energy.total()));
  const double peak = a.measures.at("max_principal_strain").value;
  EXPECT_NEAR(b.measures.at("max_principal_strain").value, peak, 1e-6 * peak);
}
