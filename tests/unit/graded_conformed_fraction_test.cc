// The graded conformed fraction (conformation.h), which an adhesion path's branch test compares,
// checked against its definition on a flat substrate, where the gap is the deflection: a sheet held
// at a uniform height g counts 1 up to the peak-traction gap g_peak and falls linearly to 0 at
// g_peak + h₀, whereas the conformed fraction drops from 1 to 0 at g_peak. Uniform states make the
// quadrature exact, so the values are checked to round-off.
#include <deal.II/base/mpi.h>

#include <nappe/analysis/conformation.h>
#include <nappe/geometry/topography.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/vdw_93_law.h>

#include <common/interpolated_state.h>

#include <gtest/gtest.h>

using namespace nappe;

namespace
{
  const double nm = 1e-9, h0 = 0.5 * nm;

  struct FlatSheet
  {
    std::shared_ptr<const Vdw93Law> law = std::make_shared<Vdw93Law>(0.3, h0);
    SheetModel                      model;
    SheetDomain                     domain;
    std::unique_ptr<SheetSystem>    system;

    FlatSheet()
    {
      model.material  = MaterialCatalogue().material("graphene");
      model.substrate = std::make_shared<AdhesionPotential>(std::make_shared<FlatTopography>(), law,
                                                            GapMeasure::normal);
      domain.length_x = domain.length_y = 10 * nm;
      domain.coarse_cells_x = domain.coarse_cells_y = 2;
      domain.global_refinements                     = 1;
      domain.periodic                               = true;
      system = std::make_unique<SheetSystem>(model, domain, MPI_COMM_WORLD);
    }

    /// (graded, conformed) fraction of the sheet held at the uniform height @p w.
    std::pair<double, double> fractions_at(double w) const
    {
      const Vector state = test_support::interpolated_state(*system, [w](const dealii::Point<2> &) {
        return std::array<double, 3>{0.0, 0.0, w};
      });
      const LoadLevel level(1.0, 1.0);
      return {graded_conformed_fraction(*system, state),
              measure_conformation(*system, state, level, 1).conformed_fraction};
    }
  };
} // namespace

TEST(GradedConformedFraction, EqualsTheConformedFractionOutsideItsRamp)
{
  const FlatSheet sheet;
  const double    peak = sheet.law->peak_traction_gap();
  for (const double w : {h0, peak - 0.01 * h0})
    {
      EXPECT_NEAR(sheet.fractions_at(w).first, 1.0, 1e-12) << "w = " << w;
      EXPECT_NEAR(sheet.fractions_at(w).second, 1.0, 1e-12) << "w = " << w;
    }
  for (const double w : {peak + h0, peak + 3 * h0})
    {
      EXPECT_NEAR(sheet.fractions_at(w).first, 0.0, 1e-12) << "w = " << w;
      EXPECT_NEAR(sheet.fractions_at(w).second, 0.0, 1e-12) << "w = " << w;
    }
}

TEST(GradedConformedFraction, FallsLinearlyOverOneEquilibriumGapPastThePeakTractionGap)
{
  const FlatSheet sheet;
  const double    peak = sheet.law->peak_traction_gap();
  for (const double share : {0.1, 0.25, 0.5, 0.9})
    {
      const auto [graded, conformed] = sheet.fractions_at(peak + share * h0);
      EXPECT_NEAR(graded, 1.0 - share, 1e-9) << "g = g_peak + " << share << " h0";
      EXPECT_EQ(conformed, 0.0) << "the conformed fraction has already dropped to 0";
    }
}
