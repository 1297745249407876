#include <deal.II/base/mpi_remote_point_evaluation.h>
#include <deal.II/base/quadrature.h>
#include <deal.II/fe/fe_values.h>

#include <nappe/analysis/point_jets.h>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    /// What travels between ranks: value, gradient and Hessian of the three components, 3 × (1 + 2 + 4).
    using Packed = std::array<double, 21>;

    /// Packs the fields at the points of the owned cells listed in @p cells, in their order.
    void evaluate_on_cells(const SheetSystem &system, const Vector &state, const ArrayView<Packed> &out,
                           const Utilities::MPI::RemotePointEvaluation<2>::CellData &cells)
    {
      const auto  &tria = system.dof_handler().get_triangulation();
      unsigned int k    = 0;
      for (unsigned int c = 0; c < cells.cells.size(); ++c)
        {
          const DoFHandler<2>::active_cell_iterator cell(&tria, cells.cells[c].first, cells.cells[c].second,
                                                         &system.dof_handler());
          const std::vector<Point<2>> points(cells.reference_point_values.begin() + cells.reference_point_ptrs[c],
                                             cells.reference_point_values.begin() + cells.reference_point_ptrs[c + 1]);
          const Quadrature<2> quadrature(points, std::vector<double>(points.size(), 1.0));
          FEValues<2> fv(system.mapping(), system.finite_element(), quadrature,
                         update_values | update_gradients | update_hessians);
          fv.reinit(cell);
          std::vector<dealii::Vector<double>>    values(points.size(), dealii::Vector<double>(3));
          std::vector<std::vector<Tensor<1, 2>>> gradients(points.size(), std::vector<Tensor<1, 2>>(3));
          std::vector<std::vector<Tensor<2, 2>>> hessians(points.size(), std::vector<Tensor<2, 2>>(3));
          fv.get_function_values(state, values);
          fv.get_function_gradients(state, gradients);
          fv.get_function_hessians(state, hessians);
          for (unsigned int q = 0; q < points.size(); ++q, ++k)
            for (unsigned int comp = 0; comp < 3; ++comp)
              {
                Packed &p       = out[k];
                p[7 * comp]     = values[q][comp];
                p[7 * comp + 1] = gradients[q][comp][0];
                p[7 * comp + 2] = gradients[q][comp][1];
                for (unsigned int a = 0; a < 2; ++a)
                  for (unsigned int b = 0; b < 2; ++b)
                    p[7 * comp + 3 + 2 * a + b] = hessians[q][comp][a][b];
              }
        }
    }

    PointJet unpack(const Packed &p)
    {
      PointJet j;
      for (unsigned int c = 0; c < 3; ++c)
        {
          j.values[c] = p[7 * c];
          j.gradients[c] = Tensor<1, 2>({p[7 * c + 1], p[7 * c + 2]});
          j.hessians[c]  = Tensor<2, 2>({{p[7 * c + 3], p[7 * c + 4]}, {p[7 * c + 5], p[7 * c + 6]}});
        }
      return j;
    }
  } // namespace

  Tensor<2, 2> PointJet::grad_u() const
  {
    Tensor<2, 2> g;
    g[0] = gradients[0];
    g[1] = gradients[1];
    return g;
  }

  Tensor<3, 2> PointJet::hess_u() const
  {
    Tensor<3, 2> h;
    h[0] = hessians[0];
    h[1] = hessians[1];
    return h;
  }

  std::vector<PointJet> evaluate_point_jets(const SheetSystem &system, const Vector &state,
                                            const std::vector<Point<2>> &points, std::vector<bool> &found)
  {
    system.require_ghosted(state);
    Utilities::MPI::RemotePointEvaluation<2> evaluation;
    evaluation.reinit(points, system.dof_handler().get_triangulation(), system.mapping());
    std::vector<Packed> per_cell, buffer;
    evaluation.evaluate_and_process<Packed>(per_cell, buffer, [&](const ArrayView<Packed> &out, const auto &cells) {
      evaluate_on_cells(system, state, out, cells);
    });
    const auto           &ptrs = evaluation.get_point_ptrs();
    std::vector<PointJet> jets(points.size());
    found.assign(points.size(), false);
    for (std::size_t i = 0; i < points.size(); ++i)
      {
        const unsigned int n = ptrs[i + 1] - ptrs[i];
        found[i]             = n > 0;
        Packed mean{};
        for (unsigned int e = ptrs[i]; e < ptrs[i + 1]; ++e)
          for (unsigned int d = 0; d < mean.size(); ++d)
            mean[d] += per_cell[e][d] / n;
        jets[i] = unpack(mean);
      }
    return jets;
  }
} // namespace nappe
