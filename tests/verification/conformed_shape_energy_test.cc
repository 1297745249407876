// Exact Föppl–von Kármán energies of prescribed conformed shapes on a periodic cell (derived, see
// docs/derivations.md §1 and §2): the one-dimensional sinusoid w = A cos kx and the egg carton
// w = A cos kx cos ky. Each is checked to 0.1 % of the exact energy per projected area, either by
// evaluating SheetSystem::energy() on the interpolated exact fields, or by a solve in which a stiff
// spring ψ = ½κ(w − s)² holds w to the shape s and the solver finds the in-plane field ũ itself.
//
// The spring's own effect is bounded by solving with κ and 10κ: the elastic energy approaches its
// κ → ∞ limit as 1/κ (docs/derivations.md §1.3), so |E(10κ) − E(∞)| ≈ |E(κ) − E(10κ)|/9, which is
// asserted to be below a tenth of the tolerance.
#include <deal.II/base/function.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/analysis/sheet_measures.h>
#include <nappe/physics/fvk_kinematics.h>
#include <nappe/physics/surface_potential.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/sheet_system.h>

#include <gtest/gtest.h>

#include "common/sheet_solve.h"

#include <cmath>
#include <cstdlib>
#include <functional>
#include <iomanip>
#include <iostream>
#include <memory>

using namespace nappe;

namespace
{
  using dealii::Point;

  const double wavelength = 1.0;                      // non-dimensional units: the energies scale exactly
  const double k          = 2.0 * M_PI / wavelength;  // wave number
  const double A          = 0.2 / k;                  // A·k = 0.2: moderate rotations, FvK applies
  const double tolerance  = 1e-3;                     // 0.1 % (the task's floor)
  // Q3 on 16 cells per wavelength: the C0IP bending energy of Q2 is 0.3 % high even at 32 cells
  // (observed), beyond the 0.1 % to be shown.
  const unsigned int degree = 3, cells_per_wavelength = 16;

  bool logging() { return std::getenv("NAPPE_TEST_LOG") != nullptr; }
  bool root() { return dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0; }

  SheetMaterial material()
  {
    SheetMaterial m;
    m.youngs_modulus_2d = 1.0;
    m.poisson_ratio     = 0.3;
    m.bending_rigidity  = 2e-3; // D k⁴ A² ≈ Y A⁴ k⁴ in size: both energies matter
    return m;
  }

  /// The shape s(x) the sheet is held to.
  using Shape = std::function<double(const Point<2> &)>;

  double sinusoid(const Point<2> &p) { return A * std::cos(k * p[0]); }
  double egg_carton(const Point<2> &p) { return A * std::cos(k * p[0]) * std::cos(k * p[1]); }

  /// ψ = ½κ(w − s(x))² [J/m²]: a stiff spring that holds the sheet to the shape s.
  class SpringToShape : public SurfacePotential
  {
  public:
    SpringToShape(Shape s, double kappa) : s_(std::move(s)), kappa_(kappa) {}
    void evaluate(const Point<2> &x, double w, double &psi, double &dpsi, double &d2psi) const override
    {
      const double d = w - s_(x);
      psi            = 0.5 * kappa_ * d * d;
      dpsi           = kappa_ * d;
      d2psi          = kappa_;
    }

  private:
    Shape  s_;
    double kappa_;
  };

  /// (ũ_x, ũ_y, w) given by functions of the position.
  class Fields : public dealii::Function<2>
  {
  public:
    Fields(Shape ux, Shape uy, Shape w) : dealii::Function<2>(3), f_{std::move(ux), std::move(uy), std::move(w)} {}
    double value(const Point<2> &p, const unsigned int c) const override { return f_[c](p); }

  private:
    Shape f_[3];
  };

