// Analytic topographies, transformations, arrays, formula, registry and CSV writer.
// All geometric numbers below are invented test scenarios, not measured data.
#include <deal.II/base/parameter_handler.h>

#include <nappe/base/units.h>
#include <nappe/geometry/formula_topography.h>
#include <nappe/geometry/lattice_array.h>
#include <nappe/geometry/linear_features.h>
#include <nappe/geometry/radial_features.h>
#include <nappe/geometry/sinusoidal_topography.h>
#include <nappe/geometry/topography_factory.h>
#include <nappe/geometry/topography_writer.h>
#include <nappe/geometry/transformed_topography.h>

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <memory>
#include <vector>

using namespace nappe;
using dealii::Point;
using dealii::Tensor;

namespace
{
  constexpr double nm  = units::nanometer;
  constexpr double deg = M_PI / 180.0;

  Point<2> P(double x_nm, double y_nm) { return Point<2>(x_nm * nm, y_nm * nm); }

  /// Max over sample points of |∇s − central difference| (h = 1e-4 nm), relative to max(1, |∇s|).
  double gradient_mismatch(const Topography &t, const double extent_nm)
  {
    const double h     = 1e-4 * nm;
    double       worst = 0.0;
    for (int i = 0; i <= 40; ++i)
      for (int j = 0; j <= 40; ++j)
        {
          // An irrational-ish lattice of points so that no sample sits on a piece boundary.
          const Point<2> p = P(extent_nm * (-1.0 + 2.0 * (i + 0.3137) / 41.0),
                               extent_nm * (-1.0 + 2.0 * (j + 0.7211) / 41.0));
          const Tensor<1, 2> g = t.gradient(p);
          for (unsigned int d = 0; d < 2; ++d)
            {
              Point<2> a = p, b = p;
              a[d] -= h;
              b[d] += h;
              const double fd = (t.height(b) - t.height(a)) / (2.0 * h);
              worst           = std::max(worst, std::abs(fd - g[d]) / std::max(1.0, std::abs(g[d])));
            }
        }
    return worst;
  }

  /// Largest jump of the gradient between neighbouring points of an n-point scan along the x axis.
  double largest_gradient_jump_along_x(const Topography &t, const double from_nm, const double to_nm, const int n)
  {
    double    worst = 0.0;
    Tensor<1, 2> previous = t.gradient(P(from_nm, 0.0));
    for (int k = 1; k <= n; ++k)
      {
        const Tensor<1, 2> g = t.gradient(P(from_nm + (to_nm - from_nm) * k / n, 0.0));
        worst                = std::max(worst, (g - previous).norm());
        previous             = g;
      }
    return worst;
  }

  std::vector<std::shared_ptr<const Topography>> catalogue()
  {
    std::vector<std::shared_ptr<const Topography>> c;
    c.push_back(std::make_shared<SinusoidalGrating>(5 * nm, 100 * nm));
    c.push_back(std::make_shared<EggCarton>(3 * nm, 80 * nm));
    c.push_back(std::make_shared<GaussianBump>(10 * nm, 20 * nm));
    c.push_back(std::make_shared<Pillar>(20 * nm, 40 * nm, 5 * nm, 4 * nm, 75 * deg));
    c.push_back(std::make_shared<Cone>(30 * nm, 50 * nm, 6 * nm, 8 * nm));
    c.push_back(std::make_shared<RingRidge>(10 * nm, 50 * nm, 20 * nm, 3 * nm, 60 * deg));
    c.push_back(std::make_shared<Trench>(15 * nm, 60 * nm, 4 * nm, 70 * deg));
    c.push_back(std::make_shared<Step>(-8 * nm, 5 * nm, 45 * deg));
    c.push_back(std::make_shared<FormulaTopography>("A*exp(-(x^2+y^2)/(2*w^2))*cos(x/w)",
                                                    std::map<std::string, double>{{"A", 4.0}, {"w", 25.0}}));
    const auto pillar = std::make_shared<Pillar>(20 * nm, 30 * nm, 5 * nm, 4 * nm, 75 * deg);
    c.push_back(LatticeArray::square(pillar, 100 * nm));
    c.push_back(LatticeArray::hexagonal(std::make_shared<GaussianBump>(5 * nm, 15 * nm), 60 * nm));
    c.push_back(std::make_shared<RotatedTopography>(std::make_shared<Trench>(15 * nm, 60 * nm, 4 * nm, 70 * deg),
                                                    30 * deg));
    c.push_back(std::make_shared<ScaledTopography>(pillar, 1.5, 0.5));
    c.push_back(std::make_shared<OffsetTopography>(pillar, P(12, -7), 2 * nm));
    c.push_back(std::make_shared<PeriodicTiling>(pillar, P(-50, -50), Tensor<1, 2>({100 * nm, 100 * nm})));
    c.push_back(std::make_shared<SumTopography>(std::vector<std::shared_ptr<const Topography>>{
      pillar, std::make_shared<SinusoidalGrating>(2 * nm, 300 * nm)}));
    return c;
  }
} // namespace


