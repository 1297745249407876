#include <deal.II/base/exceptions.h>

#include <nappe/base/units.h>
#include <nappe/geometry/topography_writer.h>

#include <cstdio>
#include <fstream>
#include <unistd.h>

namespace nappe
{
  void write_topography_csv(const Topography &t, const std::string &filename, const dealii::Point<2> &lower,
                            const dealii::Point<2> &upper, const unsigned int n_x, const unsigned int n_y)
  {
    AssertThrow(n_x >= 2 && n_y >= 2,
                dealii::ExcMessage("topography CSV '" + filename + "': expected at least 2 x 2 sample points"));
    AssertThrow(upper[0] > lower[0] && upper[1] > lower[1],
                dealii::ExcMessage("topography CSV '" + filename + "': the upper corner must exceed the lower one"));
    const std::string temporary = filename + ".tmp." + std::to_string(::getpid());
    {
      std::ofstream out(temporary);
      AssertThrow(out.good(), dealii::ExcMessage("cannot open '" + temporary + "' to write a topography"));
      out.precision(17);
      out << "x_nm,y_nm,height_nm,dsdx,dsdy\n";
      for (unsigned int j = 0; j < n_y; ++j)
        for (unsigned int i = 0; i < n_x; ++i)
          {
            const dealii::Point<2> p(lower[0] + (upper[0] - lower[0]) * i / (n_x - 1),
                                     lower[1] + (upper[1] - lower[1]) * j / (n_y - 1));
            const auto g = t.gradient(p);
            out << p[0] / units::nanometer << ',' << p[1] / units::nanometer << ','
                << t.height(p) / units::nanometer << ',' << g[0] << ',' << g[1] << '\n';
          }
      out.flush();
      const bool ok = out.good();
      out.close();
      if (!ok)
        std::remove(temporary.c_str());
      AssertThrow(ok, dealii::ExcMessage("writing the topography to '" + temporary + "' failed"));
    }
    if (std::rename(temporary.c_str(), filename.c_str()) != 0)
      {
        std::remove(temporary.c_str());
        AssertThrow(false, dealii::ExcMessage("cannot rename '" + temporary + "' to '" + filename + "'"));
      }
  }
} // namespace nappe
