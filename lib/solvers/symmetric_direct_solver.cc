#include <nappe/solvers/symmetric_direct_solver.h>

#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_vector.h>

#include <Epetra_CrsMatrix.h>
#include <Epetra_Map.h>
#include <Epetra_Vector.h>
#include <dmumps_c.h>

#include <algorithm>
#include <sstream>
#include <vector>

// MUMPS numbers its control and information arrays from 1, as in its user guide.
#define ICNTL(I) icntl[(I) - 1]
#define INFOG(I) infog[(I) - 1]
#define INFO(I) info[(I) - 1]

namespace nappe
{
  namespace internal
  {
    namespace
    {
      /**
       * Meaning of a negative MUMPS INFOG(1) and what to try. Source: MUMPS 5.5 Users' guide,
       * section "Error diagnostics".
       */
      std::string describe_mumps_error(const int error, const int detail)
      {
        // Sizes in INFOG(2) are in entries; a negative value means -value million entries.
        const std::string size = detail < 0 ? std::to_string(-static_cast<long>(detail)) +
                                                " million entries" :
                                              std::to_string(detail) + " entries";
        switch (error)
          {
            case -1:
              return "an error occurred on rank " + std::to_string(detail) +
                     " (see the MUMPS messages there; rerun with verbose = true)";
            case -2:
            case -3:
            case -16:
            case -22:
              return "MUMPS was called with invalid input (a bug in nappe, please report it)";
            case -5:
            case -7:
            case -13:
              return "not enough memory: MUMPS failed to allocate " + size +
                     ". Use more ranks, a coarser mesh, or less fill-in";
            case -6:
              return "the matrix is structurally singular (structural rank " +
                     std::to_string(detail) +
                     "): some unknowns do not enter any equation, e.g. a missing constraint or "
                     "an unconstrained hanging/pinned dof";
            case -8:
            case -9:
            case -14:
            case -15:
            case -17:
            case -20:
              return "a MUMPS work array was too small even after enlarging it (ICNTL(14)); "
                     "this usually means heavy delayed pivoting in a nearly singular matrix";
            case -10:
              return "the matrix is numerically singular" +
                     (detail >= 0 ? " (a zero pivot after " + std::to_string(detail) +
                                      " eliminated pivots)" :
                                    std::string()) +
                     ": check boundary conditions and constraints (rigid-body "
                     "modes, a pinned dof), or the state is exactly at a bifurcation";
            case -19:
              return "the working-memory limit ICNTL(23) is too small";
            default:
              return "see the MUMPS 5.5 Users' guide, section \"Error diagnostics\"";
          }
      }

      /** Work-array shortages that MUMPS says a larger ICNTL(14) cures without a new analysis. */
      bool is_workspace_shortage(const int error)
      {
        return error == -8 || error == -9 || error == -17 || error == -20;
      }
    } // namespace
  }   // namespace internal

  DirectSolverError::DirectSolverError(const std::string &message,
                                       const int          mumps_error,
                                       const int          mumps_detail)
    : std::runtime_error(message)
    , error(mumps_error)
    , detail(mumps_detail)
  {}

  struct SymmetricDirectSolver::Impl
  {
    Impl(MPI_Comm comm, bool verbose);
    ~Impl();

    /** Calls MUMPS with the given JOB; returns INFOG(1), which MUMPS makes global. */
    int call(int job);

    /** Fills rows/cols/values with the upper triangle of A (1-based global indices). */
    void extract_upper_triangle(const Epetra_CrsMatrix &A,
                                std::vector<MUMPS_INT> &rows,
                                std::vector<MUMPS_INT> &cols,
                                std::vector<double>    &values) const;

    /** Throws DirectSolverError on all ranks if INFOG(1) < 0. */
    void check(const char *phase) const;

    /** Collective: true on all ranks if the condition holds on any rank. */
    bool any(bool local) const;

    MPI_Comm        comm;
    unsigned int    rank;
    DMUMPS_STRUC_C  mumps;
    bool            analysed   = false;
    bool            factorized = false;
    unsigned int    n_analyses = 0;
    unsigned int    n_factorizations = 0;
    unsigned int    negative_pivots  = 0;

