#include <deal.II/base/mpi.h>

#include "matrix_diagonal.h"

#include <Epetra_CrsMatrix.h>

#include <algorithm>
#include <cmath>

namespace nappe::internal
{
  namespace
  {
    /// Calls f(global row, values, columns, entries, local column of the diagonal) for each owned row.
    template <typename F>
    void for_each_owned_row(const Epetra_CrsMatrix &A, const Vector &owned, F &&f)
    {
      for (const auto i : owned.locally_owned_elements())
        {
          const auto row    = static_cast<dealii::TrilinosWrappers::types::int_type>(i);
          int        n      = 0;
          double    *values = nullptr;
          int       *cols   = nullptr;
          A.ExtractMyRowView(A.LRID(row), n, values, cols);
          f(i, values, cols, n, A.LCID(row));
        }
    }
  } // namespace

  void extract_diagonal(const SparseMatrix &H, Vector &diagonal)
  {
    for_each_owned_row(H.trilinos_matrix(), diagonal, [&](auto i, double *values, int *cols, int n, int d) {
      double value = 0.0;
      for (int k = 0; k < n; ++k)
        if (cols[k] == d)
          value += values[k];
      diagonal(i) = value;
    });
    diagonal.compress(dealii::VectorOperation::insert);
  }

  void add_to_diagonal(SparseMatrix &H, const Vector &weights, double factor)
  {
    for_each_owned_row(H.trilinos_matrix(), weights, [&](auto i, double *values, int *cols, int n, int d) {
      const auto entry = std::find(cols, cols + n, d);
      if (entry != cols + n)
        values[entry - cols] += factor * weights(i);
    });
  }

  double gershgorin_shift(const SparseMatrix &H, const Vector &weights, double shift)
  {
    double largest = 0.0;
    for_each_owned_row(H.trilinos_matrix(), weights, [&](auto i, double *values, int *cols, int n, int d) {
      double off = 0.0, diagonal = 0.0;
      for (int k = 0; k < n; ++k)
        if (cols[k] == d)
          diagonal += values[k];
        else
          off += std::abs(values[k]);
      largest = std::max(largest, (off - diagonal) / weights(i) + shift);
    });
    return dealii::Utilities::MPI::max(largest, weights.get_mpi_communicator());
  }
} // namespace nappe::internal
