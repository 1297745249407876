#include <deal.II/base/exceptions.h>
#include <deal.II/base/mpi.h>

#include <nappe/base/collective.h>
#include <nappe/runs/sweep_lock.h>

#include <fcntl.h>
#include <signal.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <fstream>

namespace nappe
{
  namespace fs = std::filesystem;

  namespace
  {
    std::string host_name()
    {
      char name[256] = {};
      gethostname(name, sizeof(name) - 1);
      return name;
    }

    /// Creates the lock file exclusively; false if it exists.
    bool create_exclusively(const std::string &path)
    {
      const int fd = ::open(path.c_str(), O_WRONLY | O_CREAT | O_EXCL, 0644);
      if (fd < 0)
        {
          AssertThrow(errno == EEXIST, dealii::ExcMessage("cannot create the sweep lock '" + path +
                                                          "': " + std::strerror(errno) + "."));
          return false;
        }
      const std::string owner = std::to_string(::getpid()) + " " + host_name() + "\n";
      const bool        ok    = ::write(fd, owner.data(), owner.size()) == static_cast<ssize_t>(owner.size());
      ::close(fd);
      AssertThrow(ok, dealii::ExcMessage("cannot write the sweep lock '" + path + "' (disk full?)."));
      return true;
    }

    /// Takes the lock at @p path, or throws if a live process on this host holds it.
    void take(const std::string &path)
    {
      if (create_exclusively(path))
        return;
      std::ifstream in(path);
      long          pid = 0;
      std::string   host;
      in >> pid >> host;
      const bool alive = pid > 0 && host == host_name() && (::kill(pid, 0) == 0 || errno == EPERM);
      AssertThrow(!alive || pid == ::getpid(),
                  dealii::ExcMessage("the sweep folder '" + fs::path(path).parent_path().string() +
                                     "' is being written by process " + std::to_string(pid) + " on " + host +
                                     " (" + path + "); wait for it to finish or choose another Output directory."));
      AssertThrow(host.empty() || host == host_name(),
                  dealii::ExcMessage("the sweep folder is locked by a run on host '" + host + "' (" + path +
                                     "); if that run has ended, delete the lock file."));
      fs::remove(path); // left by a run that no longer exists
      AssertThrow(create_exclusively(path),
                  dealii::ExcMessage("another run took the sweep lock '" + path + "' at the same moment."));
    }
  } // namespace

  SweepLock::SweepLock(const std::string &directory, MPI_Comm comm)
    : path_((fs::path(directory) / "sweep.lock").string())
  {
    const bool root = dealii::Utilities::MPI::this_mpi_process(comm) == 0;
    try
      {
        run_collectively(comm, [&] {
          std::error_code error, unchecked;
          fs::create_directories(fs::path(directory) / "points", error);
          AssertThrow(fs::is_directory(fs::path(directory) / "points", unchecked),
                      dealii::ExcMessage("Sweep/Output directory: cannot create '" + directory + "/points'" +
                                         (error ? ": " + error.message() : std::string()) + "."));
          if (root)
            {
              take(path_);
              owner_ = true;
            }
        });
      }
    catch (...)
      {
        if (owner_) // taken here while another rank failed: release it
          fs::remove(path_);
        throw;
      }
  }

  SweepLock::~SweepLock()
  {
    if (owner_)
      {
        std::error_code ignored;
        fs::remove(path_, ignored);
      }
  }
} // namespace nappe