    // The analysed pattern; MUMPS keeps pointers to these arrays between calls.
    std::vector<MUMPS_INT> rows, cols;
    std::vector<double>    values;
    std::unique_ptr<Epetra_Map> row_map;

    // Gathering the right-hand side on the MUMPS host (rank 0), which solves with a dense
    // centralised right-hand side (ICNTL(20) = 0) and returns the solution there (ICNTL(21) = 0).
    std::vector<int>    host_counts, host_offsets, host_global_rows;
    mutable std::vector<double> host_buffer, host_rhs;
  };

  SymmetricDirectSolver::Impl::Impl(MPI_Comm comm_in, const bool verbose)
  {
    MPI_Comm_dup(comm_in, &comm);
    int r = 0;
    MPI_Comm_rank(comm, &r);
    rank = r;

    mumps              = DMUMPS_STRUC_C();
    mumps.comm_fortran = static_cast<MUMPS_INT>(MPI_Comm_c2f(comm));
    mumps.par          = 1; // the host takes part in the factorisation
    mumps.sym          = 2; // general symmetric: LDLᵀ with 1×1 and 2×2 pivots
    mumps.job          = -1;
    dmumps_c(&mumps);
    if (mumps.INFOG(1) < 0)
      {
        const int error = mumps.INFOG(1), detail = mumps.INFOG(2);
        MPI_Comm_free(&comm);
        throw DirectSolverError("MUMPS initialisation failed with INFOG(1) = " +
                                  std::to_string(error),
                                error,
                                detail);
      }

    // Output streams: 6 is Fortran's stdout, a negative unit silences the stream.
    mumps.ICNTL(1) = verbose ? 6 : -1; // errors
    mumps.ICNTL(2) = verbose ? 6 : -1; // diagnostics and warnings
    mumps.ICNTL(3) = verbose ? 6 : -1; // global information (host)
    mumps.ICNTL(4) = verbose ? 2 : 0;  // print level: errors, warnings, main statistics

    mumps.ICNTL(5)  = 0; // assembled matrix
    mumps.ICNTL(18) = 3; // distributed entry: each rank passes the entries of its own rows
    mumps.ICNTL(20) = 0; // dense right-hand side on the host
    mumps.ICNTL(21) = 0; // centralised solution on the host
    // Factor the root front without ScaLAPACK: INFOG(12) does not count the negative pivots
    // of a root processed by ScaLAPACK (ICNTL(13) = 0, used on more than one rank), and the
    // inertia is the reason this class exists.
    mumps.ICNTL(13) = 1;
    // Null-pivot detection on, and any null pivot is an error (see factorize()). Measured:
    // with ICNTL(24) = 0 the Neumann Laplacian (exactly singular, round-off pivot) factorises
    // "successfully" and the solve returns entries of order 1e16; MUMPS reports INFOG(1) = -10
    // only for pivots that are exactly zero. With ICNTL(24) = 1 it counts pivots below the
    // default threshold (CNTL(3) = 0: a tiny multiple of machine epsilon times the norm of the
    // preprocessed matrix) in INFOG(28).
    mumps.ICNTL(24) = 1;
  }

  SymmetricDirectSolver::Impl::~Impl()
  {
    mumps.job = -2;
    dmumps_c(&mumps);
    MPI_Comm_free(&comm);
  }

  int SymmetricDirectSolver::Impl::call(const int job)
  {
    mumps.job = job;
    dmumps_c(&mumps);
    return mumps.INFOG(1);
  }

  bool SymmetricDirectSolver::Impl::any(const bool local) const
  {
    int in = local ? 1 : 0, out = 0;
    MPI_Allreduce(&in, &out, 1, MPI_INT, MPI_MAX, comm);
    return out != 0;
  }

  void SymmetricDirectSolver::Impl::check(const char *phase) const
  {
    const int error = mumps.INFOG(1), detail = mumps.INFOG(2);
    if (error >= 0)
      return;
    std::ostringstream message;
    message << "SymmetricDirectSolver: MUMPS " << phase << " failed with INFOG(1) = " << error
            << ", INFOG(2) = " << detail << ": "
            << internal::describe_mumps_error(error, detail) << '.';
    throw DirectSolverError(message.str(), error, detail);
  }

