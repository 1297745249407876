#include <deal.II/base/exceptions.h>

#include <nappe/geometry/height_limit.h>
#include <nappe/geometry/height_map.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <sstream>

#include "format.h"
#include "input_file.h"

namespace nappe
{
  double length_unit_from_name(const std::string &unit_name)
  {
    if (unit_name == "m" || unit_name == "meter")
      return 1.0;
    if (unit_name == "mm" || unit_name == "millimeter")
      return 1e-3;
    if (unit_name == "um" || unit_name == "\u00b5m" || unit_name == "\u03bcm" || unit_name == "micrometer")
      return 1e-6;
    if (unit_name == "nm" || unit_name == "nanometer")
      return 1e-9;
    if (unit_name == "A" || unit_name == "\u00c5" || unit_name == "angstrom")
      return 1e-10;
    if (unit_name == "pm" || unit_name == "picometer")
      return 1e-12;
    AssertThrow(false, dealii::ExcMessage("unknown length unit '" + unit_name +
                                          "'; expected one of m, mm, um (µm), nm, A (angstrom), pm"));
    return 0.0;
  }


  namespace
  {
    /// Cubic-convolution weights (Keys, a = −1/2) of nodes −1, 0, 1, 2 at u ∈ [0, 1], and their u-derivatives.
    void keys_weights(const double u, double w[4], double dw[4])
    {
      const double u2 = u * u, u3 = u2 * u;
      w[0]            = -0.5 * u + u2 - 0.5 * u3;
      w[1]            = 1.0 - 2.5 * u2 + 1.5 * u3;
      w[2]            = 0.5 * u + 2.0 * u2 - 1.5 * u3;
      w[3]            = -0.5 * u2 + 0.5 * u3;
      dw[0]           = -0.5 + 2.0 * u - 1.5 * u2;
      dw[1]           = -5.0 * u + 4.5 * u2;
      dw[2]           = 0.5 + 4.0 * u - 4.5 * u2;
      dw[3]           = -u + 1.5 * u2;
    }

    int wrap_index(const int i, const int n) { return ((i % n) + n) % n; }

    /// A text file read line by line, with the context for error messages.
    struct LineReader
    {
      explicit LineReader(const std::string &filename, const std::string &kind)
        : filename(filename)
        , kind(kind)
      {
        internal::require_regular_file(filename, kind);
        in.open(filename);
        AssertThrow(in.good(), dealii::ExcMessage("cannot open " + kind + " file '" + filename + "' for reading"));
      }

      /// Next non-blank, non-comment line split into tokens; false at end of file.
      bool next(std::vector<std::string> &tokens)
      {
        std::string line;
        while (std::getline(in, line))
          {
            ++line_number;
            for (char &c : line)
              if (c == ',' || c == ';' || c == '\t' || c == '\r')
                c = ' ';
            const auto first = line.find_first_not_of(' ');
            if (first == std::string::npos || line[first] == '#' || line[first] == '%')
              continue;
            tokens.clear();
            std::istringstream words(line);
            for (std::string w; words >> w;)
              tokens.push_back(w);
            return true;
          }
        return false;
      }

      [[noreturn]] void fail(const std::string &what) const
      {
        AssertThrow(false, dealii::ExcMessage(kind + " file '" + filename + "', line " +
                                              std::to_string(line_number) + ": " + what));
        throw; // not reached
      }

      double number(const std::string &token, const std::string &expected)
      {
        char        *end   = nullptr;
        const double value = std::strtod(token.c_str(), &end);
        if (end == token.c_str() || *end != '\0')
          fail("expected " + expected + ", found '" + internal::excerpt(token) + "'");
        if (!std::isfinite(value))
          fail("expected " + expected + " (a finite number), found '" + internal::excerpt(token) + "'");
        return value;
      }

      /// A height token times @p unit [m], checked against max_topography_height.
      double height(const std::string &token, const double unit)
      {
        const double value = number(token, "a height") * unit;
        if (!(std::abs(value) <= max_topography_height))
          fail("the height " + internal::excerpt(token) + " (" + internal::nm(value) + ") is out of range; expected "
               "|height| <= " + internal::nm(max_topography_height) + " (check the height unit)");
        return value;
      }

      std::string   filename, kind;
      std::ifstream in;
      unsigned int  line_number = 0;
    };

