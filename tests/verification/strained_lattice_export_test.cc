// Strained-lattice export (io/strained_lattice.h): atom counts, no duplicates across cell edges, bond lengths
// against the local strain, refusals; and the files that tests/apps/lattice_export_test.py loads with
// general-purpose readers (ASE, gemmi) and checks with spglib (written to lattice-export/ in the working directory,
// one set per rank count, so the script also compares the 1-rank and 2-rank files).
//
// Bond check (first-order kinematics): a bond of reference length d along the unit vector n stretches to
// d(1 + n·ε·n) + O(ε²) with ε the membrane strain (Green–Lagrange, von Kármán), e.g. Landau & Lifshitz, Theory of
// Elasticity, §1 (from memory). For |ε| ≲ 10⁻² the O(ε²) and strain-variation terms stay below 10⁻⁴ d, so the
// issue's tolerance 10⁻³ d tests the kinematics, not the expansion.
#include <deal.II/base/mpi.h>

#include <nappe/base/units.h>
#include <nappe/io/strained_lattice.h>
#include <nappe/physics/material_catalogue.h>

#include "common/interpolated_state.h"

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <functional>

using namespace nappe;
using dealii::Point;
using dealii::Tensor;

namespace
{
  const double pi = 3.14159265358979323846, nm = units::nanometer;
  unsigned int n_ranks() { return dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD); }
  bool         is_root() { return dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0; }

  std::string output_base(const std::string &name)
  {
    std::filesystem::create_directories("lattice-export");
    return "lattice-export/" + name + "_np" + std::to_string(n_ranks());
  }

  SheetMaterial material(const std::string &name) { return MaterialCatalogue().material(name); }

  /// A periodic rectangle of nx × ny rows commensurate with the lattice at θ = 0: (nx a, ny √3 a).
  SheetDomain commensurate_rectangle(const SheetMaterial &m, unsigned int nx, unsigned int ny)
  {
    SheetDomain d;
    d.shape              = SheetDomain::Shape::rectangle;
    d.length_x           = nx * m.lattice.lattice_constant;
    d.length_y           = ny * std::sqrt(3.0) * m.lattice.lattice_constant;
    d.periodic           = true;
    d.coarse_cells_x     = 2;
    d.coarse_cells_y     = 2;
    d.global_refinements = 3;
    return d;
  }

  SheetModel model_of(const SheetMaterial &m)
  {
    SheetModel model;
    model.material = m;
    return model;
  }

  /// In-plane minimum image of a separation in the table's (periodic) cell.
  Tensor<1, 3> minimum_image(const AtomTable &atoms, Tensor<1, 3> delta)
  {
    if (!atoms.pbc[0])
      return delta;
    Tensor<2, 2> V;
    for (unsigned int r = 0; r < 2; ++r)
      V[r][0] = atoms.cell[0][r], V[r][1] = atoms.cell[1][r];
    Tensor<1, 2> f = dealii::invert(V) * Tensor<1, 2>({delta[0], delta[1]});
    for (unsigned int k = 0; k < 2; ++k)
      f[k] -= std::round(f[k]);
    const Tensor<1, 2> in_plane = V * f;
    delta[0] = in_plane[0], delta[1] = in_plane[1];
    return delta;
  }

  /// Visits every pair (i < j) of atoms of the given species closer than @p cutoff.
  void for_each_pair(const AtomTable &atoms, double cutoff, const std::function<void(std::size_t, std::size_t, const Tensor<1, 3> &)> &visit,
                     int species_i = -1)
  {
    for (std::size_t i = 0; i < atoms.size(); ++i)
      for (std::size_t j = i + 1; j < atoms.size(); ++j)
        {
          if (species_i >= 0 && (atoms.species[i] != species_i || atoms.species[j] != species_i))
            continue;
          const Tensor<1, 3> delta = minimum_image(atoms, atoms.positions[j] - atoms.positions[i]);
          if (delta.norm() < cutoff)
            visit(i, j, delta);
        }
  }

  double column(const AtomTable &atoms, std::size_t atom, const std::string &name)
  {
    for (std::size_t k = 0; k < atoms.n_columns(); ++k)
      if (atoms.column_names[k] == name)
        return atoms.columns[atom * atoms.n_columns() + k];
    ADD_FAILURE() << "no column " << name;
    return 0.0;
  }

  /// Largest |ℓ/d − (1 + n·ε̄·n)| over the bonds of length ≈ @p d between atoms of @p species (−1: any),
  /// ε̄ the mean of the two atoms' strain columns; also counts the bonds.
  double worst_bond_mismatch(const AtomTable &atoms, double d, int species, std::size_t &bonds)
  {
    double worst = 0.0;
    bonds        = 0;
    for_each_pair(
      atoms, 1.3 * d,
      [&](std::size_t i, std::size_t j, const Tensor<1, 3> &delta) {
        Tensor<1, 2> n({delta[0], delta[1]});
        n /= n.norm();
        double stretch = 0.0;
        for (const auto &[name, a, b] : {std::tuple<const char *, int, int>{"strain_xx", 0, 0},
                                         {"strain_yy", 1, 1},
                                         {"strain_xy", 0, 1}})
          {
            const double e = 0.5 * (column(atoms, i, name) + column(atoms, j, name));
            stretch += (a == b ? 1.0 : 2.0) * e * n[a] * n[b];
          }
        worst = std::max(worst, std::abs(delta.norm() / d - (1.0 + stretch)));
        ++bonds;
      },
      species);
    return worst;
  }

  /// A smooth periodic displacement with strains of order 10⁻³–10⁻² on an Lx × Ly cell.
  test_support::StateFunction ripple(double Lx, double Ly, double in_plane, double out_of_plane)
  {
    return [=](const Point<2> &x) {
      const double kx = 2 * pi / Lx, ky = 2 * pi / Ly;
      return std::array<double, 3>{in_plane * std::sin(kx * x[0]) * std::cos(ky * x[1]),
                                   0.5 * in_plane * std::sin(ky * x[1] + 0.3),
                                   out_of_plane * std::sin(kx * x[0]) * std::sin(ky * x[1])};
    };
  }
} // namespace

