// The transitions of a sheet laid on a pillar array while the work of adhesion Γ is raised
// (analysis/adhesion_transitions.h): at low Γ the sheet rests on the pillar tops and tents between
// them; at some Γ the tent can no longer hold and the sheet collapses onto the floor between the
// pillars (common practice: tenting and collapse of MoS2 and graphene on nanopillar arrays; no sharp
// reference for this geometry). Checked: the jump is found and classified as "tents → floor contact",
// located to the path's tolerance; before it the contact is on the raised parts only, with a share of
// the cell no larger than the pillar-top area πR²/a² plus the sidewall band (geometry of the pillar);
// after it the sheet touches the floor and the conformed fraction has grown; the jump releases
// energy (the branch that ended is carried across the bracket to first order, envelope theorem: the
// state the sheet jumps to lies lower).
//
// Scenario (our own): MoS2 (catalogue) on a square array of rounded SiO2 pillars, height 5 nm, radius
// 12 nm, pitch 60 nm, h₀ = 0.5 nm, periodic cell one pitch wide, Q2 with 16 cells per pitch.
#include <nappe/analysis/adhesion_transitions.h>
#include <nappe/analysis/state_summary.h>
#include <nappe/geometry/lattice_array.h>
#include <nappe/geometry/radial_features.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/vdw_93_law.h>

#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

#include "common/sheet_solve.h"

#include <cmath>
#include <cstdlib>
#include <iomanip>
#include <iostream>

using namespace nappe;

namespace
{
  const double nm = 1e-9, height = 5 * nm, radius = 12 * nm, pitch = 60 * nm;

  SheetProblem pillar_cell()
  {
    const MaterialCatalogue catalogue;
    SheetProblem            c;
    c.model.material        = catalogue.material("MoS2");
    c.domain.length_x       = c.domain.length_y = pitch;
    c.domain.coarse_cells_x = c.domain.coarse_cells_y = 4;
    c.domain.global_refinements                       = 2;
    c.domain.periodic                                 = true;
    auto pillar = std::make_shared<Pillar>(height, radius, 2 * nm, 2 * nm, 70.0 * M_PI / 180.0);
    c.model.substrate = std::make_shared<AdhesionPotential>(LatticeArray::square(pillar, pitch),
                                                            std::make_shared<Vdw93Law>(0.22, 0.5 * nm),
                                                            GapMeasure::normal);
    c.stepping.load_steps = 1;
    c.solver              = test_support::test_solver_settings();
    return c;
  }
} // namespace

TEST(PillarTransitions, RaisingGammaCollapsesTheTentsOntoTheFloorWithinTheBracket)
{
  const SheetProblem   problem = pillar_cell();
  AdhesionPathSettings settings;
  settings.lowest_work_of_adhesion  = 0.2; // the sheet tents here (it does down to 0.02 J/m²)
  settings.highest_work_of_adhesion = 1.0;
  settings.relative_tolerance       = 0.01;
  settings.largest_step             = 0.25;
  const bool         log  = std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0;
  const AdhesionPath path = follow_adhesion_path(problem, StartProtocol::laid_down, settings,
                                                 summary_path_measure(problem.model), MPI_COMM_WORLD,
                                                 log ? &std::cout : nullptr);
  ASSERT_TRUE(path.complete) << path.message;
  const auto transitions = find_transitions(path, settings.target_fraction);
  if (log)
    for (const auto &t : transitions)
      std::cout << "    " << t.kind << " in [" << t.gamma_lower << ", " << t.gamma_upper << "] J/m², fraction "
                << t.fraction_before << " → " << t.fraction_after << ", raised " << t.raised_before << " → "
                << t.raised_after << ", floor " << t.floor_before << " → " << t.floor_after << ", released "
                << t.energy_released << " J/m² (" << path.solves << " minimisations)\n";
  const AdhesionTransition *collapse = nullptr;
  for (const auto &t : transitions)
    if (t.kind == "tents → floor contact")
      collapse = &t;
  ASSERT_NE(collapse, nullptr) << "no tents → floor transition among " << transitions.size();
  const AdhesionTransition &t = *collapse;
  EXPECT_FALSE(t.lowering);
  EXPECT_LE(std::log(t.gamma_upper / t.gamma_lower), settings.relative_tolerance * 1.0001);
  EXPECT_EQ(t.regime_before, Regime::tents);
  EXPECT_EQ(t.regime_after, Regime::touches_floor);
  EXPECT_LT(t.floor_before, 1e-3);
  EXPECT_GT(t.raised_before, 0.0);
  // The tops and the sidewall band out to the pillar's foot (radius + height·cot α + foot radius).
  const double foot = radius + 0.5 * height / std::tan(70.0 * M_PI / 180.0) + 2 * nm;
  EXPECT_LE(t.raised_before, M_PI * foot * foot / (pitch * pitch));
  EXPECT_GT(t.floor_after, 0.0);
  EXPECT_GT(t.fraction_after, t.fraction_before + 0.1);
  EXPECT_GT(t.energy_released, 0.0);
}
