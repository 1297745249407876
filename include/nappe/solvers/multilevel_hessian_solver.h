#pragma once

#include <nappe/solvers/hessian_solver.h>
#include <nappe/solvers/sheet_system.h>

#include <memory>
#include <string>

namespace nappe
{
  /**
   * Geometric multigrid preconditioned conjugate gradients for a positive definite sheet Hessian H,
   * a HessianSolver whose set-up and solve cost grow about linearly with the number of unknowns
   * (a sparse factorisation grows like N^1.3 in time and faster in memory on these meshes).
   *
   * Levels: the same sheet (model, domain) with 1, 2, … fewer global refinements, down to
   * MultilevelSettings::coarsest_cells; the meshes are nested (every cell of a level is a parent of
   * the next level's cells). Level operators are rediscretised: each level assembles its own
   * Hessian at the fine state interpolated to it (linearize()), so membrane prestress, bending and
   * adhesion stiffness enter every level. Transfer between levels: deal.II's global-coarsening
   * transfer (MGTwoLevelTransfer), which respects each level's constraints (edges, periodicity,
   * pinned rigid modes). Smoother: Chebyshev polynomial of the Jacobi-preconditioned operator
   * (M. Adams, M. Brezina, J. Hu, R. Tuminaro, J. Comput. Phys. 188, 593, 2003), eigenvalue
   * bounds from a few CG steps. Coarse level: MUMPS LDLᵀ. V-cycle, one pre- and one post-smoothing
   * step (W. Hackbusch, Multi-Grid Methods and Applications, Springer 1985, ch. 2, from memory).
   *
   * Use: linearize(state, level) once per state, then prepare(H) with the fine Hessian assembled at
   * that state, then solve(). Collective over the fine system's communicator.
   */
  class MultilevelHessianSolver : public HessianSolver
  {
  public:
    MultilevelHessianSolver(const SheetSystem &fine, const MultilevelSettings &settings = {});
    ~MultilevelHessianSolver() override;

    /// Assembles the coarse levels' Hessians at @p state (fine, ghosted) and load level @p level.
    void linearize(const Vector &state, const LoadLevel &level) override;

    /// Shifts every coarse level's Hessian by @p mu times the absolute value of its own diagonal.
    void set_diagonal_shift(double mu) override;

    /// The shift μ of the last set_diagonal_shift() since linearize() (0: H is the Hessian itself).
    double diagonal_shift() const;

    /// Sets up the smoothers with the fine Hessian @p H (assembled at the state of the last linearize()).
    void prepare(const SparseMatrix &H) override;

    /**
     * x = H⁻¹b to MultilevelSettings::relative_tolerance by preconditioned CG; with a shifted H (a
     * globalisation step, whose accuracy does not set the rate of Newton's method near the minimum,
     * Nocedal & Wright, Numerical Optimization, 2nd ed., 2006, §7.1) to MultilevelSettings::
     * shifted_relative_tolerance. Throws HessianSolveError on every rank, with the last relative
     * residual, if CG reaches its iteration limit or diverges (‖r‖ > 10⁴‖b‖).
     */
    void solve(const Vector &rhs, Vector &solution) const override;

    std::string name() const override { return "multilevel CG"; }

    /// @p correction = one V-cycle applied to @p residual (an approximation of H⁻¹r), after prepare().
    void precondition(const Vector &residual, Vector &correction) const;

    /// The fine sheet it solves for.
    const SheetSystem &system() const;

    /// Number of levels, the fine one included.
    unsigned int n_levels() const;
    /// Unknowns of level @p l (0 = coarsest).
    dealii::types::global_dof_index level_dofs(unsigned int l) const;
    /// CG iterations of the last solve().
    unsigned int last_iterations() const;

  private:
    struct Hierarchy;
    std::unique_ptr<Hierarchy> h_;
  };
} // namespace nappe
