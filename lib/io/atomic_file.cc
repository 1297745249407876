#include <deal.II/base/exceptions.h>

#include <nappe/io/atomic_file.h>

#include <cstdio>
#include <fstream>
#include <unistd.h>

namespace nappe
{
  void write_atomically(const std::string &path, const std::function<void(std::ostream &)> &write)
  {
    const std::string temporary = path + ".tmp" + std::to_string(::getpid());
    {
      std::ofstream out(temporary);
      AssertThrow(out, dealii::ExcMessage("Cannot open '" + temporary + "' for writing."));
      write(out);
      out.close();
      AssertThrow(out, dealii::ExcMessage("Writing '" + temporary + "' failed (disk full?)."));
    }
    AssertThrow(std::rename(temporary.c_str(), path.c_str()) == 0,
                dealii::ExcMessage("Cannot rename '" + temporary + "' to '" + path + "'."));
  }
} // namespace nappe
