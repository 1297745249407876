// Sanity checks against facts of the trade (common practice, not sharp references): orders of
// magnitude that any credible model of a 2D sheet on a patterned substrate must reproduce.
//  - Graphene grown conformal on a strong corrugation carries strains of a few percent, not tens of
//    percent (common practice: strain-engineering experiments on corrugated or pillared substrates
//    report sub-percent to few-percent strains; FvK estimate (A k)²/8 ≈ 5 % for the egg carton
//    below, docs/derivations.md §2).
//  - A stiff sheet laid on tall, widely spaced pillars tents between them (common practice:
//    tenting of MoS2 and graphene on nanopillar arrays), whereas on a gentle, long-wavelength
//    corrugation it follows the substrate.
#include <deal.II/base/mpi.h>

#include <nappe/geometry/lattice_array.h>
#include <nappe/geometry/radial_features.h>
#include <nappe/geometry/sinusoidal_topography.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/vdw_93_law.h>

#include <common/sheet_solve.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <iomanip>
#include <iostream>
#include <memory>

using namespace nappe;

namespace
{
  const double nm = 1e-9;

  bool logging() { return std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0; }

  struct Case
  {
    std::string  title;
    SheetProblem problem;
  };

  Case periodic_case(const std::string &material, const std::string &substrate, std::shared_ptr<const Topography> t,
                     double period, unsigned int cells, StartProtocol protocol, double h0)
  {
    const MaterialCatalogue catalogue;
    Case                    k;
    k.title         = material + " on " + t->description();
    SheetProblem &c = k.problem;
    c.model.material = catalogue.material(material);
    c.domain.length_x = c.domain.length_y = period;
    c.domain.coarse_cells_x = c.domain.coarse_cells_y = cells / 4;
    c.domain.global_refinements                       = 2;
    c.domain.periodic                                 = true;
    c.model.substrate = std::make_shared<AdhesionPotential>(
      std::move(t), std::make_shared<Vdw93Law>(catalogue.work_of_adhesion(material, substrate), h0), GapMeasure::normal);
    c.start               = protocol;
    c.stepping.load_steps = 1; // no loads: the substrate is not scaled by λ
    return k;
  }

  SheetResult run(const Case &c)
  {
    const SheetResult r = test_support::solve_and_measure(c.problem, MPI_COMM_WORLD, logging() ? &std::cout : nullptr);
    EXPECT_TRUE(r.converged) << c.title << ": " << r.message;
    if (r.converged && logging())
      std::cout << "    " << c.title << ": conformed fraction " << std::setprecision(6)
                << r.conformation->conformed_fraction << ", peak principal strain "
                << r.measures.at("max_principal_strain").value << ", max gap " << r.conformation->max_gap / nm << " nm, "
                << r.conformation->suspended_regions.size() << " suspended regions, " << r.path.wall_time << " s\n";
    return r;
  }
} // namespace

// Graphene (catalogue: Y = 340 N/m, Lee et al. 2008) on SiO2 (Γ = 0.45 J/m², Koenig et al., Nature
// Nanotechnology 6, 543, 2011), grown conformal on an egg carton of amplitude 2 nm and wavelength 20 nm.
TEST(AdhesionSanity, GrapheneOnStrongCorrugationStrainsAFewPercent)
{
  const double   lambda = 20 * nm;
  const Case     c = periodic_case("graphene", "SiO2", std::make_shared<EggCarton>(2 * nm, lambda), lambda, 16,
                              StartProtocol::grown_conformal, 0.6 * nm);
  const SheetResult r = run(c);
  ASSERT_TRUE(r.converged);
  const double peak = r.measures.at("max_principal_strain").value;
  EXPECT_GT(peak, 1e-3);
  EXPECT_LT(peak, 0.1);
}

// MoS2 (catalogue) on SiO2 (Γ = 0.22 J/m², Lloyd et al. 2017) laid on pillars 10 nm tall, radius
// 10 nm, pitch 100 nm: the sheet tents.
TEST(AdhesionSanity, MoS2OnTallSparsePillarsTents)
{
  auto pillar = std::make_shared<Pillar>(10 * nm, 10 * nm, 3 * nm, 3 * nm, 70.0 * M_PI / 180.0);
  const double   pitch = 100 * nm;
  const Case c = periodic_case("MoS2", "SiO2", LatticeArray::square(pillar, pitch), pitch, 32, StartProtocol::laid_down, 0.5 * nm);
  const SheetResult r = run(c);
  ASSERT_TRUE(r.converged);
  EXPECT_LT(r.conformation->conformed_fraction, 0.8);
  EXPECT_GE(r.conformation->suspended_regions.size(), 1u);
}

// The same sheet laid on a gentle grating (amplitude 0.5 nm, wavelength 50 nm) conforms.
TEST(AdhesionSanity, MoS2OnGentleSinusoidConforms)
{
  const double   lambda = 50 * nm;
  const Case c = periodic_case("MoS2", "SiO2", std::make_shared<SinusoidalGrating>(0.5 * nm, lambda), lambda, 16,
                              StartProtocol::laid_down, 0.5 * nm);
  const SheetResult r = run(c);
  ASSERT_TRUE(r.converged);
  EXPECT_GE(r.conformation->conformed_fraction, 0.99);
}
