// Adhesive elastica: a sheet lying on a flat substrate over a thin ridge of height H detaches over
//
//     L = (18 D H² / Γ)^{1/4}
//
// on each side of the ridge. The free span is the cubic w = H (1 − 3t² + 2t³), t = x/L, with zero slope on the
// ridge top and at the contact line, and the contact line satisfies the classical adhesive-contact condition
// w''(L) = sqrt(2Γ/D) (energy release rate ½ D w''² = Γ; e.g. C. Majidi, Mech. Res. Commun. 34, 85 (2007);
// J. W. Obreimoff, Proc. R. Soc. A 127, 290 (1930)); 6H/L² = sqrt(2Γ/D) gives L. The same L minimises
// Π(L) = 6 D H²/L³ + Γ L per side. Derivation: docs/derivations-elastica-blister.md, part 1.
//
// Model. Bending only: the linear plate (geometric_nonlinearity = false, the membrane decouples), on a cell
// periodic in x and y, so the deflection is cylindrical (κ_yy = 0) and the bending energy density is
// (D/2) w_xx² with the sheet free to slide. The ridge is a Gaussian of height H = 1 nm and width b = 2 nm ≪ L =
// 200 nm. Adhesion: the exponential cohesive law (Xu & Needleman) with range δ (peak traction at h₀ + δ) and a
// stiff penetration branch (κ = 1000) so that the sheet hardly sinks into the ridge top.
//
// Measured detachment length L_δ: the distance from the ridge top to the nearest point of the flat part where the
// gap has fallen to the peak-traction gap g* = h₀ + δ (the library's "conformed" boundary), found by a scan and
// bisection of the finite-element gap along the line y = Ly/2, averaged over the two sides. L_δ converges to L as
// δ → 0 with an expansion in powers of sqrt(δ/H) (the cohesive zone has the length (D δ²/Γ)^{1/4} = L sqrt(δ/H) /
// 18^{1/4}; the parabolic approach w − h₀ ≈ ½ sqrt(2Γ/D) (L − x)² puts the g* point a further L sqrt(δ/(3H)) inside
// the span). Three ranges δ = H/16, H/64, H/256 (sqrt(δ) halves from one to the next): the differences of
// successive L_δ must halve (the leading sqrt(δ) term), and the two shortest ranges eliminate that term by
// Richardson extrapolation, L₀ = 2 L₃ − L₂. The shortest range is solved by both minimisers (the shifted line
// search and the trust region, MinimizerMethod) from the same start, which must find the same state.
#include <deal.II/base/function.h>
#include <deal.II/base/mpi.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/component_mask.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/base/units.h>
#include <nappe/geometry/topography.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/exponential_cohesive_law.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/sheet_system.h>

#include <gtest/gtest.h>

#include "common/sheet_solve.h"

#include <chrono>
#include <cmath>
#include <cstdlib>
#include <limits>
#include <iostream>
#include <memory>
#include <sstream>

using namespace nappe;

namespace
{
  constexpr double nm = 1e-9;
  constexpr double H  = 1.0 * nm;   // ridge height [m]
  constexpr double b  = 2.0 * nm;   // ridge width (Gaussian standard deviation) [m]
  constexpr double L_theory = 200.0 * nm; // the detachment length the work of adhesion is chosen for [m]
  constexpr double margin   = 60.0 * nm;  // adhered length beyond each contact line [m]
  constexpr double Lx = 2.0 * (L_theory + margin), Ly = 1.0 * nm, x_ridge = 0.5 * Lx;
  constexpr unsigned int cells_x = 1040; // h = 0.5 nm: 12 cells per cohesive-zone length at δ = H/256
  const double D     = 1.4 * units::electronvolt;                    // graphene-like bending rigidity [J]
  const double Gamma = 18.0 * D * H * H / std::pow(L_theory, 4);     // so that L = 200 nm [J/m²]

  void print(const std::string &line)
  {
    if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
      std::cout << line << std::endl;
  }

  std::string format(const double v, const int precision = 5)
  {
    std::ostringstream s;
    s.precision(precision);
    s << v;
    return s.str();
  }

