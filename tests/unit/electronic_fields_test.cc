// Pointwise electron–strain estimates (physics/electronic_fields.h), the lattice data of the catalogue and
// the commensurate supercell of the lattice export (io/lattice_sites.h).
#include <deal.II/base/mpi.h>

#include <nappe/base/physical_constants.h>
#include <nappe/base/units.h>
#include <nappe/io/lattice_sites.h>
#include <nappe/physics/electronic_fields.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/strain_gradient.h>

#include <common/thrown_message.h>

#include <gtest/gtest.h>

#include <cctype>
#include <cmath>
#include <fstream>
#include <functional>

namespace
{
  using namespace nappe;
  using test_support::collapsed_message_of;
  using dealii::Point;
  using dealii::SymmetricTensor;
  using dealii::Tensor;

  const double pi = 3.14159265358979323846, degree = pi / 180.0;
  const double percent = 0.01, meV = 1e-3 * units::electronvolt;

  SymmetricTensor<2, 2> strain(double xx, double yy, double xy)
  {
    SymmetricTensor<2, 2> e;
    e[0][0] = xx, e[1][1] = yy, e[0][1] = xy;
    return e;
  }

  SheetMaterial catalogue_material(const std::string &name) { return MaterialCatalogue().material(name); }
} // namespace

TEST(MonolayerLattice, CatalogueGivesGrapheneItsPublishedConstantAndBond)
{
  const SheetMaterial g = catalogue_material("graphene");
  EXPECT_EQ(g.lattice.type, LatticeType::honeycomb);
  // Graphene: a = 2.46 Å, C–C = 1.42 Å (values named in the issue and the catalogue; graphite X-ray, from memory).
  EXPECT_NEAR(g.lattice.lattice_constant / units::angstrom, 2.46, 1e-12);
  EXPECT_NEAR(g.lattice.bond_length() / units::angstrom, 1.42, 0.001);
  EXPECT_EQ(g.lattice.basis().size(), 2u);
  // Pereira, Castro Neto & Peres, Phys. Rev. B 80, 045401 (2009): β = 3.37 (value from memory, as in the issue).
  EXPECT_DOUBLE_EQ(g.electronic.hopping_decay, 3.37);
  EXPECT_FALSE(g.electronic.hopping_decay_source.empty());
}

TEST(MonolayerLattice, DichalcogenideHasMetalBetweenTwoChalcogenPlanes)
{
  const SheetMaterial m     = catalogue_material("MoS2");
  const auto          basis = m.lattice.basis();
  ASSERT_EQ(basis.size(), 3u);
  EXPECT_EQ(basis[0].species, "Mo");
  EXPECT_EQ(basis[1].species, "S");
  EXPECT_DOUBLE_EQ(basis[1].height, -basis[2].height);
  EXPECT_GT(basis[2].height, 0.0);
  EXPECT_EQ(catalogue_material("hBN").lattice.basis()[1].species, "N");
}

TEST(MonolayerLattice, PrimitiveVectorsRotateWithTheZigzagAngle)
{
  MonolayerLattice l = catalogue_material("graphene").lattice;
  l.orientation      = 25 * degree;
  const auto [a1, a2] = l.primitive_vectors();
  EXPECT_NEAR(std::atan2(a1[1], a1[0]), 25 * degree, 1e-14);
  EXPECT_NEAR(a1 * a2 / (a1.norm() * a2.norm()), 0.5, 1e-14); // 60° between a₁ and a₂
}

TEST(ElectronicFields, BiaxialStrainReproducesTheMeasuredMoS2CoefficientExactly)
{
  // Lloyd et al., Nano Letters 16, 5836 (2016): optical gap of suspended monolayer MoS2 falls by 99 meV per %
  // of equibiaxial strain (abstract verified).
  const SheetMaterial m = catalogue_material("MoS2");
  const auto         &k = biaxial_gap_coefficient(m);
  for (const double e : {-0.5 * percent, 0.3 * percent, 1 * percent, 2.5 * percent})
    EXPECT_NEAR(band_gap_shift(strain(e, e, 0.0), k) / meV, -99.0 * e / percent, 1e-9);
  // Shear does not enter the trace-only model.
  EXPECT_NEAR(band_gap_shift(strain(1 * percent, 1 * percent, 0.7 * percent), k) / meV, -99.0, 1e-9);
  EXPECT_NE(k.kind.find("biaxial"), std::string::npos);
}

