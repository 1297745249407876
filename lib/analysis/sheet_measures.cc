#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>

#include <nappe/analysis/sheet_measures.h>
#include <nappe/physics/fvk_kinematics.h>

namespace nappe
{
  using namespace dealii;

  SymmetricTensor<2, 2> membrane_strain(const SheetModel &model, double load_factor, const Tensor<2, 2> &grad_u,
                                        const Tensor<1, 2> &grad_w)
  {
    SymTensor strain = load_factor * (model.loads.mean_strain - model.loads.eigenstrain) + symmetrize(grad_u);
    if (model.geometric_nonlinearity)
      strain += 0.5 * symmetric_outer(grad_w, grad_w);
    return strain;
  }

  namespace
  {
    /// Keeps the candidate with the larger key; ties keep the first.
    void keep_larger(LocatedValue &best, double &best_key, double key, double value, const Point<2> &where)
    {
      if (key > best_key)
        {
          best_key       = key;
          best.value     = value;
          best.location  = where;
        }
    }

    /// The extreme over all ranks: the rank with the largest key (lowest rank on ties) provides it.
    LocatedValue agree(const LocatedValue &local, double key, MPI_Comm comm)
    {
      const double       global_key = Utilities::MPI::max(key, comm);
      const unsigned int rank       = Utilities::MPI::this_mpi_process(comm);
      const unsigned int owner =
        Utilities::MPI::min(key == global_key ? rank : Utilities::MPI::n_mpi_processes(comm), comm);
      double data[3] = {0, 0, 0};
      if (rank == owner)
        {
          data[0] = local.value;
          data[1] = local.location[0];
          data[2] = local.location[1];
        }
      double sum[3];
      Utilities::MPI::sum(ArrayView<const double>(data, 3), comm, ArrayView<double>(sum, 3));
      return {sum[0], Point<2>(sum[1], sum[2])};
    }
  } // namespace

  SheetMeasures measure_sheet(const SheetSystem &system, const Vector &state, double load_factor)
  {
    const unsigned int p = system.model().discretization.degree;
    const QGauss<2>    quadrature(p + 1);
    FEValues<2>        fv(system.mapping(), system.finite_element(), quadrature,
                   update_values | update_gradients | update_hessians | update_quadrature_points);
    const FEValuesExtractors::Vector in_plane(0);
    const FEValuesExtractors::Scalar deflection(2);
    const unsigned int n_q = quadrature.size();
    std::vector<Tensor<2, 2>> grad_u(n_q), hess_w(n_q);
    std::vector<Tensor<1, 2>> grad_w(n_q);
    std::vector<double>       w(n_q);

    constexpr double lowest = -std::numeric_limits<double>::max();
    SheetMeasures    m;
    double key[6] = {lowest, lowest, lowest, lowest, lowest, lowest};
    for (const auto &cell : system.dof_handler().active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fv.reinit(cell);
        fv[in_plane].get_function_gradients(state, grad_u);
        fv[deflection].get_function_gradients(state, grad_w);
        fv[deflection].get_function_hessians(state, hess_w);
        fv[deflection].get_function_values(state, w);
        for (unsigned int q = 0; q < n_q; ++q)
          {
            const Point<2> &x              = fv.quadrature_point(q);
            const auto      strain         = membrane_strain(system.model(), load_factor, grad_u[q], grad_w[q]);
            const auto [e1, e2]            = principal_values(strain);
            const auto [k1, k2]            = principal_values(symmetrize(hess_w[q]));
            const double    areal          = e1 + e2;
            const double    curvature      = std::max(std::abs(k1), std::abs(k2));
            keep_larger(m.max_deflection, key[0], std::abs(w[q]), w[q], x);
            keep_larger(m.max_principal_strain, key[1], e1, e1, x);
            keep_larger(m.min_principal_strain, key[2], -e2, e2, x);
            keep_larger(m.max_areal_strain, key[3], std::abs(areal), areal, x);
            keep_larger(m.max_shear_strain, key[4], 0.5 * (e1 - e2), 0.5 * (e1 - e2), x);
            keep_larger(m.max_curvature, key[5], curvature, curvature, x);
          }
      }
    const MPI_Comm comm = system.communicator();
    m.max_deflection       = agree(m.max_deflection, key[0], comm);
    m.max_principal_strain = agree(m.max_principal_strain, key[1], comm);
    m.min_principal_strain = agree(m.min_principal_strain, key[2], comm);
    m.max_areal_strain     = agree(m.max_areal_strain, key[3], comm);
    m.max_shear_strain     = agree(m.max_shear_strain, key[4], comm);
    m.max_curvature        = agree(m.max_curvature, key[5], comm);
    return m;
  }
} // namespace nappe
