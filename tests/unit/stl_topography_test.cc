// STL surfaces as height fields: a fine triangulation of an analytic bump, written by the test in
// ASCII and binary, reproduces the bump; bad files are reported with file and line.
// Geometry numbers are invented test scenarios.
#include <nappe/base/units.h>
#include <nappe/geometry/height_map.h>
#include <nappe/geometry/radial_features.h>
#include <nappe/geometry/stl_topography.h>

#include <common/thrown_message.h>

#include <gtest/gtest.h>

#include <array>
#include <cctype>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <fstream>

using namespace nappe;
using test_support::collapsed_message_of;
using dealii::Point;

namespace
{
  constexpr double nm = units::nanometer;
  using Facet         = std::array<std::array<double, 3>, 3>;

  Point<2> P(double x_nm, double y_nm) { return Point<2>(x_nm * nm, y_nm * nm); }

  /// The bump s = 10 exp(−r²/800) nm on [−L, L]² triangulated with n × n squares (two facets each),
  /// coordinates in nm, plus a bottom face at z = −5 nm (below the surface, so never the topmost).
  std::vector<Facet> bump_facets(const unsigned int n, const double L = 60.0)
  {
    const GaussianBump bump(10 * nm, 20 * nm);
    auto vertex = [&](unsigned int i, unsigned int j) -> std::array<double, 3> {
      const double x = -L + 2.0 * L * i / n, y = -L + 2.0 * L * j / n;
      return {x, y, bump.height(P(x, y)) / nm};
    };
    std::vector<Facet> f;
    for (unsigned int j = 0; j < n; ++j)
      for (unsigned int i = 0; i < n; ++i)
        {
          f.push_back({vertex(i, j), vertex(i + 1, j), vertex(i + 1, j + 1)});
          f.push_back({vertex(i, j), vertex(i + 1, j + 1), vertex(i, j + 1)});
        }
    f.push_back({{{-L, -L, -5}, {L, L, -5}, {L, -L, -5}}});
    f.push_back({{{-L, -L, -5}, {-L, L, -5}, {L, L, -5}}});
    return f;
  }

  void write_ascii(const std::string &file, const std::vector<Facet> &facets)
  {
    std::ofstream out(file);
    out.precision(17);
    out << "solid bump\n";
    for (const auto &f : facets)
      {
        out << "  facet normal 0 0 1\n    outer loop\n";
        for (const auto &v : f)
          out << "      vertex " << v[0] << ' ' << v[1] << ' ' << v[2] << '\n';
        out << "    endloop\n  endfacet\n";
      }
    out << "endsolid bump\n";
  }

  void write_binary(const std::string &file, const std::vector<Facet> &facets)
  {
    std::ofstream out(file, std::ios::binary);
    char          header[80] = {};
    std::strncpy(header, "solid-looking header of a binary file", 79); // exporters do this; must still be binary
    out.write(header, 80);
    const std::uint32_t n = facets.size();
    out.write(reinterpret_cast<const char *>(&n), 4);
    for (const auto &f : facets)
      {
        const float normal[3] = {0, 0, 1};
        out.write(reinterpret_cast<const char *>(normal), 12);
        for (const auto &v : f)
          for (const double c : v)
            {
              const float x = static_cast<float>(c);
              out.write(reinterpret_cast<const char *>(&x), 4);
            }
        const std::uint16_t attribute = 0;
        out.write(reinterpret_cast<const char *>(&attribute), 2);
      }
  }

  /// Max height [m] and gradient errors of stl against the bump over interior points.
  std::pair<double, double> error_against_bump(const Topography &stl)
  {
    const GaussianBump bump(10 * nm, 20 * nm);
    double             e_h = 0.0, e_g = 0.0;
    for (int i = 0; i < 23; ++i)
      for (int j = 0; j < 23; ++j)
        {
          const Point<2> p = P(-50.0 + 100.0 * (i + 0.377) / 23.0, -50.0 + 100.0 * (j + 0.613) / 23.0);
          e_h              = std::max(e_h, std::abs(stl.height(p) - bump.height(p)));
          e_g              = std::max(e_g, (stl.gradient(p) - bump.gradient(p)).norm());
        }
    return {e_h, e_g};
  }
} // namespace


TEST(StlTopography, AsciiTriangulationReproducesTheSurfaceWithSecondOrderHeightError)
{
  write_ascii("stl_bump_coarse.stl", bump_facets(60));
  write_ascii("stl_bump_fine.stl", bump_facets(120));
  const StlTopography coarse("stl_bump_coarse.stl"), fine("stl_bump_fine.stl");
  EXPECT_EQ(fine.n_triangles(), 2u * 120 * 120 + 2);
  const auto e_coarse = error_against_bump(coarse), e_fine = error_against_bump(fine);
  // Piecewise-linear interpolation: height error ≤ h² max|s''| / 2 (h = 2 nm: 0.05 nm), O(h²); gradient O(h).
  EXPECT_LT(e_coarse.first, 0.05 * nm);
  EXPECT_GT(std::log2(e_coarse.first / e_fine.first), 1.7);
  EXPECT_LT(e_fine.second, 0.03);
  EXPECT_GT(std::log2(e_coarse.second / e_fine.second), 0.8);
  // The topmost facet wins: the bottom face at −5 nm is never reported.
  EXPECT_GT(fine.height(P(55, -55)), 0.0);
  std::remove("stl_bump_coarse.stl");
  std::remove("stl_bump_fine.stl");
}

