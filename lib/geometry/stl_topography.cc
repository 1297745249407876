// The only unit that includes CGAL (heavy): the AABB tree of the STL facets.
#include <deal.II/base/exceptions.h>

#include <nappe/geometry/height_limit.h>
#include <nappe/geometry/stl_topography.h>

#include <CGAL/AABB_traits.h>
#include <CGAL/AABB_tree.h>
#include <CGAL/AABB_triangle_primitive.h>
#include <CGAL/Simple_cartesian.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <fstream>
#include <sstream>

#include "format.h"
#include "input_file.h"

namespace nappe
{
  namespace
  {
    using Kernel     = CGAL::Simple_cartesian<double>;
    using Triangle   = Kernel::Triangle_3;
    using Iterator   = std::vector<Triangle>::const_iterator;
    using Primitive  = CGAL::AABB_triangle_primitive<Kernel, Iterator>;
    using Tree       = CGAL::AABB_tree<CGAL::AABB_traits<Kernel, Primitive>>;
    using Vertex     = std::array<double, 3>;
    using RawFacet   = std::array<Vertex, 3>;

    [[noreturn]] void fail(const std::string &message)
    {
      AssertThrow(false, dealii::ExcMessage(message));
      throw; // not reached
    }

    /// The message for a vertex whose height z (in file units, times @p unit in m) is out of range.
    std::string height_out_of_range(const double z, const double unit)
    {
      return "height z = " + internal::num(z) + " file units (" + internal::nm(z * unit) +
             "); expected |z| <= " + internal::nm(max_topography_height) + " (check the length unit)";
    }

    bool height_in_range(const double z, const double unit) { return std::abs(z * unit) <= max_topography_height; }

    std::vector<RawFacet> read_binary(const std::string &filename, std::ifstream &in, const std::uint32_t n,
                                      const double unit)
    {
      std::vector<RawFacet> facets(n);
      in.seekg(84);
      char record[50];
      for (std::uint32_t k = 0; k < n; ++k)
        {
          if (!in.read(record, 50))
            fail("binary STL file '" + filename + "': the file ends inside facet " + std::to_string(k + 1));
          for (unsigned int v = 0; v < 3; ++v)
            for (unsigned int c = 0; c < 3; ++c)
              {
                float f;
                std::memcpy(&f, record + 12 + 12 * v + 4 * c, 4); // skip the 12-byte normal
                if (!std::isfinite(f))
                  fail("binary STL file '" + filename + "': facet " + std::to_string(k + 1) +
                       " has a non-finite vertex coordinate; expected finite numbers");
                facets[k][v][c] = f;
              }
          for (unsigned int v = 0; v < 3; ++v)
            if (!height_in_range(facets[k][v][2], unit))
              fail("binary STL file '" + filename + "': facet " + std::to_string(k + 1) + " has a vertex at " +
                   height_out_of_range(facets[k][v][2], unit));
        }
      return facets;
    }

    std::vector<RawFacet> read_ascii(const std::string &filename, std::ifstream &in, const double unit)
    {
      in.seekg(0);
      std::vector<RawFacet> facets;
      std::string           line;
      unsigned int          line_number = 0;
      // A tiny state machine over the keywords; names after solid/endsolid are skipped.
      enum class Expect
      {
        solid,
        facet_or_endsolid,
        outer_loop,
        vertex,
        endloop,
        endfacet
      } expect         = Expect::solid;
      unsigned int n_v = 0;
      RawFacet     current{};
      auto         error = [&](const std::string &what, const std::string &found) {
        fail("ASCII STL file '" + filename + "', line " + std::to_string(line_number) + ": expected " + what +
             ", found '" + internal::excerpt(found) + "'");
      };
      while (std::getline(in, line))
        {
          ++line_number;
          std::istringstream words(line);
          std::string        keyword;
          if (!(words >> keyword))
            continue;
          switch (expect)
            {
              case Expect::solid:
                if (keyword != "solid")
                  error("'solid'", line);
                expect = Expect::facet_or_endsolid;
                break;
              case Expect::facet_or_endsolid:
                {
                  if (keyword == "endsolid")
                    {
                      expect = Expect::solid;
                      break;
                    }
                  std::string normal;
                  if (keyword != "facet" || !(words >> normal) || normal != "normal")
                    error("'facet normal nx ny nz' or 'endsolid'", line);
                  expect = Expect::outer_loop;
                  break;
                }
              case Expect::outer_loop:
                {
                  std::string loop;
                  if (keyword != "outer" || !(words >> loop) || loop != "loop")
                    error("'outer loop'", line);
                  expect = Expect::vertex;
                  n_v    = 0;
                  break;
                }
              case Expect::vertex:
                {
                  if (keyword != "vertex")
                    error("'vertex x y z' (vertex " + std::to_string(n_v + 1) + " of 3)", line);
                  for (unsigned int c = 0; c < 3; ++c)
                    {
                      std::string token;
                      if (!(words >> token))
                        error("three coordinates after 'vertex'", line);
                      char        *end   = nullptr;
                      const double value = std::strtod(token.c_str(), &end);
                      if (end == token.c_str() || *end != '\0' || !std::isfinite(value))
                        error("a finite number as coordinate " + std::to_string(c + 1) + " of the vertex", token);
                      current[n_v][c] = value;
                    }
                  if (!height_in_range(current[n_v][2], unit))
                    fail("ASCII STL file '" + filename + "', line " + std::to_string(line_number) + ": a vertex at " +
                         height_out_of_range(current[n_v][2], unit));
                  if (++n_v == 3)
                    expect = Expect::endloop;
                  break;
                }
              case Expect::endloop:
                if (keyword != "endloop")
                  error("'endloop' after three vertices", line);
                expect = Expect::endfacet;
                break;
              case Expect::endfacet:
                if (keyword != "endfacet")
                  error("'endfacet'", line);
                facets.push_back(current);
                expect = Expect::facet_or_endsolid;
                break;
            }
        }
      if (expect != Expect::solid)
        fail("ASCII STL file '" + filename + "', line " + std::to_string(line_number) +
             " (end of file): the file ends inside a solid; expected 'endsolid'");
      return facets;
    }
  } // namespace