TEST(StrainedLatticeExport, UnstrainedCellHasEveryAtomOnceWithThreeNeighboursAtTheBondLength)
{
  for (const std::string name : {"graphene", "hBN", "MoS2"})
    {
      const SheetMaterial m = material(name);
      const SheetSystem   system(model_of(m), commensurate_rectangle(m, 10, 6), MPI_COMM_WORLD);
      const Vector        state = test_support::interpolated_state(system, [](const Point<2> &) {
        return std::array<double, 3>{0.0, 0.0, 0.0};
      });
      LatticeExportSettings settings;
      LatticeExportReport   report;
      const AtomTable       atoms = strained_lattice_atoms(system, state, 1.0, settings, report);
      // 10 × 12 primitive cells (the rectangle holds nx · 2ny of them), times the basis.
      EXPECT_EQ(report.n_atoms, 120u * m.lattice.basis().size()) << name;
      EXPECT_EQ(report.supercell.n_primitive_cells(), 120);
      EXPECT_LT(report.supercell.largest_residual_strain(), 1e-12);
      EXPECT_EQ(report.n_off_sheet, 0u);
      export_strained_lattice(system, state, 1.0, settings, output_base(name + "_cell"));
      if (!is_root())
        continue;
      ASSERT_EQ(atoms.size(), report.n_atoms);
      // No two atoms closer than 0.9 bond lengths in 3D (a duplicate across a cell edge would be at 0), and every
      // atom of sublattice A has 3 neighbours of sublattice B at the in-plane distance d = a/√3 (6 for MoS2: two
      // chalcogens above each other).
      const double              d = m.lattice.bond_length(), h = m.lattice.chalcogen_height;
      std::vector<unsigned int> neighbours(atoms.size(), 0);
      double                    closest = 1e300;
      for_each_pair(atoms, 1.1 * std::sqrt(d * d + h * h), [&](std::size_t i, std::size_t j, const Tensor<1, 3> &delta) {
        closest = std::min(closest, delta.norm());
        if (atoms.species[i] != atoms.species[j] && std::abs(std::hypot(delta[0], delta[1]) - d) < 1e-6 * d)
          ++neighbours[atoms.species[i] == 0 ? i : j];
      });
      EXPECT_GT(closest, 0.9 * d) << name;
      for (std::size_t i = 0; i < atoms.size(); ++i)
        {
          if (atoms.species[i] == 0)
            {
              EXPECT_EQ(neighbours[i], name == "MoS2" ? 6u : 3u) << name << " atom " << i;
            }
        }
    }
}

