#include <deal.II/base/quadrature_lib.h>
#include <deal.II/distributed/solution_transfer.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_interface_values.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping_cartesian.h>
#include <deal.II/fe/mapping_q.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/sparsity_tools.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/base/message_number.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/fvk_kinematics.h>
#include <nappe/solvers/sheet_system.h>

#include <limits>
#include <sstream>
#include <tuple>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    const FEValuesExtractors::Vector in_plane(0);
    const FEValuesExtractors::Scalar deflection(2);


    bool supports_deflection(const EdgeCondition &e) { return e.deflection != DeflectionCondition::free; }

    /// The mesh vertex nearest to @p target among those passing @p accept(cell, vertex), agreed on by all
    /// ranks (ties broken by the smaller x, then y). Throws if no rank has such a vertex.
    template <class Accept>
    Point<2> agreed_vertex(const DoFHandler<2> &dofs, const Point<2> &target, Accept &&accept, MPI_Comm comm)
    {
      double   best = std::numeric_limits<double>::max();
      Point<2> best_point;
      for (const auto &cell : dofs.active_cell_iterators())
        if (cell->is_locally_owned())
          for (const unsigned int v : cell->vertex_indices())
            if (accept(cell, v) && cell->vertex(v).distance(target) < best)
              {
                best       = cell->vertex(v).distance(target);
                best_point = cell->vertex(v);
              }
      const double global_best = Utilities::MPI::min(best, comm);
      AssertThrow(global_best < std::numeric_limits<double>::max(),
                  ExcMessage("No mesh vertex is available to pin a rigid-body mode."));
      // Coordinates are in metres: the tolerance must scale with the mesh, not be an absolute 1e-9.
      const double tol = 1e-9 * (target.norm() + global_best);
      const double big = std::numeric_limits<double>::max();
      const bool   mine = best <= global_best + tol;
      const double x    = Utilities::MPI::min(mine ? best_point[0] : big, comm);
      const double y =
        Utilities::MPI::min(mine && std::abs(best_point[0] - x) <= tol ? best_point[1] : big, comm);
      return Point<2>(x, y);
    }

    /**
     * FEInterfaceValues (used by the edge terms) evaluates the two sides of a face at the same
     * quadrature points only if both cells parametrise the face in the same direction. That holds
     * for deal.II's own meshes and for interior faces of any consistently ordered 2D mesh, but a
     * periodic face pair of a Gmsh mesh may be traversed in opposite directions. Checks, once per
     * face at setup (the assembly loop stays untouched), that the points of the two sides coincide,
     * or differ by the lattice vector on periodic faces, to 1e-8 of the face length. Collective:
     * throws on every rank if any rank finds a mismatch.
     */
    void check_interface_quadrature(const DoFHandler<2> &dofs, const Mapping<2> &mapping, const FiniteElement<2> &fe,
                                    unsigned int n_points, const SheetDomain &domain, MPI_Comm comm)
    {
      FEInterfaceValues<2> fiv(mapping, fe, QGauss<1>(n_points), update_quadrature_points);
      Tensor<1, 2>         a1, a2;
      if (domain.periodic)
        std::tie(a1, a2) = domain.lattice_vectors();
      std::string problem;
      for (const auto &cell : dofs.active_cell_iterators())
        {
          if (!cell->is_locally_owned() || !problem.empty())
            continue;
          for (const unsigned int f : cell->face_indices())
            {
              const bool periodic = cell->at_boundary(f) && cell->has_periodic_neighbor(f);
              if (cell->at_boundary(f) && !periodic)
                continue;
              const auto neighbor = cell->neighbor_or_periodic_neighbor(f);
              if (!neighbor->is_active() || neighbor->level() != cell->level())
                continue; // reported by the assembly as a non-conforming mesh
              const unsigned int nf = periodic ? cell->periodic_neighbor_face_no(f) : cell->neighbor_face_no(f);
              fiv.reinit(cell, f, numbers::invalid_unsigned_int, neighbor, nf, numbers::invalid_unsigned_int);
              Tensor<1, 2> offset; // x_neighbor − x_cell expected at every point
              if (periodic)
                switch (cell->face(f)->boundary_id())
                  {
                    case 0: offset = a1; break;
                    case 1: offset = -a1; break;
                    case 2: offset = a2; break;
                    default: offset = -a2; break;
                  }
              const double tol = 1e-8 * cell->face(f)->measure();
              for (const unsigned int q : fiv.quadrature_point_indices())
                {
                  const Point<2> &here  = fiv.get_fe_face_values(0).quadrature_point(q);
                  const Point<2> &there = fiv.get_fe_face_values(1).quadrature_point(q);
                  if ((there - here - offset).norm() > tol)
                    {
                      std::ostringstream msg;
                      msg << "The quadrature points on the two sides of the " << (periodic ? "periodic " : "")
                          << "edge at (" << here[0] << ", " << here[1] << ") m do not coincide"
                          << (periodic ? " up to the lattice vector" : "") << " (other side at (" << there[0] << ", "
                          << there[1] << ") m): the mesh faces are inconsistently oriented"
                          << (domain.shape == SheetDomain::Shape::mesh_file ? " in '" + domain.mesh_file + "'" : "")
                          << ". The C0 interior penalty terms need both cells of an edge to run along it in the "
                             "same direction; for a periodic Gmsh mesh, mesh the opposite edges with 'Periodic "
                             "Curve' and the same curve direction, or use a structured (Transfinite) boundary layer.";
                      problem = msg.str();
                      break;
                    }
                }
              if (!problem.empty())
                break;
            }
        }
      const bool any = Utilities::MPI::max(problem.empty() ? 0u : 1u, comm) > 0;
      AssertThrow(!any, ExcMessage(problem.empty() ? "The mesh faces are inconsistently oriented on another rank: "
                                                     "quadrature points on the two sides of an edge do not coincide."
                                                   : problem));
    }

    // Every cell an axis-parallel rectangle (a rectangular cell and its refinements): the Cartesian
    // mapping gives the same values and derivatives as the bilinear one at a fraction of the cost.
    std::unique_ptr<Mapping<2>> make_mapping(const Triangulation<2> &tria, MPI_Comm comm)
    {
      unsigned int skewed = 0;
      for (const auto &cell : tria.active_cell_iterators())
        {
          if (cell->is_artificial())
            continue;
          const double     tolerance = 1e-12 * cell->diameter();
          const Tensor<1, 2> along_x = cell->vertex(1) - cell->vertex(0), along_y = cell->vertex(2) - cell->vertex(0);
          const Tensor<1, 2> across  = cell->vertex(3) - cell->vertex(0);
          if (std::abs(along_x[1]) > tolerance || std::abs(along_y[0]) > tolerance || along_x[0] <= 0 ||
              along_y[1] <= 0 || (across - along_x - along_y).norm() > tolerance)
            ++skewed;
        }
      if (Utilities::MPI::max(skewed, comm) == 0)
        return std::make_unique<MappingCartesian<2>>();
      return std::make_unique<MappingQ<2>>(1);
    }
  } // namespace

  SheetSystem::SheetSystem(const SheetModel &model, const SheetDomain &domain, MPI_Comm comm)
    : model_(model)
    , domain_(domain)
    , comm_(comm)
    , tria_(comm)
    , fe_(FE_Q<2>(model.discretization.degree), 3) // one base element: what the multilevel transfer requires
  {
    AssertThrow(model.discretization.degree >= 2,
                ExcMessage("Element degree must be at least 2 for the C0 interior penalty bending term; got " +
                           std::to_string(model.discretization.degree) + "."));
    AssertThrow(model.discretization.penalty_factor > 0.0, ExcMessage("The penalty factor must be positive."));
    AssertThrow(model.material.youngs_modulus_2d >= 0.0 && model.material.bending_rigidity >= 0.0,
                ExcMessage("Y and D must be non-negative."));
    AssertThrow(model.material.poisson_ratio > -1.0 && model.material.poisson_ratio < 0.5 + 1e-12,
                ExcMessage("Poisson's ratio must lie in (-1, 0.5]."));
    if (domain_.shape == SheetDomain::Shape::mesh_file)
      {
        // The rest of the solver reads the domain's size from length_x/length_y (e.g. as a length
        // scale); for a mesh file these are the sides of its bounding box.
        const auto [lower, upper] = domain_.bounding_box();
        domain_.length_x          = upper[0] - lower[0];
        domain_.length_y          = upper[1] - lower[1];
      }
    make_sheet_mesh(tria_, domain_);
    mapping_ = make_mapping(tria_, comm_);
    for (const auto &[id, edge] : model_.edges)
      AssertThrow(!domain_.periodic || id > 3,
                  ExcMessage("Boundary id " + std::to_string(id) +
                             " of a periodic cell is periodic and cannot carry an edge condition."));
    setup_dofs();
    check_interface_quadrature(dof_handler_, *mapping_, fe_, model_.discretization.degree + 1, domain_, comm_);
    setup_constraints();
    setup_sparsity();
    locate_point_loads();
  }

  SheetSystem::~SheetSystem() { dof_handler_.clear(); }

  types::global_dof_index SheetSystem::n_dofs() const { return dof_handler_.n_dofs(); }

  void SheetSystem::setup_dofs()
  {
    dof_handler_.reinit(tria_);
    dof_handler_.distribute_dofs(fe_);
    owned_dofs_ = dof_handler_.locally_owned_dofs();
    DoFTools::extract_locally_relevant_dofs(dof_handler_, relevant_dofs_);
    split_between_ranks_ = Utilities::MPI::max(relevant_dofs_.n_elements() > owned_dofs_.n_elements() ? 1 : 0, comm_) == 1;
  }

  void SheetSystem::setup_constraints()
  {
    constraints_.clear();
    constraints_.reinit(relevant_dofs_);
    DoFTools::make_hanging_node_constraints(dof_handler_, constraints_);
    if (domain_.periodic)
      {
        const auto [a1, a2] = domain_.lattice_vectors();
        std::vector<GridTools::PeriodicFacePair<DoFHandler<2>::cell_iterator>> pairs;
        GridTools::collect_periodic_faces(dof_handler_, 0, 1, 0, pairs, a1);
        GridTools::collect_periodic_faces(dof_handler_, 2, 3, 1, pairs, a2);
        DoFTools::make_periodicity_constraints<2, 2>(pairs, constraints_);
      }
    const Functions::ZeroFunction<2> zero(3);
    for (const auto &[id, edge] : model_.edges)
      {
        if (supports_deflection(edge))
          VectorTools::interpolate_boundary_values(*mapping_, dof_handler_, id, zero, constraints_,
                                                   fe_.component_mask(deflection));
        if (edge.in_plane == InPlaneCondition::fixed)
          VectorTools::interpolate_boundary_values(*mapping_, dof_handler_, id, zero, constraints_,
                                                   fe_.component_mask(in_plane));
      }
    pin_rigid_modes();
    constraints_.close();
  }

  // Removes the modes the energy does not see: in-plane translations (and, for a sheet with no
  // fixed edge, the in-plane rotation) and, without supports or substrate, the vertical translation.
  void SheetSystem::pin_rigid_modes()
  {
    bool any_fixed = false, any_support = false;
    for (const auto &[id, edge] : model_.edges)
      {
        any_fixed |= edge.in_plane == InPlaneCondition::fixed;
        any_support |= supports_deflection(edge);
      }
    const Point<2> center = domain_.center();
    const auto     box    = domain_.bounding_box();
    // Exactly one vertex: the tolerance is a tiny fraction of the domain (coordinates are in metres;
    // an absolute tolerance of 1e-9 m would pin every vertex within 1 nm and clamp a patch).
    const double   same_vertex = 1e-9 * box.first.distance(box.second);
    auto pin = [&](const Point<2> &p, std::vector<unsigned int> components) {
      for (const auto &cell : dof_handler_.active_cell_iterators())
        if (!cell->is_artificial())
          for (const unsigned int v : cell->vertex_indices())
            if (cell->vertex(v).distance(p) < same_vertex)
              for (const unsigned int c : components)
                {
                  const auto dof = cell->vertex_dof_index(v, c);
                  if (relevant_dofs_.is_element(dof) && !constraints_.is_constrained(dof))
                    constraints_.add_line(dof);
                }
    };
    // A hanging vertex of an adapted mesh (or one already held by an edge) cannot carry a pin.
    auto free_for = [&](std::vector<unsigned int> components) {
      return [this, components](const auto &cell, unsigned int v) {
        for (const unsigned int c : components)
          if (constraints_.is_constrained(cell->vertex_dof_index(v, c)))
            return false;
        return true;
      };
    };
    if (!any_fixed)
      {
        const Point<2> anchor = agreed_vertex(dof_handler_, center, free_for({0, 1}), comm_);
        pin(anchor, {0, 1});
        if (!domain_.periodic)
          {
            // The farthest vertex on the line y = y_anchor fixes the rotation about the anchor.
            const double extent = domain_.shape == SheetDomain::Shape::disk ? domain_.radius : domain_.length_x;
            const Point<2> far(anchor[0] + 2.0 * extent, anchor[1]);
            const double   tol = 1e-9 * extent;
            // An unstructured mesh file may have no vertex on that line; any vertex to the right
            // of the anchor also fixes the rotation.
            const bool     unstructured = domain_.shape == SheetDomain::Shape::mesh_file;
            const auto     free_y       = free_for({1});
            const Point<2> second       = agreed_vertex(
              dof_handler_, far,
              [&](const auto &cell, unsigned int v) {
                const Point<2> &x = cell->vertex(v);
                return (unstructured || std::abs(x[1] - anchor[1]) < tol) && x[0] > anchor[0] + tol &&
                       free_y(cell, v);
              },
              comm_);
            pin(second, {1});
          }
      }
    if (!any_support && !model_.substrate)
      pin(agreed_vertex(dof_handler_, center, free_for({2}), comm_), {2});
  }

  void SheetSystem::setup_sparsity()
  {
    DynamicSparsityPattern dsp(relevant_dofs_);
    DoFTools::make_sparsity_pattern(dof_handler_, dsp, constraints_, false,
                                    Utilities::MPI::this_mpi_process(comm_));
    // Edge terms couple the w dofs of the two cells sharing an edge.
    std::vector<types::global_dof_index> here(fe_.n_dofs_per_cell()), there(fe_.n_dofs_per_cell());
    std::vector<types::global_dof_index> coupled;
    for (const auto &cell : dof_handler_.active_cell_iterators())
      if (cell->is_locally_owned())
        for (const unsigned int f : cell->face_indices())
          {
            if (cell->at_boundary(f) && !cell->has_periodic_neighbor(f))
              continue;
            const auto neighbor = cell->neighbor_or_periodic_neighbor(f);
            if (neighbor->has_children())
              continue; // its children couple to this cell from their side
            cell->get_dof_indices(here);
            neighbor->get_dof_indices(there);
            coupled.clear();
            for (unsigned int i = 0; i < fe_.n_dofs_per_cell(); ++i)
              if (fe_.system_to_component_index(i).first == 2)
                {
                  coupled.push_back(here[i]);
                  coupled.push_back(there[i]);
                }
            constraints_.add_entries_local_to_global(coupled, dsp, false);
          }
    SparsityTools::distribute_sparsity_pattern(dsp, owned_dofs_, comm_, relevant_dofs_);
    hessian_.reinit(owned_dofs_, owned_dofs_, dsp, comm_);
    edge_terms_.clear();
    edge_terms_ready_ = false;
    edge_operator_.reset();
  }

  void SheetSystem::adapt(Vector &state)
  {
    Vector ghosted = make_ghosted_vector();
    ghosted        = state;
    parallel::distributed::SolutionTransfer<2, Vector> transfer(dof_handler_);
    tria_.prepare_coarsening_and_refinement();
    transfer.prepare_for_coarsening_and_refinement(ghosted);
    tria_.execute_coarsening_and_refinement();
    setup_dofs();
    state = make_owned_vector();
    transfer.interpolate(state);
    setup_constraints();
    constraints_.distribute(state);
    setup_sparsity();
    point_loads_.clear();
    locate_point_loads();
  }

  bool SheetSystem::uniform_mesh() const
  {
    int lowest = std::numeric_limits<int>::max(), highest = 0;
    for (const auto &cell : tria_.active_cell_iterators())
      if (cell->is_locally_owned())
        {
          lowest  = std::min(lowest, cell->level());
          highest = std::max(highest, cell->level());
        }
    return Utilities::MPI::min(lowest, comm_) == Utilities::MPI::max(highest, comm_);
  }

  // The w shape functions at @p p on exactly one rank (the lowest that owns a cell containing it);
  // empty on the others.
  SheetSystem::PointEvaluation SheetSystem::evaluate_at(const Point<2> &p) const
  {
    const unsigned int rank    = Utilities::MPI::this_mpi_process(comm_);
    const unsigned int n_ranks = Utilities::MPI::n_mpi_processes(comm_);
    std::pair<DoFHandler<2>::active_cell_iterator, Point<2>> found;
    bool here = false;
    try
      {
        found = GridTools::find_active_cell_around_point(*mapping_, dof_handler_, p);
        here  = found.first.state() == IteratorState::valid && found.first->is_locally_owned();
      }
    catch (const std::exception &)
      {
      }
    const unsigned int owner = Utilities::MPI::min(here ? rank : n_ranks, comm_);
    AssertThrow(owner < n_ranks, ExcMessage("The point (" + message_number(p[0] / 1e-9) + ", " +
                                            message_number(p[1] / 1e-9) + ") nm lies outside the sheet."));
    PointEvaluation eval;
    if (owner == rank)
      {
        eval.dofs.resize(fe_.n_dofs_per_cell());
        found.first->get_dof_indices(eval.dofs);
        for (unsigned int i = 0; i < fe_.n_dofs_per_cell(); ++i)
          eval.w_shape_values.push_back(
            fe_.system_to_component_index(i).first == 2 ? fe_.shape_value(i, found.second) : 0.0);
      }
    return eval;
  }

  void SheetSystem::locate_point_loads()
  {
    for (const PointLoad &load : model_.loads.point_loads)
      {
        auto eval   = std::make_unique<PointEvaluation>(evaluate_at(load.location));
        eval->force = load.force;
        point_loads_.push_back(std::move(eval));
      }
  }

  double SheetSystem::deflection_at(const Vector &state, const Point<2> &p) const
  {
    require_ghosted(state);
    const PointEvaluation eval = evaluate_at(p);
    double                w    = 0.0;
    for (unsigned int i = 0; i < eval.dofs.size(); ++i)
      w += state(eval.dofs[i]) * eval.w_shape_values[i];
    return Utilities::MPI::sum(w, comm_);
  }

  double SheetSystem::physical_force_scale(const LoadLevel &level) const
  {
    const double L     = std::sqrt(domain_.area());
    const auto  &m     = model_.material;
    double       scale = L * m.youngs_modulus_2d * 1e-3 + m.bending_rigidity / L;
    if (const AdhesionPotential *a = model_.adhesion())
      scale += L * level.adhesion * a->law().work_of_adhesion();
    else if (model_.substrate)
      return std::numeric_limits<double>::infinity();
    scale += level.load * std::abs(model_.loads.pressure) * L * L;
    for (const auto &f : model_.loads.point_loads)
      scale += level.load * std::abs(f.force);
    return scale;
  }

  Vector SheetSystem::make_owned_vector() const { return Vector(owned_dofs_, comm_); }

  Vector SheetSystem::make_ghosted_vector() const { return Vector(owned_dofs_, relevant_dofs_, comm_); }

  void SheetSystem::require_ghosted(const Vector &state) const
  {
    AssertThrow(state.size() == n_dofs(),
                ExcMessage("A sheet state of " + std::to_string(state.size()) + " entries was passed to a system of " +
                           std::to_string(n_dofs()) + " unknowns (a state of another mesh?)."));
    AssertThrow(!split_between_ranks_ || state.has_ghost_elements(),
                ExcMessage("A sheet state without ghost entries was passed where cells read it on a mesh split "
                           "between ranks: copy the owned state into make_ghosted_vector() (ghosted = owned; not "
                           "ghosted = a returned vector, which replaces the ghosted layout)."));
  }

  EnergyParts SheetSystem::energy(const Vector &state, const LoadLevel &level) const
  {
    return assemble_parts(state, level, nullptr, nullptr, nullptr);
  }

  EnergyParts SheetSystem::assemble(const Vector &state, const LoadLevel &level, Vector &residual,
                                    SparseMatrix *hessian, Vector *force_magnitude) const
  {
    return assemble_parts(state, level, &residual, hessian, force_magnitude);
  }
} // namespace nappe