TEST(AnalyticTopography, HeightsMatchTheirFormulasAtKnownPoints)
{
  EXPECT_NEAR(SinusoidalGrating(5 * nm, 100 * nm).height(P(25, 3)), 0.0, 1e-15);
  EXPECT_NEAR(SinusoidalGrating(5 * nm, 100 * nm).height(P(50, 3)), -5 * nm, 1e-20);
  EXPECT_NEAR(EggCarton(3 * nm, 80 * nm).height(P(40, 40)), 3 * nm, 1e-20);
  EXPECT_NEAR(GaussianBump(10 * nm, 20 * nm).height(P(20, 0)), 10 * nm * std::exp(-0.5), 1e-20);

  const Pillar pillar(20 * nm, 40 * nm, 5 * nm, 4 * nm, 75 * deg);
  EXPECT_NEAR(pillar.height(P(0, 0)), 20 * nm, 1e-20);   // flat top
  EXPECT_NEAR(pillar.height(P(30, 0)), 20 * nm, 1e-20);  // still on the plateau
  EXPECT_NEAR(pillar.height(P(0, 40)), 10 * nm, 1e-18);  // flank at half height through R
  EXPECT_NEAR(pillar.height(P(60, 0)), 0.0, 1e-20);      // substrate
  EXPECT_NEAR(pillar.gradient(P(0, 40)).norm(), std::tan(75 * deg), 1e-9);

  // Cone: on the straight flank s = H (1 − ρ/R).
  const Cone cone(30 * nm, 50 * nm, 6 * nm, 8 * nm);
  EXPECT_NEAR(cone.height(P(25, 0)), 15 * nm, 1e-18);
  EXPECT_LT(cone.height(P(0, 0)), 30 * nm); // the tip is rounded off
  EXPECT_GT(cone.height(P(0, 0)), 25 * nm);

  const RingRidge ring(10 * nm, 50 * nm, 20 * nm, 3 * nm, 60 * deg);
  EXPECT_NEAR(ring.height(P(0, 0)), 0.0, 1e-20);
  EXPECT_NEAR(ring.height(P(0, 50)), 10 * nm, 1e-20);
  EXPECT_NEAR(ring.height(P(40, 0)), 5 * nm, 1e-18);
  EXPECT_NEAR(ring.height(P(-60, 0)), 5 * nm, 1e-18);

  const Trench trench(15 * nm, 60 * nm, 4 * nm, 70 * deg);
  EXPECT_NEAR(trench.height(P(0, 123)), -15 * nm, 1e-20);
  EXPECT_NEAR(trench.height(P(30, 0)), -7.5 * nm, 1e-18);
  EXPECT_NEAR(trench.height(P(100, 0)), 0.0, 1e-20);

  const Step step(8 * nm, 5 * nm, 45 * deg);
  EXPECT_NEAR(step.height(P(-50, 0)), 0.0, 1e-20);
  EXPECT_NEAR(step.height(P(0, 7)), 4 * nm, 1e-18);
  EXPECT_NEAR(step.height(P(50, 0)), 8 * nm, 1e-20);
}

