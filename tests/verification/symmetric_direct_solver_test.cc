// SymmetricDirectSolver (MUMPS LDLᵀ) against matrices whose spectrum is known in closed form.
//
// 1D: the Dirichlet Laplacian T = tridiag(-1, 2, -1)/h² of size n, h = 1/(n+1), has eigenvalues
//   λ_k = (4/h²) sin²(kπ/(2(n+1))), k = 1..n
// (e.g. G. Strang, Linear Algebra and its Applications, 4th ed., or Y. Saad, Iterative Methods
// for Sparse Linear Systems, 2nd ed., §2.2). So T - σI has exactly #{k : λ_k < σ} negative
// eigenvalues, which by Sylvester's law of inertia is the number of negative LDLᵀ pivots.
//
// 2D: -Δ on the unit square with u = 0 on the boundary has eigenvalues π²(i² + j²), i, j ≥ 1.
// Conforming Q1 eigenvalues λ_h of K u = λ M u are upper bounds converging as O(h²) (min-max),
// so for σ well inside a gap of the exact spectrum K - σM has #{exact λ < σ} negative
// eigenvalues (M is SPD, Sylvester again).
#include <nappe/solvers/symmetric_direct_solver.h>

#include <deal.II/base/index_set.h>
#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/base/timer.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/grid/grid_generator.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/sparsity_tools.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_sparsity_pattern.h>
#include <deal.II/lac/trilinos_vector.h>
#include <deal.II/numerics/vector_tools.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <vector>

using namespace dealii;

namespace
{
  const MPI_Comm comm = MPI_COMM_WORLD;

  /** Eigenvalues of tridiag(-1, 2, -1)/h², h = 1/(n+1), ascending. */
  std::vector<double> laplacian_1d_eigenvalues(const unsigned int n)
  {
    const double        h = 1.0 / (n + 1);
    std::vector<double> lambda(n);
    for (unsigned int k = 1; k <= n; ++k)
      lambda[k - 1] = 4.0 / (h * h) * std::pow(std::sin(k * M_PI / (2.0 * (n + 1))), 2);
    return lambda;
  }

  /** A distributed n×n matrix with the given half bandwidth (entries beyond 1 stored as 0). */
  void make_banded_pattern(const unsigned int n, const unsigned int bandwidth,
                           TrilinosWrappers::SparseMatrix &A)
  {
    const IndexSet owned = Utilities::MPI::create_evenly_distributed_partitioning(comm, n);
    TrilinosWrappers::SparsityPattern sp(owned, comm);
    for (const auto i : owned)
      for (unsigned int j = (i >= bandwidth ? i - bandwidth : 0); j <= std::min<unsigned>(n - 1, i + bandwidth); ++j)
        sp.add(i, j);
    sp.compress();
    A.reinit(sp);
  }

  /** Fills A (pattern from make_banded_pattern) with tridiag(-1, 2, -1)/h² - σI. */
  void fill_shifted_laplacian_1d(const double sigma, TrilinosWrappers::SparseMatrix &A)
  {
    const unsigned int n = A.m();
    const double       h = 1.0 / (n + 1);
    A                    = 0;
    for (const auto i : A.locally_owned_range_indices())
      {
        A.set(i, i, 2.0 / (h * h) - sigma);
        if (i > 0)
          A.set(i, i - 1, -1.0 / (h * h));
        if (i + 1 < n)
          A.set(i, i + 1, -1.0 / (h * h));
      }
    A.compress(VectorOperation::insert);
  }

  /** ‖A x - b‖ / ‖b‖. */
  double relative_residual(const TrilinosWrappers::SparseMatrix &A,
                           const TrilinosWrappers::MPI::Vector  &x,
                           const TrilinosWrappers::MPI::Vector  &b)
  {
    TrilinosWrappers::MPI::Vector r(b);
    A.vmult(r, x);
    r -= b;
    return r.l2_norm() / b.l2_norm();
  }

  /**
   * Normwise backward error ‖A x - b‖₂ / (‖A‖_F ‖x‖₂ + ‖b‖₂) (Higham, Accuracy and Stability of
   * Numerical Algorithms, 2nd ed., Thm. 7.1 with the Frobenius norm as an upper bound for ‖A‖₂).
   * A backward-stable solver gives a small multiple of machine epsilon whatever the
   * conditioning; the relative residual grows with ‖x‖ near an eigenvalue.
   */
  double backward_error(const TrilinosWrappers::SparseMatrix &A,
                        const TrilinosWrappers::MPI::Vector  &x,
                        const TrilinosWrappers::MPI::Vector  &b)
  {
    TrilinosWrappers::MPI::Vector r(b);
    A.vmult(r, x);
    r -= b;
    return r.l2_norm() / (A.frobenius_norm() * x.l2_norm() + b.l2_norm());
  }

