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
    const auto        fail      = [&](const int reason) {
      std::remove(temporary.c_str());
      AssertThrow(false, dealii::ExcMessage("Writing '" + path + "' failed (" +
                                            (reason ? std::string(std::strerror(reason)) : "disk full?") +
                                            "); nothing was written under that name."));
    };
    {
      std::ofstream out(temporary);
      AssertThrow(out, dealii::ExcMessage("Cannot open '" + temporary + "' for writing: " + std::strerror(errno) + "."));
      try
        {
          write(out);
          out.close();
        }
      catch (...)
        {
          if (out) // the writer failed for its own reason: pass that on
            {
              std::remove(temporary.c_str());
              throw;
            }
        }
      if (!out) // a library writer that checks its stream reports a generic I/O error: name the file instead
        fail(errno);
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
