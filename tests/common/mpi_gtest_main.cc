// GoogleTest main for nappe's suites: initialises MPI, lets only rank 0 print, and makes the
// program fail when a test failed on any rank.
#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

int main(int argc, char **argv)
{
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  ::testing::InitGoogleTest(&argc, argv);

  const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD);
  if (rank != 0)
    {
      auto &listeners = ::testing::UnitTest::GetInstance()->listeners();
      delete listeners.Release(listeners.default_result_printer());
    }

  const int local_failed = RUN_ALL_TESTS() != 0 ? 1 : 0;
  return dealii::Utilities::MPI::max(local_failed, MPI_COMM_WORLD);
}