TEST(ElectronicFields, TraceModelUniaxialPredictionBracketsTheMeasuredValue)
{
  // The model's uniaxial coefficient κ_b(1 − ν_t)/2 for the two limiting transverse states: uniaxial strain
  // (ν_t = 0) gives −49.5 meV/%, uniaxial stress of a free MoS2 sheet (ν_t = catalogue ν = 0.29) −35.1 meV/%.
  // Conley et al., Nano Letters 13, 3626 (2013), measured about −45 meV/% (abstract verified) on a bent
  // substrate, between the two (docs/electronics.md).
  const SheetMaterial m  = catalogue_material("MoS2");
  const auto         &k  = biaxial_gap_coefficient(m);
  const double        per = meV / percent;
  EXPECT_NEAR(trace_model_uniaxial_coefficient(k, 0.0) / per, -49.5, 1e-9);
  EXPECT_NEAR(trace_model_uniaxial_coefficient(k, m.poisson_ratio) / per, -35.145, 1e-9);
  const double measured = m.electronic.uniaxial_gap.value / per;
  EXPECT_NEAR(measured, -45.0, 1e-12);
  EXPECT_LT(trace_model_uniaxial_coefficient(k, 0.0) / per, measured);
  EXPECT_GT(trace_model_uniaxial_coefficient(k, m.poisson_ratio) / per, measured);
}

TEST(ElectronicFields, DeformationPotentialIsGTimesTheTrace)
{
  const SheetMaterial g = catalogue_material("graphene");
  const double        c = deformation_potential_constant(g);
  EXPECT_NEAR(deformation_potential(strain(0.01, 0.004, 0.02), c) / units::electronvolt, 4.0 * 0.014, 1e-12);
}

TEST(ElectronicFields, VectorPotentialPicksUpThreeTimesTheLatticeAngle)
{
  PseudoGaugeCoupling c = PseudoGaugeCoupling::of(catalogue_material("graphene"));
  const auto          e = strain(0.012, -0.004, 0.003);
  // θ = 0: A = (ħβ/(2ed))(ε_xx − ε_yy, −2ε_xy).
  const auto A0 = pseudo_vector_potential(e, c);
  EXPECT_NEAR(A0[0], c.prefactor() * 0.016, 1e-12 * std::abs(A0[0]));
  EXPECT_NEAR(A0[1], c.prefactor() * -0.006, 1e-12 * std::abs(A0[0]));
  c.orientation = 60 * degree; // sublattices exchanged: sign flip
  const auto A60 = pseudo_vector_potential(e, c);
  c.orientation = 120 * degree; // the same lattice
  const auto A120 = pseudo_vector_potential(e, c);
  for (unsigned int i = 0; i < 2; ++i)
    {
      EXPECT_NEAR(A60[i], -A0[i], 1e-12 * A0.norm());
      EXPECT_NEAR(A120[i], A0[i], 1e-12 * A0.norm());
    }
  // The same physical result from rotating the strain into the lattice frame by hand, θ = 25°.
  c.orientation = 25 * degree;
  const double           t = c.orientation;
  const Tensor<2, 2>     R({{std::cos(t), -std::sin(t)}, {std::sin(t), std::cos(t)}});
  const Tensor<2, 2>     e_lattice = dealii::transpose(R) * Tensor<2, 2>(e) * R;
  PseudoGaugeCoupling    frame     = c;
  frame.orientation                = 0.0;
  const auto A_lattice = pseudo_vector_potential(dealii::symmetrize(e_lattice), frame);
  const auto A_sheet   = pseudo_vector_potential(e, c);
  const auto rotated   = R * A_lattice;
  for (unsigned int i = 0; i < 2; ++i)
    EXPECT_NEAR(A_sheet[i], rotated[i], 1e-12 * A0.norm());
}

TEST(ElectronicFields, StrainGradientOfTheVonKarmanTermMatchesCentralDifferences)
{
  // w = sin(x)cos(2y) (units: 1/m scale irrelevant): ∂_k(½∂_iw∂_jw) against central differences.
  auto grad_w = [](double x, double y) { return Tensor<1, 2>({std::cos(x) * std::cos(2 * y), -2 * std::sin(x) * std::sin(2 * y)}); };
  auto hess_w = [](double x, double y) {
    return Tensor<2, 2>({{-std::sin(x) * std::cos(2 * y), -2 * std::cos(x) * std::sin(2 * y)},
                         {-2 * std::cos(x) * std::sin(2 * y), -4 * std::sin(x) * std::cos(2 * y)}});
  };
  const double x = 0.3, y = -0.7, h = 1e-6;
  const auto   g = membrane_strain_gradient(Tensor<3, 2>(), grad_w(x, y), hess_w(x, y), true);
  for (unsigned int k = 0; k < 2; ++k)
    {
      const double dx = k == 0 ? h : 0, dy = k == 1 ? h : 0;
      const auto   p = grad_w(x + dx, y + dy), m = grad_w(x - dx, y - dy);
      for (unsigned int i = 0; i < 2; ++i)
        for (unsigned int j = 0; j < 2; ++j)
          EXPECT_NEAR(g[i][j][k], (0.5 * p[i] * p[j] - 0.5 * m[i] * m[j]) / (2 * h), 1e-8);
    }
  EXPECT_EQ(membrane_strain_gradient(Tensor<3, 2>(), grad_w(x, y), hess_w(x, y), false).norm(), 0.0);
}

