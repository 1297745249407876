// Γ_hold, Γ_eq and Γ_snap do not depend on the number of MPI ranks: the held graphene grating of
// adhesion_thresholds_test.cc, computed on rank 0 alone (MPI_COMM_SELF from MPI_Comm_split) and on
// all ranks, gives thresholds whose brackets agree within the bisection tolerance (|ln(Γ₁/Γ₂)| ≤
// Relative tolerance for the bracket midpoints), and both paths take the same number of states.
// Run on 2 ranks.
#include <deal.II/base/mpi.h>

#include <nappe/analysis/adhesion_limits.h>
#include <nappe/geometry/sinusoidal_topography.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/vdw_93_law.h>

#include <gtest/gtest.h>

#include <mpi.h>

#include <array>
#include <cmath>

using namespace nappe;

namespace
{
  /// Graphene held on a grating of period 40 nm and amplitude 2 nm (our own scenario), Q2, 64 cells.
  SheetProblem held_grating()
  {
    SheetProblem c;
    c.model.material            = MaterialCatalogue().material("graphene");
    c.domain.length_x           = 40e-9;
    c.domain.length_y           = 2.5e-9;
    c.domain.coarse_cells_x     = 16;
    c.domain.global_refinements = 2;
    c.domain.periodic           = true;
    c.model.substrate     = std::make_shared<AdhesionPotential>(std::make_shared<SinusoidalGrating>(2e-9, 40e-9),
                                                            std::make_shared<Vdw93Law>(0.45, 0.5e-9),
                                                            GapMeasure::normal);
    c.stepping.load_steps = 1;
    return c;
  }

  AdhesionPathSettings threshold_range()
  {
    AdhesionPathSettings s;
    s.lowest_work_of_adhesion  = 0.05;
    s.highest_work_of_adhesion = 1.0;
    return s;
  }

  /// hold, eq, snap midpoints and the number of states on each path.
  std::array<double, 5> thresholds(MPI_Comm comm)
  {
    const AdhesionLimits l = find_adhesion_limits(held_grating(), threshold_range(), comm);
    EXPECT_TRUE(l.hold.found && l.equal_energy.found && l.snap.found);
    return {l.hold.value(), l.equal_energy.value(), l.snap.value(), double(l.lowering.points.size()),
            double(l.raising.points.size())};
  }
} // namespace

TEST(ThresholdRankIndependence, HeldGrating)
{
  const int rank = dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD);
  ASSERT_GE(dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD), 2u) << "run this test on 2 ranks";
  MPI_Comm self;
  MPI_Comm_split(MPI_COMM_WORLD, rank, 0, &self);
  std::array<double, 5> serial{};
  if (rank == 0)
    serial = thresholds(self);
  MPI_Bcast(serial.data(), serial.size(), MPI_DOUBLE, 0, MPI_COMM_WORLD);
  MPI_Comm_free(&self);
  const std::array<double, 5> parallel = thresholds(MPI_COMM_WORLD);
  const double                tolerance = threshold_range().relative_tolerance;
  for (unsigned int k = 0; k < 3; ++k)
    EXPECT_LE(std::abs(std::log(parallel[k] / serial[k])), tolerance)
      << "threshold " << k << ": 1 rank " << serial[k] << " J/m², all ranks " << parallel[k] << " J/m²";
  EXPECT_EQ(parallel[3], serial[3]) << "states on the lowering path";
  EXPECT_EQ(parallel[4], serial[4]) << "states on the raising path";
}