    /// Sorted distinct values of v, merging values closer than tol; the clusters' first members.
    std::vector<double> distinct_values(std::vector<double> v, const double tol)
    {
      std::sort(v.begin(), v.end());
      std::vector<double> d;
      for (const double x : v)
        if (d.empty() || x - d.back() > tol)
          d.push_back(x);
      return d;
    }
  } // namespace


  HeightMap::HeightMap(const dealii::Point<2> &origin, const dealii::Tensor<1, 2> &spacing, const unsigned int n_x,
                       const unsigned int n_y, std::vector<double> values, const Extension extension,
                       std::string source_in)
    : x0(origin)
    , dx(spacing)
    , nx(n_x)
    , ny(n_y)
    , z(std::move(values))
    , ext(extension)
    , source(std::move(source_in))
  {
    AssertThrow(nx >= 4 && ny >= 4,
                dealii::ExcMessage("height map from " + source + ": expected at least 4 x 4 points for bicubic "
                                   "interpolation, found " + std::to_string(nx) + " x " + std::to_string(ny)));
    AssertThrow(z.size() == std::size_t(nx) * ny,
                dealii::ExcMessage("height map from " + source + ": expected " + std::to_string(nx * ny) +
                                   " values for " + std::to_string(nx) + " x " + std::to_string(ny) +
                                   " points, found " + std::to_string(z.size())));
    for (unsigned int d = 0; d < 2; ++d)
      AssertThrow(std::isfinite(dx[d]) && dx[d] > 0.0,
                  dealii::ExcMessage("height map from " + source + ": the grid spacing must be positive, found " +
                                     internal::nm(dx[d]) + (d == 0 ? " along x" : " along y")));
    for (std::size_t k = 0; k < z.size(); ++k)
      AssertThrow(std::abs(z[k]) <= max_topography_height,
                  dealii::ExcMessage("height map from " + source + ": the height at node (" +
                                     std::to_string(k % nx) + ", " + std::to_string(k / nx) + ") is " +
                                     internal::nm(z[k]) + "; expected a finite height with |height| <= " +
                                     internal::nm(max_topography_height)));
  }