  /// One wavelength along x; along y one wavelength (egg carton) or a thin strip of the same mesh
  /// density (sinusoid).
  SheetDomain cell(bool strip, unsigned int cells_per_wavelength)
  {
    SheetDomain d;
    d.length_x           = wavelength;
    d.length_y           = strip ? 4 * wavelength / cells_per_wavelength : wavelength; // strip: 4 cells
    d.coarse_cells_x     = cells_per_wavelength / 4;
    d.coarse_cells_y     = strip ? 1 : cells_per_wavelength / 4;
    d.global_refinements = 2;
    d.periodic           = true;
    return d;
  }

  SheetModel model(Shape s, double kappa, unsigned int degree)
  {
    SheetModel m;
    m.material                = material();
    m.discretization.degree   = degree;
    if (kappa > 0)
      m.substrate = std::make_shared<SpringToShape>(std::move(s), kappa);
    return m;
  }

  struct Solved
  {
    std::unique_ptr<SheetSystem> system;
    Vector                       state; // ghosted
    EnergyParts                  parts;
  };

  /// Minimises from w = s, ũ = 0 with the spring of stiffness κ; requires a certified minimum.
  Solved solve_held(const SheetModel &m, const SheetDomain &domain, const Shape &s)
  {
    Solved out;
    out.system = std::make_unique<SheetSystem>(m, domain, MPI_COMM_WORLD);
    Vector owned = out.system->make_owned_vector();
    dealii::VectorTools::interpolate(out.system->mapping(), out.system->dof_handler(),
                                     Fields([](const Point<2> &) { return 0.0; },
                                            [](const Point<2> &) { return 0.0; }, s),
                                     owned);
    out.system->constraints().distribute(owned);
    EnergyMinimizer minimizer(*out.system, MinimizerSettings(), logging() && root() ? &std::cout : nullptr,
                              test_support::test_solvers(*out.system));
    const MinimizerReport report = minimizer.minimize(owned, 1.0, 0.0);
    EXPECT_TRUE(report.converged) << report.message;
    EXPECT_EQ(report.negative_pivots, 0u);
    out.state = out.system->make_ghosted_vector();
    out.state = owned;
    out.parts = report.parts;
    return out;
  }

  void report(const char *what, double observed, double exact)
  {
    if (logging() && root())
      std::cout << "    " << what << ": observed " << std::setprecision(10) << observed << ", exact " << exact
                << ", rel. error " << std::setprecision(3) << std::abs(observed - exact) / exact << "\n";
  }

  /// Largest |N_h − N_exact| over the quadrature points, all ranks [N/m].
  double max_stress_error(const SheetSystem &system, const Vector &state,
                          const std::function<dealii::SymmetricTensor<2, 2>(const Point<2> &)> &exact)
  {
    const unsigned int               p = system.model().discretization.degree;
    dealii::FEValues<2>              fv(system.mapping(), system.finite_element(), dealii::QGauss<2>(p + 1),
                           dealii::update_gradients | dealii::update_quadrature_points);
    const dealii::FEValuesExtractors::Vector in_plane(0);
    const dealii::FEValuesExtractors::Scalar deflection(2);
    std::vector<dealii::Tensor<2, 2>>        grad_u(fv.n_quadrature_points);
    std::vector<dealii::Tensor<1, 2>>        grad_w(fv.n_quadrature_points);
    double                                   err = 0.0;
    for (const auto &c : system.dof_handler().active_cell_iterators())
      if (c->is_locally_owned())
        {
          fv.reinit(c);
          fv[in_plane].get_function_gradients(state, grad_u);
          fv[deflection].get_function_gradients(state, grad_w);
          for (unsigned int q = 0; q < fv.n_quadrature_points; ++q)
            {
              const SheetModel &model  = system.model();
              const auto        strain = membrane_strain(model.base_strain(1.0), grad_u[q], grad_w[q],
                                                  model.geometric_nonlinearity);
              const auto        N      = membrane_stress(strain, model.material);
              err = std::max(err, (N - exact(fv.quadrature_point(q))).norm());
            }
        }
    return dealii::Utilities::MPI::max(err, MPI_COMM_WORLD);
  }
} // namespace

