// Linear response of an adhered sheet to a gentle substrate corrugation (derived, see
// docs/derivations.md §3). On s = A_s cos kx with A_s ≪ h₀ the 9-3 law acts as a spring of stiffness
// K = φ''(h₀) = 27Γ/h₀² about the equilibrium gap, and the sheet, in-plane tension N, follows with
//     A_w / A_s = K / (K + D k⁴ + N k²),
// where A_w = (2/|Ω|) ∫ (w − h₀) cos kx dA is the cos kx Fourier coefficient of the deflection.
// Checked to 1 % for N = 0 and N > 0 (equibiaxial pre-tension from a negative eigenstrain −ε,
// N = Y ε/(1−ν)), each at two wave numbers on either side of the crossover D k⁴ = K.
//
// Geometric nonlinearity stays on: with A_s = 10⁻³ h₀ the neglected terms are relatively O((A_s/h₀)²)
// from the cubic term of φ, and O(Y A_w²/4D) ≈ 10⁻⁵ from the membrane strain ½(∂w)² (derivations §3).
#include <deal.II/base/function.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/geometry/sinusoidal_topography.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/vdw_93_law.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/sheet_system.h>

#include <gtest/gtest.h>

#include "common/sheet_solve.h"

#include <cmath>
#include <cstdlib>
#include <iomanip>
#include <iostream>
#include <memory>

using namespace nappe;

namespace
{
  // MoS2-like constants (share/materials.prm: Y = 180 N/m, ν = 0.29, D = 9.61 eV) and a MoS2-on-SiO2-
  // like interface (Γ = 0.22 J/m², h₀ = 0.5 nm); the reference formula holds for any values.
  const double Y = 180.0, nu = 0.29, D = 9.61 * 1.602176634e-19;
  const double gamma_adh = 0.22, h0 = 0.5e-9;
  const double K         = 27.0 * gamma_adh / (h0 * h0); // φ''(h₀) of the 9-3 law (vdw_93_law.h)
  const double A_s       = 1e-3 * h0;

  struct Response
  {
    double ratio;     // observed A_w/A_s
    double reference; // K/(K + D k⁴ + N k²)
  };

  /// (2/|Ω|) ∫ (w − h₀) cos kx dA over the cell, all ranks.
  double cosine_coefficient(const SheetSystem &system, const Vector &state, double k)
  {
    const unsigned int               p = system.model().discretization.degree;
    dealii::FEValues<2>              fv(system.mapping(), system.finite_element(), dealii::QGauss<2>(p + 2),
                           dealii::update_values | dealii::update_quadrature_points | dealii::update_JxW_values);
    const dealii::FEValuesExtractors::Scalar deflection(2);
    std::vector<double>                      w(fv.n_quadrature_points);
    double                                   integral = 0.0;
    for (const auto &c : system.dof_handler().active_cell_iterators())
      if (c->is_locally_owned())
        {
          fv.reinit(c);
          fv[deflection].get_function_values(state, w);
          for (unsigned int q = 0; q < fv.n_quadrature_points; ++q)
            integral += (w[q] - h0) * std::cos(k * fv.quadrature_point(q)[0]) * fv.JxW(q);
        }
    return 2.0 * dealii::Utilities::MPI::sum(integral, MPI_COMM_WORLD) / system.domain().area();
  }

  Response respond(double wavelength, double pretension_strain)
  {
    const double k = 2.0 * M_PI / wavelength;
    SheetDomain  domain;
    domain.length_x           = wavelength;
    domain.length_y           = wavelength / 8; // a strip with square cells: the response is 1D
    domain.coarse_cells_x     = 8;
    domain.coarse_cells_y     = 1;
    domain.global_refinements = 1;
    domain.periodic           = true;

    SheetModel model;
    model.material.youngs_modulus_2d = Y;
    model.material.poisson_ratio     = nu;
    model.material.bending_rigidity  = D;
    model.discretization.degree      = 3; // Q2 is 0.9 % low at 16 cells per wavelength (observed): C0IP bending error
    model.loads.eigenstrain[0][0] = model.loads.eigenstrain[1][1] = -pretension_strain;
    model.substrate = std::make_shared<AdhesionPotential>(std::make_shared<SinusoidalGrating>(A_s, wavelength),
                                                          std::make_shared<Vdw93Law>(gamma_adh, h0),
                                                          GapMeasure::vertical);

    SheetSystem system(model, domain, MPI_COMM_WORLD);
    Vector      owned = system.make_owned_vector();
    // Start flat at the equilibrium gap: ũ = 0, w = h₀.
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(),
                                     dealii::Functions::ConstantFunction<2>({0.0, 0.0, h0}), owned);
    system.constraints().distribute(owned);
    const bool      log = std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0;
    EnergyMinimizer minimizer(system, MinimizerSettings(), log ? &std::cout : nullptr,
                              test_support::test_solvers(system));
    const MinimizerReport report = minimizer.minimize(owned, 1.0, 0.0);
    EXPECT_TRUE(report.converged) << report.message;
    EXPECT_EQ(report.negative_pivots, 0u);
    Vector state = system.make_ghosted_vector();
    state        = owned;

    const double N = Y * pretension_strain / (1.0 - nu); // equibiaxial: N = Y/(1−ν²)·(1+ν)ε
    Response     r;
    r.ratio     = cosine_coefficient(system, state, k) / A_s;
    r.reference = K / (K + D * std::pow(k, 4) + N * k * k);
    if (log)
      std::cout << "    λ = " << wavelength * 1e9 << " nm, N = " << N << " N/m: A_w/A_s = " << std::setprecision(8)
                << r.ratio << ", reference " << r.reference << ", rel. error " << std::setprecision(3)
                << std::abs(r.ratio - r.reference) / r.reference << "\n";
    return r;
  }
} // namespace

// Bending and adhesion balance at λ = 2π (D/K)^{1/4} ≈ 3.2 nm; 4 nm and 2.5 nm lie on either side.
class SmallAmplitudeResponse : public ::testing::TestWithParam<std::tuple<double, double>>
{};

TEST_P(SmallAmplitudeResponse, FollowsTheLinearTransferFunction)
{
  const auto [wavelength, strain] = GetParam();
  const Response r                = respond(wavelength, strain);
  EXPECT_NEAR(r.ratio, r.reference, 1e-2 * r.reference);
}

INSTANTIATE_TEST_SUITE_P(WavelengthAndTension, SmallAmplitudeResponse,
                         ::testing::Combine(::testing::Values(4e-9, 2.5e-9), ::testing::Values(0.0, 1e-2)),
                         [](const auto &info) {
                           return std::string(std::get<0>(info.param) > 3e-9 ? "Long" : "Short") + "Wave" +
                                  (std::get<1>(info.param) > 0 ? "Tensioned" : "Tensionless");
                         });
