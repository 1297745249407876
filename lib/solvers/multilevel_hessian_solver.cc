#include <deal.II/lac/diagonal_matrix.h>
#include <deal.II/lac/la_parallel_vector.h>
#include <deal.II/lac/precondition.h>
#include <deal.II/lac/solver_cg.h>
#include <deal.II/multigrid/mg_base.h>
#include <deal.II/multigrid/mg_transfer_global_coarsening.h>
#include <deal.II/multigrid/multigrid.h>

#include <nappe/solvers/multilevel_hessian_solver.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include "matrix_diagonal.h"

#include <algorithm>
#include <cmath>
#include <sstream>

namespace nappe
{
  using namespace dealii;

  namespace
  {
    using LevelVector = LinearAlgebra::distributed::Vector<double>;
    using Jacobi      = DiagonalMatrix<LevelVector>;
    using Chebyshev   = PreconditionChebyshev<SparseMatrix, LevelVector, Jacobi>;
    using Transfer    = MGTransferGlobalCoarsening<2, LevelVector>;

    // Trilinos and deal.II vectors built on one DoFHandler's owned dofs store them in the same order.
    void copy_owned(const Vector &from, LevelVector &to) { std::copy(from.begin(), from.end(), to.begin()); }
    void copy_owned(const LevelVector &from, Vector &to) { std::copy(from.begin(), from.end(), to.begin()); }

    /// Spectral range of D⁻¹H the Chebyshev smoother damps, [λ_max/range, λ_max] (common practice, no source).
    const double       smoothing_range       = 20.0;
    /// CG stops as diverged when ‖r‖ exceeds this many times ‖b‖ (an indefinite H or preconditioner,
    /// or a right-hand side outside the range of a singular H; common practice, no source).
    const double       divergence_factor     = 1e4;
    const unsigned int eigenvalue_cg_steps   = 20; ///< CG steps estimating λ_max(D⁻¹H)
  } // namespace

  struct MultilevelHessianSolver::Hierarchy
  {
    // The coarse systems' Hessians are this solver's own (linearize assembles them).
    const SheetSystem                       &fine;
    MultilevelSettings                       settings;
    std::vector<std::unique_ptr<SheetSystem>> coarse; ///< levels 0 … L−2, coarsest first
    std::vector<Vector>                      coarse_scaling; ///< |diag| of each coarse Hessian, unshifted
    double                                   coarse_shift = 0.0; ///< μ added to them as μ·|diag|
    MGLevelObject<MGTwoLevelTransfer<2, LevelVector>> transfers;
    std::unique_ptr<Transfer>                transfer;
    const SparseMatrix                      *fine_matrix = nullptr;
    std::vector<Chebyshev>                   smoothers;
    std::unique_ptr<SymmetricDirectSolver>   coarse_factors;
    std::unique_ptr<MGMatrixBase<LevelVector>>      operators;
    std::unique_ptr<MGSmootherBase<LevelVector>>    smoother;
    std::unique_ptr<MGCoarseGridBase<LevelVector>>  coarse_solve;
    std::unique_ptr<Multigrid<LevelVector>>         multigrid;
    std::unique_ptr<PreconditionMG<2, LevelVector, Transfer>> vcycle;
    mutable unsigned int                     last_iterations = 0;

    unsigned int n_levels() const { return coarse.size() + 1; }
    unsigned int finest() const { return coarse.size(); }
    const SheetSystem &system(unsigned int l) const { return l == finest() ? fine : *coarse[l]; }
    const SparseMatrix &matrix(unsigned int l) const
    {
      return l == finest() ? *fine_matrix : coarse[l]->hessian_matrix();
    }
    void init_vector(unsigned int l, LevelVector &v) const
    {
      v.reinit(system(l).dof_handler().locally_owned_dofs(), fine.communicator());
    }
  };

  namespace
  {
    /// The level operators: the coarse levels' own Hessians and the fine H.
    template <class Levels>
    class LevelOperators : public MGMatrixBase<LevelVector>
    {
    public:
      explicit LevelOperators(const Levels &h) : h_(h) {}
      void vmult(const unsigned int l, LevelVector &dst, const LevelVector &src) const override
      {
        h_.matrix(l).vmult(dst, src);
      }
      void vmult_add(const unsigned int l, LevelVector &dst, const LevelVector &src) const override
      {
        h_.matrix(l).vmult_add(dst, src);
      }
      void Tvmult(const unsigned int l, LevelVector &dst, const LevelVector &src) const override
      {
        vmult(l, dst, src); // symmetric
      }
      void Tvmult_add(const unsigned int l, LevelVector &dst, const LevelVector &src) const override
      {
        vmult_add(l, dst, src);
      }
      unsigned int get_minlevel() const override { return 0; }
      unsigned int get_maxlevel() const override { return h_.finest(); }

    private:
      const Levels &h_;
    };

