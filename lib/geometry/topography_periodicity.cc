#include <nappe/geometry/topography_periodicity.h>

#include <algorithm>
#include <cmath>
#include <sstream>

namespace nappe
{
  namespace
  {
    std::string in_nm(const dealii::Tensor<1, 2> &v)
    {
      std::ostringstream s;
      s << "(" << v[0] * 1e9 << ", " << v[1] * 1e9 << ") nm";
      return s.str();
    }

    /// How many periods of the lattice @p cell spans, if a whole number; otherwise a reason.
    std::string whole_periods(const TopographyLattice &l, const dealii::Tensor<1, 2> &cell, const std::string &name)
    {
      // Coefficients of cell = n a₁ + m a₂ (stripes: only the component across them counts).
      const double det = l.a1[0] * l.a2[1] - l.a1[1] * l.a2[0];
      const double n   = (cell[0] * l.a2[1] - cell[1] * l.a2[0]) / det;
      const double m   = (l.a1[0] * cell[1] - l.a1[1] * cell[0]) / det;
      const bool   stripes = l.kind == TopographyLattice::Kind::stripes;
      if (std::abs(n - std::round(n)) < 1e-6 && (stripes || std::abs(m - std::round(m)) < 1e-6))
        return "";
      std::ostringstream s;
      s << "the cell vector " << in_nm(cell) << " is not a whole number of periods of the " << name
        << " (period " << in_nm(l.a1);
      if (!stripes)
        s << " and " << in_nm(l.a2);
      s << "; it spans " << n << " periods";
      if (!stripes) // the coefficients of cell = n a₁ + m a₂
        s << " of the first and " << m << " of the second";
      s << ")";
      return s.str();
    }

    /// The largest difference of height and slope between an edge and its periodic image.
    std::string edge_mismatch(const Topography &t, const dealii::Point<2> &start, const dealii::Tensor<1, 2> &along,
                              const dealii::Tensor<1, 2> &shift)
    {
      const unsigned int n = 101;
      double             low = 1e300, high = -1e300, worst = 0.0, worst_slope = 0.0;
      dealii::Point<2>   where;
      for (unsigned int k = 0; k < n; ++k)
        {
          const dealii::Point<2> x = start + (double(k) / (n - 1)) * along;
          const double           s0 = t.height(x), s1 = t.height(x + shift);
          low  = std::min({low, s0, s1});
          high = std::max({high, s0, s1});
          if (std::abs(s1 - s0) > worst)
            {
              worst = std::abs(s1 - s0);
              where = x;
            }
          worst_slope = std::max(worst_slope, (t.gradient(x + shift) - t.gradient(x)).norm());
        }
      const double tolerance = 1e-6 * (high - low) + 1e-15;
      if (worst <= tolerance && worst_slope <= 1e-6 * std::max(1.0, (high - low) / along.norm()))
        return "";
      std::ostringstream s;
      s << "its height differs by up to " << worst * 1e9 << " nm (at " << in_nm(where)
        << ") between opposite edges of the cell, which are " << in_nm(shift) << " apart";
      if (worst <= tolerance)
        {
          s.str("");
          s << "its slope jumps by up to " << worst_slope << " between opposite edges of the cell";
        }
      return s.str();
    }
  } // namespace

  std::string periodicity_mismatch(const Topography &t, const dealii::Point<2> &origin, const dealii::Tensor<1, 2> &a1,
                                   const dealii::Tensor<1, 2> &a2)
  {
    std::string why;
    if (const auto l = t.lattice())
      for (const auto &cell : {a1, a2})
        if (why.empty())
          why = whole_periods(*l, cell, t.name());
    if (why.empty())
      why = edge_mismatch(t, origin, a2, a1);
    if (why.empty())
      why = edge_mismatch(t, origin, a1, a2);
    return why.empty() ? "" : t.description() + ": " + why;
  }
} // namespace nappe
