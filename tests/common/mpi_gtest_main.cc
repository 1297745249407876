// GoogleTest main for nappe's suites: initialises MPI, lets only rank 0 print, and makes the
// program fail when a test failed on any rank.
#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

#ifdef __SANITIZE_ADDRESS__
#  include <sanitizer/lsan_interface.h>
#endif

int main(int argc, char **argv)
{
#ifdef __SANITIZE_ADDRESS__
  // Sanitizer build: what Open MPI (and what deal.II starts with it) allocates while it starts up is
  // theirs to keep. Some of it comes from components that MPI_Init itself loads, registers and unloads
  // again, so no suppression could name them; ignoring the allocations of start-up lets the leak check
  // use the fast unwinder (frame pointers), several times faster than the DWARF unwinder on every
  // allocation that suppressions by library name would need.
  __lsan_disable();
#endif
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
#ifdef __SANITIZE_ADDRESS__
  __lsan_enable();
#endif
  ::testing::InitGoogleTest(&argc, argv);

  const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD);
  if (rank != 0)
    {
      auto &listeners = ::testing::UnitTest::GetInstance()->listeners();
      delete listeners.Release(listeners.default_result_printer());
    }

  const int local_failed = RUN_ALL_TESTS() != 0 ? 1 : 0;
#ifdef __SANITIZE_ADDRESS__
  // Sanitizer build: look for leaks now, while MPI is alive. Open MPI unloads its components in
  // MPI_Finalize, and what they keep then shows up as leaks of unnamed modules that no suppression can
  // name; after this check the end-of-process check is skipped.
  __lsan_do_leak_check();
#endif
  return dealii::Utilities::MPI::max(local_failed, MPI_COMM_WORLD);
}