TEST(AnalyticTopography, GradientsAgreeWithCentralDifferencesForEveryType)
{
  for (const auto &t : catalogue())
    {
      SCOPED_TRACE(t->description());
      EXPECT_LT(gradient_mismatch(*t, 130.0), 2e-5);
    }
}

TEST(AnalyticTopography, RoundedFeaturesHaveContinuousGradients)
{
  // C1 witness: the largest gradient jump between neighbouring scan points shrinks in proportion to
  // the point spacing (≈ max|s''|·spacing); a kink would keep a jump of the size of its slope change.
  const std::vector<std::shared_ptr<const Topography>> features = {
    std::make_shared<Pillar>(20 * nm, 40 * nm, 5 * nm, 4 * nm, 75 * deg),
    std::make_shared<Cone>(30 * nm, 50 * nm, 6 * nm, 8 * nm),
    std::make_shared<RingRidge>(10 * nm, 50 * nm, 20 * nm, 3 * nm, 60 * deg),
    std::make_shared<Trench>(15 * nm, 60 * nm, 4 * nm, 70 * deg),
    std::make_shared<Step>(8 * nm, 5 * nm, 45 * deg)};
  for (const auto &t : features)
    {
      SCOPED_TRACE(t->description());
      const double coarse = largest_gradient_jump_along_x(*t, -100, 100, 50000);
      const double fine   = largest_gradient_jump_along_x(*t, -100, 100, 100000);
      EXPECT_LT(fine, 0.6 * coarse);
      EXPECT_LT(fine, 0.05);
    }
}

TEST(AnalyticTopography, OversizedEdgeRadiiAreRejectedWithTheParameterName)
{
  try
    {
      Pillar(20 * nm, 40 * nm, 100 * nm, 4 * nm, 75 * deg);
      FAIL() << "expected an exception";
    }
  catch (const std::exception &e)
    {
      EXPECT_NE(std::string(e.what()).find("edge radii"), std::string::npos) << e.what();
    }
  EXPECT_THROW(Pillar(20 * nm, 40 * nm, 5 * nm, 4 * nm, 90 * deg), std::exception);
  EXPECT_THROW(RingRidge(10 * nm, 5 * nm, 20 * nm, 3 * nm, 60 * deg), std::exception);
}

TEST(LatticeArray, IsPeriodicAlongItsLatticeVectors)
{
  const auto pillar = std::make_shared<Pillar>(20 * nm, 30 * nm, 5 * nm, 4 * nm, 75 * deg);
  const auto square = LatticeArray::square(pillar, 100 * nm);
  const auto hex    = LatticeArray::hexagonal(std::make_shared<GaussianBump>(5 * nm, 15 * nm), 60 * nm);
  const Tensor<1, 2> a1({60 * nm, 0.0}), a2({30 * nm, 30 * std::sqrt(3.0) * nm});
  for (const Point<2> &p : {P(3, 7), P(-41, 18), P(130.5, -77.25)})
    {
      EXPECT_NEAR(square->height(p + Tensor<1, 2>({100 * nm, 0.0})), square->height(p), 1e-18);
      EXPECT_NEAR(square->height(p + Tensor<1, 2>({-300 * nm, 200 * nm})), square->height(p), 1e-18);
      EXPECT_NEAR(hex->height(p + a1), hex->height(p), 1e-18);
      EXPECT_NEAR(hex->height(p + 3.0 * a2 - a1), hex->height(p), 1e-18);
      EXPECT_NEAR((hex->gradient(p + a2) - hex->gradient(p)).norm(), 0.0, 1e-12);
    }
  // Separated pillars: at a lattice point the array is the single pillar.
  EXPECT_NEAR(square->height(P(200, -100)), 20 * nm, 1e-20);
  EXPECT_NEAR(square->height(P(50, 50)), 0.0, 1e-20);
  // Overlapping Gaussians add up: at a lattice point, 1 + 6 exp(-a²/2σ²) + ... of the peak.
  const double ratio = std::exp(-0.5 * 16.0);
  EXPECT_NEAR(hex->height(P(0, 0)) / (5 * nm), 1.0 + 6.0 * ratio, 1e-6);
}

