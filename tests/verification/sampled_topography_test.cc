// Sampled topographies reproduce the analytic one they were sampled from. The same laid-down case —
// a MoS2 monolayer pulled onto a square array of Gaussian bumps on a periodic cell — is run with
//   (a) the analytic LatticeArray of GaussianBump,
//   (b) a HeightMap sampled from it (HeightMap::sample, periodic, bicubic: C1),
//   (c) an STL written from a fine triangulation of it (heights only C0, slopes piecewise constant),
//   (d) that STL resampled into a periodic HeightMap (C1 again, as stl_topography.h recommends),
// and the conformed fraction, the peak principal strain and the total energy must agree with (a) to
// 1 %. The reference is case (a) itself (a consistency check, no external source). The normal gap
// measure is used so that the sampled slopes matter, not only the heights.
#include <deal.II/base/mpi.h>

#include <nappe/geometry/height_map.h>
#include <nappe/geometry/lattice_array.h>
#include <nappe/geometry/radial_features.h>
#include <nappe/geometry/stl_topography.h>
#include <nappe/physics/vdw_93_law.h>

#include <common/sheet_solve.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <fstream>
#include <iomanip>
#include <iostream>
#include <memory>
#include <string>

using namespace nappe;

namespace
{
  const double nm    = 1e-9;
  const double pitch = 40 * nm; // cell size = array pitch

  bool logging() { return std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0; }

  /// Gaussian bumps of height 3 nm and σ = 4 nm on a square lattice of pitch 40 nm.
  std::shared_ptr<const Topography> analytic()
  {
    return LatticeArray::square(std::make_shared<GaussianBump>(3 * nm, 4 * nm), pitch);
  }

  /// Binary STL of t over [lo, hi]² triangulated by n × n squares (two facets each), in nm.
  void write_binary_stl(const Topography &t, const std::string &file, double lo, double hi, unsigned int n)
  {
    std::ofstream out(file, std::ios::binary);
    char          header[80] = "nappe sampled_topography_test";
    out.write(header, 80);
    const std::uint32_t n_facets = 2 * n * n;
    out.write(reinterpret_cast<const char *>(&n_facets), 4);
    const double h      = (hi - lo) / n;
    auto         vertex = [&](unsigned int i, unsigned int j) {
      const dealii::Point<2> p(lo + i * h, lo + j * h);
      return std::array<float, 3>{float(p[0] / nm), float(p[1] / nm), float(t.height(p) / nm)};
    };
    auto facet = [&](const std::array<float, 3> &a, const std::array<float, 3> &b, const std::array<float, 3> &c) {
      const float         normal[3] = {0, 0, 1}; // ignored by the reader
      const std::uint16_t attribute = 0;
      out.write(reinterpret_cast<const char *>(normal), 12);
      for (const auto *v : {&a, &b, &c})
        out.write(reinterpret_cast<const char *>(v->data()), 12);
      out.write(reinterpret_cast<const char *>(&attribute), 2);
    };
    for (unsigned int j = 0; j < n; ++j)
      for (unsigned int i = 0; i < n; ++i)
        {
          facet(vertex(i, j), vertex(i + 1, j), vertex(i + 1, j + 1));
          facet(vertex(i, j), vertex(i + 1, j + 1), vertex(i, j + 1));
        }
    AssertThrow(out, dealii::ExcMessage("could not write " + file));
  }

  struct Outcome
  {
    double conformed_fraction = 0, peak_strain = 0, total_energy = 0;
  };

