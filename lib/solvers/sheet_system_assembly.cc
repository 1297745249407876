// Assembly of the sheet energy, its gradient and its Hessian (see sheet_system.h for the form).
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_interface_values.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/full_matrix.h>
#include <deal.II/lac/sparsity_tools.h>
#include <deal.II/lac/vector.h>

#include <nappe/physics/fvk_kinematics.h>
#include <nappe/solvers/sheet_system.h>

#include <tuple>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    const FEValuesExtractors::Vector in_plane(0);
    const FEValuesExtractors::Scalar deflection(2);
    constexpr unsigned int w_component = 2;
  } // namespace

  namespace
  {
    /// Adds |local| to the magnitude vector (if requested).
    void add_magnitude(const AffineConstraints<double> &constraints, const dealii::Vector<double> &local,
                       const std::vector<types::global_dof_index> &dofs, Vector *magnitude)
    {
      if (!magnitude)
        return;
      dealii::Vector<double> absolute(local.size());
      for (unsigned int i = 0; i < local.size(); ++i)
        absolute(i) = std::abs(local(i));
      constraints.distribute_local_to_global(absolute, dofs, *magnitude);
    }
  } // namespace

  EnergyParts SheetSystem::assemble_parts(const Vector &state, const LoadLevel &level, Vector *residual,
                                          SparseMatrix *hessian, Vector *magnitude) const
  {
    require_ghosted(state);
    if (magnitude)
      *magnitude = 0.0;
    if (residual)
      *residual = 0.0;
    if (hessian)
      *hessian = 0.0;
    EnergyParts parts;
    assemble_cells(state, level, residual, hessian, magnitude, parts);
    assemble_edges(state, residual, nullptr, magnitude, parts); // their Hessian is edge_operator()
    assemble_point_loads(state, level.load, residual, parts);
    if (residual)
      residual->compress(VectorOperation::add);
    if (hessian)
      {
        hessian->compress(VectorOperation::add);
        hessian->add(1.0, edge_operator());
      }
    if (magnitude)
      magnitude->compress(VectorOperation::add);
    parts.stretching    = Utilities::MPI::sum(parts.stretching, comm_);
    parts.bending       = Utilities::MPI::sum(parts.bending, comm_);
    parts.substrate     = Utilities::MPI::sum(parts.substrate, comm_);
    parts.external_work = Utilities::MPI::sum(parts.external_work, comm_);
    return parts;
  }

  void SheetSystem::assemble_cells(const Vector &state, const LoadLevel &level, Vector *residual,
                                   SparseMatrix *hessian, Vector *magnitude, EnergyParts &parts) const
  {
    const unsigned int p = model_.discretization.degree;
    const QGauss<2>    quadrature(p + 1);
    FEValues<2>        fv(*mapping_, fe_, quadrature,
                   update_values | update_gradients | update_hessians | update_quadrature_points |
                     update_JxW_values);
    const unsigned int n_q = quadrature.size(), n_dofs = fe_.n_dofs_per_cell();

    const SheetMaterial &mat       = model_.material;
    const bool           nonlinear = model_.geometric_nonlinearity;
    const SymTensor      base_strain = model_.base_strain(level.load);
    const double         pressure    = level.load * model_.loads.pressure;

    std::vector<Tensor<2, 2>> grad_u(n_q), hess_w(n_q);
    std::vector<Tensor<1, 2>> grad_w(n_q);
    std::vector<double>       w(n_q);
    std::vector<SymTensor>    d_strain(n_dofs), d_stress(n_dofs), d_curv(n_dofs), d_moment(n_dofs);
    std::vector<Tensor<1, 2>> d_grad_w(n_dofs);
    std::vector<double>       d_w(n_dofs);
    FullMatrix<double>        cell_matrix(n_dofs, n_dofs);
    dealii::Vector<double>    cell_rhs(n_dofs);
    std::vector<types::global_dof_index> dofs(n_dofs);
    std::vector<double>       cell_state(n_dofs); // read from the distributed vector once per cell

    // An in-plane dof varies only the strain; a w dof varies strain, slope, curvature and gap. The
    // loops skip the products that vanish identically, so the sums are the full ones to the last bit.
    std::vector<unsigned int> u_dofs, w_dofs;
    for (unsigned int i = 0; i < n_dofs; ++i)
      (fe_.system_to_component_index(i).first == w_component ? w_dofs : u_dofs).push_back(i);
    const auto &u_view = fv[in_plane];
    const auto &w_view = fv[deflection];

    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fv.reinit(cell);
        cell->get_dof_values(state, cell_state.begin(), cell_state.end());
        u_view.get_function_gradients_from_local_dof_values(cell_state, grad_u);
        w_view.get_function_gradients_from_local_dof_values(cell_state, grad_w);
        w_view.get_function_hessians_from_local_dof_values(cell_state, hess_w);
        w_view.get_function_values_from_local_dof_values(cell_state, w);
        cell_matrix = 0;
        cell_rhs    = 0;
        for (unsigned int q = 0; q < n_q; ++q)
          {
            const double    dA     = fv.JxW(q);
            const SymTensor strain    = membrane_strain(base_strain, grad_u[q], grad_w[q], nonlinear);
            const SymTensor stress    = membrane_stress(strain, mat);
            const SymTensor curvature = symmetrize(hess_w[q]);
            const SymTensor moment    = bending_moment(curvature, mat);
            double          psi = 0.0, dpsi = 0.0, d2psi = 0.0;
            if (model_.substrate)
              {
                model_.substrate->evaluate(fv.quadrature_point(q), w[q], psi, dpsi, d2psi);
                psi *= level.adhesion;
                dpsi *= level.adhesion;
                d2psi *= level.adhesion;
              }

            parts.stretching += 0.5 * (stress * strain) * dA;
            parts.bending += 0.5 * (moment * curvature) * dA;
            parts.substrate += psi * dA;
            parts.external_work += pressure * w[q] * dA;
            if (!residual)
              continue;

            for (const unsigned int i : u_dofs)
              {
                d_strain[i] = u_view.symmetric_gradient(i, q);
                cell_rhs(i) += (stress * d_strain[i]) * dA;
              }
            for (const unsigned int i : w_dofs)
              {
                d_grad_w[i] = w_view.gradient(i, q);
                d_w[i]      = w_view.value(i, q);
                d_strain[i] = nonlinear ? symmetric_outer(grad_w[q], d_grad_w[i]) : SymTensor();
                d_curv[i]   = symmetrize(w_view.hessian(i, q));
                cell_rhs(i) += (stress * d_strain[i] + moment * d_curv[i] + (dpsi - pressure) * d_w[i]) * dA;
              }
            if (!hessian)
              continue;
            for (unsigned int j = 0; j < n_dofs; ++j)
              d_stress[j] = membrane_stress(d_strain[j], mat);
            for (const unsigned int j : w_dofs)
              d_moment[j] = bending_moment(d_curv[j], mat);
            for (const unsigned int i : u_dofs)
              for (unsigned int j = 0; j < n_dofs; ++j)
                cell_matrix(i, j) += (d_strain[i] * d_stress[j]) * dA;
            for (const unsigned int i : w_dofs)
              {
                for (const unsigned int j : u_dofs)
                  cell_matrix(i, j) += (d_strain[i] * d_stress[j]) * dA;
                const Tensor<1, 2> stress_grad_wi = stress * d_grad_w[i];
                for (const unsigned int j : w_dofs)
                  {
                    double k = d_strain[i] * d_stress[j] + d_curv[i] * d_moment[j] + d2psi * d_w[i] * d_w[j];
                    if (nonlinear)
                      k += stress_grad_wi * d_grad_w[j];
                    cell_matrix(i, j) += k * dA;
                  }
              }
          }
        if (!residual)
          continue;
        cell->get_dof_indices(dofs);
        if (hessian)
          constraints_.distribute_local_to_global(cell_matrix, cell_rhs, dofs, *hessian, *residual);
        else
          constraints_.distribute_local_to_global(cell_rhs, dofs, *residual);
        add_magnitude(constraints_, cell_rhs, dofs, magnitude);
      }
  }

  // The C0 interior penalty terms: each interior or periodic edge once (by the cell with the smaller
  // id, or the smaller subdomain across ranks; between cells of different levels by the finer one,
  // sub-edge by sub-edge), and the clamped boundary edges.
  std::vector<SheetSystem::EdgeTerms> SheetSystem::evaluate_edge_terms() const
  {
    const unsigned int p = model_.discretization.degree;
    const QGauss<1>    quadrature(p + 1);
    FEInterfaceValues<2> fiv(*mapping_, fe_, quadrature,
                             update_values | update_gradients | update_hessians | update_quadrature_points |
                               update_JxW_values | update_normal_vectors);
    const SheetMaterial &mat     = model_.material;
    const double         penalty = model_.discretization.penalty_factor * p * (p + 1) * mat.bending_rigidity;

    auto clamped = [&](types::boundary_id id) {
      const auto it = model_.edges.find(id);
      return it != model_.edges.end() && it->second.deflection == DeflectionCondition::clamped;
    };

    std::vector<EdgeTerms> edges;
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        for (const unsigned int f : cell->face_indices())
          {
            double h = cell->measure() / cell->face(f)->measure();
            if (cell->at_boundary(f) && !cell->has_periodic_neighbor(f))
              {
                if (!clamped(cell->face(f)->boundary_id()))
                  continue;
                fiv.reinit(cell, f);
              }
            else
              {
                const bool periodic = cell->at_boundary(f);
                const auto neighbor = cell->neighbor_or_periodic_neighbor(f);
                if (neighbor->has_children())
                  continue; // each finer neighbour integrates its part of the edge
                unsigned int nf = 0, nsf = numbers::invalid_unsigned_int;
                if (neighbor->level() < cell->level())
                  std::tie(nf, nsf) = periodic ? cell->periodic_neighbor_of_coarser_periodic_neighbor(f)
                                               : cell->neighbor_of_coarser_neighbor(f);
                else
                  {
                    if (neighbor->is_locally_owned() ? !(cell->id() < neighbor->id())
                                                     : cell->subdomain_id() > neighbor->subdomain_id())
                      continue;
                    nf = periodic ? cell->periodic_neighbor_face_no(f) : cell->neighbor_face_no(f);
                  }
                h = std::min(h, neighbor->measure() / neighbor->face(nf)->measure());
                fiv.reinit(cell, f, numbers::invalid_unsigned_int, neighbor, nf, nsf);
              }

            // Only the w interface dofs enter the edge terms.
            EdgeTerms                edge;
            std::vector<unsigned int> w_dofs;
            const auto              &interface_dofs = fiv.get_interface_dof_indices();
            for (unsigned int k = 0; k < fiv.n_current_interface_dofs(); ++k)
              {
                const auto local = fiv.interface_dof_to_dof_indices(k);
                const auto side  = local[0] != numbers::invalid_unsigned_int ? 0 : 1;
                if (fe_.system_to_component_index(local[side]).first == w_component)
                  {
                    w_dofs.push_back(k);
                    edge.dofs.push_back(interface_dofs[k]);
                  }
              }
            edge.penalty_over_h = penalty / h;
            for (const unsigned int q : fiv.quadrature_point_indices())
              {
                const Tensor<1, 2> &normal = fiv.normal(q);
                for (const unsigned int k : w_dofs)
                  {
                    edge.slope_jump.push_back(fiv[deflection].jump_in_gradients(k, q) * normal);
                    edge.normal_moment.push_back(
                      normal * (bending_moment(dealii::symmetrize(fiv[deflection].average_of_hessians(k, q)), mat) *
                                normal));
                  }
                edge.weights.push_back(fiv.JxW(q));
              }
            edges.push_back(std::move(edge));
          }
      }
    return edges;
  }

  const std::vector<SheetSystem::EdgeTerms> &SheetSystem::edge_terms() const
  {
    if (!edge_terms_ready_)
      {
        edge_terms_       = evaluate_edge_terms();
        edge_terms_ready_ = true;
      }
    return edge_terms_;
  }

  const SparseMatrix &SheetSystem::edge_operator() const
  {
    if (!edge_operator_)
      {
        // Its own pattern, the w–w couplings of the edges (a part of the Hessian's, far smaller than it).
        DynamicSparsityPattern dsp(relevant_dofs_);
        for (const EdgeTerms &edge : edge_terms())
          {
            constraints_.add_entries_local_to_global(edge.dofs, dsp, false);
            for (const auto i : edge.dofs)
              dsp.add(i, i); // the diagonal placeholders of constrained rows
          }
        SparsityTools::distribute_sparsity_pattern(dsp, owned_dofs_, comm_, relevant_dofs_);
        auto K = std::make_unique<SparseMatrix>();
        K->reinit(owned_dofs_, owned_dofs_, dsp, comm_);
        Vector scratch = make_owned_vector();
        EnergyParts unused;
        assemble_edges(make_ghosted_vector(), &scratch, K.get(), nullptr, unused);
        K->compress(VectorOperation::add);
        edge_operator_ = std::move(K);
      }
    return *edge_operator_;
  }

  void SheetSystem::assemble_edges(const Vector &state, Vector *residual, SparseMatrix *hessian,
                                   Vector *magnitude, EnergyParts &parts) const
  {
    std::vector<double>    U;
    FullMatrix<double>     edge_matrix;
    dealii::Vector<double> edge_rhs;
    for (const EdgeTerms &edge : edge_terms())
      {
        const unsigned int n = edge.dofs.size();
        U.resize(n);
        for (unsigned int a = 0; a < n; ++a)
          U[a] = state(edge.dofs[a]);
        edge_matrix.reinit(hessian ? n : 0, hessian ? n : 0);
        edge_rhs.reinit(n);
        for (unsigned int q = 0; q < edge.weights.size(); ++q)
          {
            const double *jump_n = &edge.slope_jump[q * n], *moment_nn = &edge.normal_moment[q * n];
            double        w_jump = 0.0, w_moment = 0.0;
            for (unsigned int a = 0; a < n; ++a)
              {
                w_jump += U[a] * jump_n[a];
                w_moment += U[a] * moment_nn[a];
              }
            const double dL = edge.weights[q], penalty_h = edge.penalty_over_h;
            parts.bending += (-w_moment * w_jump + 0.5 * penalty_h * w_jump * w_jump) * dL;
            if (!residual)
              continue;
            for (unsigned int a = 0; a < n; ++a)
              {
                edge_rhs(a) += (-moment_nn[a] * w_jump - w_moment * jump_n[a] + penalty_h * w_jump * jump_n[a]) * dL;
                if (hessian)
                  for (unsigned int b = 0; b < n; ++b)
                    edge_matrix(a, b) +=
                      (-moment_nn[a] * jump_n[b] - moment_nn[b] * jump_n[a] + penalty_h * jump_n[a] * jump_n[b]) * dL;
              }
          }
        if (!residual)
          continue;
        if (hessian)
          constraints_.distribute_local_to_global(edge_matrix, edge_rhs, edge.dofs, *hessian, *residual);
        else
          constraints_.distribute_local_to_global(edge_rhs, edge.dofs, *residual);
        add_magnitude(constraints_, edge_rhs, edge.dofs, magnitude);
      }
  }

  void SheetSystem::assemble_point_loads(const Vector &state, double load_factor, Vector *residual,
                                         EnergyParts &parts) const
  {
    for (const auto &load : point_loads_)
      {
        if (load->dofs.empty())
          continue;
        const double force = load_factor * load->force;
        dealii::Vector<double> local(load->dofs.size());
        double                 w = 0.0;
        for (unsigned int i = 0; i < load->dofs.size(); ++i)
          {
            w += state(load->dofs[i]) * load->w_shape_values[i];
            local(i) = -force * load->w_shape_values[i];
          }
        parts.external_work += force * w;
        if (residual)
          constraints_.distribute_local_to_global(local, load->dofs, *residual);
      }
  }
} // namespace nappe