// w = A cos kx, ũ_x = (A²k/8) sin 2kx: ε_xx = A²k²/4 uniform, ε_yy = ε_xy = 0 (docs/derivations.md §1).
// Bending D A²k⁴/4 and stretching Y A⁴k⁴/(32(1−ν²)) per projected area.
TEST(ConformedShapeEnergy, SinusoidInterpolatedFieldsHaveExactEnergies)
{
  const SheetDomain   domain = cell(true, cells_per_wavelength);
  const SheetModel    m      = model(sinusoid, 0.0, degree);
  const SheetMaterial mat    = m.material;
  SheetSystem         system(m, domain, MPI_COMM_WORLD);
  Vector              owned = system.make_owned_vector();
  dealii::VectorTools::interpolate(
    system.mapping(), system.dof_handler(),
    Fields([](const Point<2> &p) { return A * A * k / 8 * std::sin(2 * k * p[0]); },
           [](const Point<2> &) { return 0.0; }, sinusoid),
    owned);
  // No constraints().distribute(): the interpolant of the periodic fields is already periodic, and
  // without a substrate the rigid-mode pin would set w = 0 at the centre vertex, where w = −A.
  Vector state = system.make_ghosted_vector();
  state        = owned;
  const EnergyParts e = system.energy(state, 1.0);

  const double bending    = mat.bending_rigidity * A * A * std::pow(k, 4) / 4;
  const double stretching = mat.youngs_modulus_2d * std::pow(A * k, 4) / (32 * (1 - mat.poisson_ratio * mat.poisson_ratio));
  report("bending per area", e.bending / domain.area(), bending);
  report("stretching per area", e.stretching / domain.area(), stretching);
  EXPECT_NEAR(e.bending / domain.area(), bending, tolerance * bending);
  EXPECT_NEAR(e.stretching / domain.area(), stretching, tolerance * stretching);
}

// The same sinusoid held by a stiff spring: the solver must find the relaxed ũ itself.
TEST(ConformedShapeEnergy, SinusoidHeldBySpringRelaxesToExactEnergies)
{
  const SheetDomain   domain = cell(true, cells_per_wavelength);
  const SheetMaterial mat    = material();
  const double        bending    = mat.bending_rigidity * A * A * std::pow(k, 4) / 4;
  const double stretching = mat.youngs_modulus_2d * std::pow(A * k, 4) / (32 * (1 - mat.poisson_ratio * mat.poisson_ratio));
  // Elastic stiffness of the sinusoidal mode, D k⁴ + N k² with the tension N ≈ Y A²k²/4/(1−ν²);
  // the spring is 10⁵ and 10⁶ times stiffer.
  const double mode_stiffness = mat.bending_rigidity * std::pow(k, 4) + mat.membrane_stiffness() * A * A * std::pow(k, 4) / 4;
  const double kappa          = 1e5 * mode_stiffness;

  const Solved soft  = solve_held(model(sinusoid, kappa, degree), domain, sinusoid);
  const Solved stiff = solve_held(model(sinusoid, 10 * kappa, degree), domain, sinusoid);
  const double area  = domain.area();
  report("bending per area (κ)", soft.parts.bending / area, bending);
  report("bending per area (10κ)", stiff.parts.bending / area, bending);
  report("stretching per area (κ)", soft.parts.stretching / area, stretching);
  report("stretching per area (10κ)", stiff.parts.stretching / area, stretching);
  EXPECT_NEAR(stiff.parts.bending / area, bending, tolerance * bending);
  EXPECT_NEAR(stiff.parts.stretching / area, stretching, tolerance * stretching);
  // The spring's remaining effect, |E(10κ) − E(∞)| ≈ |E(κ) − E(10κ)|/9, is well below the tolerance.
  EXPECT_LT(std::abs(soft.parts.bending - stiff.parts.bending) / 9, 0.1 * tolerance * bending * area);
  EXPECT_LT(std::abs(soft.parts.stretching - stiff.parts.stretching) / 9, 0.1 * tolerance * stretching * area);
}

