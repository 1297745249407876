#include <deal.II/base/exceptions.h>

#include <nappe/io/atomic_file.h>

#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fstream>

namespace nappe
{
  void write_atomically(const std::string &path, const std::function<void(std::ostream &)> &write)
  {
    const std::string temporary = path + ".tmp" + std::to_string(::getpid());
    bool              written   = false;
    {
      std::ofstream out(temporary);
      AssertThrow(out, dealii::ExcMessage("Cannot open '" + temporary + "' for writing: " + std::strerror(errno) + "."));
      try
        {
          write(out);
          out.close();
          written = static_cast<bool>(out);
        }
      catch (...)
        {
          std::remove(temporary.c_str());
          throw;
        }
    }
    if (!written)
      {
        const int reason = errno;
        std::remove(temporary.c_str());
        AssertThrow(false, dealii::ExcMessage("Writing '" + path + "' failed (" +
                                              (reason ? std::string(std::strerror(reason)) : "disk full?") +
                                              "); nothing was written under that name."));
      }
    if (std::rename(temporary.c_str(), path.c_str()) != 0)
      {
        const int reason = errno;
        std::remove(temporary.c_str());
        AssertThrow(false, dealii::ExcMessage("Cannot rename '" + temporary + "' to '" + path +
                                              "': " + std::strerror(reason) + "."));
      }
  }
} // namespace nappe
