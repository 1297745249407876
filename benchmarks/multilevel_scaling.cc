// One Newton step (assembly of residual and Hessian + linear solve) on a clamped graphene drum
// deflected 20 nm, by the sparse direct solver (MUMPS LDLᵀ) and by multilevel CG, from 37k to 2.4M
// unknowns (global refinements 4 → 7). Run one solver per process to read its peak memory:
//   multilevel_scaling --benchmark_filter=direct     (refinements 4–6; 7 not run: ≈ 17 GB extrapolated)
//   multilevel_scaling --benchmark_filter=multilevel
// The counters give unknowns, CG iterations, levels and the process' peak resident memory [MB].
#include <deal.II/base/function.h>
#include <deal.II/base/mpi.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/solvers/multilevel_hessian_solver.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include <benchmark/benchmark.h>
#include <common/clamped_drum.h>
#include <sys/resource.h>

namespace
{
  const double radius = 500e-9, deflection = 20e-9;

  using nappe::bench::drum;
  using nappe::bench::drum_model;

  /// w = w₀(1 − r²/R²)², the clamped plate's shape, so that membrane and bending are coupled.
  class ClampedShape : public dealii::Function<2>
  {
  public:
    ClampedShape() : dealii::Function<2>(3) {}
    double value(const dealii::Point<2> &p, const unsigned int component) const override
    {
      const double s = 1.0 - p.square() / (radius * radius);
      return component == 2 ? deflection * s * s : 0.0;
    }
  };

  nappe::Vector deflected_state(const nappe::SheetSystem &system)
  {
    nappe::Vector owned = system.make_owned_vector();
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), ClampedShape(), owned);
    nappe::Vector ghosted = system.make_ghosted_vector();
    ghosted               = owned;
    return ghosted;
  }

  double peak_memory_mb()
  {
    rusage usage;
    getrusage(RUSAGE_SELF, &usage);
    return dealii::Utilities::MPI::sum(usage.ru_maxrss / 1024.0, MPI_COMM_WORLD);
  }

  /// The drum at @p refinements with its deflected state: a Newton step's matrix and right-hand side.
  struct DrumStep
  {
    explicit DrumStep(unsigned int refinements)
      : system(drum_model(), drum(refinements), MPI_COMM_WORLD)
      , state(deflected_state(system))
      , residual(system.make_owned_vector())
      , step(system.make_owned_vector())
    {}
    void assemble() { system.assemble(state, 1.0, residual, &system.hessian_matrix()); }

    nappe::SheetSystem system;
    nappe::Vector      state, residual, step;
  };

  void newton_step_direct(benchmark::State &state)
  {
    DrumStep                     d(state.range(0));
    nappe::SymmetricDirectSolver solver(MPI_COMM_WORLD);
    for (auto _ : state)
      {
        d.assemble();
        solver.factorize(d.system.hessian_matrix());
        solver.solve(d.residual, d.step);
      }
    state.counters["dofs"]           = d.system.n_dofs();
    state.counters["peak_memory_MB"] = peak_memory_mb();
  }

  void newton_step_multilevel(benchmark::State &state)
  {
    DrumStep                       d(state.range(0));
    nappe::MultilevelHessianSolver solver(d.system);
    for (auto _ : state)
      {
        d.assemble();
        solver.linearize(d.state, 1.0);
        solver.prepare(d.system.hessian_matrix());
        solver.solve(d.residual, d.step);
      }
    state.counters["dofs"]           = d.system.n_dofs();
    state.counters["cg_iterations"]  = solver.last_iterations();
    state.counters["levels"]         = solver.n_levels();
    state.counters["peak_memory_MB"] = peak_memory_mb();
  }
} // namespace

BENCHMARK(newton_step_direct)->DenseRange(4, 6)->Iterations(1)->Unit(benchmark::kSecond);
BENCHMARK(newton_step_multilevel)->DenseRange(4, 7)->Iterations(1)->Unit(benchmark::kSecond);
