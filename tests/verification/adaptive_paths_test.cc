// Adhesion paths on adaptive meshes (solvers/adhesion_path.h with Mesh adaptation cycles): the
// thresholds and transitions found on a mesh that is adapted at the start and refined along the
// path where the adhesion front and the strain peaks move agree with those found on the uniform mesh
// at the finest level: the Γ of each within 1 %, the conformed fractions before and after within
// 0.01 (the acceptance criterion of the adaptive-mesh work; the uniform mesh is the reference, no
// closed form exists for these cells). The meshes are small here (finest: 16 × 16 cells per period)
// so that the test is quick; at these sizes the front and the strain peaks cover much of the cell
// and the adapted meshes save little. The saving at finer levels is measured by
// benchmarks/adaptive_limits.sh (benchmarks/README.md).
//
// Scenarios (our own): MoS2 (catalogue) laid on a square array of rounded SiO2 pillars (height 5 nm,
// radius 12 nm, pitch 60 nm), Γ raised until the tents collapse onto the floor; MoS2 grown conformal
// on an egg carton (amplitude 2 nm, wavelength 30 nm), Γ lowered until the conformed branch lets go
// (Γ_hold). h₀ = 0.5 nm.
#include <nappe/analysis/adhesion_limits.h>
#include <nappe/analysis/adhesion_transitions.h>
#include <nappe/analysis/state_summary.h>
#include <nappe/geometry/lattice_array.h>
#include <nappe/geometry/radial_features.h>
#include <nappe/geometry/sinusoidal_topography.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/vdw_93_law.h>

#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <iostream>

using namespace nappe;

namespace
{
  const double nm = 1e-9;

  bool logging() { return std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0; }

  SheetProblem laid_on(std::shared_ptr<const Topography> topography, double cell)
  {
    const MaterialCatalogue catalogue;
    SheetProblem            p;
    p.model.material        = catalogue.material("MoS2");
    p.domain.length_x       = p.domain.length_y = cell;
    p.domain.coarse_cells_x = p.domain.coarse_cells_y = 4;
    p.domain.periodic                                 = true;
    p.model.substrate = std::make_shared<AdhesionPotential>(topography, std::make_shared<Vdw93Law>(0.22, 0.5 * nm),
                                                            GapMeasure::normal);
    p.stepping.load_steps = 1;
    return p;
  }

  SheetProblem pillar_cell()
  {
    const double pitch  = 60 * nm;
    auto         pillar = std::make_shared<Pillar>(5 * nm, 12 * nm, 2 * nm, 2 * nm, 70.0 * M_PI / 180.0);
    return laid_on(LatticeArray::square(pillar, pitch), pitch);
  }

  SheetProblem egg_carton_cell()
  {
    const double wavelength = 30 * nm;
    return laid_on(std::make_shared<EggCarton>(2 * nm, wavelength), wavelength);
  }

  // Adaptive meshes start from the coarse cells and adapt twice; the uniform mesh is refined twice.
  const unsigned int adaptation_cycles = 2;

  AdhesionPath follow(SheetProblem problem, unsigned int refinements, unsigned int cycles, StartProtocol start,
                      const AdhesionPathSettings &settings)
  {
    problem.domain.global_refinements = refinements;
    problem.adaptation.cycles         = cycles;
    AdhesionPath path = follow_adhesion_path(problem, start, settings, summary_path_measure(problem.model),
                                             MPI_COMM_WORLD, logging() ? &std::cout : nullptr);
    if (logging())
      std::cout << "    refinements " << refinements << ", cycles " << cycles << ": " << path.largest_unknowns
                << " unknowns at most, " << path.mesh_adaptations << " adaptations, " << path.solves << " minimisations, "
                << path.wall_time << " s\n";
    return path;
  }

  void log_transitions(const std::vector<AdhesionTransition> &transitions)
  {
    if (logging())
      for (const auto &t : transitions)
        std::cout << "      " << t.kind << " in [" << t.gamma_lower << ", " << t.gamma_upper << "] J/m², fraction "
                  << t.fraction_before << " → " << t.fraction_after << "\n";
  }