TEST(StrainedLatticeExport, BondLengthsFollowTheLocalStrain)
{
  for (const std::string name : {"graphene", "MoS2"})
    {
      const SheetMaterial m      = material(name);
      SheetModel          model  = model_of(m);
      model.loads.mean_strain[0][0] = 0.003; // stretches the cell vectors too
      const SheetDomain domain = commensurate_rectangle(m, 12, 7);
      const SheetSystem system(model, domain, MPI_COMM_WORLD);
      const Vector      state = test_support::interpolated_state(system, ripple(domain.length_x, domain.length_y,
                                                                                 0.004 * domain.length_x / (2 * pi),
                                                                                 0.06 * domain.length_x / (2 * pi)));
      LatticeExportSettings settings;
      LatticeExportReport   report;
      const AtomTable       atoms = strained_lattice_atoms(system, state, 1.0, settings, report);
      export_strained_lattice(system, state, 1.0, settings, output_base(name + "_rippled"));
      if (!is_root())
        continue;
      double largest_strain = 0.0;
      for (std::size_t i = 0; i < atoms.size(); ++i)
        largest_strain = std::max({largest_strain, std::abs(column(atoms, i, "strain_xx")),
                                   std::abs(column(atoms, i, "strain_yy"))});
      EXPECT_GT(largest_strain, 2e-3); // the check is not vacuous
      EXPECT_LT(largest_strain, 2e-2);
      // Graphene: C–C bonds (d = a/√3). MoS2: Mo–Mo second neighbours in the metal plane (a).
      std::size_t  bonds = 0;
      const double worst = name == "graphene" ? worst_bond_mismatch(atoms, m.lattice.bond_length(), -1, bonds)
                                              : worst_bond_mismatch(atoms, m.lattice.lattice_constant, 0, bonds);
      EXPECT_EQ(bonds, name == "graphene" ? 3 * atoms.size() / 2 : 3 * atoms.size() / 3);
      EXPECT_LT(worst, 1e-3) << name;
      EXPECT_NEAR(atoms.cell[0][0], 1.003 * domain.length_x, 1e-12 * domain.length_x);
      std::cout << "  " << name << " rippled cell: " << atoms.size() << " atoms, " << bonds
                << " bonds, largest |strain| " << largest_strain << ", worst |l/d - (1 + n.e.n)| " << worst << "\n";
    }
}

TEST(StrainedLatticeExport, FlakeKeepsOnlyAtomsOnTheSheet)
{
  const SheetMaterial m = material("graphene");
  SheetDomain         domain;
  domain.shape              = SheetDomain::Shape::rectangle;
  domain.length_x           = 5 * nm;
  domain.length_y           = 5 * nm;
  domain.global_refinements = 3;
  const SheetSystem system(model_of(m), domain, MPI_COMM_WORLD);
  const Vector      state = test_support::interpolated_state(system, [](const Point<2> &) {
    return std::array<double, 3>{0.0, 0.0, 0.0};
  });
  LatticeExportSettings settings;
  settings.region = LatticeExportSettings::Region::polygon;
  // A box hanging 1 nm over the sheet's right edge: the atoms over the edge are left out.
  settings.polygon = {Point<2>(2 * nm, 1 * nm), Point<2>(6 * nm, 1 * nm), Point<2>(6 * nm, 4 * nm), Point<2>(2 * nm, 4 * nm)};
  LatticeExportReport report;
  const AtomTable     atoms = strained_lattice_atoms(system, state, 1.0, settings, report);
  const auto          all   = region_sites(m.lattice, settings.polygon, MPI_COMM_SELF);
  std::size_t         on_sheet = 0;
  for (const auto &p : all.positions)
    on_sheet += p[0] <= 5 * nm + 1e-6 * m.lattice.lattice_constant;
  EXPECT_EQ(report.n_atoms, on_sheet);
  EXPECT_EQ(report.n_atoms + report.n_off_sheet, all.size());
  EXPECT_FALSE(report.periodic);
  export_strained_lattice(system, state, 1.0, settings, output_base("graphene_flake"));
}

TEST(StrainedLatticeExport, RefusesAnIncommensurateCellNamingTheEntryAndACommensurateSize)
{
  const SheetMaterial m      = material("MoS2");
  SheetDomain         domain = commensurate_rectangle(m, 10, 6);
  domain.length_x *= 1.04; // 4 % off: the nearest supercell would carry a residual strain of about 1.5 %
  const SheetSystem system(model_of(m), domain, MPI_COMM_WORLD);
  const Vector      state = system.make_ghosted_vector();
  LatticeExportSettings settings;
  std::string           message;
  try
    {
      LatticeExportReport report;
      strained_lattice_atoms(system, state, 1.0, settings, report);
    }
  catch (const std::exception &e)
    {
      message = e.what();
    }
  EXPECT_NE(message.find("Largest residual strain"), std::string::npos) << message;
  EXPECT_NE(message.find("commensurate"), std::string::npos) << message;
}