  void SymmetricDirectSolver::Impl::extract_upper_triangle(const Epetra_CrsMatrix &A,
                                                           std::vector<MUMPS_INT> &r,
                                                           std::vector<MUMPS_INT> &c,
                                                           std::vector<double>    &v) const
  {
    r.clear();
    c.clear();
    v.clear();
    r.reserve(A.NumMyNonzeros() / 2 + A.NumMyRows());
    c.reserve(r.capacity());
    v.reserve(r.capacity());
    for (int i = 0; i < A.NumMyRows(); ++i)
      {
        int     n_entries = 0;
        double *row_values = nullptr;
        int    *row_columns = nullptr;
        A.ExtractMyRowView(i, n_entries, row_values, row_columns);
        const int global_row = A.GRID(i);
        for (int k = 0; k < n_entries; ++k)
          {
            const int global_column = A.GCID(row_columns[k]);
            if (global_column >= global_row)
              {
                r.push_back(global_row + 1);
                c.push_back(global_column + 1);
                v.push_back(row_values[k]);
              }
          }
      }
  }

  SymmetricDirectSolver::SymmetricDirectSolver(MPI_Comm comm, const bool verbose)
    : impl(std::make_unique<Impl>(comm, verbose))
  {}

  SymmetricDirectSolver::~SymmetricDirectSolver() = default;

  void SymmetricDirectSolver::factorize(const dealii::TrilinosWrappers::SparseMatrix &matrix)
  {
    Impl                   &s = *impl;
    const Epetra_CrsMatrix &A = matrix.trilinos_matrix();
    s.factorized              = false;

    const bool bad_input = s.any(!A.Filled() || A.NumGlobalRows() != A.NumGlobalCols() ||
                                 A.RowMap().MinAllGID() != 0 ||
                                 A.RowMap().MaxAllGID() != A.NumGlobalRows() - 1);
    if (bad_input)
      throw DirectSolverError("SymmetricDirectSolver::factorize: expected a compressed square "
                              "matrix with global row indices 0..n-1",
                              0,
                              0);

    // Reuse the analysis only if the pattern and the row partition are the analysed ones.
    std::vector<MUMPS_INT> new_rows, new_cols;
    std::vector<double>    new_values;
    s.extract_upper_triangle(A, new_rows, new_cols, new_values);
    if (s.analysed)
      {
        const bool same_partition = s.row_map->SameAs(A.RowMap()); // collective
        const bool changed = s.any(!same_partition || new_rows != s.rows || new_cols != s.cols);
        if (changed)
          s.analysed = false;
      }
    s.values.swap(new_values);
    s.mumps.a_loc = s.values.data();

    if (!s.analysed)
      {
        s.rows.swap(new_rows);
        s.cols.swap(new_cols);
        s.row_map = std::make_unique<Epetra_Map>(A.RowMap());

        s.mumps.n       = A.NumGlobalRows();
        s.mumps.nnz_loc = static_cast<MUMPS_INT8>(s.rows.size());
        s.mumps.irn_loc = s.rows.data();
        s.mumps.jcn_loc = s.cols.data();

        // Where each rank's rows go in the host's global right-hand side.
        const int n_local = A.NumMyRows();
        std::vector<int> my_rows(n_local);
        for (int i = 0; i < n_local; ++i)
          my_rows[i] = A.GRID(i);
        int n_ranks = 1;
        MPI_Comm_size(s.comm, &n_ranks);
        s.host_counts.assign(s.rank == 0 ? n_ranks : 0, 0);
        MPI_Gather(&n_local, 1, MPI_INT, s.host_counts.data(), 1, MPI_INT, 0, s.comm);
        s.host_offsets.assign(s.host_counts.size(), 0);
        for (std::size_t p = 1; p < s.host_counts.size(); ++p)
          s.host_offsets[p] = s.host_offsets[p - 1] + s.host_counts[p - 1];
        s.host_global_rows.assign(s.rank == 0 ? s.mumps.n : 0, 0);
        MPI_Gatherv(my_rows.data(), n_local, MPI_INT, s.host_global_rows.data(),
                    s.host_counts.data(), s.host_offsets.data(), MPI_INT, 0, s.comm);
        s.host_buffer.assign(s.host_global_rows.size(), 0.);
        s.host_rhs.assign(s.host_global_rows.size(), 0.);

        s.call(1);
        s.check("analysis (JOB = 1)");
        s.analysed = true;
        ++s.n_analyses;
      }

    // Work-array shortages are cured by a larger relaxation ICNTL(14) (percent) and a new
    // numeric factorisation with the same analysis.
    const int default_relaxation = s.mumps.ICNTL(14);
    for (int attempt = 0; attempt < 4; ++attempt)
      {
        const int error = s.call(2);
        if (!internal::is_workspace_shortage(error))
          break;
        s.mumps.ICNTL(14) = 2 * std::max(s.mumps.ICNTL(14), 20);
      }
    s.mumps.ICNTL(14) = default_relaxation;
    s.check("numeric factorisation (JOB = 2)");

    // MUMPS returns INFOG on all ranks; broadcast the host's values anyway so that the inertia
    // the Newton solver branches on, and the decision to throw, are identical everywhere.
    int counts[2] = {s.mumps.INFOG(12), s.mumps.INFOG(28)};
    MPI_Bcast(counts, 2, MPI_INT, 0, s.comm);
    if (counts[1] > 0)
      throw DirectSolverError(
        "SymmetricDirectSolver: MUMPS numeric factorisation (JOB = 2) found " +
          std::to_string(counts[1]) +
          " null pivot(s) (INFOG(28)): " + internal::describe_mumps_error(-10, -1) + '.',
        -10,
        counts[1]);
    s.negative_pivots = static_cast<unsigned int>(counts[0]);
    s.factorized      = true;
    ++s.n_factorizations;
  }