// w = A cos kx cos ky. Bending D A²k⁴/2 per area (the Gaussian-curvature term averages to zero).
// In-plane (Airy, docs/derivations.md §2): with the mean strain E = −(A²k²/8) I that absorbs the
// excess length (zero mean stress), N_xx = (Y A²k²/8) cos 2ky, N_yy = (Y A²k²/8) cos 2kx, N_xy = 0 and
// stretching Y A⁴k⁴/128 per area. With E = 0 (the sheet cannot slide in) a uniform tension
// N̄ = Y/(1−ν)·A²k²/8 adds to both normal resultants and Y A⁴k⁴/(64(1−ν)) to the stretching energy.
class EggCartonHeldBySpring : public ::testing::TestWithParam<bool>
{};

TEST_P(EggCartonHeldBySpring, RelaxesToAiryStressAndExactEnergies)
{
  const bool          can_slide = GetParam();
  const SheetDomain   domain    = cell(false, cells_per_wavelength);
  const SheetMaterial mat       = material();
  const double        Y = mat.youngs_modulus_2d, nu = mat.poisson_ratio;
  const double        mean_strain = A * A * k * k / 8; // ⟨½ ∂w∂w⟩ along x and y
  const double        bending     = mat.bending_rigidity * A * A * std::pow(k, 4) / 2;
  const double        stretching  = Y * std::pow(A * k, 4) / 128 + (can_slide ? 0.0 : Y * std::pow(A * k, 4) / (64 * (1 - nu)));
  const double        amplitude   = Y * A * A * k * k / 8;
  const double        mean_stress = can_slide ? 0.0 : Y / (1 - nu) * mean_strain;
  const auto          exact_N     = [&](const Point<2> &p) {
    dealii::SymmetricTensor<2, 2> N;
    N[0][0] = mean_stress + amplitude * std::cos(2 * k * p[1]);
    N[1][1] = mean_stress + amplitude * std::cos(2 * k * p[0]);
    return N;
  };

  const double mode_stiffness = mat.bending_rigidity * std::pow(k, 4) + (amplitude + mean_stress) * k * k;
  const double kappa          = 1e5 * mode_stiffness;
  auto         held           = [&](double spring) {
    SheetModel m = model(egg_carton, spring, degree);
    if (can_slide)
      m.loads.mean_strain[0][0] = m.loads.mean_strain[1][1] = -mean_strain;
    return solve_held(m, domain, egg_carton);
  };
  const Solved soft  = held(kappa);
  const Solved stiff = held(10 * kappa);
  const double area  = domain.area();
  report("bending per area (κ)", soft.parts.bending / area, bending);
  report("bending per area (10κ)", stiff.parts.bending / area, bending);
  report("stretching per area (κ)", soft.parts.stretching / area, stretching);
  report("stretching per area (10κ)", stiff.parts.stretching / area, stretching);
  EXPECT_NEAR(stiff.parts.bending / area, bending, tolerance * bending);
  EXPECT_NEAR(stiff.parts.stretching / area, stretching, tolerance * stretching);
  EXPECT_LT(std::abs(soft.parts.bending - stiff.parts.bending) / 9, 0.1 * tolerance * bending * area);
  EXPECT_LT(std::abs(soft.parts.stretching - stiff.parts.stretching) / 9, 0.1 * tolerance * stretching * area);

  // Stress resultants at every quadrature point, relative to the amplitude Y A²k²/8.
  const double stress_error = max_stress_error(*stiff.system, stiff.state, exact_N) / amplitude;
  if (logging() && root())
    std::cout << "    max |N_h − N_exact| / (Y A²k²/8) = " << stress_error << "\n";
  EXPECT_LT(stress_error, 1e-2);
}

INSTANTIATE_TEST_SUITE_P(MeanStrain, EggCartonHeldBySpring, ::testing::Values(true, false),
                         [](const auto &info) { return info.param ? "SlidingIn" : "Immovable"; });
