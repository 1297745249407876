// Speed of one Newton step's parts on a clamped drum (Q2): assembly of energy, residual and
// Hessian, and the LDLᵀ factorisation. Targets live here, not in tests.
#include <deal.II/base/mpi.h>

#include <nappe/solvers/sheet_system.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include <benchmark/benchmark.h>

namespace
{
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
    d.radius             = 500e-9;
    d.global_refinements = refinements;
    return d;
  }

  void assemble_hessian(benchmark::State &state)
  {
    nappe::SheetSystem system(drum_model(), drum(state.range(0)), MPI_COMM_WORLD);
    nappe::Vector      u = system.make_ghosted_vector(), r = system.make_owned_vector();
    for (auto _ : state)
      system.assemble(u, 1.0, r, &system.hessian_matrix());
    state.counters["dofs"] = system.n_dofs();
  }

  void factorize_hessian(benchmark::State &state)
  {
    nappe::SheetSystem system(drum_model(), drum(state.range(0)), MPI_COMM_WORLD);
    nappe::Vector      u = system.make_ghosted_vector(), r = system.make_owned_vector();
    system.assemble(u, 1.0, r, &system.hessian_matrix());
    nappe::SymmetricDirectSolver solver(MPI_COMM_WORLD);
    for (auto _ : state)
      solver.factorize(system.hessian_matrix());
    state.counters["dofs"] = system.n_dofs();
  }
} // namespace

BENCHMARK(assemble_hessian)->Arg(3)->Arg(4)->Arg(5)->Unit(benchmark::kMillisecond);
BENCHMARK(factorize_hessian)->Arg(3)->Arg(4)->Arg(5)->Unit(benchmark::kMillisecond);

int main(int argc, char **argv)
{
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  benchmark::Initialize(&argc, argv);
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  return 0;
}
