// The conformation analysis of a laid-down case does not depend on the number of MPI ranks: a MoS2
// sheet pulled onto a square pillar array, solved and measured on rank 0 alone (MPI_COMM_SELF
// obtained by MPI_Comm_split) and on all ranks, gives the same energies, conformed fraction,
// number of suspended regions and peak principal strain up to round-off (relative 1e-8, as in
// rank_independence_test.cc). Run on 2 ranks.
#include <deal.II/base/mpi.h>

#include <nappe/geometry/lattice_array.h>
#include <nappe/geometry/radial_features.h>
#include <nappe/physics/vdw_93_law.h>

#include <common/sheet_solve.h>

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

namespace
{
  const double nm = 1e-9;

  enum Output
  {
    total,
    stretching,
    bending,
    substrate,
    conformed_fraction,
    suspended_regions,
    peak_strain,
    n_outputs
  };
  const std::array<std::string, n_outputs> output_names = {"total energy",       "stretching energy", "bending energy",
                                                           "substrate energy",   "conformed fraction",
                                                           "suspended regions",  "peak principal strain"};
  using Outputs = std::array<double, n_outputs>;

  SheetProblem pillar_case()
  {
    SheetProblem c;
    c.model.material.youngs_modulus_2d = 180;                    // MoS2, share/materials.prm
    c.model.material.poisson_ratio     = 0.29;                   // share/materials.prm
    c.model.material.bending_rigidity  = 9.61 * 1.602176634e-19; // 9.61 eV, share/materials.prm
    const double pitch                 = 60 * nm;
    c.domain.length_x = c.domain.length_y = pitch;
    c.domain.coarse_cells_x = c.domain.coarse_cells_y = 4;
    c.domain.global_refinements                       = 2; // 16 × 16 Q2 cells
    c.domain.periodic                                 = true;
    auto pillar = std::make_shared<Pillar>(6 * nm, 10 * nm, 3 * nm, 3 * nm, 70.0 * M_PI / 180.0);
    c.model.substrate = std::make_shared<AdhesionPotential>(LatticeArray::square(pillar, pitch),
                                                     std::make_shared<Vdw93Law>(0.22, 0.5 * nm), GapMeasure::normal);
    c.start               = StartProtocol::laid_down;
    c.stepping.load_steps = 1;
    return c;
  }

  Outputs solve(const std::string &name, MPI_Comm comm)
  {
    const bool           log = std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(comm) == 0;
    const SheetResult r = test_support::solve_and_measure(pillar_case(), comm, log ? &std::cout : nullptr);
    EXPECT_TRUE(r.converged) << name << ": " << r.message;
    Outputs out{};
    if (!r.converged)
      return out;
    out[total]              = r.energy.total();
    out[stretching]         = r.energy.stretching;
    out[bending]            = r.energy.bending;
    out[substrate]          = r.energy.substrate;
    out[conformed_fraction] = r.conformation->conformed_fraction;
    out[suspended_regions]  = r.conformation->suspended_regions.size();
    out[peak_strain]        = r.measures.at("max_principal_strain").value;
    return out;
  }
} // namespace

TEST(ConformationRankIndependence, LaidDownPillarArray)
{
  const int rank = dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD);
  ASSERT_GE(dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD), 2u) << "run this test on 2 ranks";
  MPI_Comm self;
  MPI_Comm_split(MPI_COMM_WORLD, rank, 0, &self);
  Outputs serial{};
  if (rank == 0)
    serial = solve("serial", self);
  MPI_Bcast(serial.data(), n_outputs, MPI_DOUBLE, 0, MPI_COMM_WORLD);
  MPI_Comm_free(&self);

  const Outputs parallel = solve("parallel", MPI_COMM_WORLD);

  // The case must be a real test of the conformation measures: partly suspended.
  EXPECT_GT(serial[conformed_fraction], 0.0);
  EXPECT_LT(serial[conformed_fraction], 1.0);
  EXPECT_GE(serial[suspended_regions], 1.0);

  const double energy_scale =
    std::max({std::abs(serial[stretching]), std::abs(serial[bending]), std::abs(serial[substrate])});
  for (unsigned int k = 0; k < n_outputs; ++k)
    {
      const double scale = k < conformed_fraction ? energy_scale : std::abs(serial[k]);
      const double diff  = std::abs(parallel[k] - serial[k]) / scale;
      if (std::getenv("NAPPE_TEST_LOG") && rank == 0)
        std::cout << "    " << output_names[k] << ": 1 rank " << std::setprecision(15) << serial[k] << ", "
                  << dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD) << " ranks " << parallel[k]
                  << ", rel. diff " << std::setprecision(3) << diff << "\n";
      EXPECT_LE(diff, 1e-8) << output_names[k] << ": 1 rank " << serial[k] << ", all ranks " << parallel[k];
    }
}
