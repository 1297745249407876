// Speed of one Newton step's parts on a clamped drum (Q2): assembly of energy, residual and
// Hessian, and the LDLᵀ factorisation. Targets live here, not in tests.
#include <deal.II/base/mpi.h>

#include <nappe/solvers/sheet_system.h>
#include <nappe/solvers/symmetric_direct_solver.h>

#include <benchmark/benchmark.h>
#include <common/clamped_drum.h>

namespace
{
  using nappe::bench::drum;
  using nappe::bench::drum_model;

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
