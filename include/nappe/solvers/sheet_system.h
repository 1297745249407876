#pragma once

#include <deal.II/base/index_set.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/fe_system.h>
#include <deal.II/fe/mapping_q.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_vector.h>

#include <nappe/geometry/sheet_domain.h>
#include <nappe/physics/sheet_model.h>

#include <memory>

namespace nappe
{
  using Vector       = dealii::TrilinosWrappers::MPI::Vector;
  using SparseMatrix = dealii::TrilinosWrappers::SparseMatrix;

  /// The sheet's energy split by origin [J]. External work enters the total with a minus sign.
  struct EnergyParts
  {
    double stretching = 0.0; ///< ½∫N:ε dA
    double bending    = 0.0; ///< ½∫M:κ dA plus the interior-penalty edge terms
    double substrate  = 0.0; ///< ∫ψ(x, w) dA (adhesion)
    double external_work = 0.0; ///< ∫p·w dA + Σ F·w(x_F)

    double total() const { return stretching + bending + substrate - external_work; }
  };

  /**
   * The discrete Föppl–von Kármán sheet: the finite element space (u, w) ∈ Q_p² × Q_p on a
   * distributed mesh, the constraints from edges, periodicity and pinned rigid modes, and the
   * assembly of energy, residual (its gradient) and Hessian.
   *
   * Bending uses the symmetric C0 interior penalty method (Engel et al., Comput. Methods Appl.
   * Mech. Engrg. 191, 3669, 2002; Brenner & Sung, J. Sci. Comput. 22, 83, 2005) with the energy
   *   Σ_K ½∫M:κ − Σ_e ∫{M_nn}[∂_n w] + Σ_e ½∫η p(p+1) D/h_e [∂_n w]²,
   * over interior and periodic edges and clamped boundary edges. On an adapted mesh an edge between
   * a cell and its finer neighbours is integrated once per sub-edge, from the finer side, and w is
   * kept continuous at hanging nodes by constraints.
   *
   * The state vector holds (ũ, w); the total in-plane displacement is u = λE·x + ũ. All constraints
   * are homogeneous, so a state that satisfies them stays feasible under constrained updates.
   * Energies are evaluated at a LoadLevel: the load factor λ scales the loads, the adhesion factor c
   * the substrate potential.
   */
  class SheetSystem
  {
  public:
    SheetSystem(const SheetModel &model, const SheetDomain &domain, MPI_Comm comm);
    ~SheetSystem();

    /// Number of degrees of freedom (all ranks).
    dealii::types::global_dof_index n_dofs() const;
    const dealii::DoFHandler<2> &dof_handler() const { return dof_handler_; }
    /// The distributed mesh, on which mesh adaptation sets refine and coarsen flags before adapt().
    dealii::parallel::distributed::Triangulation<2> &mesh() { return tria_; }
    const dealii::FESystem<2> &finite_element() const { return fe_; }
    const dealii::Mapping<2> &mapping() const { return *mapping_; }
    const dealii::AffineConstraints<double> &constraints() const { return constraints_; }
    const SheetModel &model() const { return model_; }
    const SheetDomain &domain() const { return domain_; }
    MPI_Comm communicator() const { return comm_; }

    /// A vector with the owned partition (for solvers and updates).
    Vector make_owned_vector() const;
    /// A ghosted vector (owned + relevant), as required by assembly and output.
    Vector make_ghosted_vector() const;
    /**
     * Throws unless @p state has this system's size and, on a mesh split between ranks, ghost entries:
     * cells read their neighbours' dofs from them. An owned vector, or a returned vector moved into a
     * ghosted one (the move takes the temporary's layout; a copy from a named vector fills the ghosts),
     * would otherwise give silently wrong values on the cells at rank boundaries. The same on every rank
     * (whether a vector has ghost entries is a property of its parallel layout).
     */
    void require_ghosted(const Vector &state) const;

    /// The energy at @p state (ghosted) and load level (λ, c), without derivatives.
    EnergyParts energy(const Vector &state, const LoadLevel &level) const;

    /**
     * Energy, gradient (@p residual, owned, constrained entries zero) and, if @p hessian is not
     * null, the Hessian (constrained rows/columns replaced by a positive diagonal) at @p state.
     * If @p force_magnitude is not null it receives the assembled absolute values of the element
     * contributions to the residual: the size of the internal forces, a physical scale for the
     * residual tolerance that does not vanish at equilibrium.
     */
    EnergyParts assemble(const Vector &state, const LoadLevel &level, Vector &residual, SparseMatrix *hessian,
                         Vector *force_magnitude = nullptr) const;

