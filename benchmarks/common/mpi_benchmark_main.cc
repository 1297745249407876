// The one main() of every benchmark: MPI set up around Google Benchmark's runner.
#include <deal.II/base/mpi.h>

#include <benchmark/benchmark.h>

int main(int argc, char **argv)
{
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  benchmark::Initialize(&argc, argv);
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  return 0;
}