  struct StlTopography::Impl
  {
    std::string            filename;
    Options                options;
    std::vector<Triangle>  triangles;
    Tree                   tree;
    double                 z_min = 0.0, z_max = 0.0, tolerance = 0.0;
    dealii::Point<2>       lower, upper;

    /// Topmost facet above/below p: (found, z, gradient).
    bool query(const dealii::Point<2> &p, double &z, dealii::Tensor<1, 2> &g) const
    {
      const double   e = tolerance;
      const CGAL::Bbox_3 box(p[0] - e, p[1] - e, z_min - 1.0, p[0] + e, p[1] + e, z_max + 1.0);
      std::vector<Primitive::Id> hits;
      tree.all_intersected_primitives(box, std::back_inserter(hits));
      bool found = false;
      for (const auto &id : hits)
        {
          const Triangle &t = *id;
          const auto &a = t.vertex(0), &b = t.vertex(1), &c = t.vertex(2);
          const double det = (b.x() - a.x()) * (c.y() - a.y()) - (c.x() - a.x()) * (b.y() - a.y());
          const double area_scale = std::abs(b.x() - a.x()) + std::abs(c.x() - a.x()) + std::abs(b.y() - a.y()) +
                                    std::abs(c.y() - a.y());
          if (std::abs(det) <= 1e-12 * area_scale * area_scale)
            continue; // vertical or degenerate facet
          // Barycentric coordinates of p in the facet's projection.
          const double l1 = ((b.x() - p[0]) * (c.y() - p[1]) - (c.x() - p[0]) * (b.y() - p[1])) / det;
          const double l2 = ((c.x() - p[0]) * (a.y() - p[1]) - (a.x() - p[0]) * (c.y() - p[1])) / det;
          const double l3 = 1.0 - l1 - l2;
          const double slack = -1e-10;
          if (l1 < slack || l2 < slack || l3 < slack)
            continue;
          const double zt = l1 * a.z() + l2 * b.z() + l3 * c.z();
          if (found && zt <= z)
            continue;
          found = true;
          z     = zt;
          // Normal n = (b − a) × (c − a); the height gradient is −(n_x, n_y)/n_z.
          const double ux = b.x() - a.x(), uy = b.y() - a.y(), uz = b.z() - a.z();
          const double vx = c.x() - a.x(), vy = c.y() - a.y(), vz = c.z() - a.z();
          const double nx = uy * vz - uz * vy, ny = uz * vx - ux * vz, nz = ux * vy - uy * vx;
          g[0]            = -nx / nz;
          g[1]            = -ny / nz;
        }
      return found;
    }

    void outside(const dealii::Point<2> &p, double &z, dealii::Tensor<1, 2> &g) const
    {
      AssertThrow(options.outside == Outside::constant,
                  dealii::ExcMessage("STL file '" + filename + "': no facet lies above or below the point (" +
                                     internal::nm(p[0]) + ", " + internal::nm(p[1]) + "); the footprint's bounding box is [" +
                                     internal::nm(lower[0]) + ", " + internal::nm(upper[0]) + "] x [" +
                                     internal::nm(lower[1]) + ", " + internal::nm(upper[1]) +
                                     "]. Keep the domain on the design or select the constant extension outside it"));
      z = options.outside_height;
      g = dealii::Tensor<1, 2>();
    }
  };