  /// A straight Gaussian ridge along y: s = H exp(−(x − x_r)²/(2b²)).
  class GaussianRidge : public Topography
  {
  public:
    double height(const dealii::Point<2> &p) const override
    {
      const double d = p[0] - x_ridge;
      return H * std::exp(-d * d / (2.0 * b * b));
    }
    dealii::Tensor<1, 2> gradient(const dealii::Point<2> &p) const override
    {
      dealii::Tensor<1, 2> g;
      g[0] = -(p[0] - x_ridge) / (b * b) * height(p);
      return g;
    }
    std::string name() const override { return "gaussian-ridge"; }
    std::string description() const override { return "Gaussian ridge along y, H = 1 nm, b = 2 nm"; }
  };

  /// Initial guess: u = 0, w = h₀ + the elastica cubic of span L0 (a wrong span: the solver must move the front).
  class CubicSpan : public dealii::Function<2>
  {
  public:
    CubicSpan(const double h0, const double span) : dealii::Function<2>(3), h0(h0), span(span) {}
    double value(const dealii::Point<2> &p, const unsigned int component) const override
    {
      if (component != 2)
        return 0.0;
      const double t = std::abs(p[0] - x_ridge) / span;
      return h0 + (t < 1.0 ? H * (1.0 - 3.0 * t * t + 2.0 * t * t * t) : 0.0);
    }

  private:
    double h0, span;
  };

  struct Detachment
  {
    double left, right; ///< L_δ on each side [m]
    double crest_gap;   ///< gap on the ridge top minus h₀ (negative: the sheet sinks into the penalty branch) [m]
    unsigned int iterations;
  };

  // The equilibrium gap is h₀ = δ; for the vertical gap it only offsets the whole sheet, so one range's solution,
  // shifted by the change of h₀, is a starting state for the next.

  SheetModel elastica_model(const std::shared_ptr<const AdhesionPotential> &adhesion)
  {
    SheetModel model;
    model.material.youngs_modulus_2d = 340.0; // irrelevant: the linear membrane decouples and stays unloaded
    model.material.poisson_ratio     = 0.16;  // irrelevant for cylindrical bending
    model.material.bending_rigidity  = D;
    model.geometric_nonlinearity     = false;
    model.substrate                  = adhesion;
    return model;
  }

  SheetDomain elastica_domain()
  {
    SheetDomain domain;
    domain.length_x           = Lx;
    domain.length_y           = Ly;
    domain.coarse_cells_x     = cells_x;
    domain.coarse_cells_y     = 2;
    domain.global_refinements = 0;
    domain.periodic           = true;
    return domain;
  }

  // Minimises for range δ from @p owned (updated in place): the cubic guess of a wrong span for the first range,
  // the previous range's solution afterwards (continuation in δ; the mesh is the same).
  Detachment solve_elastica(const double delta, Vector *previous, const double previous_delta,
                            const MinimizerMethod method = MinimizerMethod::line_search)
  {
    const double h0 = delta;
    auto law      = std::make_shared<ExponentialCohesiveLaw>(Gamma, h0, delta, 1000.0);
    auto adhesion = std::make_shared<AdhesionPotential>(std::make_shared<GaussianRidge>(), law, GapMeasure::vertical);
    SheetSystem system(elastica_model(adhesion), elastica_domain(), MPI_COMM_WORLD);
    Vector      owned = system.make_owned_vector();
    if (previous->size() == owned.size())
      {
        owned = *previous;
        const dealii::IndexSet w_dofs =
          dealii::DoFTools::extract_dofs(system.dof_handler(), dealii::ComponentMask({false, false, true}));
        for (const auto i : w_dofs)
          if (owned.in_local_range(i))
            owned(i) += h0 - previous_delta;
        owned.compress(dealii::VectorOperation::insert);
      }
    else
      {
        dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), CubicSpan(h0, 1.25 * L_theory),
                                         owned);
        system.constraints().distribute(owned);
      }
    MinimizerSettings settings;
    settings.max_iterations = 200;
    settings.method         = method;
    EnergyMinimizer minimizer(system, settings, std::getenv("NAPPE_TEST_LOG") ? &std::cout : nullptr,
                              test_support::test_solvers(system));
    const MinimizerReport report = minimizer.minimize(owned, 1.0, 0.0);
    EXPECT_TRUE(report.converged) << report.message;
    EXPECT_EQ(report.negative_pivots, 0u);
    Vector state = system.make_ghosted_vector();
    state        = owned;
    *previous    = owned;

    const double g_star = law->peak_traction_gap();
    const auto   gap    = [&](const double x) {
      const dealii::Point<2> p(x, 0.5 * Ly);
      return adhesion->gap(p, system.deflection_at(state, p));
    };
    // From the middle of the span (gap ≈ H/2 ≫ g*) outwards to the first point with gap ≤ g*, then bisection.
    const auto front = [&](const double direction) {
      double inside = x_ridge + direction * 0.5 * L_theory, step = direction * 1.0 * nm, outside = inside + step;
      while (gap(outside) > g_star)
        {
          inside = outside;
          outside += step;
          if (std::abs(outside - x_ridge) > 0.5 * Lx)
            return std::numeric_limits<double>::quiet_NaN();
        }
      for (unsigned int k = 0; k < 40; ++k)
        {
          const double mid = 0.5 * (inside + outside);
          (gap(mid) > g_star ? inside : outside) = mid;
        }
      return std::abs(0.5 * (inside + outside) - x_ridge);
    };
    return {front(-1.0), front(+1.0), gap(x_ridge) - h0, report.iterations};
  }
} // namespace

