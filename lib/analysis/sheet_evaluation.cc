#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>

#include <nappe/analysis/sheet_evaluation.h>
#include <nappe/physics/fvk_kinematics.h>

namespace nappe
{
  using namespace dealii;

  Tensor<1, 2> PointState::displacement() const
  {
    const auto E = level.load * model->loads.mean_strain;
    return E * x + u_periodic;
  }

  PointState make_point_state(const SheetModel &model, const LoadLevel &level, const Point<2> &x,
                              const std::vector<double> &values, const std::vector<Tensor<1, 2>> &gradients,
                              const std::vector<Tensor<2, 2>> &hessians)
  {
    PointState s;
    s.x      = x;
    s.model  = &model;
    s.level  = level;
    s.w      = values[2];
    s.grad_w = gradients[2];
    s.hess_w = hessians[2];
    for (unsigned int i = 0; i < 2; ++i)
      {
        s.u_periodic[i] = values[i];
        s.grad_u[i]     = gradients[i];
        s.hess_u[i]     = hessians[i];
      }
    s.strain = membrane_strain(model.base_strain(level.load), s.grad_u, s.grad_w, model.geometric_nonlinearity);
    return s;
  }

  void for_each_cell(const SheetSystem &system, const Vector &state, const LoadLevel &level,
                     const std::function<void(const CellPoints &)> &visit)
  {
    system.require_ghosted(state);
    const QGauss<2> quadrature(system.model().discretization.degree + 1);
    FEValues<2>     fv(system.mapping(), system.finite_element(), quadrature,
                   update_values | update_gradients | update_hessians | update_quadrature_points |
                     update_JxW_values);
    const unsigned int                     n_q = quadrature.size();
    std::vector<dealii::Vector<double>>    values(n_q, dealii::Vector<double>(3));
    std::vector<std::vector<Tensor<1, 2>>> gradients(n_q, std::vector<Tensor<1, 2>>(3));
    std::vector<std::vector<Tensor<2, 2>>> hessians(n_q, std::vector<Tensor<2, 2>>(3));
    std::vector<double>                    point_values(3);
    CellPoints                             cell_points;
    cell_points.points.resize(n_q);
    cell_points.weights.resize(n_q);
    for (const auto &cell : system.dof_handler().active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fv.reinit(cell);
        fv.get_function_values(state, values);
        fv.get_function_gradients(state, gradients);
        fv.get_function_hessians(state, hessians);
        cell_points.cell = cell;
        for (unsigned int q = 0; q < n_q; ++q)
          {
            for (unsigned int c = 0; c < 3; ++c)
              point_values[c] = values[q](c);
            cell_points.points[q]  = make_point_state(system.model(), level, fv.quadrature_point(q), point_values,
                                                     gradients[q], hessians[q]);
            cell_points.weights[q] = fv.JxW(q);
          }
        visit(cell_points);
      }
  }
} // namespace nappe
