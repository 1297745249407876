// Pressurised graphene blister in equilibrium with its delamination front: the energy-release argument of
// S. P. Koenig, N. G. Boddeti, M. L. Dunn & J. S. Bunch, "Ultrastrong adhesion of graphene membranes",
// Nature Nanotechnology 6, 543 (2011), eq. (2) and Supplementary Information:
//
//     Γ = (5/4) C Δp δ = (5/4) C K Y (δ/a)⁴,   C(0.16) ≈ 0.524 (V = C π a² δ),  K(0.16) ≈ 3.09 (Δp = K Y δ³/a⁴),
//
// for a Hencky membrane clamped at the delamination radius a. The derivation (Π = −(3/4) Δp V at fixed pressure,
// G = −∂Π/∂A = (5/4) C Δp δ) is in docs/derivations-elastica-blister.md.
//
// How the check works. A blister held at fixed pressure is an unstable equilibrium (G grows as a^{4/3}), so it is
// not simulated with a cohesive law; instead clamped finite-element blisters of radius a (edge clamped and
// immovable: the Hencky problem, which tests/verification/membrane_limit_test.cc shows nappe solves within 0.3 %)
// give the total potential energy Π(a) = stretching + bending − Δp V, and the energy release rate is the central
// difference quotient G = −[Π(a₊) − Π(a₋)] / [π (a₊² − a₋²)] with a₊², a₋² = a₀² (1 ± 0.04) (symmetric in A, so
// the quotient's own error is (m−1)(m−2) h²/6 ≈ −6e-5 for Π ∝ A^{5/3}). C and K come from Hencky's series, not from
// the finite elements.
//
// Bending: graphene's D = 1.4 eV. The bending boundary layer at the clamped edge has width sqrt(D/N) ≈ 0.5 nm
// against a = 1 µm: ε = sqrt(D/(Y a²)) (Δp a/Y)^{-1/3} ≈ 1e-4, so bending changes the answers by ~1e-4.
#include <deal.II/base/mpi.h>

#include <nappe/base/units.h>

#include "common/sheet_solve.h"
#include "reference/axisymmetric_fvk.h"

#include <chrono>
#include <cmath>
#include <sstream>

using namespace nappe;

namespace
{
  // Graphene (Koenig et al. 2011: Y = 340 N/m, ν = 0.16) and a Koenig-sized blister.
  constexpr double Y = 340.0, nu = 0.16, a0 = 1.0e-6; // [N/m], [-], [m]
  const double     D = 1.4 * units::electronvolt;     // [J]
  constexpr double pressure = 4.0e6;                  // Δp [Pa]; δ/a ≈ 0.155 at a0
  constexpr double gamma_adhesion = 0.45;             // Γ [J/m²], graphene on SiO₂ (Koenig et al. 2011)
  constexpr unsigned int refinements = 3;             // of the 12-cell disk (membrane_limit_test: K within +0.3 %)

  void print(const std::string &line)
  {
    if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
      std::cout << line << std::endl;
  }

  struct Blister
  {
    double radius;     ///< a [m]
    double potential;  ///< Π = U_s + U_b − Δp V [J]
    double volume;     ///< V = ∫w dA [m³]
    double deflection; ///< δ = w(0) [m]
    double stretching; ///< U_s [J]
  };

  // The clamped (immovable-edge) blister of radius a under Δp: Hencky's problem plus graphene's tiny D.
  Blister solve_blister(const double a)
  {
    SheetModel model;
    model.material.youngs_modulus_2d = Y;
    model.material.poisson_ratio     = nu;
    model.material.bending_rigidity  = D;
    model.edges[0]                   = {DeflectionCondition::clamped, InPlaneCondition::fixed};
    model.loads.pressure             = pressure;
    SheetDomain domain;
    domain.shape              = SheetDomain::Shape::disk;
    domain.radius             = a;
    domain.global_refinements = refinements;
    const auto solved = test_support::solve_sheet(model, domain, 2);
    const auto &parts = solved.report.parts;
    return {a, parts.total(), parts.external_work / pressure,
            solved.system->deflection_at(solved.state, dealii::Point<2>(0, 0)), parts.stretching};
  }

  // Hencky's membrane (D = 0, u(a) = 0) in his scaling: σ_r = (Y Δp² a²)^{1/3} S(ρ), ρ = r/a, with the slope
  // w' = −(Δp a/Y)^{1/3} ρ/(2S). With 1/S = Σ c_n ρ^{2n}:
  //   δ = a (Δp a/Y)^{1/3} Σ c_n/(4(n+1))      (K1, so K = 1/K1³),
  //   V = 2π a² ∫₀¹ ρ w dρ = π a³ (Δp a/Y)^{1/3} Σ c_n/(4(n+2)),
  // hence C = V/(π a² δ) = Σ c_n/(4(n+2)) / Σ c_n/(4(n+1)). The centre stress S(0) is the one of
  // nappe::reference (shooting, u(a) = 0); the coefficients are Hencky's recursion (reference::internal).
  struct HenckyConstants
  {
    double k1, K, C;
  };

  HenckyConstants hencky_constants(const double poisson_ratio)
  {
    const double s0 = reference::internal::membrane_centre_stress(poisson_ratio, 1e-13);
    const auto   b  = reference::internal::hencky_series(s0, 120);
    std::vector<double> c(b.size(), 0.0);
    double deflection_sum = 0.0, volume_sum = 0.0;
    for (std::size_t k = 0; k < b.size(); ++k)
      {
        double sum = (k == 0) ? 1.0 : 0.0;
        for (std::size_t i = 1; i <= k; ++i)
          sum -= b[i] * c[k - i];
        c[k] = sum / b[0];
        deflection_sum += c[k] / (4.0 * (k + 1));
        volume_sum += c[k] / (4.0 * (k + 2));
      }
    return {deflection_sum, 1.0 / std::pow(deflection_sum, 3), volume_sum / deflection_sum};
  }

