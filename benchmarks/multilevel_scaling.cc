// One Newton step (assembly of residual and Hessian + linear solve) on a clamped graphene drum
// deflected 20 nm, by the sparse direct solver (MUMPS LDLᵀ) and by multilevel CG, from 37k to 2.4M
// unknowns (global refinements 4 → 7). Run one solver per process to read its peak memory:
//   multilevel_scaling --benchmark_filter=direct     (refinements 4–6; 7 does not fit a 24 GB machine)
//   multilevel_scaling --benchmark_filter=multilevel
// The counters give unknowns, CG iterations, levels and the process' peak resident memory [MB].
#include <deal.II/base/function.h>
#include <deal.II/base/mpi.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/solvers/multilevel_hessian_solver.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include <benchmark/benchmark.h>
#include <sys/resource.h>

namespace
{
  const double radius = 500e-9, deflection = 20e-9;

  nappe::SheetModel drum_model()
  {
    nappe::SheetModel model;
    model.material.youngs_modulus_2d = 340.0;
    model.material.poisson_ratio     = 0.165;
    model.material.bending_rigidity  = 2.2e-19;
    model.edges[0]                   = {nappe::DeflectionCondition::clamped, nappe::InPlaneCondition::fixed};
    model.loads.pressure             = 1e5;
    return model;
  }

  nappe::SheetDomain drum(unsigned int refinements)
  {
    nappe::SheetDomain d;
    d.shape              = nappe::SheetDomain::Shape::disk;
    d.radius             = radius;
    d.global_refinements = refinements;
    return d;
  }

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

  void newton_step_direct(benchmark::State &state)
  {
    nappe::SheetSystem system(drum_model(), drum(state.range(0)), MPI_COMM_WORLD);
    const nappe::Vector u = deflected_state(system);
    nappe::Vector       r = system.make_owned_vector(), x = system.make_owned_vector();
    nappe::SymmetricDirectSolver solver(MPI_COMM_WORLD);
    for (auto _ : state)
      {
        system.assemble(u, 1.0, r, &system.hessian_matrix());
        solver.factorize(system.hessian_matrix());
        solver.solve(r, x);
      }
    state.counters["dofs"]           = system.n_dofs();
    state.counters["peak_memory_MB"] = peak_memory_mb();
  }

  void newton_step_multilevel(benchmark::State &state)
  {
    nappe::SheetSystem system(drum_model(), drum(state.range(0)), MPI_COMM_WORLD);
    const nappe::Vector u = deflected_state(system);
    nappe::Vector       r = system.make_owned_vector(), x = system.make_owned_vector();
    nappe::MultilevelHessianSolver solver(system);
    for (auto _ : state)
      {
        system.assemble(u, 1.0, r, &system.hessian_matrix());
        solver.linearize(u, 1.0);
        solver.prepare(system.hessian_matrix());
        solver.solve(r, x);
      }
    state.counters["dofs"]           = system.n_dofs();
    state.counters["cg_iterations"]  = solver.last_iterations();
    state.counters["levels"]         = solver.n_levels();
    state.counters["peak_memory_MB"] = peak_memory_mb();
  }
} // namespace

BENCHMARK(newton_step_direct)->DenseRange(4, 6)->Iterations(1)->Unit(benchmark::kSecond);
BENCHMARK(newton_step_multilevel)->DenseRange(4, 7)->Iterations(1)->Unit(benchmark::kSecond);

int main(int argc, char **argv)
{
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  benchmark::Initialize(&argc, argv);
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  return 0;
}