  Outcome run(std::shared_ptr<const Topography> topography, const std::string &name)
  {
    SheetProblem c;
    c.model.material.name              = "MoS2";
    c.model.material.youngs_modulus_2d = 180;   // share/materials.prm, Bertolazzi et al. 2011
    c.model.material.poisson_ratio     = 0.29;  // share/materials.prm
    c.model.material.bending_rigidity  = 9.61 * 1.602176634e-19; // 9.61 eV, share/materials.prm
    c.domain.length_x = c.domain.length_y = pitch;
    c.domain.coarse_cells_x = c.domain.coarse_cells_y = 4;
    c.domain.global_refinements                       = 2; // 16 × 16 Q2 cells, 2.5 nm
    c.domain.periodic                                 = true;
    c.model.substrate  = std::make_shared<AdhesionPotential>(std::move(topography), std::make_shared<Vdw93Law>(0.1, 0.5 * nm),
                                                     GapMeasure::normal);
    c.start               = StartProtocol::laid_down;
    c.stepping.load_steps = 1; // no loads: the substrate is not scaled by λ
    const SheetResult r   = test_support::solve_and_measure(c, MPI_COMM_WORLD, logging() ? &std::cout : nullptr);
    EXPECT_TRUE(r.converged) << name << ": " << r.message;
    Outcome o;
    if (!r.converged)
      return o;
    o.conformed_fraction = r.conformation->conformed_fraction;
    o.peak_strain        = r.measures.at("max_principal_strain").value;
    o.total_energy       = r.energy.total();
    if (logging())
      std::cout << "    " << name << ": conformed fraction " << std::setprecision(8) << o.conformed_fraction
                << ", peak principal strain " << o.peak_strain << ", total energy " << o.total_energy << " J, "
                << r.path.newton_iterations << " Newton iterations, " << r.path.wall_time << " s\n";
    return o;
  }

  void expect_close(const Outcome &o, const Outcome &ref, const std::string &name)
  {
    EXPECT_NEAR(o.conformed_fraction, ref.conformed_fraction, 1e-2 * ref.conformed_fraction) << name;
    EXPECT_NEAR(o.peak_strain, ref.peak_strain, 1e-2 * std::abs(ref.peak_strain)) << name;
    EXPECT_NEAR(o.total_energy, ref.total_energy, 1e-2 * std::abs(ref.total_energy)) << name;
  }

  /// The STL file, written once by rank 0 (before any rank reads it).
  std::string stl_file()
  {
    const std::string file = "sampled_topography_bumps.stl";
    if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
      // 0.25 nm facets (σ/16) over the cell plus a 5 nm margin, so every sheet point has a facet.
      write_binary_stl(*analytic(), file, -5 * nm, pitch + 5 * nm, 200);
    MPI_Barrier(MPI_COMM_WORLD);
    return file;
  }

  const Outcome &reference()
  {
    static const Outcome ref = run(analytic(), "analytic");
    return ref;
  }

  /// A periodic height map on the cell, 64 × 64 nodes (0.625 nm), sampled from @p t.
  std::shared_ptr<const Topography> sampled(const Topography &t)
  {
    const unsigned int   n = 64;
    dealii::Tensor<1, 2> spacing;
    spacing[0] = spacing[1] = pitch / n;
    return std::make_shared<HeightMap>(HeightMap::sample(t, dealii::Point<2>(), spacing, n, n, HeightMap::Extension::periodic));
  }
} // namespace

TEST(SampledTopography, AnalyticCaseTentsPartially)
{
  // Guard that the comparison is not trivial: part of the sheet is suspended.
  EXPECT_GT(reference().conformed_fraction, 0.05);
  EXPECT_LT(reference().conformed_fraction, 0.99);
}

TEST(SampledTopography, HeightMapReproducesAnalytic)
{
  expect_close(run(sampled(*analytic()), "height_map"), reference(), "height map");
}

TEST(SampledTopography, RawStlReproducesAnalytic)
{
  StlTopography::Options options; // nm, error outside the footprint
  expect_close(run(std::make_shared<StlTopography>(stl_file(), options), "stl"), reference(), "raw STL");
}

TEST(SampledTopography, ResampledStlReproducesAnalytic)
{
  const StlTopography stl(stl_file());
  expect_close(run(sampled(stl), "stl_resampled"), reference(), "resampled STL");
}