    /// One Chebyshev step per smoothing on every level but the coarsest.
    class ChebyshevSmoother : public MGSmootherBase<LevelVector>
    {
    public:
      explicit ChebyshevSmoother(const std::vector<Chebyshev> &levels) : levels_(levels) {}
      void clear() override {}
      void smooth(const unsigned int l, LevelVector &u, const LevelVector &rhs) const override
      {
        levels_[l].step(u, rhs);
      }
      void apply(const unsigned int l, LevelVector &u, const LevelVector &rhs) const override
      {
        levels_[l].vmult(u, rhs);
      }

    private:
      const std::vector<Chebyshev> &levels_;
    };

    /// The coarsest level solved with its LDLᵀ factors.
    class DirectCoarseSolve : public MGCoarseGridBase<LevelVector>
    {
    public:
      DirectCoarseSolve(const SymmetricDirectSolver &factors, Vector rhs)
        : factors_(factors), rhs_(rhs), solution_(std::move(rhs))
      {}
      void operator()(const unsigned int, LevelVector &dst, const LevelVector &src) const override
      {
        copy_owned(src, rhs_);
        factors_.solve(rhs_, solution_);
        copy_owned(solution_, dst);
      }

    private:
      const SymmetricDirectSolver &factors_;
      mutable Vector               rhs_, solution_;
    };

    std::shared_ptr<Jacobi> inverse_diagonal(const SparseMatrix &H, const SheetSystem &system)
    {
      Vector d = system.make_owned_vector();
      internal::extract_diagonal(H, d);
      auto jacobi = std::make_shared<Jacobi>();
      jacobi->get_vector().reinit(system.dof_handler().locally_owned_dofs(), system.communicator());
      copy_owned(d, jacobi->get_vector());
      bool positive = true;
      for (auto &v : jacobi->get_vector())
        {
          positive = positive && v > 0.0;
          v        = v > 0.0 ? 1.0 / v : 0.0;
        }
      AssertThrow(Utilities::MPI::min(positive ? 1 : 0, system.communicator()) == 1,
                  ExcMessage("Multilevel CG: the Hessian has a diagonal entry ≤ 0, so it is not positive definite; "
                             "use Solver/Linear solver = direct LDLT for this state."));
      return jacobi;
    }
  } // namespace

  MultilevelHessianSolver::MultilevelHessianSolver(const SheetSystem &fine, const MultilevelSettings &settings)
    : h_(std::make_unique<Hierarchy>(Hierarchy{fine, settings, {}, {}, 0.0, {}, {}, nullptr, {}, {}, {}, {}, {}, {}, {}, 0}))
  {
    const SheetDomain &domain  = fine.domain();
    const unsigned int lowest  = domain.periodic ? 1 : 0; // a periodic cell keeps ≥ 2 cells per direction
    double             cells   = fine.dof_handler().get_triangulation().n_global_active_cells();
    unsigned int       coarsest = domain.global_refinements;
    while (coarsest > lowest && cells > settings.coarsest_cells)
      {
        --coarsest;
        cells /= 4.0;
      }
    for (unsigned int r = coarsest; r < domain.global_refinements; ++r)
      {
        SheetDomain level_domain        = domain;
        level_domain.global_refinements = r;
        h_->coarse.push_back(std::make_unique<SheetSystem>(fine.model(), level_domain, fine.communicator()));
      }
    h_->coarse_scaling.resize(h_->coarse.size());
    h_->transfers.resize(0, h_->finest());
    for (unsigned int l = 1; l < h_->n_levels(); ++l)
      h_->transfers[l].reinit_geometric_transfer(h_->system(l).dof_handler(), h_->system(l - 1).dof_handler(),
                                                 h_->system(l).constraints(), h_->system(l - 1).constraints());
    h_->transfer = std::make_unique<Transfer>(h_->transfers, [this](const unsigned int l, LevelVector &v) {
      h_->init_vector(l, v);
    });
  }

  MultilevelHessianSolver::~MultilevelHessianSolver() = default;

  void MultilevelHessianSolver::linearize(const Vector &state, const LoadLevel &level)
  {
    std::vector<LevelVector> states(h_->n_levels());
    Vector                   owned = h_->fine.make_owned_vector();
    owned                          = state;
    h_->init_vector(h_->finest(), states.back());
    copy_owned(owned, states.back());
    for (unsigned int l = h_->finest(); l > 0; --l)
      {
        h_->init_vector(l - 1, states[l - 1]);
        h_->transfers[l].interpolate(states[l - 1], states[l]);
      }
    for (unsigned int l = 0; l < h_->finest(); ++l)
      {
        SheetSystem &system  = *h_->coarse[l];
        Vector       coarse  = system.make_owned_vector(), residual = system.make_owned_vector();
        copy_owned(states[l], coarse);
        Vector ghosted = system.make_ghosted_vector();
        ghosted        = coarse;
        system.assemble(ghosted, level, residual, &system.hessian_matrix());
        Vector &scaling = h_->coarse_scaling[l];
        scaling.reinit(residual);
        internal::extract_diagonal(system.hessian_matrix(), scaling);
        for (auto &d : scaling)
          d = std::abs(d);
      }
    h_->coarse_shift = 0.0;
  }