  StlTopography::StlTopography(const std::string &filename, const Options &options)
    : impl(std::make_unique<Impl>())
  {
    impl->filename = filename;
    impl->options  = options;
    AssertThrow(std::isfinite(options.length_unit) && options.length_unit > 0.0,
                dealii::ExcMessage("STL file '" + filename + "': the length unit must be positive"));
    AssertThrow(std::isfinite(options.outside_height),
                dealii::ExcMessage("STL file '" + filename + "': the height outside the footprint must be finite"));

    internal::require_regular_file(filename, "STL");
    std::ifstream in(filename, std::ios::binary);
    AssertThrow(in.good(), dealii::ExcMessage("cannot open STL file '" + filename + "' for reading"));
    in.seekg(0, std::ios::end);
    const std::streamoff size = in.tellg();
    in.seekg(0);
    char header[84] = {};
    in.read(header, std::min<std::streamoff>(size, 84));
    in.clear();
    std::uint32_t n_binary = 0;
    if (size >= 84)
      std::memcpy(&n_binary, header + 80, 4);
    const bool is_binary    = size >= 84 && size == 84 + 50 * std::streamoff(n_binary);
    const bool starts_solid = size >= 5 && std::strncmp(header, "solid", 5) == 0;
    // Binary exporters often begin the 80-byte comment with "solid" too; an ASCII file has no control
    // bytes other than white space in its first 84 bytes, a binary one has its facet count there.
    const bool looks_text = starts_solid && std::none_of(header, header + std::min<std::streamoff>(size, 84), [](char c) {
                              const auto b = static_cast<unsigned char>(c);
                              return b < 0x20 && b != '\t' && b != '\n' && b != '\r' && b != '\f' && b != '\v';
                            });

    std::vector<RawFacet> facets;
    if (is_binary)
      facets = read_binary(filename, in, n_binary, options.length_unit);
    else if (looks_text)
      facets = read_ascii(filename, in, options.length_unit);
    else if (size < 84)
      fail("STL file '" + filename + "': expected an ASCII STL starting with 'solid' or a binary STL with an "
           "84-byte header, found a file of " + std::to_string(size) + " bytes");
    else
      fail("binary STL file '" + filename + "': the header announces " + std::to_string(n_binary) +
           " facets, which need " + std::to_string(84 + 50 * std::streamoff(n_binary)) +
           " bytes, but the file has " + std::to_string(size) + " bytes (truncated or not an STL file" +
           (starts_solid ? "; its header starts with 'solid' but it contains binary data" : "") + ")");
    AssertThrow(!facets.empty(), dealii::ExcMessage("STL file '" + filename + "': expected at least one facet, found none"));

    const double u = options.length_unit;
    double       lo[3], hi[3];
    for (unsigned int c = 0; c < 3; ++c)
      {
        lo[c] = std::numeric_limits<double>::infinity();
        hi[c] = -lo[c];
      }
    impl->triangles.reserve(facets.size());
    for (const auto &f : facets)
      {
        Kernel::Point_3 v[3];
        for (unsigned int k = 0; k < 3; ++k)
          {
            v[k] = Kernel::Point_3(f[k][0] * u, f[k][1] * u, f[k][2] * u);
            for (unsigned int c = 0; c < 3; ++c)
              {
                lo[c] = std::min(lo[c], f[k][c] * u);
                hi[c] = std::max(hi[c], f[k][c] * u);
              }
          }
        impl->triangles.emplace_back(v[0], v[1], v[2]);
      }
    impl->z_min     = lo[2];
    impl->z_max     = hi[2];
    impl->lower     = dealii::Point<2>(lo[0], lo[1]);
    impl->upper     = dealii::Point<2>(hi[0], hi[1]);
    impl->tolerance = 1e-9 * std::max(hi[0] - lo[0], hi[1] - lo[1]);
    impl->tree.insert(impl->triangles.cbegin(), impl->triangles.cend());
    impl->tree.build(); // build now: lazy construction on the first query would not be thread-safe
  }

  StlTopography::StlTopography(const std::string &filename)
    : StlTopography(filename, Options())
  {}

  StlTopography::~StlTopography()                                  = default;
  StlTopography::StlTopography(StlTopography &&) noexcept            = default;
  StlTopography &StlTopography::operator=(StlTopography &&) noexcept = default;

  double StlTopography::height(const dealii::Point<2> &p) const
  {
    double               z = 0.0;
    dealii::Tensor<1, 2> g;
    if (!impl->query(p, z, g))
      impl->outside(p, z, g);
    return z;
  }

  dealii::Tensor<1, 2> StlTopography::gradient(const dealii::Point<2> &p) const
  {
    double               z = 0.0;
    dealii::Tensor<1, 2> g;
    if (!impl->query(p, z, g))
      impl->outside(p, z, g);
    return g;
  }

  std::size_t StlTopography::n_triangles() const { return impl->triangles.size(); }

  dealii::Point<2> StlTopography::footprint_lower() const { return impl->lower; }

  dealii::Point<2> StlTopography::footprint_upper() const { return impl->upper; }

  std::string StlTopography::description() const
  {
    return "STL surface '" + impl->filename + "', " + std::to_string(impl->triangles.size()) +
           " facets, footprint [" + internal::nm(impl->lower[0]) + ", " + internal::nm(impl->upper[0]) + "] x [" +
           internal::nm(impl->lower[1]) + ", " + internal::nm(impl->upper[1]) + "], topmost facet on vertical lines" +
           (impl->options.outside == Outside::constant
              ? ", height " + internal::nm(impl->options.outside_height) + " outside"
              : ", error outside");
  }
} // namespace nappe