  HeightMap HeightMap::read(const std::string &filename, const ReadOptions &options)
  {
    AssertThrow(options.length_unit > 0.0 && options.height_unit > 0.0,
                dealii::ExcMessage("height map file '" + filename + "': the length and height units must be positive"));
    LineReader               reader(filename, "height map");
    std::vector<std::string> tokens;
    const std::string        source = "file '" + filename + "'";

    if (options.format == ReadOptions::Format::matrix)
      {
        std::vector<double> values;
        unsigned int        n_columns = 0, n_rows = 0, first_line = 0;
        while (reader.next(tokens))
          {
            if (n_rows == 0)
              {
                n_columns  = tokens.size();
                first_line = reader.line_number;
              }
            else if (tokens.size() != n_columns)
              reader.fail("expected " + std::to_string(n_columns) + " heights as on line " +
                          std::to_string(first_line) + " (rows must have equal length), found " +
                          std::to_string(tokens.size()));
            for (const auto &t : tokens)
              values.push_back(reader.height(t, options.height_unit));
            ++n_rows;
          }
        AssertThrow(n_rows >= 4 && n_columns >= 4,
                    dealii::ExcMessage("height map file '" + filename + "', line " +
                                       std::to_string(reader.line_number) +
                                       " (end of file): expected at least 4 rows of at least 4 heights for bicubic "
                                       "interpolation, found " + std::to_string(n_rows) + " rows of " +
                                       std::to_string(n_columns)));
        if (options.first_row_at_top)
          for (unsigned int j = 0; j < n_rows / 2; ++j)
            std::swap_ranges(values.begin() + j * n_columns, values.begin() + (j + 1) * n_columns,
                             values.begin() + (n_rows - 1 - j) * n_columns);
        return HeightMap(options.origin, options.spacing, n_columns, n_rows, std::move(values), options.extension,
                         source);
      }

    // xyz columns.
    std::vector<std::array<double, 3>> points;
    std::vector<unsigned int>          lines;
    while (reader.next(tokens))
      {
        if (tokens.size() != 3)
          reader.fail("expected three numbers 'x y z', found " + std::to_string(tokens.size()) + " values");
        points.push_back({reader.number(tokens[0], "a coordinate x") * options.length_unit,
                          reader.number(tokens[1], "a coordinate y") * options.length_unit,
                          reader.height(tokens[2], options.height_unit)});
        lines.push_back(reader.line_number);
      }
    AssertThrow(points.size() >= 16,
                dealii::ExcMessage("height map file '" + filename + "', line " + std::to_string(reader.line_number) +
                                   " (end of file): expected at least 4 x 4 grid points for bicubic interpolation, "
                                   "found " + std::to_string(points.size()) + " points"));
    std::array<std::vector<double>, 2> grid;
    for (unsigned int d = 0; d < 2; ++d)
      {
        std::vector<double> c(points.size());
        for (std::size_t k = 0; k < points.size(); ++k)
          c[k] = points[k][d];
        const auto   range = std::minmax_element(c.begin(), c.end());
        const double span  = *range.second - *range.first;
        grid[d]            = distinct_values(c, 1e-6 * span);
        AssertThrow(grid[d].size() >= 4,
                    dealii::ExcMessage("height map file '" + filename + "': expected at least 4 distinct " +
                                       (d == 0 ? "x" : "y") + " coordinates for bicubic interpolation, found " +
                                       std::to_string(grid[d].size())));
      }
    const unsigned int   n_x = grid[0].size(), n_y = grid[1].size();
    dealii::Point<2>     origin(grid[0].front(), grid[1].front());
    dealii::Tensor<1, 2> spacing;
    spacing[0] = (grid[0].back() - grid[0].front()) / (n_x - 1);
    spacing[1] = (grid[1].back() - grid[1].front()) / (n_y - 1);
    std::vector<double> values(std::size_t(n_x) * n_y, std::numeric_limits<double>::quiet_NaN());
    for (std::size_t k = 0; k < points.size(); ++k)
      {
        int index[2];
        for (unsigned int d = 0; d < 2; ++d)
          {
            const double t = (points[k][d] - origin[d]) / spacing[d];
            index[d]       = static_cast<int>(std::lround(t));
            if (std::abs(t - index[d]) > 1e-3 || index[d] < 0 || index[d] >= int(d == 0 ? n_x : n_y))
              {
                reader.line_number = lines[k];
                reader.fail(std::string("the point is not on the regular grid implied by the file (") +
                            std::to_string(n_x) + " x " + std::to_string(n_y) + " nodes, spacing " +
                            internal::nm(spacing[0]) + " x " + internal::nm(spacing[1]) +
                            "); expected equally spaced x and y values");
              }
          }
        double &slot = values[std::size_t(index[1]) * n_x + index[0]];
        if (!std::isnan(slot))
          {
            reader.line_number = lines[k];
            reader.fail("the grid point (" + internal::num(points[k][0] / options.length_unit) + ", " +
                        internal::num(points[k][1] / options.length_unit) + ") appears a second time");
          }
        slot = points[k][2];
      }
    AssertThrow(points.size() == values.size(),
                dealii::ExcMessage("height map file '" + filename + "': expected all " +
                                   std::to_string(values.size()) + " points of the " + std::to_string(n_x) + " x " +
                                   std::to_string(n_y) + " grid, found " + std::to_string(points.size()) +
                                   " (missing grid points)"));
    return HeightMap(origin, spacing, n_x, n_y, std::move(values), options.extension, source);
  }


  HeightMap HeightMap::sample(const Topography &t, const dealii::Point<2> &origin, const dealii::Tensor<1, 2> &spacing,
                              const unsigned int n_x, const unsigned int n_y, const Extension extension)
  {
    std::vector<double> values(std::size_t(n_x) * n_y);
    for (unsigned int j = 0; j < n_y; ++j)
      for (unsigned int i = 0; i < n_x; ++i)
        values[std::size_t(j) * n_x + i] =
          t.height(dealii::Point<2>(origin[0] + i * spacing[0], origin[1] + j * spacing[1]));
    return HeightMap(origin, spacing, n_x, n_y, std::move(values), extension, "samples of [" + t.description() + "]");
  }