TEST(LatticeArray, RefusesAFeatureWithoutFiniteSupport)
{
  EXPECT_THROW(LatticeArray::square(std::make_shared<SinusoidalGrating>(1 * nm, 10 * nm), 50 * nm), std::exception);
}

TEST(TransformedTopography, AxisymmetricFeatureIsInvariantUnderRotation)
{
  const auto cone = std::make_shared<Cone>(30 * nm, 50 * nm, 6 * nm, 8 * nm);
  const RotatedTopography rotated(cone, 37 * deg);
  for (const Point<2> &p : {P(3, 7), P(-41, 18), P(20, -30)})
    {
      EXPECT_NEAR(rotated.height(p), cone->height(p), 1e-20);
      EXPECT_NEAR((rotated.gradient(p) - cone->gradient(p)).norm(), 0.0, 1e-12);
    }
}

TEST(TransformedTopography, RotatedGratingEqualsGratingOfRotatedCoordinates)
{
  const auto grating = std::make_shared<SinusoidalGrating>(5 * nm, 100 * nm);
  const RotatedTopography r90(grating, 90 * deg);
  // Rotated by 90°, the grating varies along y: s(x, y) = A cos(2πy/λ).
  EXPECT_NEAR(r90.height(P(17, 50)), -5 * nm, 1e-18);
  EXPECT_NEAR(r90.height(P(-33, 0)), 5 * nm, 1e-18);
  EXPECT_NEAR(r90.gradient(P(17, 25))[1], -5 * nm * 2 * M_PI / (100 * nm), 1e-12);
  EXPECT_NEAR(r90.gradient(P(17, 25))[0], 0.0, 1e-12);
  // Egg carton: a quarter turn maps the surface onto itself (cos is even).
  const auto egg = std::make_shared<EggCarton>(3 * nm, 80 * nm);
  const RotatedTopography egg90(egg, 90 * deg);
  for (const Point<2> &p : {P(3, 7), P(-41, 18)})
    EXPECT_NEAR(egg90.height(p), egg->height(p), 1e-18);
  // A rotation by 360° is the identity.
  const auto trench = std::make_shared<Trench>(15 * nm, 60 * nm, 4 * nm, 70 * deg);
  EXPECT_NEAR(RotatedTopography(trench, 2 * M_PI).height(P(25, 9)), trench->height(P(25, 9)), 1e-17);
}

TEST(TransformedTopography, ScaleOffsetAndTilingActAsDocumented)
{
  const auto bump = std::make_shared<GaussianBump>(10 * nm, 20 * nm);
  EXPECT_NEAR(ScaledTopography(bump, 2.0, 0.5).height(P(40, 0)), 5 * nm * std::exp(-0.5), 1e-20);
  EXPECT_NEAR(OffsetTopography(bump, P(10, 20), 1 * nm).height(P(10, 20)), 11 * nm, 1e-20);
  const PeriodicTiling tiled(bump, P(-50, -50), Tensor<1, 2>({100 * nm, 120 * nm}));
  EXPECT_NEAR(tiled.height(P(100, 0)), 10 * nm, 1e-20);
  EXPECT_NEAR(tiled.height(P(-300 + 7, 240 + 3)), bump->height(P(7, 3)), 1e-20);
}

TEST(FormulaTopography, ReadsNanometresAndReportsBadExpressions)
{
  const FormulaTopography f("a*x + b*y^2", {{"a", 0.1}, {"b", 0.01}});
  EXPECT_NEAR(f.height(P(10, 20)), (1.0 + 4.0) * nm, 1e-20);
  EXPECT_NEAR(f.gradient(P(10, 20))[0], 0.1, 1e-9);
  EXPECT_NEAR(f.gradient(P(10, 20))[1], 0.4, 1e-9);
  try
    {
      FormulaTopography("x + (y", {});
      FAIL() << "expected an exception";
    }
  catch (const std::exception &e)
    {
      EXPECT_NE(std::string(e.what()).find("Expression"), std::string::npos) << e.what();
    }
}