TEST(AdhesiveElastica, DetachmentLengthConvergesToClassicalResult)
{
  const auto   start = std::chrono::steady_clock::now();
  const double ranges[3] = {H / 16.0, H / 64.0, H / 256.0};
  double       lengths[3];
  Vector       state;
  for (unsigned int k = 0; k < 3; ++k)
    {
      const Detachment d = solve_elastica(ranges[k], &state, k > 0 ? ranges[k - 1] : 0.0);
      lengths[k]         = 0.5 * (d.left + d.right);
      print("delta = H/" + format(H / ranges[k], 4) + ": L_delta = " + format(d.left / nm, 7) + " / " +
            format(d.right / nm, 7) + " nm (left/right), L_delta/L = " + format(lengths[k] / L_theory, 6) +
            ", crest gap - h0 = " + format(d.crest_gap / nm, 3) + " nm" + ", Newton iterations " +
            std::to_string(d.iterations));
      EXPECT_NEAR(d.left / d.right, 1.0, 1e-3); // symmetric problem
    }
  const double extrapolated = 2.0 * lengths[2] - lengths[1];
  const double seconds      = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  print("L = (18 D H^2/Gamma)^(1/4) = " + format(L_theory / nm, 6) + " nm; extrapolated L0 = " +
        format(extrapolated / nm, 7) + " nm (ratio " + format(extrapolated / L_theory, 6) + "); " +
        format(seconds, 3) + " s");
  // Each shorter range is closer to the limit, by the sqrt(δ) law: successive differences halve (measured ratio
  // 2.12; the next term of the expansion, O(δ), makes it 2 + O(sqrt(δ))).
  EXPECT_LT(std::abs(lengths[1] - L_theory), std::abs(lengths[0] - L_theory));
  EXPECT_LT(std::abs(lengths[2] - L_theory), std::abs(lengths[1] - L_theory));
  EXPECT_NEAR((lengths[1] - lengths[0]) / (lengths[2] - lengths[1]), 2.0, 0.3);
  // The extrapolated length matches L. What is left is the O(δ) term: a second Richardson level on the three
  // ranges moves the value by 0.12 % (measured), so 0.5 % bounds it with a margin.
  EXPECT_NEAR(extrapolated / L_theory, 1.0, 0.005);
}

TEST(AdhesiveElastica, BothMinimisersFindTheSameStateAtTheShortestRange)
{
  Vector state;
  solve_elastica(H / 64.0, &state, 0.0);
  Vector           start = state;
  const Detachment by_line_search = solve_elastica(H / 256.0, &state, H / 64.0, MinimizerMethod::line_search);
  const Detachment by_trust_region =
    solve_elastica(H / 256.0, &start, H / 64.0, MinimizerMethod::trust_region);
  print("delta = H/256: L_delta = " + format(by_line_search.left / nm, 7) + " nm (line search, " +
        std::to_string(by_line_search.iterations) + " Newton iterations), " + format(by_trust_region.left / nm, 7) +
        " nm (trust region, " + std::to_string(by_trust_region.iterations) + ")");
  EXPECT_NEAR(by_trust_region.left / by_line_search.left, 1.0, 1e-4);
  EXPECT_NEAR(by_trust_region.right / by_line_search.right, 1.0, 1e-4);
}