  std::array<double, 3> HeightMap::level_plane()
  {
    // On a complete regular grid the centred coordinates are orthogonal (Σ(x − x̄)(y − ȳ) = 0), so the
    // least-squares normal equations decouple into a mean and two one-dimensional slopes.
    const double xm = 0.5 * (nx - 1), ym = 0.5 * (ny - 1); // in grid units
    double       sum = 0.0, sxz = 0.0, syz = 0.0, sxx = 0.0, syy = 0.0;
    for (unsigned int j = 0; j < ny; ++j)
      for (unsigned int i = 0; i < nx; ++i)
        {
          const double v = z[std::size_t(j) * nx + i], a = i - xm, b = j - ym;
          sum += v;
          sxz += a * v;
          syz += b * v;
          sxx += a * a;
          syy += b * b;
        }
    const double c0 = sum / z.size(), c1 = sxz / sxx, c2 = syz / syy;
    for (unsigned int j = 0; j < ny; ++j)
      for (unsigned int i = 0; i < nx; ++i)
        z[std::size_t(j) * nx + i] -= c0 + c1 * (i - xm) + c2 * (j - ym);
    return {c0, c1 / dx[0], c2 / dx[1]};
  }


  void HeightMap::smooth(const double sigma)
  {
    AssertThrow(std::isfinite(sigma) && sigma >= 0.0,
                dealii::ExcMessage("height map from " + source + ": the smoothing width must be non-negative, found " +
                                   internal::nm(sigma)));
    if (sigma == 0.0)
      return;
    for (unsigned int d = 0; d < 2; ++d)
      {
        const double s = sigma / dx[d];
        const int    n = d == 0 ? nx : ny;
        // Checked before the conversion to int; a kernel wider than a periodic scan only flattens it.
        AssertThrow(4.0 * s < n,
                    dealii::ExcMessage("height map from " + source + ": the smoothing width " + internal::nm(sigma) +
                                       " is too large for the scan (4 sigma must be shorter than the scan)"));
        const int radius = static_cast<int>(std::ceil(4.0 * s));
        std::vector<double> w(2 * radius + 1);
        double              total = 0.0;
        for (int k = -radius; k <= radius; ++k)
          total += (w[k + radius] = std::exp(-0.5 * k * k / (s * s)));
        for (double &x : w)
          x /= total;
        const std::vector<double> old = z;
        for (unsigned int j = 0; j < ny; ++j)
          for (unsigned int i = 0; i < nx; ++i)
            {
              double    acc = 0.0;
              const int c   = d == 0 ? i : j;
              for (int k = -radius; k <= radius; ++k)
                {
                  int m = c + k;
                  if (ext == Extension::periodic)
                    m = wrap_index(m, n);
                  else
                    {
                      // even reflection about the edge nodes, as the clamped extension
                      const int period = 2 * (n - 1);
                      m                = wrap_index(m, period);
                      if (m >= n)
                        m = period - m;
                    }
                  acc += w[k + radius] * (d == 0 ? old[std::size_t(j) * nx + m] : old[std::size_t(m) * nx + i]);
                }
              z[std::size_t(j) * nx + i] = acc;
            }
      }
    source += ", smoothed with sigma = " + internal::nm(sigma);
  }


  dealii::Point<2> HeightMap::last_node() const
  {
    return dealii::Point<2>(x0[0] + (nx - 1) * dx[0], x0[1] + (ny - 1) * dx[1]);
  }


  double HeightMap::ghost_x(const int i, const int j) const
  {
    // j is a valid row here.
    const int n = nx;
    if (i >= 0 && i < n)
      return z[std::size_t(j) * nx + i];
    switch (ext)
      {
        case Extension::periodic:
          return z[std::size_t(j) * nx + wrap_index(i, n)];
        case Extension::clamped:
          return z[std::size_t(j) * nx + (i < 0 ? 1 : n - 2)];
        case Extension::error:
        default:
          {
            const std::size_t row = std::size_t(j) * nx;
            return i < 0 ? 3.0 * z[row] - 3.0 * z[row + 1] + z[row + 2]
                         : 3.0 * z[row + n - 1] - 3.0 * z[row + n - 2] + z[row + n - 3];
          }
      }
  }