TEST(ElectronicFields, MissingConstantsAreRefusedNamingTheCatalogueEntry)
{
  EXPECT_NE(collapsed_message_of([] { PseudoGaugeCoupling::of(catalogue_material("MoS2")); }).find("honeycomb"),
            std::string::npos);
  EXPECT_NE(collapsed_message_of([] { PseudoGaugeCoupling::of(catalogue_material("hBN")); }).find("Hopping decay beta"),
            std::string::npos);
  const std::string no_gap = collapsed_message_of([] { biaxial_gap_coefficient(catalogue_material("graphene")); });
  EXPECT_NE(no_gap.find("Biaxial gap coefficient"), std::string::npos) << no_gap;
  const std::string no_potential = collapsed_message_of([] { deformation_potential_constant(catalogue_material("WSe2")); });
  EXPECT_NE(no_potential.find("Deformation potential"), std::string::npos) << no_potential;
}

TEST(MaterialCatalogue, RejectsAnUnsourcedElectronicCoefficient)
{
  const std::string path = ::testing::TempDir() + "unsourced.prm";
  std::ofstream(path) << "subsection Materials\n  subsection foil\n    set 2D Young modulus = 100\n"
                         "    set Poisson ratio = 0.3\n    set Bending rigidity = 2\n    set Nominal thickness = 0.5\n"
                         "    subsection Electronic\n      set Biaxial gap coefficient = -50\n    end\n  end\nend\n";
  const std::string message = collapsed_message_of([&] { MaterialCatalogue catalogue(path); });
  EXPECT_NE(message.find("Materials/foil/Electronic/Biaxial gap coefficient source"), std::string::npos) << message;
}

TEST(LatticeSites, CommensurateRectangleHasNoResidualAndTheRightAtomCount)
{
  MonolayerLattice   l = catalogue_material("graphene").lattice;
  const double       a = l.lattice_constant;
  Tensor<1, 2>       L1({10 * a, 0.0}), L2({0.0, 6 * std::sqrt(3.0) * a});
  const auto         cell = nearest_commensurate_cell(l, L1, L2);
  EXPECT_EQ(cell.n_primitive_cells(), 120);
  EXPECT_LT(cell.largest_residual_strain(), 1e-14);
  const auto sites = periodic_cell_sites(l, cell, MPI_COMM_WORLD);
  EXPECT_EQ(sites.size(), 240u);
  // A cell 0.3 % too long along x: the supercell keeps 10 columns and carries the 0.3 % as residual strain.
  const auto stretched = nearest_commensurate_cell(l, 1.003 * L1, L2);
  EXPECT_EQ(stretched.n_primitive_cells(), 120);
  EXPECT_NEAR(stretched.residual_strain[0][0], 0.5 * (1.003 * 1.003 - 1), 1e-12);
  EXPECT_NEAR(stretched.residual_strain[1][1], 0.0, 1e-12);
}

TEST(LatticeSites, RegionSitesFillAPolygonAtTheLatticeDensity)
{
  MonolayerLattice l = catalogue_material("MoS2").lattice;
  l.orientation      = 17 * degree;
  const double L     = 30 * l.lattice_constant;
  const std::vector<Point<2>> triangle = {Point<2>(0, 0), Point<2>(L, 0), Point<2>(0, L)};
  const auto   sites    = region_sites(l, triangle, MPI_COMM_WORLD);
  const double per_area = 3 / (0.5 * std::sqrt(3.0) * l.lattice_constant * l.lattice_constant);
  // Count = density × area up to a boundary layer of about one atom row along the perimeter.
  const double expected = per_area * 0.5 * L * L, perimeter_rows = 3 * (2 + std::sqrt(2.0)) * L / l.lattice_constant;
  EXPECT_NEAR(double(sites.size()), expected, perimeter_rows);
  for (const auto &p : sites.positions)
    EXPECT_TRUE(inside_polygon(triangle, p));
}