TEST(StlTopography, BinaryFileGivesTheSameSurfaceInMicrometres)
{
  auto facets = bump_facets(80);
  for (auto &f : facets)
    for (auto &v : f)
      for (double &c : v)
        c *= 1e-3; // nm → µm
  write_binary("stl_bump_binary.stl", facets);
  StlTopography::Options o;
  o.length_unit = length_unit_from_name("um");
  const StlTopography stl("stl_bump_binary.stl", o);
  EXPECT_EQ(stl.n_triangles(), facets.size());
  const auto e = error_against_bump(stl);
  EXPECT_LT(e.first, 0.03 * nm); // float coordinates add ≈ 1e-7 relative, far below this
  EXPECT_LT(e.second, 0.05);
  EXPECT_NEAR(stl.footprint_upper()[0], 60 * nm, 1e-7 * 60 * nm); // float coordinates
  std::remove("stl_bump_binary.stl");
}

TEST(StlTopography, OutsideTheFootprintErrsOrReturnsTheChosenHeight)
{
  write_ascii("stl_bump_small.stl", bump_facets(20));
  const StlTopography strict("stl_bump_small.stl");
  const std::string   msg = collapsed_message_of([&] { strict.height(P(75, 0)); });
  EXPECT_NE(msg.find("stl_bump_small.stl"), std::string::npos) << msg;
  EXPECT_NE(msg.find("75 nm"), std::string::npos) << msg;
  StlTopography::Options o;
  o.outside        = StlTopography::Outside::constant;
  o.outside_height = -1 * nm;
  const StlTopography lenient("stl_bump_small.stl", o);
  EXPECT_DOUBLE_EQ(lenient.height(P(75, 0)), -1 * nm);
  EXPECT_DOUBLE_EQ(lenient.gradient(P(75, 0)).norm(), 0.0);
  std::remove("stl_bump_small.stl");
}

TEST(StlTopography, ResamplingToAHeightMapGivesAC1Surface)
{
  write_ascii("stl_bump_resample.stl", bump_facets(120));
  const StlTopography stl("stl_bump_resample.stl");
  const HeightMap     map = HeightMap::sample(stl, P(-50, -50), dealii::Tensor<1, 2>({2 * nm, 2 * nm}), 51, 51,
                                              HeightMap::Extension::clamped);
  const GaussianBump  bump(10 * nm, 20 * nm);
  EXPECT_NEAR(map.height(P(3.3, -7.1)), bump.height(P(3.3, -7.1)), 0.02 * nm);
  EXPECT_NEAR((map.gradient(P(3.3, -7.1)) - bump.gradient(P(3.3, -7.1))).norm(), 0.0, 0.01);
  std::remove("stl_bump_resample.stl");
}

TEST(StlTopography, BadFilesGiveErrorsNamingTheFileAndLine)
{
  {
    std::ofstream("stl_bad_vertex.stl") << "solid x\n facet normal 0 0 1\n  outer loop\n   vertex 0 0 0\n"
                                           "   vertex 1 zero 0\n   vertex 0 1 0\n  endloop\n endfacet\nendsolid x\n";
  }
  std::string msg = collapsed_message_of([] { StlTopography("stl_bad_vertex.stl"); });
  EXPECT_NE(msg.find("stl_bad_vertex.stl"), std::string::npos) << msg;
  EXPECT_NE(msg.find("line 5"), std::string::npos) << msg;
  EXPECT_NE(msg.find("finite number"), std::string::npos) << msg;

  {
    std::ofstream("stl_missing_endloop.stl") << "solid x\n facet normal 0 0 1\n  outer loop\n   vertex 0 0 0\n"
                                                "   vertex 1 0 0\n   vertex 0 1 0\n endfacet\nendsolid x\n";
  }
  msg = collapsed_message_of([] { StlTopography("stl_missing_endloop.stl"); });
  EXPECT_NE(msg.find("line 7"), std::string::npos) << msg;
  EXPECT_NE(msg.find("'endloop'"), std::string::npos) << msg;

  {
    std::ofstream out("stl_truncated.stl", std::ios::binary);
    const std::string   header(80, 'h');
    const std::uint32_t n = 10;
    out.write(header.data(), 80);
    out.write(reinterpret_cast<const char *>(&n), 4);
    out << std::string(120, '\0');
  }
  msg = collapsed_message_of([] { StlTopography("stl_truncated.stl"); });
  EXPECT_NE(msg.find("stl_truncated.stl"), std::string::npos) << msg;
  EXPECT_NE(msg.find("10 facets"), std::string::npos) << msg;
  EXPECT_NE(msg.find("204 bytes"), std::string::npos) << msg;

  msg = collapsed_message_of([] { StlTopography("stl_does_not_exist.stl"); });
  EXPECT_NE(msg.find("stl_does_not_exist.stl"), std::string::npos) << msg;
  for (const char *f : {"stl_bad_vertex.stl", "stl_missing_endloop.stl", "stl_truncated.stl"})
    std::remove(f);
}