  double HeightMap::node(const int i, const int j) const
  {
    const int n = ny;
    if (j >= 0 && j < n)
      return ghost_x(i, j);
    switch (ext)
      {
        case Extension::periodic:
          return ghost_x(i, wrap_index(j, n));
        case Extension::clamped:
          return ghost_x(i, j < 0 ? 1 : n - 2);
        case Extension::error:
        default:
          return j < 0 ? 3.0 * ghost_x(i, 0) - 3.0 * ghost_x(i, 1) + ghost_x(i, 2)
                       : 3.0 * ghost_x(i, n - 1) - 3.0 * ghost_x(i, n - 2) + ghost_x(i, n - 3);
      }
  }


  void HeightMap::locate(const dealii::Point<2> &p, int cell[2], double u[2], bool clamped[2]) const
  {
    for (unsigned int d = 0; d < 2; ++d)
      {
        const int n = d == 0 ? nx : ny;
        double    t = (p[d] - x0[d]) / dx[d];
        // A non-finite grid coordinate (a non-finite point, or a spacing so small that the quotient
        // overflows) has no cell; converting it to int would be undefined.
        AssertThrow(std::isfinite(t), dealii::ExcMessage("height map from " + source + ": the point (" +
                                                         internal::nm(p[0]) + ", " + internal::nm(p[1]) +
                                                         ") has no grid cell for the spacing " + internal::nm(dx[d])));
        clamped[d]  = false;
        if (ext == Extension::periodic)
          {
            t -= n * std::floor(t / n);
            cell[d] = std::min(static_cast<int>(std::floor(t)), n - 1);
          }
        else
          {
            if (ext == Extension::error && (t < -1e-9 || t > n - 1 + 1e-9))
              {
                const dealii::Point<2> top = last_node();
                AssertThrow(false, dealii::ExcMessage("height map from " + source + ": the point (" +
                                                      internal::nm(p[0]) + ", " + internal::nm(p[1]) +
                                                      ") lies outside the scan [" + internal::nm(x0[0]) + ", " +
                                                      internal::nm(top[0]) + "] x [" + internal::nm(x0[1]) + ", " +
                                                      internal::nm(top[1]) + "] and the extension is 'error'"));
              }
            if (t < 0.0 || t > n - 1)
              clamped[d] = true;
            t       = std::clamp(t, 0.0, double(n - 1));
            cell[d] = std::min(static_cast<int>(std::floor(t)), n - 2);
          }
        u[d] = t - cell[d];
      }
  }


  double HeightMap::height(const dealii::Point<2> &p) const
  {
    int    cell[2];
    double u[2], wx[4], wy[4], dwx[4], dwy[4];
    bool   clamped[2];
    locate(p, cell, u, clamped);
    keys_weights(u[0], wx, dwx);
    keys_weights(u[1], wy, dwy);
    double s = 0.0;
    for (int b = 0; b < 4; ++b)
      {
        double row = 0.0;
        for (int a = 0; a < 4; ++a)
          row += wx[a] * node(cell[0] - 1 + a, cell[1] - 1 + b);
        s += wy[b] * row;
      }
    return s;
  }


  dealii::Tensor<1, 2> HeightMap::gradient(const dealii::Point<2> &p) const
  {
    int    cell[2];
    double u[2], wx[4], wy[4], dwx[4], dwy[4];
    bool   clamped[2];
    locate(p, cell, u, clamped);
    keys_weights(u[0], wx, dwx);
    keys_weights(u[1], wy, dwy);
    dealii::Tensor<1, 2> g;
    for (int b = 0; b < 4; ++b)
      for (int a = 0; a < 4; ++a)
        {
          const double v = node(cell[0] - 1 + a, cell[1] - 1 + b);
          g[0] += dwx[a] * wy[b] * v;
          g[1] += wx[a] * dwy[b] * v;
        }
    // Beyond a clamped edge the map is constant along the outward direction.
    for (unsigned int d = 0; d < 2; ++d)
      g[d] = clamped[d] ? 0.0 : g[d] / dx[d];
    return g;
  }


  std::string HeightMap::description() const
  {
    static const char *names[] = {"periodic", "clamped", "error"};
    return "height map from " + source + ", " + std::to_string(nx) + " x " + std::to_string(ny) +
           " nodes, spacing " + internal::nm(dx[0]) + " x " + internal::nm(dx[1]) + ", origin (" +
           internal::nm(x0[0]) + ", " + internal::nm(x0[1]) + "), bicubic (Keys) interpolation, " +
           names[static_cast<int>(ext)] + " extension";
  }
} // namespace nappe
