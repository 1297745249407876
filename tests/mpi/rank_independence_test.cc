// The solution does not depend on the number of MPI ranks: the same nonlinear case solved on one
// rank (a communicator of rank 0 alone) and on all ranks gives the same energies, deflection and
// Newton path, up to round-off. Run on 2 ranks.
#include <deal.II/base/mpi.h>

#include <nappe/physics/sheet_material.h>
#include <nappe/physics/surface_potential.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/sheet_system.h>

#include <common/test_substrates.h>

#include <gtest/gtest.h>

#include <mpi.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdlib>
#include <iomanip>
#include <iostream>
#include <string>

using namespace nappe;
using test_support::SpringToTopography;

namespace
{
  /// The scalar outputs compared between rank counts.
  enum Output
  {
    total,
    stretching,
    bending,
    substrate,
    external_work,
    center_deflection,
    newton_iterations,
    n_outputs
  };
  const std::array<std::string, n_outputs> output_names = {"total energy",      "stretching energy",
                                                           "bending energy",    "substrate energy",
                                                           "external work",     "centre deflection",
                                                           "Newton iterations"};
  using Outputs = std::array<double, n_outputs>;

  /// Solves @p model with @p load_steps equal increments on @p comm; Newton iterations summed over steps.
  Outputs solve(const SheetModel &model, const SheetDomain &domain, unsigned int load_steps, MPI_Comm comm)
  {
    SheetSystem     system(model, domain, comm);
    const bool      log = std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(comm) == 0;
    EnergyMinimizer minimizer(system, MinimizerSettings(), log ? &std::cout : nullptr);
    Vector          state = system.make_owned_vector();
    MinimizerReport report;
    unsigned int    iterations = 0;
    for (unsigned int step = 1; step <= load_steps; ++step)
      {
        report = minimizer.minimize(state, double(step) / load_steps, 0.0);
        EXPECT_TRUE(report.converged) << "load step " << step << ": " << report.message;
        EXPECT_EQ(report.negative_pivots, 0u);
        iterations += report.iterations;
      }
    Vector ghosted = system.make_ghosted_vector();
    ghosted        = state;
    Outputs out;
    out[total]             = report.parts.total();
    out[stretching]        = report.parts.stretching;
    out[bending]           = report.parts.bending;
    out[substrate]         = report.parts.substrate;
    out[external_work]     = report.parts.external_work;
    out[center_deflection] = system.deflection_at(ghosted, domain.center());
    out[newton_iterations] = iterations;
    return out;
  }

  /// Solves on rank 0 alone and on all ranks, and compares the outputs to @p tolerance relative to
  /// the largest energy (energies) or to themselves (deflection, iterations).
  void expect_rank_independent(const SheetModel &model, const SheetDomain &domain, unsigned int load_steps,
                               double tolerance = 1e-8)
  {
    const int rank = dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD);
    ASSERT_GE(dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD), 2u) << "run this test on 2 ranks";
    MPI_Comm self;
    MPI_Comm_split(MPI_COMM_WORLD, rank, 0, &self);
    Outputs serial{};
    if (rank == 0)
      serial = solve(model, domain, load_steps, self);
    MPI_Bcast(serial.data(), n_outputs, MPI_DOUBLE, 0, MPI_COMM_WORLD);
    MPI_Comm_free(&self);

    const Outputs parallel = solve(model, domain, load_steps, MPI_COMM_WORLD);

    const double energy_scale = std::max({std::abs(serial[stretching]), std::abs(serial[bending]),
                                          std::abs(serial[substrate]), std::abs(serial[external_work])});
    for (unsigned int k = 0; k < n_outputs; ++k)
      {
        const double scale = k < center_deflection ? energy_scale : std::abs(serial[k]);
        const double diff  = std::abs(parallel[k] - serial[k]) / scale;
        if (std::getenv("NAPPE_TEST_LOG") && rank == 0)
          std::cout << "    " << output_names[k] << ": 1 rank " << std::setprecision(15) << serial[k] << ", "
                    << dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD) << " ranks " << parallel[k]
                    << ", rel. diff " << std::setprecision(3) << diff << "\n";
        EXPECT_LE(diff, tolerance) << output_names[k] << ": 1 rank " << serial[k] << ", all ranks " << parallel[k];
      }
  }
} // namespace

// Clamped circular plate with an immovable edge; the pressure gives w0/h ≈ 1, well into the
// nonlinear (membrane-stiffened) range.
TEST(RankIndependence, ClampedCircularPlateUnderLargePressure)
{
  const double thickness = 0.01, youngs = 200e9, radius = 1.0;
  SheetModel   model;
  model.material = SheetMaterial::from_plate(youngs, thickness, 0.3);
  model.edges[0] = {DeflectionCondition::clamped, InPlaneCondition::fixed};
  // q a⁴/(E h⁴) ≈ 8.7 gives w0/h ≈ 1 by the approximate large-deflection formula of Timoshenko &
  // Woinowsky-Krieger (1959), ch. 13, clamped immovable edge: q a⁴/(64 D) = w0 (1 + 0.488 w0²/h²).
  // (Observed here: w0/h = 0.97.)
  model.loads.pressure = 8.7 * youngs * std::pow(thickness / radius, 4);
  SheetDomain domain;
  domain.shape              = SheetDomain::Shape::disk;
  domain.radius             = radius;
  domain.global_refinements = 3;
  expect_rank_independent(model, domain, 2);
}

// Periodic rectangle on a nonlinear spring substrate under a point load.
TEST(RankIndependence, PeriodicRectangleWithPointLoadOnSpringSubstrate)
{
  SheetDomain domain;
  domain.length_x           = 1.0;
  domain.length_y           = 0.8;
  domain.coarse_cells_x     = 2;
  domain.periodic           = true;
  domain.global_refinements = 3;
  SheetModel model;
  model.material.youngs_modulus_2d = 1.0;
  model.material.poisson_ratio     = 0.3;
  model.material.bending_rigidity  = 1e-4;
  model.substrate                  = std::make_shared<SpringToTopography>(domain, 1.0, 50.0, 0.01);
  model.loads.point_loads.push_back({domain.center(), 0.02});
  model.loads.eigenstrain[0][0] = model.loads.eigenstrain[1][1] = -1e-3;
  expect_rank_independent(model, domain, 1);
}

// The rhombic cell of a hexagonal array, sheet on a corrugated substrate under a sheared mean strain.
TEST(RankIndependence, RhombicCellOnCorrugatedSubstrate)
{
  SheetDomain domain;
  domain.shape              = SheetDomain::Shape::rhombus;
  domain.length_x           = 1.0;
  domain.periodic           = true;
  domain.global_refinements = 4;
  SheetModel model;
  model.material.youngs_modulus_2d = 1.0;
  model.material.poisson_ratio     = 0.2;
  model.material.bending_rigidity  = 1e-4;
  model.substrate                  = std::make_shared<SpringToTopography>(domain, 0.5, 20.0, 0.05);
  model.loads.mean_strain[0][1]    = 2e-3;
  model.loads.eigenstrain[0][0] = model.loads.eigenstrain[1][1] = -5e-4;
  model.loads.point_loads.push_back({dealii::Point<2>(0.4, 0.3), 0.005});
  expect_rank_independent(model, domain, 1);
}
