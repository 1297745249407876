// Height maps: interpolation accuracy and order, levelling, smoothing, extensions, file reading, errors.
// The surfaces and files are invented test scenarios.
#include <nappe/base/units.h>
#include <nappe/geometry/height_map.h>
#include <nappe/geometry/sinusoidal_topography.h>

#include <common/thrown_message.h>

#include <gtest/gtest.h>

#include <cctype>
#include <cmath>
#include <fstream>

using namespace nappe;
using test_support::collapsed_message_of;
using dealii::Point;
using dealii::Tensor;

namespace
{
  constexpr double nm = units::nanometer;

  Point<2> P(double x_nm, double y_nm) { return Point<2>(x_nm * nm, y_nm * nm); }

  /// Max errors of height [m] and gradient [-] of an egg carton (λ = 100 nm) sampled with n nodes per
  /// period, periodic extension, over interior points off the nodes.
  std::pair<double, double> sampling_error(const unsigned int n)
  {
    const EggCarton   egg(5 * nm, 100 * nm);
    const double      h = 100.0 / n;
    const HeightMap   map = HeightMap::sample(egg, P(0, 0), Tensor<1, 2>({h * nm, h * nm}), n, n,
                                              HeightMap::Extension::periodic);
    double e_h = 0.0, e_g = 0.0;
    for (int i = 0; i < 37; ++i)
      for (int j = 0; j < 37; ++j)
        {
          const Point<2> p = P(100.0 * (i + 0.37) / 37.0, 100.0 * (j + 0.61) / 37.0);
          e_h              = std::max(e_h, std::abs(map.height(p) - egg.height(p)));
          e_g              = std::max(e_g, (map.gradient(p) - egg.gradient(p)).norm());
        }
    return {e_h, e_g};
  }

  std::string write_file(const std::string &name, const std::string &content)
  {
    std::ofstream(name) << content;
    return name;
  }

} // namespace


TEST(HeightMap, InterpolatesThroughTheNodes)
{
  const SinusoidalGrating g(5 * nm, 100 * nm);
  const HeightMap map = HeightMap::sample(g, P(-10, -10), Tensor<1, 2>({4 * nm, 5 * nm}), 11, 8,
                                          HeightMap::Extension::error);
  EXPECT_NEAR(map.height(P(-10 + 3 * 4, -10 + 2 * 5)), g.height(P(2, 0)), 1e-22);
}

TEST(HeightMap, SampledAnalyticSurfaceConvergesAtThirdOrderInHeightAndSecondInGradient)
{
  // Keys (1981): cubic convolution with a = −1/2 is third-order accurate; its derivative second order.
  const auto coarse = sampling_error(16), fine = sampling_error(32), finer = sampling_error(64);
  const double order_h = std::log2(fine.first / finer.first), order_g = std::log2(fine.second / finer.second);
  EXPECT_GT(std::log2(coarse.first / fine.first), 2.7);
  EXPECT_GT(order_h, 2.8);
  EXPECT_LT(order_h, 3.3);
  EXPECT_GT(order_g, 1.8);
  EXPECT_LT(order_g, 2.3);
  EXPECT_LT(finer.first, 1e-3 * 5 * nm);
}

TEST(HeightMap, ErrorExtensionKeepsFullAccuracyUpToTheScanEdge)
{
  const EggCarton egg(5 * nm, 100 * nm);
  double          e[2];
  for (unsigned int k = 0; k < 2; ++k)
    {
      const unsigned int n   = 21 + 20 * k; // 5 nm and 2.5 nm spacing over [0, 100] nm
      const double       h   = 100.0 / (n - 1);
      const HeightMap    map = HeightMap::sample(egg, P(0, 0), Tensor<1, 2>({h * nm, h * nm}), n, n,
                                                 HeightMap::Extension::error);
      e[k]                   = 0.0;
      for (double x : {0.3, 1.1, 1.9, 98.7, 99.9})
        e[k] = std::max(e[k], std::abs(map.height(P(x, 0.4)) - egg.height(P(x, 0.4))));
    }
  EXPECT_GT(std::log2(e[0] / e[1]), 2.5);
  EXPECT_THROW(HeightMap::sample(egg, P(0, 0), Tensor<1, 2>({5 * nm, 5 * nm}), 21, 21, HeightMap::Extension::error)
                 .height(P(101, 50)),
               std::exception);
}

TEST(HeightMap, ClampedExtensionIsFlatAndContinuousOutsideTheScan)
{
  const EggCarton egg(5 * nm, 100 * nm);
  const HeightMap map = HeightMap::sample(egg, P(0, 0), Tensor<1, 2>({2 * nm, 2 * nm}), 51, 51,
                                          HeightMap::Extension::clamped);
  EXPECT_NEAR(map.height(P(130, 30)), map.height(P(100, 30)), 1e-22);
  EXPECT_NEAR(map.gradient(P(130, 30))[0], 0.0, 1e-15);
  EXPECT_NEAR(map.gradient(P(100 - 1e-6, 30))[0], 0.0, 1e-6); // zero normal slope at the edge: C1
  EXPECT_NEAR(map.height(P(50 + 0.3, 30)), egg.height(P(50.3, 30)), 1e-3 * nm);
}