  /** A right-hand side that is not an eigenvector. */
  TrilinosWrappers::MPI::Vector make_rhs(const TrilinosWrappers::SparseMatrix &A)
  {
    TrilinosWrappers::MPI::Vector b(A.locally_owned_range_indices(), comm);
    for (const auto i : A.locally_owned_range_indices())
      b[i] = 1.0 + std::sin(0.37 * i) + 0.1 * (i % 7);
    b.compress(VectorOperation::insert);
    return b;
  }

  /** The same value on every rank? */
  bool same_on_all_ranks(const unsigned int value)
  {
    return Utilities::MPI::min(value, comm) == Utilities::MPI::max(value, comm);
  }
} // namespace

TEST(SymmetricDirectSolver, CountsNegativeEigenvaluesOfShiftedLaplacian1D)
{
  const unsigned int        n      = 300;
  const std::vector<double> lambda = laplacian_1d_eigenvalues(n);

  TrilinosWrappers::SparseMatrix A;
  make_banded_pattern(n, 1, A);
  nappe::SymmetricDirectSolver solver(comm);

  // σ below the spectrum, in gaps (midpoints between λ_m and λ_{m+1} → m negative), above it.
  std::vector<std::pair<double, unsigned int>> shifts = {{0.5 * lambda[0], 0},
                                                         {1.1 * lambda.back(), n}};
  for (const unsigned int m : {1u, 2u, 7u, 50u, 150u, 299u})
    shifts.emplace_back(0.5 * (lambda[m - 1] + lambda[m]), m);

  for (const auto &[sigma, expected] : shifts)
    {
      fill_shifted_laplacian_1d(sigma, A);
      solver.factorize(A);
      EXPECT_EQ(solver.n_negative_pivots(), expected) << "sigma = " << sigma;
      EXPECT_TRUE(same_on_all_ranks(solver.n_negative_pivots()));
    }
}

TEST(SymmetricDirectSolver, SolvesIndefiniteSystemToRoundOff)
{
  const unsigned int        n      = 400;
  const std::vector<double> lambda = laplacian_1d_eigenvalues(n);

  TrilinosWrappers::SparseMatrix A;
  make_banded_pattern(n, 1, A);
  fill_shifted_laplacian_1d(0.5 * (lambda[180] + lambda[181]), A); // 181 negative eigenvalues

  nappe::SymmetricDirectSolver solver(comm);
  solver.factorize(A);
  ASSERT_EQ(solver.n_negative_pivots(), 181u);

  const TrilinosWrappers::MPI::Vector b = make_rhs(A);
  TrilinosWrappers::MPI::Vector       x(b);
  x = 0;
  solver.solve(b, x);
  EXPECT_LT(relative_residual(A, x, b), 1e-12);

  // In place: the right-hand side is overwritten by the solution.
  TrilinosWrappers::MPI::Vector y(b);
  solver.solve(y, y);
  y -= x;
  EXPECT_LT(y.l2_norm(), 1e-14 * x.l2_norm());
}

TEST(SymmetricDirectSolver, AnalysesOnceForValuesRefilledInPlace)
{
  const unsigned int        n      = 200;
  const std::vector<double> lambda = laplacian_1d_eigenvalues(n);

  TrilinosWrappers::SparseMatrix A;
  make_banded_pattern(n, 1, A);
  const TrilinosWrappers::MPI::Vector b = make_rhs(A);
  TrilinosWrappers::MPI::Vector       x(b);

  nappe::SymmetricDirectSolver solver(comm);
  for (const unsigned int m : {0u, 3u, 10u, 60u, 120u})
    {
      const double sigma = m == 0 ? -1.0 : 0.5 * (lambda[m - 1] + lambda[m]);
      fill_shifted_laplacian_1d(sigma, A);
      solver.factorize(A);
      EXPECT_EQ(solver.n_negative_pivots(), m);
      solver.solve(b, x);
      EXPECT_LT(backward_error(A, x, b), 1e-15);
    }
  EXPECT_EQ(solver.n_symbolic_factorizations(), 1u);
  EXPECT_EQ(solver.n_numeric_factorizations(), 5u);

  solver.reset();
  solver.factorize(A);
  EXPECT_EQ(solver.n_symbolic_factorizations(), 2u);
  EXPECT_EQ(solver.n_numeric_factorizations(), 6u);
  EXPECT_EQ(solver.n_negative_pivots(), 120u);
}

