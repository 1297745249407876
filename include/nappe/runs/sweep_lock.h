#pragma once

#include <mpi.h>

#include <string>

namespace nappe
{
  /**
   * Creates a sweep's output directory (and its points/ folder) and owns it while the object lives:
   * rank 0 creates <directory>/sweep.lock exclusively, holding its process id and host. A directory
   * locked by a live process is refused with a message naming it; a lock left by a process that no
   * longer runs on this host is taken over. Collective; the lock is removed on destruction, also when
   * the run ends with an error.
   */
  class SweepLock
  {
  public:
    SweepLock(const std::string &directory, MPI_Comm comm);
    ~SweepLock();
    SweepLock(const SweepLock &)            = delete;
    SweepLock &operator=(const SweepLock &) = delete;

  private:
    std::string path_;
    bool        owner_ = false;
  };
} // namespace nappe
