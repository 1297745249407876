// The inertia of the Hessian detects loss of stability, and the minimiser leaves a saddle:
// a simply supported square plate with immovable edges under an isotropic eigenstrain (thermal
// expansion) buckles when the compressive resultant N = Y ε₀ / (1 − ν) reaches the classical
// biaxial critical value N_cr = 2π² D / a² (mode m = n = 1; Timoshenko & Gere, Theory of Elastic
// Stability, 2nd ed., 1961, §9.2, eq. 9-9 with α = 1 and equal stresses in x and y).
#include <nappe/physics/sheet_material.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include "common/sheet_solve.h"

#include <cmath>

using namespace nappe;

namespace
{
  const SheetMaterial plate = SheetMaterial::from_plate(70e9, 1e-3, 0.3);
  constexpr double    side  = 0.1;

  double critical_eigenstrain()
  {
    return 2.0 * M_PI * M_PI * plate.bending_rigidity * (1.0 - plate.poisson_ratio) /
           (plate.youngs_modulus_2d * side * side);
  }

  SheetModel heated_plate(double eigenstrain_over_critical)
  {
    SheetModel model;
    model.material = plate;
    for (dealii::types::boundary_id id = 0; id < 4; ++id)
      model.edges[id] = {DeflectionCondition::simply_supported, InPlaneCondition::fixed};
    model.loads.eigenstrain = eigenstrain_over_critical * critical_eigenstrain() *
                              dealii::unit_symmetric_tensor<2>();
    return model;
  }

  SheetDomain square()
  {
    SheetDomain d;
    d.length_x = d.length_y = side;
    d.global_refinements    = 4;
    return d;
  }

  /// The multilevel solver and its eigen-certificate, with levels down to a 4×4 mesh.
  SolverSettings multilevel()
  {
    SolverSettings s;
    s.linear_solver                = "multilevel CG";
    s.multilevel.coarsest_cells    = 16;
    return s;
  }

  /// Negative eigenvalues of the Hessian at the flat state, as the certificate of @p solver counts them.
  unsigned int flat_state_negative_eigenvalues(double eigenstrain_over_critical, const SolverSettings &solver)
  {
    SheetSystem system(heated_plate(eigenstrain_over_critical), square(), MPI_COMM_WORLD);
    Vector      state = system.make_ghosted_vector(), residual = system.make_owned_vector();
    system.assemble(state, 1.0, residual, &system.hessian_matrix());
    HessianSolvers solvers = make_hessian_solvers(solver, system);
    solvers.solver->linearize(state, 1.0);
    solvers.solver->prepare(system.hessian_matrix());
    return solvers.certificate->negative_eigenvalues(system.hessian_matrix());
  }

  /// Negative pivots of the Hessian at the flat (u = w = 0) state.
  unsigned int flat_state_negative_pivots(double eigenstrain_over_critical)
  {
    SheetSystem     system(heated_plate(eigenstrain_over_critical), square(), MPI_COMM_WORLD);
    Vector          state = system.make_ghosted_vector(), residual = system.make_owned_vector();
    system.assemble(state, 1.0, residual, &system.hessian_matrix());
    SymmetricDirectSolver solver(MPI_COMM_WORLD);
    solver.factorize(system.hessian_matrix());
    return solver.n_negative_pivots();
  }
} // namespace

TEST(BucklingInertia, FlatPlateIsStableJustBelowTheClassicalBucklingLoad)
{
  EXPECT_EQ(flat_state_negative_pivots(0.98), 0u);
}

TEST(BucklingInertia, FlatPlateHasOneUnstableModeJustAboveTheClassicalBucklingLoad)
{
  EXPECT_EQ(flat_state_negative_pivots(1.02), 1u);
}

// Starting exactly at the flat state (a stationary point: R = 0 by symmetry) the minimiser must
// recognise the saddle, leave it along negative curvature and end on a buckled, stable state.
TEST(BucklingInertia, MinimiserLeavesTheFlatSaddleForABuckledMinimum)
{
  const auto   solved = test_support::solve_sheet(heated_plate(2.0), square());
  const double w0     = solved.system->deflection_at(solved.state, dealii::Point<2>(side / 2, side / 2));
  EXPECT_TRUE(solved.report.converged);
  EXPECT_EQ(solved.report.negative_pivots, 0u);
  EXPECT_GE(solved.report.saddle_escapes, 1u);
  // Lower energy than the flat state, whose energy is the stretching of the held eigenstrain.
  Vector flat = solved.system->make_ghosted_vector();
  EXPECT_LT(solved.report.energy, solved.system->energy(flat, 1.0).total());
  // A buckle of a few plate thicknesses (post-buckling amplitude grows like √(ε₀/ε_cr − 1)).
  EXPECT_GT(std::abs(w0), 0.1 * plate.nominal_thickness);
}

// The factorisation-free certificate (LOBPCG with the multilevel preconditioner) against the inertia
// of the LDLᵀ factorisation, on both sides of the buckling load.
TEST(BucklingInertia, MultilevelCertificateAgreesWithTheInertiaOnBothSidesOfTheBucklingLoad)
{
  EXPECT_EQ(flat_state_negative_eigenvalues(0.98, multilevel()), flat_state_negative_pivots(0.98));
  EXPECT_EQ(flat_state_negative_eigenvalues(1.02, multilevel()), flat_state_negative_pivots(1.02));
  EXPECT_EQ(flat_state_negative_eigenvalues(1.02, multilevel()), 1u);
}

// The whole minimisation with the multilevel solver and certificate: it too leaves the saddle and
// finds the buckle the direct solver finds.
TEST(BucklingInertia, MultilevelSolverLeavesTheFlatSaddleForTheSameBuckle)
{
  const dealii::Point<2> centre(side / 2, side / 2);
  const auto direct = test_support::solve_sheet(heated_plate(2.0), square());
  const auto mg     = test_support::solve_sheet(heated_plate(2.0), square(), 1, MPI_COMM_WORLD, multilevel());
  EXPECT_TRUE(mg.report.converged) << mg.report.message;
  EXPECT_GE(mg.report.saddle_escapes, 1u);
  const double w_direct = direct.system->deflection_at(direct.state, centre);
  const double w_mg     = mg.system->deflection_at(mg.state, centre);
  // The buckle's sign is a choice of the saddle escape; its size is not.
  EXPECT_NEAR(std::abs(w_mg), std::abs(w_direct), 1e-6 * std::abs(w_direct));
  EXPECT_NEAR(mg.report.energy, direct.report.energy, 1e-8 * std::abs(direct.report.energy));
}
