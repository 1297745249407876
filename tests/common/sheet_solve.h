#pragma once

// Test helper: solve a sheet model on a domain to a certified minimum in one call.
#include <nappe/analysis/sheet_result.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/sheet_problem.h>
#include <nappe/solvers/sheet_system.h>

#include <gtest/gtest.h>

#include <cstdlib>
#include <iostream>

namespace nappe::test_support
{
  /**
   * The solver settings the verification suites run with: the library's default, or the linear solver
   * named by the environment variable NAPPE_TEST_LINEAR_SOLVER (ctest runs the suites a second time with
   * "multilevel CG", its coarsest level lowered to 16 cells so that the small test meshes have several levels).
   */
  inline SolverSettings test_solver_settings()
  {
    SolverSettings s;
    if (const char *name = std::getenv("NAPPE_TEST_LINEAR_SOLVER"))
      {
        s.linear_solver             = name;
        s.multilevel.coarsest_cells = 16;
      }
    return s;
  }

  /// The test_solver_settings() implementations for @p system.
  inline HessianSolvers test_solvers(const SheetSystem &system)
  {
    return make_hessian_solvers(test_solver_settings(), system);
  }

  struct SolvedSheet
  {
    std::unique_ptr<SheetSystem> system;
    Vector                       state; ///< ghosted
    MinimizerReport              report;
  };

  /// Minimises from the flat state with @p load_steps equal load increments; fails the test if a
  /// step does not converge to a stable state.
  inline SolvedSheet solve_sheet(const SheetModel &model, const SheetDomain &domain, unsigned int load_steps = 1,
                                 MPI_Comm comm = MPI_COMM_WORLD, const SolverSettings &solver = test_solver_settings())
  {
    SolvedSheet out;
    out.system = std::make_unique<SheetSystem>(model, domain, comm);
    EnergyMinimizer minimizer(*out.system, MinimizerSettings(), std::getenv("NAPPE_TEST_LOG") ? &std::cout : nullptr,
                              make_hessian_solvers(solver, *out.system));
    Vector          owned = out.system->make_owned_vector();
    for (unsigned int step = 1; step <= load_steps; ++step)
      {
        out.report = minimizer.minimize(owned, double(step) / load_steps, 0.0);
        EXPECT_TRUE(out.report.converged) << "load step " << step << ": " << out.report.message;
        EXPECT_EQ(out.report.negative_pivots, 0u);
      }
    out.state = out.system->make_ghosted_vector();
    out.state = owned;
    return out;
  }

  /// Solves a problem along its load path and measures the result (nothing is written).
  inline SheetResult solve_and_measure(const SheetProblem &problem, MPI_Comm comm = MPI_COMM_WORLD,
                                       std::ostream *log = nullptr)
  {
    SheetProblem with_test_solver = problem;
    with_test_solver.solver       = test_solver_settings();
    return analyse_solution(solve_sheet_problem(with_test_solver, comm, log), with_test_solver);
  }
} // namespace nappe::test_support