  void SymmetricDirectSolver::solve(const dealii::TrilinosWrappers::MPI::Vector &rhs,
                                    dealii::TrilinosWrappers::MPI::Vector       &solution) const
  {
    Impl &s = *impl;
    if (!s.factorized)
      throw DirectSolverError("SymmetricDirectSolver::solve: no valid factorisation; call "
                              "factorize() first (and check that it did not throw)",
                              0,
                              0);
    const Epetra_MultiVector &b = rhs.trilinos_vector();
    Epetra_MultiVector       &x = solution.trilinos_vector();
    const bool same_maps = b.Map().SameAs(*s.row_map) && x.Map().SameAs(*s.row_map); // collective
    if (!same_maps || s.any(b.NumVectors() != 1 || x.NumVectors() != 1))
      throw DirectSolverError("SymmetricDirectSolver::solve: right-hand side and solution must "
                              "be non-ghosted vectors with the row partition of the factorised "
                              "matrix",
                              0,
                              0);

    const int n_local = b.MyLength();
    MPI_Gatherv(b[0], n_local, MPI_DOUBLE, s.host_buffer.data(), s.host_counts.data(),
                s.host_offsets.data(), MPI_DOUBLE, 0, s.comm);
    if (s.rank == 0)
      for (std::size_t k = 0; k < s.host_buffer.size(); ++k)
        s.host_rhs[s.host_global_rows[k]] = s.host_buffer[k];

    s.mumps.rhs  = s.host_rhs.data();
    s.mumps.nrhs = 1;
    s.mumps.lrhs = s.mumps.n;
    s.call(3);
    s.check("solve (JOB = 3)");

    if (s.rank == 0)
      for (std::size_t k = 0; k < s.host_buffer.size(); ++k)
        s.host_buffer[k] = s.host_rhs[s.host_global_rows[k]];
    MPI_Scatterv(s.host_buffer.data(), s.host_counts.data(), s.host_offsets.data(), MPI_DOUBLE,
                 x[0], n_local, MPI_DOUBLE, 0, s.comm);
  }

  unsigned int SymmetricDirectSolver::n_negative_pivots() const
  {
    if (!impl->factorized)
      throw DirectSolverError("SymmetricDirectSolver::n_negative_pivots: no valid "
                              "factorisation; call factorize() first",
                              0,
                              0);
    return impl->negative_pivots;
  }

  void SymmetricDirectSolver::reset()
  {
    impl->analysed   = false;
    impl->factorized = false;
  }

  unsigned int SymmetricDirectSolver::n_symbolic_factorizations() const
  {
    return impl->n_analyses;
  }

  unsigned int SymmetricDirectSolver::n_numeric_factorizations() const
  {
    return impl->n_factorizations;
  }
} // namespace nappe