TEST(HeightMap, PeriodicExtensionRepeatsTheScan)
{
  const EggCarton egg(5 * nm, 100 * nm);
  const HeightMap map = HeightMap::sample(egg, P(0, 0), Tensor<1, 2>({5 * nm, 5 * nm}), 20, 20,
                                          HeightMap::Extension::periodic);
  EXPECT_NEAR(map.height(P(-37.3, 260.1)), map.height(P(62.7, 60.1)), 1e-21);
  EXPECT_NEAR((map.gradient(P(99.99, 3)) - map.gradient(P(-0.01, 3))).norm(), 0.0, 1e-12);
}

TEST(HeightMap, PlaneLevellingRemovesATiltExactly)
{
  std::vector<double> z;
  for (unsigned int j = 0; j < 7; ++j)
    for (unsigned int i = 0; i < 9; ++i)
      z.push_back((3.0 + 0.02 * (i * 2.0) - 0.05 * (j * 3.0)) * nm);
  HeightMap  map(P(0, 0), Tensor<1, 2>({2 * nm, 3 * nm}), 9, 7, z, HeightMap::Extension::clamped);
  const auto c = map.level_plane();
  EXPECT_NEAR(c[1], 0.02, 1e-14);
  EXPECT_NEAR(c[2], -0.05, 1e-14);
  for (unsigned int j = 0; j < 7; ++j)
    for (unsigned int i = 0; i < 9; ++i)
      EXPECT_NEAR(map.node_value(i, j), 0.0, 1e-24);
}

TEST(HeightMap, LevellingIsBlindToAnAddedTilt)
{
  // Least squares is linear: levelling a grating plus a tilt gives the levelled grating.
  const SinusoidalGrating g(5 * nm, 100 * nm);
  std::vector<double>     z, z_tilted;
  for (unsigned int j = 0; j < 20; ++j)
    for (unsigned int i = 0; i < 40; ++i)
      {
        z.push_back(g.height(P(5.0 * i, 5.0 * j)));
        z_tilted.push_back(z.back() + (0.1 * 5.0 * i + 0.03 * 5.0 * j + 7.0) * nm);
      }
  HeightMap plain(P(0, 0), Tensor<1, 2>({5 * nm, 5 * nm}), 40, 20, z, HeightMap::Extension::periodic);
  HeightMap tilted(P(0, 0), Tensor<1, 2>({5 * nm, 5 * nm}), 40, 20, z_tilted, HeightMap::Extension::periodic);
  plain.level_plane();
  const auto c = tilted.level_plane();
  for (const Point<2> &p : {P(50, 30), P(12.5, 77.7)})
    EXPECT_NEAR(tilted.height(p), plain.height(p), 1e-22);
  EXPECT_NEAR(c[2], 0.03, 1e-12);
}

TEST(HeightMap, GaussianSmoothingDampsShortWavelengthsAndKeepsPlanes)
{
  // A grating of wavelength 4Δ is damped by exp(−k²σ²/2) for σ = Δ: k = 2π/(4Δ) → factor exp(−π²/8).
  const SinusoidalGrating g(5 * nm, 20 * nm);
  HeightMap               map = HeightMap::sample(g, P(0, 0), Tensor<1, 2>({5 * nm, 5 * nm}), 16, 8,
                                                  HeightMap::Extension::periodic);
  map.smooth(5 * nm);
  EXPECT_NEAR(map.node_value(0, 3) / (5 * nm), std::exp(-M_PI * M_PI / 8.0), 0.01);
  std::vector<double> plane(64, 2 * nm);
  HeightMap           flat(P(0, 0), Tensor<1, 2>({1 * nm, 1 * nm}), 8, 8, plane, HeightMap::Extension::clamped);
  flat.smooth(1.5 * nm);
  EXPECT_NEAR(flat.node_value(0, 7), 2 * nm, 1e-22);
}

TEST(HeightMap, ReadsAMatrixFileInTheStatedUnits)
{
  // Heights in nm on a 0.01 µm grid; comment and blank lines are skipped, commas separate.
  const std::string file = write_file("height_map_matrix.txt", "# AFM export\n"
                                                               "0, 1, 2, 3, 4\n"
                                                               "\n"
                                                               "1 2 3 4 5\n"
                                                               "% another comment\n"
                                                               "2;3;4;5;6\n"
                                                               "3\t4\t5\t6\t7\n");
  HeightMap::ReadOptions o;
  o.spacing     = Tensor<1, 2>({0.01e-6, 0.01e-6});
  o.height_unit = length_unit_from_name("nm");
  o.extension   = HeightMap::Extension::error;
  const HeightMap map = HeightMap::read(file, o);
  EXPECT_EQ(map.n_points_x(), 5u);
  EXPECT_EQ(map.n_points_y(), 4u);
  // The data are the plane z = (x + y)/10 nm: cubic convolution reproduces planes exactly.
  EXPECT_NEAR(map.height(P(13, 27)), 4.0 * nm, 1e-20);
  EXPECT_NEAR(map.gradient(P(13, 27))[0], 0.1, 1e-12);
  o.first_row_at_top = true;
  EXPECT_NEAR(HeightMap::read(file, o).height(P(0, 0)), 3.0 * nm, 1e-20);
  std::remove(file.c_str());
}