  std::string format(const double v, const int precision = 5)
  {
    std::ostringstream s;
    s.precision(precision);
    s << v;
    return s.str();
  }
} // namespace

// Hencky's constants at ν = 0.16 against Koenig et al.'s values (SI of Nature Nanotech. 6, 543: C = 0.524,
// K = 3.09) and against the shooting solution of nappe::reference.
TEST(AdhesionBlister, HenckyVolumeConstantMatchesKoenig)
{
  const auto h = hencky_constants(nu);
  print("Hencky nu = 0.16: K1 = " + format(h.k1, 7) + ", K = " + format(h.K, 6) + ", C = " + format(h.C, 6));
  EXPECT_NEAR(h.k1 / reference::hencky_constant(nu), 1.0, 1e-8);
  EXPECT_NEAR(h.K / 3.09, 1.0, 0.005);
  EXPECT_NEAR(h.C / 0.524, 1.0, 0.005);
}

// G(a) = −dΠ/dA at fixed Δp from finite-element blisters against (5/4) C Δp δ, and the radius at which G = Γ
// against Koenig's δ/a = (Γ / ((5/4) C K Y))^{1/4}.
TEST(AdhesionBlister, EnergyReleaseRateMatchesKoenigFormula)
{
  const auto   start = std::chrono::steady_clock::now();
  const auto   h     = hencky_constants(nu);
  const double a_minus = a0 * std::sqrt(1.0 - 0.04), a_plus = a0 * std::sqrt(1.0 + 0.04);
  const Blister minus = solve_blister(a_minus), centre = solve_blister(a0), plus = solve_blister(a_plus);

  // Virial of a membrane at fixed pressure: U_s = Δp V/4, so Π = −(3/4) Δp V (docs/derivations-elastica-blister.md).
  const double virial = centre.stretching / (0.25 * pressure * centre.volume);
  const double c_fe   = centre.volume / (M_PI * a0 * a0 * centre.deflection);
  const double k_fe   = pressure * std::pow(a0, 4) / (Y * std::pow(centre.deflection, 3));

  const double g_fe      = -(plus.potential - minus.potential) / (M_PI * (a_plus * a_plus - a_minus * a_minus));
  const double g_formula = 1.25 * h.C * pressure * centre.deflection;
  const double g_koenig  = 1.25 * h.C * h.K * Y * std::pow(centre.deflection / a0, 4);
  print("Blister a = " + format(a0 * 1e6) + " um, dp = " + format(pressure * 1e-6) +
        " MPa: delta/a = " + format(centre.deflection / a0, 6) + ", U_s/(dp V/4) = " + format(virial, 6) +
        ", C_FE = " + format(c_fe, 6) + ", K_FE = " + format(k_fe, 6));
  print("  G_FE = " + format(g_fe, 6) + " J/m^2, (5/4) C dp delta = " + format(g_formula, 6) +
        " (ratio " + format(g_fe / g_formula, 6) + "), (5/4) C K Y (delta/a)^4 = " + format(g_koenig, 6) +
        " (ratio " + format(g_fe / g_koenig, 6) + ")");
  EXPECT_NEAR(virial, 1.0, 0.01);
  EXPECT_NEAR(c_fe / h.C, 1.0, 0.01);
  EXPECT_NEAR(g_fe / g_formula, 1.0, 0.03);
  EXPECT_NEAR(g_fe / g_koenig, 1.0, 0.03);

  // Equilibrium with Γ: the two one-sided quotients give G at the radii a₋' = sqrt((a₋² + a₀²)/2) and
  // a₊' = sqrt((a₀² + a₊²)/2), hence the local exponent n = d ln G / d ln a (4/3 for the membrane); the radius
  // with G = Γ follows by a power-law step from a₀, and a fourth finite-element blister at that radius gives δ/a.
  const auto quotient = [](const Blister &lo, const Blister &hi) {
    return -(hi.potential - lo.potential) / (M_PI * (hi.radius * hi.radius - lo.radius * lo.radius));
  };
  const double r_lo = std::sqrt(0.5 * (a_minus * a_minus + a0 * a0)), r_hi = std::sqrt(0.5 * (a0 * a0 + a_plus * a_plus));
  const double n        = std::log(quotient(centre, plus) / quotient(minus, centre)) / std::log(r_hi / r_lo);
  const double a_eq     = a0 * std::pow(gamma_adhesion / g_fe, 1.0 / n);
  const Blister eq      = solve_blister(a_eq);
  const double ratio_fe = eq.deflection / a_eq;
  const double ratio_koenig = std::pow(gamma_adhesion / (1.25 * h.C * h.K * Y), 0.25);
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  print("  d ln G/d ln a = " + format(n, 6) + " (membrane 4/3); G = Gamma = " + format(gamma_adhesion) +
        " J/m^2 at a = " + format(a_eq * 1e6, 6) + " um: delta/a FE = " + format(ratio_fe, 6) + ", Koenig " +
        format(ratio_koenig, 6) + " (ratio " + format(ratio_fe / ratio_koenig, 6) + "); " + format(seconds, 3) +
        " s");
  EXPECT_NEAR(n, 4.0 / 3.0, 0.01);
  EXPECT_NEAR(ratio_fe / ratio_koenig, 1.0, 0.03);
}