TEST(TopographyFactory, BuildsAnArrayedRotatedFeatureFromParameters)
{
  dealii::ParameterHandler prm;
  TopographyFactory::declare_parameters(prm);
  prm.parse_input_from_string("subsection Topography\n"
                              "  set Type = pillar\n"
                              "  set Array = hexagonal\n"
                              "  set Array pitch = 150\n"
                              "  set Rotation angle = 30\n"
                              "  set Offset x = 10\n"
                              "  subsection Pillar\n"
                              "    set Height = 25\n"
                              "    set Radius = 40\n"
                              "  end\n"
                              "end\n");
  const auto t = TopographyFactory::parse_parameters(prm);
  EXPECT_NEAR(t->height(P(10, 0)), 25 * nm, 1e-20);
  // The rotated hexagonal lattice has a point at 150 nm along 30°.
  EXPECT_NEAR(t->height(P(10 + 150 * std::cos(30 * deg), 150 * std::sin(30 * deg))), 25 * nm, 1e-18);
  EXPECT_NEAR(t->height(P(10 + 75, 0)), 0.0, 1e-20);
  EXPECT_NE(t->description().find("hexagonal array"), std::string::npos);
}

TEST(TopographyFactory, EveryRegisteredAnalyticTypeBuildsWithDefaults)
{
  for (const auto &name : TopographyFactory::registered_names())
    {
      if (name == "height map" || name == "stl")
        continue; // need a file
      dealii::ParameterHandler prm;
      TopographyFactory::declare_parameters(prm);
      prm.parse_input_from_string("subsection Topography\n  set Type = " + name + "\nend\n");
      EXPECT_NO_THROW(TopographyFactory::parse_parameters(prm)) << name;
    }
}

TEST(TopographyFactory, RejectsInconsistentParametersNamingThem)
{
  {
    dealii::ParameterHandler unknown;
    TopographyFactory::declare_parameters(unknown);
    EXPECT_ANY_THROW(unknown.parse_input_from_string("subsection Topography\n  set Type = volcano\nend\n"));
  }
  dealii::ParameterHandler prm;
  TopographyFactory::declare_parameters(prm);
  prm.parse_input_from_string("subsection Topography\n set Type = trench\n set Array = square\nend\n");
  try
    {
      TopographyFactory::parse_parameters(prm);
      FAIL() << "expected an exception";
    }
  catch (const std::exception &e)
    {
      EXPECT_NE(std::string(e.what()).find("Topography/Array"), std::string::npos) << e.what();
    }
  prm.parse_input_from_string("subsection Topography\n set Type = cone\n set Array = none\n"
                              " subsection Cone\n  set Tip radius = 500\n end\nend\n");
  EXPECT_THROW(TopographyFactory::parse_parameters(prm), std::exception);
}

TEST(TopographyWriter, WritesAHeaderAndOneRowPerNodeInNanometres)
{
  const std::string file = "topography_writer_test.csv";
  write_topography_csv(GaussianBump(10 * nm, 20 * nm), file, P(-20, -10), P(20, 10), 5, 3);
  std::ifstream in(file);
  std::string   line;
  std::getline(in, line);
  EXPECT_EQ(line, "x_nm,y_nm,height_nm,dsdx,dsdy");
  unsigned int rows = 0;
  double       x = 0, y = 0, h = 0;
  while (std::getline(in, line))
    {
      if (rows == 7) // node (2, 1): the origin, the bump's peak
        {
          char c;
          std::istringstream(line) >> x >> c >> y >> c >> h;
        }
      ++rows;
    }
  EXPECT_EQ(rows, 15u);
  EXPECT_NEAR(x, 0.0, 1e-12);
  EXPECT_NEAR(y, 0.0, 1e-12);
  EXPECT_NEAR(h, 10.0, 1e-12);
  EXPECT_FALSE(std::ifstream(file + ".tmp").good());
  std::remove(file.c_str());
}