TEST(SymmetricDirectSolver, AnalysesAgainWhenThePatternChanges)
{
  const unsigned int        n      = 200;
  const std::vector<double> lambda = laplacian_1d_eigenvalues(n);
  const double              sigma  = 0.5 * (lambda[41] + lambda[42]);

  TrilinosWrappers::SparseMatrix tridiagonal, pentadiagonal;
  make_banded_pattern(n, 1, tridiagonal);
  make_banded_pattern(n, 2, pentadiagonal); // same values, two more stored zero diagonals
  fill_shifted_laplacian_1d(sigma, tridiagonal);
  fill_shifted_laplacian_1d(sigma, pentadiagonal);

  nappe::SymmetricDirectSolver solver(comm);
  solver.factorize(tridiagonal);
  solver.factorize(pentadiagonal);
  EXPECT_EQ(solver.n_symbolic_factorizations(), 2u);
  EXPECT_EQ(solver.n_negative_pivots(), 42u);

  const TrilinosWrappers::MPI::Vector b = make_rhs(pentadiagonal);
  TrilinosWrappers::MPI::Vector       x(b);
  solver.solve(b, x);
  EXPECT_LT(relative_residual(pentadiagonal, x, b), 1e-12);
}

TEST(SymmetricDirectSolver, ThrowsOnMatrixWithAZeroRowAndColumn)
{
  // A dof that enters no equation: its row and column are stored but zero.
  const unsigned int             n = 50;
  TrilinosWrappers::SparseMatrix A;
  make_banded_pattern(n, 1, A);
  fill_shifted_laplacian_1d(0.0, A);
  const unsigned int dead = n / 2;
  for (const auto i : A.locally_owned_range_indices())
    if (i == dead)
      for (const unsigned int j : {dead - 1, dead, dead + 1})
        A.set(i, j, 0.0);
    else if (i + 1 == dead || i == dead + 1)
      A.set(i, dead, 0.0);
  A.compress(VectorOperation::insert);

  nappe::SymmetricDirectSolver solver(comm);
  try
    {
      solver.factorize(A);
      ADD_FAILURE() << "factorize() accepted a singular matrix";
    }
  catch (const nappe::DirectSolverError &e)
    {
      EXPECT_EQ(e.mumps_error(), -10) << e.what();
      EXPECT_NE(std::string(e.what()).find("singular"), std::string::npos) << e.what();
    }
  EXPECT_THROW(solver.n_negative_pivots(), nappe::DirectSolverError);

  // The solver is usable again once the matrix is fixed.
  fill_shifted_laplacian_1d(0.0, A);
  solver.factorize(A);
  EXPECT_EQ(solver.n_negative_pivots(), 0u);
}

TEST(SymmetricDirectSolver, ThrowsOnNeumannLaplacian)
{
  // tridiag(-1, 2, -1) with 1 in the corners: row sums are exactly 0, the constant vector is
  // its null space.
  const unsigned int             n = 64;
  TrilinosWrappers::SparseMatrix A;
  make_banded_pattern(n, 1, A);
  A = 0;
  for (const auto i : A.locally_owned_range_indices())
    {
      A.set(i, i, (i == 0 || i + 1 == n) ? 1.0 : 2.0);
      if (i > 0)
        A.set(i, i - 1, -1.0);
      if (i + 1 < n)
        A.set(i, i + 1, -1.0);
    }
  A.compress(VectorOperation::insert);

  // Measured: without MUMPS' null-pivot detection this "succeeds" and solve() returns entries
  // of order 1e16.
  nappe::SymmetricDirectSolver solver(comm);
  EXPECT_THROW(solver.factorize(A), nappe::DirectSolverError);
}

TEST(SymmetricDirectSolver, SolveWithoutFactorisationThrows)
{
  TrilinosWrappers::SparseMatrix A;
  make_banded_pattern(10, 1, A);
  TrilinosWrappers::MPI::Vector b = make_rhs(A), x(b);
  nappe::SymmetricDirectSolver  solver(comm);
  EXPECT_THROW(solver.solve(b, x), nappe::DirectSolverError);
}