    /// The matrix with the Hessian's sparsity pattern; reused across Newton steps.
    SparseMatrix &hessian_matrix() { return hessian_; }

    /**
     * The size of the forces this problem can exert [N], from its physical parameters on a cell of
     * size L = √(area): L·(Y·10⁻³ + Γ) + D/L + |p|·L² + Σ|F| (a 0.1 % membrane strain, the adhesion,
     * bending over the cell, the loads at level λ). Residual tolerances are relative to it, so that a
     * trivial case (a flat sheet on a flat substrate) converges at once and a result's residual is
     * small in physical terms, not only relative to its start. Infinite when the substrate term is a
     * surface potential other than an adhesion law (e.g. a test's elastic foundation), whose force scale
     * the model does not know: then only the relative tolerances apply.
     */
    double physical_force_scale(const LoadLevel &level) const;

    /**
     * Refines and coarsens the cells flagged on mesh() (after p4est's 2:1 balance, also across
     * periodic edges), carries @p state (owned) to the new mesh by interpolation, and rebuilds the
     * dofs, the constraints (with hanging-node constraints), the Hessian's sparsity and the point
     * loads. Objects that keep references into the old system (minimisers, Hessian solvers) must be
     * rebuilt. Collective.
     */
    void adapt(Vector &state);
    /// Whether every cell has the same refinement level (false after adapt() refined part of the mesh).
    bool uniform_mesh() const;

    /// w of @p state (ghosted) at a point [m]; the same on every rank.
    double deflection_at(const Vector &state, const dealii::Point<2> &p) const;

  private:
    /// A point load's shape function values on the owning rank (empty on the others).
    struct PointEvaluation
    {
      double                                       force = 0.0;
      std::vector<dealii::types::global_dof_index> dofs;
      std::vector<double>                          w_shape_values;
    };

    void setup_dofs();
    void setup_constraints();
    void setup_sparsity();
    void locate_point_loads();
    PointEvaluation evaluate_at(const dealii::Point<2> &p) const;
    void pin_rigid_modes();
    EnergyParts assemble_parts(const Vector &state, const LoadLevel &level, Vector *residual, SparseMatrix *hessian,
                               Vector *magnitude) const;
    void assemble_cells(const Vector &state, const LoadLevel &level, Vector *residual, SparseMatrix *hessian,
                        Vector *magnitude, EnergyParts &parts) const;
    void assemble_edges(const Vector &state, Vector *residual, SparseMatrix *hessian, Vector *magnitude,
                        EnergyParts &parts) const;
    void assemble_point_loads(const Vector &state, double load_factor, Vector *residual,
                              EnergyParts &parts) const;
    /// What the C0IP terms of one edge need, which depends on the mesh only: its w dofs and, at each
    /// quadrature point, each dof's jump of the normal slope [1/m] and normal moment [N], and the weight [m].
    struct EdgeTerms
    {
      std::vector<dealii::types::global_dof_index> dofs;
      std::vector<double> slope_jump, normal_moment; ///< [q · dofs.size() + a]
      std::vector<double> weights;
      double              penalty_over_h = 0.0; ///< [N]
    };
    /// The edges' terms, evaluated once per mesh (the interface values of every edge at every assembly
    /// cost more than the rest of an assembly).
    const std::vector<EdgeTerms> &edge_terms() const;
    std::vector<EdgeTerms>        evaluate_edge_terms() const;
    /// The edge terms are quadratic in w: their Hessian K (constraints condensed, as assembled into the
    /// Hessian) depends on the mesh only, and is assembled once per mesh and added to each Hessian.
    const SparseMatrix &edge_operator() const;

    SheetModel  model_;
    SheetDomain domain_;
    MPI_Comm    comm_;
    dealii::parallel::distributed::Triangulation<2> tria_;
    dealii::FESystem<2>                            fe_;
    std::unique_ptr<dealii::Mapping<2>>            mapping_;
    dealii::DoFHandler<2>                          dof_handler_;
    dealii::IndexSet                               owned_dofs_;
    dealii::IndexSet                               relevant_dofs_;
    bool                                           split_between_ranks_ = false; ///< some rank has ghost dofs
    dealii::AffineConstraints<double>              constraints_;
    mutable SparseMatrix                           hessian_;
    mutable std::vector<EdgeTerms>                 edge_terms_;     ///< built on first use; empty: not yet
    mutable bool                                   edge_terms_ready_ = false;
    mutable std::unique_ptr<SparseMatrix>          edge_operator_;  ///< K of edge_operator(), built on first use
    std::vector<std::unique_ptr<PointEvaluation>>  point_loads_;
  };
} // namespace nappe
