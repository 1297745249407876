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
#include <nappe/geometry/sinusoidal_topography.h>

#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

#include "common/mos2_cells.h"

#include <cmath>
#include <cstdlib>
#include <iostream>

using namespace nappe;

namespace
{
  const double nm = 1e-9;

  bool logging() { return std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0; }

  SheetProblem egg_carton_cell()
  {
    const double wavelength = 30 * nm;
    SheetProblem p = test_support::mos2_periodic_cell(std::make_shared<EggCarton>(2 * nm, wavelength), wavelength);
    p.start        = StartProtocol::grown_conformal;
    return p;
  }

  // Adaptive meshes start from the coarse cells and adapt twice; the uniform mesh is refined twice.
  const unsigned int adaptation_cycles = 2;

  AdhesionPath follow(SheetProblem problem, unsigned int refinements, unsigned int cycles,
                      const AdhesionPathSettings &settings)
  {
    problem.domain.global_refinements = refinements;
    problem.adaptation.cycles         = cycles;
    AdhesionPath path = follow_adhesion_path(problem, problem.start, settings, summary_path_measure(problem.model),
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

  /// One path on the uniform mesh at the finest level and on the adaptive mesh, with their jumps.
  struct PathPair
  {
    AdhesionPath                    uniform, adaptive;
    std::vector<AdhesionTransition> on_uniform, on_adapted;
  };

  /// Follows both paths; fails the test unless both are complete and the adaptive mesh was adapted
  /// at the start and again along the path, never beyond the finest level.
  PathPair follow_both(const SheetProblem &problem, const AdhesionPathSettings &settings)
  {
    PathPair p;
    p.uniform  = follow(problem, adaptation_cycles, 0, settings);
    p.adaptive = follow(problem, 0, adaptation_cycles, settings);
    EXPECT_TRUE(p.uniform.complete) << p.uniform.message;
    EXPECT_TRUE(p.adaptive.complete) << p.adaptive.message;
    p.on_uniform = find_transitions(p.uniform, settings.target_fraction);
    p.on_adapted = find_transitions(p.adaptive, settings.target_fraction);
    log_transitions(p.on_uniform);
    log_transitions(p.on_adapted);
    EXPECT_EQ(p.uniform.mesh_adaptations, 0u);
    EXPECT_GT(p.adaptive.mesh_adaptations, adaptation_cycles);
    EXPECT_LE(p.adaptive.largest_unknowns, p.uniform.largest_unknowns);
    return p;
  }

  void expect_same_transition(const AdhesionTransition &found, const AdhesionTransition &reference)
  {
    EXPECT_NEAR(std::log(found.gamma_upper / reference.gamma_upper), 0.0, 0.01);
    EXPECT_NEAR(found.fraction_before, reference.fraction_before, 0.01);
    EXPECT_NEAR(found.fraction_after, reference.fraction_after, 0.01);
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
  const PathPair            p         = follow_both(test_support::mos2_on_pillar_array(), settings);
  const AdhesionTransition *reference = first_of_kind(p.on_uniform, "tents → floor contact");
  const AdhesionTransition *found     = first_of_kind(p.on_adapted, "tents → floor contact");
  ASSERT_NE(reference, nullptr);
  ASSERT_NE(found, nullptr);
  expect_same_transition(*found, *reference);
}

TEST(AdaptivePaths, EggCartonHoldingThresholdOnAnAdaptedMeshMatchesTheUniformMesh)
{
  AdhesionPathSettings settings;
  settings.lowest_work_of_adhesion  = 0.1;
  settings.highest_work_of_adhesion = 1.5;
  settings.relative_tolerance       = 2e-3;
  const PathPair          p         = follow_both(egg_carton_cell(), settings);
  const AdhesionThreshold reference = hold_threshold(p.uniform, settings.target_fraction);
  const AdhesionThreshold found     = hold_threshold(p.adaptive, settings.target_fraction);
  if (logging())
    std::cout << "    Γ_hold uniform [" << reference.lower << ", " << reference.upper << "], adaptive [" << found.lower
              << ", " << found.upper << "] J/m²\n";
  ASSERT_TRUE(reference.found) << reference.how;
  ASSERT_TRUE(found.found) << found.how;
  EXPECT_NEAR(std::log(found.value() / reference.value()), 0.0, 0.01);
  // The first jump below Γ_hold: where the contact front depins.
  ASSERT_FALSE(p.on_uniform.empty());
  ASSERT_FALSE(p.on_adapted.empty());
  expect_same_transition(p.on_adapted.front(), p.on_uniform.front());
}
