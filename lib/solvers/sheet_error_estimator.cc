// Residual-based error indicators of a sheet state (see sheet_error_estimator.h for the terms).
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_interface_values.h>
#include <deal.II/fe/fe_values.h>

#include <nappe/physics/fvk_kinematics.h>
#include <nappe/solvers/sheet_error_estimator.h>

#include <tuple>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    const FEValuesExtractors::Vector in_plane(0);
    const FEValuesExtractors::Scalar deflection(2);

    /// 1/s, or 0 where a stiffness is zero (a term without its stiffness carries no energy).
    double inverse(double s) { return s > 0.0 ? 1.0 / s : 0.0; }

    /// The membrane and bending resultants at the points of one side of an edge (or of a cell).
    struct Resultants
    {
      std::vector<Tensor<1, 2>> traction_n; ///< N·n [N/m]
      std::vector<double>       moment_nn;  ///< n·M·n [N]
      std::vector<double>       shear_n;    ///< D ∂_n Δw [N/m]
      std::vector<double>       slope_n;    ///< ∂_n w [-]
    };

    Resultants resultants_on(const FEValuesBase<2> &fv, const Vector &state, const SheetModel &model,
                             const SymTensor &base_strain, const std::vector<Tensor<1, 2>> &normals)
    {
      const unsigned int        n_q = fv.n_quadrature_points;
      std::vector<Tensor<2, 2>> grad_u(n_q), hess_w(n_q);
      std::vector<Tensor<1, 2>> grad_w(n_q);
      std::vector<Tensor<3, 2>> third_w(n_q);
      fv[in_plane].get_function_gradients(state, grad_u);
      fv[deflection].get_function_gradients(state, grad_w);
      fv[deflection].get_function_hessians(state, hess_w);
      fv[deflection].get_function_third_derivatives(state, third_w);
      Resultants r;
      const SheetMaterial &mat = model.material;
      for (unsigned int q = 0; q < n_q; ++q)
        {
          const Tensor<1, 2> &n = normals[q];
          const SymTensor stress =
            membrane_stress(membrane_strain(base_strain, grad_u[q], grad_w[q], model.geometric_nonlinearity), mat);
          r.traction_n.push_back(stress * n);
          r.moment_nn.push_back(n * (bending_moment(symmetrize(hess_w[q]), mat) * n));
          double d_laplacian = 0.0;
          for (unsigned int k = 0; k < 2; ++k)
            d_laplacian += n[k] * (third_w[q][0][0][k] + third_w[q][1][1][k]);
          r.shear_n.push_back(mat.bending_rigidity * d_laplacian);
          r.slope_n.push_back(grad_w[q] * n);
        }
      return r;
    }

    /// div N at a point from the second derivatives of u and w: ∂_k ε_ij = ½(u_i,jk + u_j,ik) + ½(w_,ik w_,j + w_,i w_,jk).
    Tensor<1, 2> membrane_divergence(const Tensor<3, 2> &hess_u, const Tensor<1, 2> &grad_w, const Tensor<2, 2> &hess_w,
                                     const SheetModel &model)
    {
      Tensor<1, 2> div;
      for (unsigned int k = 0; k < 2; ++k)
        {
          SymTensor d_strain;
          for (unsigned int i = 0; i < 2; ++i)
            for (unsigned int j = i; j < 2; ++j)
              {
                d_strain[i][j] = 0.5 * (hess_u[i][j][k] + hess_u[j][i][k]);
                if (model.geometric_nonlinearity)
                  d_strain[i][j] += 0.5 * (hess_w[i][k] * grad_w[j] + grad_w[i] * hess_w[j][k]);
              }
          const SymTensor d_stress = membrane_stress(d_strain, model.material);
          for (unsigned int i = 0; i < 2; ++i)
            div[i] += d_stress[i][k];
        }
      return div;
    }

    class Estimator
    {
    public:
      Estimator(const SheetSystem &system, const Vector &state, const LoadLevel &level)
        : system_(system)
        , model_(system.model())
        , state_(state)
        , level_(level)
        , base_strain_(model_.base_strain(level.load))
        , weight_membrane_(inverse(model_.material.youngs_modulus_2d))
        , weight_bending_(inverse(model_.material.bending_rigidity))
      {
        const auto &tria = system.dof_handler().get_triangulation();
        out_.residual.reinit(tria.n_active_cells());
        out_.jumps.reinit(tria.n_active_cells());
        out_.peak_strain.reinit(tria.n_active_cells());
        out_.on_adhesion_front.assign(tria.n_active_cells(), false);
      }

      CellErrorIndicators run()
      {
        add_cell_residuals();
        add_edge_jumps();
        out_.squared = out_.residual;
        out_.squared += out_.jumps;
        double local = 0.0;
        for (const float e : out_.squared)
          local += e;
        out_.total_squared     = Utilities::MPI::sum(local, system_.communicator());
        out_.sheet_peak_strain = Utilities::MPI::max(double(out_.peak_strain.linfty_norm()), system_.communicator());
        return std::move(out_);
      }

    private:
      void add_cell_residuals()
      {
        const unsigned int p = model_.discretization.degree;
        FEValues<2>        fv(system_.mapping(), system_.finite_element(), QGauss<2>(p + 1),
                       update_values | update_gradients | update_hessians | update_quadrature_points |
                         update_JxW_values);
        const unsigned int        n_q = fv.n_quadrature_points;
        std::vector<Tensor<2, 2>> grad_u(n_q), hess_w(n_q);
        std::vector<Tensor<3, 2>> hess_u(n_q);
        std::vector<Tensor<1, 2>> grad_w(n_q);
        std::vector<double>       w(n_q);
        const double              pressure = level_.load * model_.loads.pressure;
        for (const auto &cell : system_.dof_handler().active_cell_iterators())
          {
            if (!cell->is_locally_owned())
              continue;
            fv.reinit(cell);
            fv[in_plane].get_function_gradients(state_, grad_u);
            fv[in_plane].get_function_hessians(state_, hess_u);
            fv[deflection].get_function_gradients(state_, grad_w);
            fv[deflection].get_function_hessians(state_, hess_w);
            fv[deflection].get_function_values(state_, w);
            const double h = cell->diameter() / std::sqrt(2.0);
            double       vertical = 0.0, in_plane_sq = 0.0;
            bool         inside = false, outside = false;
            for (unsigned int q = 0; q < n_q; ++q)
              {
                double psi = 0.0, dpsi = 0.0, d2psi = 0.0;
                if (model_.substrate)
                  model_.substrate->evaluate(fv.quadrature_point(q), w[q], psi, dpsi, d2psi);
                (d2psi > 0.0 ? inside : outside) = true;
                const SymTensor strain =
                  membrane_strain(base_strain_, grad_u[q], grad_w[q], model_.geometric_nonlinearity);
                const SymTensor stress    = membrane_stress(strain, model_.material);
                const auto [high, low]    = principal_values(strain);
                float &peak               = out_.peak_strain(cell->active_cell_index());
                peak                      = std::max<float>(peak, std::max(std::abs(high), std::abs(low)));
                const double r = pressure - level_.adhesion * dpsi +
                                 (model_.geometric_nonlinearity ? stress * symmetrize(hess_w[q]) : 0.0);
                vertical += r * r * fv.JxW(q);
                in_plane_sq += membrane_divergence(hess_u[q], grad_w[q], hess_w[q], model_).norm_square() * fv.JxW(q);
              }
            out_.residual(cell->active_cell_index()) +=
              std::pow(h, 4) * weight_bending_ * vertical + h * h * weight_membrane_ * in_plane_sq;
            out_.on_adhesion_front[cell->active_cell_index()] = model_.adhesion() && inside && outside;
          }
      }

      /// The jump terms of one edge (or sub-edge) of length h_e, shared between the two cells.
      double edge_term(const Resultants &a, const Resultants &b, const FEInterfaceValues<2> &fiv, double h_e) const
      {
        const double D = model_.material.bending_rigidity;
        double       sum = 0.0;
        for (const unsigned int q : fiv.quadrature_point_indices())
          {
            const double slope  = a.slope_n[q] - b.slope_n[q];
            const double moment = a.moment_nn[q] - b.moment_nn[q];
            const double shear  = a.shear_n[q] - b.shear_n[q];
            sum += (D / h_e * slope * slope +
                    weight_bending_ * (h_e * moment * moment + std::pow(h_e, 3) * shear * shear) +
                    h_e * weight_membrane_ * (a.traction_n[q] - b.traction_n[q]).norm_square()) *
                   fiv.JxW(q);
          }
        return sum;
      }

      bool clamped(types::boundary_id id) const
      {
        const auto it = model_.edges.find(id);
        return it != model_.edges.end() && it->second.deflection == DeflectionCondition::clamped;
      }

      void add_edge_jumps()
      {
        const unsigned int p = model_.discretization.degree;
        FEInterfaceValues<2> fiv(system_.mapping(), system_.finite_element(), QGauss<1>(p + 1),
                                 update_values | update_gradients | update_hessians | update_3rd_derivatives |
                                   update_quadrature_points | update_JxW_values | update_normal_vectors);
        for (const auto &cell : system_.dof_handler().active_cell_iterators())
          {
            if (!cell->is_locally_owned())
              continue;
            for (const unsigned int f : cell->face_indices())
              {
                const double h_e = cell->face(f)->measure();
                if (cell->at_boundary(f) && !cell->has_periodic_neighbor(f))
                  {
                    if (!clamped(cell->face(f)->boundary_id()))
                      continue;
                    fiv.reinit(cell, f);
                    const Resultants a =
                      resultants_on(fiv.get_fe_face_values(0), state_, model_, base_strain_, fiv.get_normal_vectors());
                    double sum = 0.0;
                    for (const unsigned int q : fiv.quadrature_point_indices())
                      sum += model_.material.bending_rigidity / h_e * a.slope_n[q] * a.slope_n[q] * fiv.JxW(q);
                    out_.jumps(cell->active_cell_index()) += sum;
                    continue;
                  }
                // Every cell visits each of its edges (or sub-edges, where the neighbour is finer) and
                // keeps half: each cell's indicator is computed where the cell is owned.
                const bool periodic = cell->at_boundary(f);
                const auto neighbor = cell->neighbor_or_periodic_neighbor(f);
                if (neighbor->has_children())
                  {
                    const unsigned int nf = periodic ? cell->periodic_neighbor_face_no(f) : cell->neighbor_face_no(f);
                    for (unsigned int sf = 0; sf < cell->face(f)->n_children(); ++sf)
                      {
                        const auto child = periodic ? cell->periodic_neighbor_child_on_subface(f, sf)
                                                    : cell->neighbor_child_on_subface(f, sf);
                        fiv.reinit(cell, f, sf, child, nf, numbers::invalid_unsigned_int);
                        add_half_of_edge(cell, fiv, child->face(nf)->measure());
                      }
                    continue;
                  }
                unsigned int nf = 0, nsf = numbers::invalid_unsigned_int;
                if (neighbor->level() < cell->level())
                  std::tie(nf, nsf) = periodic ? cell->periodic_neighbor_of_coarser_periodic_neighbor(f)
                                               : cell->neighbor_of_coarser_neighbor(f);
                else
                  nf = periodic ? cell->periodic_neighbor_face_no(f) : cell->neighbor_face_no(f);
                fiv.reinit(cell, f, numbers::invalid_unsigned_int, neighbor, nf, nsf);
                add_half_of_edge(cell, fiv, h_e);
              }
          }
      }

      void add_half_of_edge(const DoFHandler<2>::active_cell_iterator &cell, const FEInterfaceValues<2> &fiv,
                            double h_e)
      {
        const auto      &normals = fiv.get_normal_vectors();
        const Resultants a       = resultants_on(fiv.get_fe_face_values(0), state_, model_, base_strain_, normals);
        const Resultants b       = resultants_on(fiv.get_fe_face_values(1), state_, model_, base_strain_, normals);
        out_.jumps(cell->active_cell_index()) += 0.5 * edge_term(a, b, fiv, h_e);
      }

      const SheetSystem   &system_;
      const SheetModel    &model_;
      const Vector        &state_;
      const LoadLevel      level_;
      const SymTensor      base_strain_;
      const double         weight_membrane_, weight_bending_;
      CellErrorIndicators  out_;
    };
  } // namespace

  CellErrorIndicators estimate_cell_errors(const SheetSystem &system, const Vector &state, const LoadLevel &level)
  {
    system.require_ghosted(state);
    return Estimator(system, state, level).run();
  }
} // namespace nappe