TEST(HeightMap, ReadsXyzColumnsInAnyOrderInMicrometres)
{
  std::string content = "# x[um] y[um] z[um]\n";
  for (int k = 19; k >= 0; --k) // reverse order, 5 x 4 grid with spacing 0.5 um x 0.25 um
    {
      const int i = k % 5, j = k / 5;
      content += std::to_string(1.0 + 0.5 * i) + " " + std::to_string(0.25 * j) + " " +
                 std::to_string(0.001 * (i + 2 * j)) + "\n";
    }
  const std::string      file = write_file("height_map_xyz.txt", content);
  HeightMap::ReadOptions o;
  o.format      = HeightMap::ReadOptions::Format::xyz;
  o.length_unit = length_unit_from_name("um");
  o.height_unit = length_unit_from_name("\u00b5m");
  const HeightMap map = HeightMap::read(file, o);
  EXPECT_EQ(map.n_points_x(), 5u);
  EXPECT_EQ(map.n_points_y(), 4u);
  EXPECT_NEAR(map.spacing()[0], 0.5e-6, 1e-15);
  EXPECT_NEAR(map.origin()[0], 1.0e-6, 1e-15);
  EXPECT_NEAR(map.node_value(4, 3), 0.001e-6 * 10, 1e-18);
  std::remove(file.c_str());
}

TEST(HeightMap, BadFilesGiveErrorsNamingTheFileAndLine)
{
  HeightMap::ReadOptions o;
  o.spacing = Tensor<1, 2>({1 * nm, 1 * nm});
  const std::string rows = "1 2 3 4\n1 2 3 4\n1 2 3 4\n1 2 3 4\n";

  std::string f   = write_file("bad_token_map.txt", "1 2 3 4\n1 2 x3 4\n" + rows);
  std::string msg = collapsed_message_of([&] { HeightMap::read(f, o); });
  EXPECT_NE(msg.find("bad_token_map.txt"), std::string::npos) << msg;
  EXPECT_NE(msg.find("line 2"), std::string::npos) << msg;
  EXPECT_NE(msg.find("expected a height"), std::string::npos) << msg;
  std::remove(f.c_str());

  f   = write_file("ragged_map.txt", "# header\n1 2 3 4\n1 2 3 4\n1 2 3\n1 2 3 4\n");
  msg = collapsed_message_of([&] { HeightMap::read(f, o); });
  EXPECT_NE(msg.find("ragged_map.txt"), std::string::npos) << msg;
  EXPECT_NE(msg.find("line 4"), std::string::npos) << msg;
  EXPECT_NE(msg.find("expected 4 heights"), std::string::npos) << msg;
  std::remove(f.c_str());

  f   = write_file("nan_map.txt", "1 2 3 4\n1 2 3 4\n1 nan 3 4\n1 2 3 4\n");
  msg = collapsed_message_of([&] { HeightMap::read(f, o); });
  EXPECT_NE(msg.find("nan_map.txt"), std::string::npos) << msg;
  EXPECT_NE(msg.find("line 3"), std::string::npos) << msg;
  EXPECT_NE(msg.find("finite"), std::string::npos) << msg;
  std::remove(f.c_str());

  f   = write_file("small_map.txt", "1 2 3 4\n1 2 3 4\n");
  msg = collapsed_message_of([&] { HeightMap::read(f, o); });
  EXPECT_NE(msg.find("small_map.txt"), std::string::npos) << msg;
  EXPECT_NE(msg.find("at least 4 rows"), std::string::npos) << msg;
  std::remove(f.c_str());

  o.format = HeightMap::ReadOptions::Format::xyz;
  f        = write_file("short_xyz.txt", "0 0 1\n1 0 1\n2 0\n");
  msg      = collapsed_message_of([&] { HeightMap::read(f, o); });
  EXPECT_NE(msg.find("short_xyz.txt"), std::string::npos) << msg;
  EXPECT_NE(msg.find("line 3"), std::string::npos) << msg;
  EXPECT_NE(msg.find("three numbers"), std::string::npos) << msg;
  std::remove(f.c_str());

  msg = collapsed_message_of([&] { HeightMap::read("no_such_height_map.txt", o); });
  EXPECT_NE(msg.find("no_such_height_map.txt"), std::string::npos) << msg;
  EXPECT_NE(collapsed_message_of([] { length_unit_from_name("furlong"); }).find("furlong"), std::string::npos);
}