  /// The mesh was adapted at the start and again along the path, never beyond the finest level.
  void expect_adapted_along_the_path(const AdhesionPath &adaptive, const AdhesionPath &uniform)
  {
    EXPECT_EQ(uniform.mesh_adaptations, 0u);
    EXPECT_GT(adaptive.mesh_adaptations, adaptation_cycles);
    EXPECT_LE(adaptive.largest_unknowns, uniform.largest_unknowns);
  }

  const AdhesionTransition *first_of_kind(const std::vector<AdhesionTransition> &transitions, const std::string &kind)
  {
    for (const auto &t : transitions)
      if (t.kind == kind)
        return &t;
    return nullptr;
  }
} // namespace

TEST(AdaptivePaths, PillarCollapseOnAnAdaptedMeshMatchesTheUniformMesh)
{
  AdhesionPathSettings settings;
  settings.lowest_work_of_adhesion  = 0.2;
  settings.highest_work_of_adhesion = 1.0;
  settings.relative_tolerance       = 2e-3;
  settings.largest_step             = 0.25;
  const AdhesionPath uniform  = follow(pillar_cell(), adaptation_cycles, 0, StartProtocol::laid_down, settings);
  const AdhesionPath adaptive = follow(pillar_cell(), 0, adaptation_cycles, StartProtocol::laid_down, settings);
  ASSERT_TRUE(uniform.complete) << uniform.message;
  ASSERT_TRUE(adaptive.complete) << adaptive.message;
  const auto on_uniform = find_transitions(uniform, settings.target_fraction);
  const auto on_adapted = find_transitions(adaptive, settings.target_fraction);
  log_transitions(on_uniform);
  log_transitions(on_adapted);
  const AdhesionTransition *reference = first_of_kind(on_uniform, "tents → floor contact");
  const AdhesionTransition *found     = first_of_kind(on_adapted, "tents → floor contact");
  ASSERT_NE(reference, nullptr);
  ASSERT_NE(found, nullptr);
  EXPECT_NEAR(std::log(found->gamma_upper / reference->gamma_upper), 0.0, 0.01);
  EXPECT_NEAR(found->fraction_before, reference->fraction_before, 0.01);
  EXPECT_NEAR(found->fraction_after, reference->fraction_after, 0.01);
  expect_adapted_along_the_path(adaptive, uniform);
}

TEST(AdaptivePaths, EggCartonHoldingThresholdOnAnAdaptedMeshMatchesTheUniformMesh)
{
  AdhesionPathSettings settings;
  settings.lowest_work_of_adhesion  = 0.1;
  settings.highest_work_of_adhesion = 1.5;
  settings.relative_tolerance       = 2e-3;
  const AdhesionPath uniform  = follow(egg_carton_cell(), adaptation_cycles, 0, StartProtocol::grown_conformal, settings);
  const AdhesionPath adaptive = follow(egg_carton_cell(), 0, adaptation_cycles, StartProtocol::grown_conformal, settings);
  ASSERT_TRUE(uniform.complete) << uniform.message;
  ASSERT_TRUE(adaptive.complete) << adaptive.message;
  const auto on_uniform = find_transitions(uniform, settings.target_fraction);
  const auto on_adapted = find_transitions(adaptive, settings.target_fraction);
  log_transitions(on_uniform);
  log_transitions(on_adapted);
  const AdhesionThreshold reference = hold_threshold(uniform, settings.target_fraction);
  const AdhesionThreshold found     = hold_threshold(adaptive, settings.target_fraction);
  if (logging())
    std::cout << "    Γ_hold uniform [" << reference.lower << ", " << reference.upper << "], adaptive [" << found.lower
              << ", " << found.upper << "] J/m²\n";
  ASSERT_TRUE(reference.found) << reference.how;
  ASSERT_TRUE(found.found) << found.how;
  EXPECT_NEAR(std::log(found.value() / reference.value()), 0.0, 0.01);
  // The first jump below Γ_hold: where the contact front depins.
  ASSERT_FALSE(on_uniform.empty());
  ASSERT_FALSE(on_adapted.empty());
  EXPECT_NEAR(std::log(on_adapted.front().gamma_upper / on_uniform.front().gamma_upper), 0.0, 0.01);
  EXPECT_NEAR(on_adapted.front().fraction_before, on_uniform.front().fraction_before, 0.01);
  EXPECT_NEAR(on_adapted.front().fraction_after, on_uniform.front().fraction_after, 0.01);
  expect_adapted_along_the_path(adaptive, uniform);
}
