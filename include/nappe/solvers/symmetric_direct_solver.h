#pragma once

#include <mpi.h>

#include <memory>
#include <stdexcept>
#include <string>

namespace dealii::TrilinosWrappers
{
  class SparseMatrix;
  namespace MPI
  {
    class Vector;
  }
} // namespace dealii::TrilinosWrappers

namespace nappe
{
  /**
   * A factorisation failed or cannot be used. what() says which MUMPS phase failed, the MUMPS
   * error code INFOG(1) with its detail INFOG(2), what the code means and what to try. Thrown
   * on every rank of the solver's communicator, so a collective caller can catch it uniformly.
   */
  class DirectSolverError : public std::runtime_error
  {
  public:
    DirectSolverError(const std::string &message, int mumps_error, int mumps_detail);

    /** MUMPS INFOG(1) (negative), or 0 when the error was found before MUMPS was called. */
    int mumps_error() const { return error; }
    /** MUMPS INFOG(2), the detail that goes with INFOG(1). */
    int mumps_detail() const { return detail; }

  private:
    int error;
    int detail;
  };

  /**
   * Sparse direct solver for a symmetric, possibly indefinite matrix: MUMPS 5 with SYM = 2, i.e.
   * a distributed LDLᵀ factorisation with 1×1 and 2×2 pivots, called through the MUMPS C
   * interface on the Epetra data inside deal.II's Trilinos wrappers.
   *
   * Besides solving, each numeric factorisation yields the inertia of the matrix: by Sylvester's
   * law of inertia the number of negative pivots of LDLᵀ (MUMPS INFOG(12)) equals the number of
   * negative eigenvalues of A. The Newton solver uses it to certify that a converged state is a
   * stable minimum (Hessian positive definite) and to detect folds.
   *
   * Symbolic analysis (ordering, elimination tree) is done on the first factorize() and reused by
   * later calls as long as the sparsity pattern and row partition stay the same, e.g. for the
   * same matrix object re-assembled in place. A pattern change is detected (the stored entry
   * indices are compared) and triggers a new analysis; reset() forces one.
   *
   * Preconditions: A is symmetric; only its upper triangle (column ≥ row) is passed to MUMPS, so
   * an unsymmetric matrix is silently replaced by its symmetric completion of that triangle.
   * Every member function is collective over the communicator, including the destructor, which
   * must run before MPI is finalised.
   *
   * Why not Amesos_Mumps: Trilinos 13.2 hard-codes MUMPS SYM = 0 (LU) in
   * Amesos_Mumps::SymbolicFactorization, ignoring "MatrixProperty"/"MatrixType" (Trilinos bugs
   * 2331/2332); with LU, INFOG(12) counts off-diagonal pivots, not negative ones.
   */
  class SymmetricDirectSolver
  {
  public:
    /**
     * @param comm the communicator of the matrices to factorise (duplicated internally).
     * @param verbose let MUMPS print errors, warnings and statistics (ICNTL(1..4)) to stdout;
     *        silent by default.
     */
    explicit SymmetricDirectSolver(MPI_Comm comm, bool verbose = false);
    ~SymmetricDirectSolver();

    SymmetricDirectSolver(const SymmetricDirectSolver &)            = delete;
    SymmetricDirectSolver &operator=(const SymmetricDirectSolver &) = delete;

    /**
     * Numeric LDLᵀ factorisation of A, preceded by a symbolic analysis on the first call, after
     * reset(), or when the pattern or row partition of A differs from the analysed one. A must be
     * compressed (fill-complete), square, with global indices 0..n-1. Throws DirectSolverError if
     * MUMPS fails, including mumps_error() = -10 for a numerically singular matrix (a zero
     * pivot, or a null pivot found by MUMPS' null-pivot detection ICNTL(24) = 1, counted in
     * mumps_detail() = INFOG(28)); the previous factorisation is then no longer usable.
     */
    void factorize(const dealii::TrilinosWrappers::SparseMatrix &A);

    /**
     * Solves A x = b with the last factorisation. @p rhs and @p solution are non-ghosted vectors
     * with the row partition of the factorised A; they may be the same object.
     */
    void solve(const dealii::TrilinosWrappers::MPI::Vector &rhs,
               dealii::TrilinosWrappers::MPI::Vector       &solution) const;

    /**
     * Number of negative pivots of the last numeric factorisation (MUMPS INFOG(12)) = number of
     * negative eigenvalues of A. Identical on all ranks. Throws if there is no factorisation.
     */
    unsigned int n_negative_pivots() const;

    /** Forget the symbolic analysis; the next factorize() performs a new one. */
    void reset();

    /** Number of symbolic analyses (MUMPS JOB = 1) performed so far. */
    unsigned int n_symbolic_factorizations() const;
    /** Number of successful numeric factorisations (MUMPS JOB = 2) performed so far. */
    unsigned int n_numeric_factorizations() const;

  private:
    struct Impl;
    std::unique_ptr<Impl> impl;
  };
} // namespace nappe