TEST(SymmetricDirectSolver, CountsEigenvaluesOfShiftedLaplacianOnUnitSquare)
{
  // Q1 on a 64×64 mesh of the unit square: 63² = 3969 interior unknowns.
  parallel::distributed::Triangulation<2> tria(comm);
  GridGenerator::hyper_cube(tria, 0.0, 1.0);
  tria.refine_global(6);
  const FE_Q<2>   fe(1);
  DoFHandler<2>   dof_handler(tria);
  dof_handler.distribute_dofs(fe);
  const IndexSet owned = dof_handler.locally_owned_dofs();
  IndexSet       relevant;
  DoFTools::extract_locally_relevant_dofs(dof_handler, relevant);

  AffineConstraints<double> constraints(relevant);
  DoFTools::make_zero_boundary_constraints(dof_handler, constraints);
  constraints.close();

  TrilinosWrappers::SparsityPattern sp(owned, owned, relevant, comm);
  DoFTools::make_sparsity_pattern(dof_handler, sp, constraints, false,
                                  Utilities::MPI::this_mpi_process(comm));
  sp.compress();
  TrilinosWrappers::SparseMatrix K(sp), M(sp), A(sp);

  const QGauss<2> quadrature(2);
  FEValues<2>     fe_values(fe, quadrature, update_values | update_gradients | update_JxW_values);
  FullMatrix<double> k_cell(fe.dofs_per_cell, fe.dofs_per_cell), m_cell(k_cell);
  std::vector<types::global_dof_index> dofs(fe.dofs_per_cell);
  for (const auto &cell : dof_handler.active_cell_iterators())
    if (cell->is_locally_owned())
      {
        fe_values.reinit(cell);
        k_cell = 0;
        m_cell = 0;
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          for (unsigned int i = 0; i < fe.dofs_per_cell; ++i)
            for (unsigned int j = 0; j < fe.dofs_per_cell; ++j)
              {
                k_cell(i, j) += fe_values.shape_grad(i, q) * fe_values.shape_grad(j, q) *
                                fe_values.JxW(q);
                m_cell(i, j) += fe_values.shape_value(i, q) * fe_values.shape_value(j, q) *
                                fe_values.JxW(q);
              }
        cell->get_dof_indices(dofs);
        constraints.distribute_local_to_global(k_cell, dofs, K);
        constraints.distribute_local_to_global(m_cell, dofs, M);
      }
  K.compress(VectorOperation::add);
  M.compress(VectorOperation::add);

  // Constrained boundary rows carry a positive diagonal of K - σM for every σ used here
  // (K_ii ~ 1, σ M_ii ≤ 22π² h²), so they add only positive eigenvalues.
  auto expected_count = [](const double sigma_over_pi2) {
    unsigned int count = 0;
    for (unsigned int i = 1; i < 10; ++i)
      for (unsigned int j = 1; j < 10; ++j)
        count += (i * i + j * j < sigma_over_pi2) ? 1 : 0;
    return count;
  };

  nappe::SymmetricDirectSolver solver(comm);
  const TrilinosWrappers::MPI::Vector b = make_rhs(K);
  TrilinosWrappers::MPI::Vector       x(b);
  Timer                               timer(comm);
  double                              factorize_time = 0;
  // σ/π² in gaps of {2, 5, 5, 8, 10, 10, 13, 13, 17, 17, 18, 20, 20, 25, ...}.
  for (const double s : {1.0, 3.0, 6.5, 9.0, 11.5, 15.0, 17.5, 19.0, 22.0})
    {
      A = 0;
      A.add(1.0, K);
      A.add(-s * M_PI * M_PI, M);
      timer.restart();
      solver.factorize(A);
      factorize_time += timer.wall_time();
      EXPECT_EQ(solver.n_negative_pivots(), expected_count(s)) << "sigma/pi^2 = " << s;
      EXPECT_TRUE(same_on_all_ranks(solver.n_negative_pivots()));
      solver.solve(b, x);
      EXPECT_LT(backward_error(A, x, b), 1e-15);
    }
  EXPECT_EQ(solver.n_symbolic_factorizations(), 1u);
  if (Utilities::MPI::this_mpi_process(comm) == 0)
    std::cout << "    " << dof_handler.n_dofs() << " unknowns: mean analysis + factorisation "
              << factorize_time / 9 << " s" << std::endl;
}