  void MultilevelHessianSolver::set_diagonal_shift(double mu)
  {
    for (unsigned int l = 0; l < h_->finest(); ++l)
      internal::add_to_diagonal(h_->coarse[l]->hessian_matrix(), h_->coarse_scaling[l], mu - h_->coarse_shift);
    h_->coarse_shift = mu;
  }

  void MultilevelHessianSolver::prepare(const SparseMatrix &H)
  {
    h_->fine_matrix = &H;
    h_->smoothers.resize(h_->n_levels());
    for (unsigned int l = 1; l < h_->n_levels(); ++l)
      {
        Chebyshev::AdditionalData data;
        data.degree              = h_->settings.smoother_degree;
        data.smoothing_range     = smoothing_range;
        data.eig_cg_n_iterations = eigenvalue_cg_steps;
        data.preconditioner      = inverse_diagonal(h_->matrix(l), h_->system(l));
        h_->smoothers[l].initialize(h_->matrix(l), data);
      }
    if (!h_->coarse_factors)
      h_->coarse_factors = std::make_unique<SymmetricDirectSolver>(h_->fine.communicator());
    h_->coarse_factors->factorize(h_->matrix(0));
    if (!h_->vcycle)
      {
        h_->operators    = std::make_unique<LevelOperators<Hierarchy>>(*h_);
        h_->smoother     = std::make_unique<ChebyshevSmoother>(h_->smoothers);
        h_->coarse_solve = std::make_unique<DirectCoarseSolve>(*h_->coarse_factors, h_->system(0).make_owned_vector());
        h_->multigrid    = std::make_unique<Multigrid<LevelVector>>(*h_->operators, *h_->coarse_solve, *h_->transfer,
                                                                 *h_->smoother, *h_->smoother, 0, h_->finest());
        h_->vcycle = std::make_unique<PreconditionMG<2, LevelVector, Transfer>>(h_->fine.dof_handler(),
                                                                                *h_->multigrid, *h_->transfer);
      }
  }

  void MultilevelHessianSolver::precondition(const Vector &residual, Vector &correction) const
  {
    LevelVector r, z;
    h_->init_vector(h_->finest(), r);
    h_->init_vector(h_->finest(), z);
    copy_owned(residual, r);
    h_->vcycle->vmult(z, r);
    copy_owned(z, correction);
  }

  void MultilevelHessianSolver::solve(const Vector &rhs, Vector &solution) const
  {
    Assert(h_->vcycle, ExcMessage("prepare() before solve()"));

    LevelVector b, x;
    h_->init_vector(h_->finest(), b);
    h_->init_vector(h_->finest(), x);
    copy_owned(rhs, b);
    const double  b_norm    = b.l2_norm();
    const double  tolerance = h_->coarse_shift > 0.0 ? h_->settings.shifted_relative_tolerance :
                                                       h_->settings.relative_tolerance;
    SolverControl control(h_->settings.max_iterations, tolerance * b_norm);
    control.set_failure_criterion(divergence_factor);
    SolverCG<LevelVector> cg(control);
    try
      {
        if (b_norm > 0.0)
          cg.solve(*h_->fine_matrix, x, b, *h_->vcycle);
      }
    catch (const SolverControl::NoConvergence &e)
      {
        std::ostringstream message;
        message << "Multilevel CG did not converge in " << e.last_step << " iterations (relative residual "
                << e.last_residual / b_norm << ", target " << tolerance
                << "): the Hessian is near singular or indefinite in this state, or its coarse levels miss "
                << "features of the fine mesh; use Solver/Linear solver = direct LDLT, or raise Solver/Multilevel "
                << "coarsest cells (now " << h_->settings.coarsest_cells << ") or Solver/Multilevel iteration limit "
                << "(now " << h_->settings.max_iterations << ").";
        throw HessianSolveError(message.str());
      }
    h_->last_iterations = control.last_step();
    copy_owned(x, solution);
  }

  double MultilevelHessianSolver::diagonal_shift() const { return h_->coarse_shift; }

  unsigned int MultilevelHessianSolver::n_levels() const { return h_->n_levels(); }

  types::global_dof_index MultilevelHessianSolver::level_dofs(unsigned int l) const
  {
    return h_->system(l).n_dofs();
  }

  unsigned int MultilevelHessianSolver::last_iterations() const { return h_->last_iterations; }

  const SheetSystem &MultilevelHessianSolver::system() const { return h_->fine; }
} // namespace nappe
