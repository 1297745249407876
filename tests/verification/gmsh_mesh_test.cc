// Sheets on Gmsh meshes (meshes/*.msh, read through SheetDomain::Shape::mesh_file): a classical
// plate solution on the unstructured drum, the exact homogeneous state of the periodic square and
// rhombic cells, and clear errors for a missing or unusable file.
#include <deal.II/base/function.h>
#include <deal.II/base/mpi.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/physics/fvk_kinematics.h>
#include <nappe/physics/sheet_material.h>

#include "common/sheet_solve.h"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <string>

using namespace nappe;

namespace
{
  /// The shipped meshes, found relative to this source file (no CMake variable needed).
  std::string mesh(const std::string &name)
  {
    return (std::filesystem::path(__FILE__).parent_path() / ".." / ".." / "meshes" / name).lexically_normal().string();
  }

  SheetDomain mesh_domain(const std::string &name, double scale, unsigned int refinements, bool periodic)
  {
    SheetDomain d;
    d.shape              = SheetDomain::Shape::mesh_file;
    d.mesh_file          = mesh(name);
    d.mesh_scale         = scale;
    d.global_refinements = refinements;
    d.periodic           = periodic;
    return d;
  }

  /// ½ ε:C:ε per area, plane stress (Timoshenko & Goodier, Theory of Elasticity, 2nd ed. 1951, §8).
  double plane_stress_energy_density(const SymTensor &e, const SheetMaterial &m)
  {
    const double nu = m.poisson_ratio, trace = e[0][0] + e[1][1];
    return 0.5 * m.youngs_modulus_2d / (1.0 - nu * nu) *
           ((1.0 - nu) * (e[0][0] * e[0][0] + e[1][1] * e[1][1] + 2.0 * e[0][1] * e[0][1]) + nu * trace * trace);
  }

  /// A small in-plane field ũ periodic on the cell spanned by a1, a2 (w = 0).
  class PeriodicPerturbation : public dealii::Function<2>
  {
  public:
    PeriodicPerturbation(const SheetDomain &d, double amplitude) : dealii::Function<2>(3), amplitude_(amplitude)
    {
      const auto [a1, a2] = d.lattice_vectors();
      const double det    = a1[0] * a2[1] - a1[1] * a2[0];
      b1_[0] = a2[1] / det, b1_[1] = -a2[0] / det;
      b2_[0] = -a1[1] / det, b2_[1] = a1[0] / det;
    }
    double value(const dealii::Point<2> &p, const unsigned int c) const override
    {
      if (c == 2)
        return 0.0;
      const double s = 2.0 * M_PI * (b1_ * p), t = 2.0 * M_PI * (b2_ * p);
      return amplitude_ * (std::sin(s + 0.3 + c) * std::cos(t - 0.2 * c) + 0.4 * std::cos(s - 2.0 * t + c));
    }

  private:
    double               amplitude_;
    dealii::Tensor<1, 2> b1_, b2_;
  };

  SymTensor strain(double xx, double yy, double xy)
  {
    SymTensor s;
    s[0][0] = xx, s[1][1] = yy, s[0][1] = xy;
    return s;
  }

  /// Under mean strain E a periodic cell stays in the homogeneous state ũ = 0, w = 0 with the
  /// stretching energy ½E:C:E·area; Newton starts from a small periodic perturbation.
  void check_homogeneous_state(const SheetDomain &domain, double exact_area)
  {
    SheetModel model;
    model.material          = SheetMaterial::from_plate(70e9, 1e-3, 0.33);
    model.loads.mean_strain = strain(1.5e-3, 2e-3, 7e-4);
    SheetSystem system(model, domain, MPI_COMM_WORLD);
    EXPECT_NEAR(domain.area() / exact_area, 1.0, 1e-12);

    const double L     = std::sqrt(exact_area);
    Vector       state = system.make_owned_vector();
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), PeriodicPerturbation(domain, 1e-6 * L),
                                     state);
    system.constraints().distribute(state);
    EnergyMinimizer minimizer(system, MinimizerSettings(), std::getenv("NAPPE_TEST_LOG") ? &std::cout : nullptr,
                              test_support::test_solvers(system));
    const double    force_scale = model.material.youngs_modulus_2d * model.loads.mean_strain.norm() * L;
    const MinimizerReport report = minimizer.minimize(state, 1.0, force_scale);
    ASSERT_TRUE(report.converged) << report.message;
    EXPECT_EQ(report.negative_pivots, 0u);
    EXPECT_LE(state.linfty_norm(), 1e-12 * model.loads.mean_strain.norm() * L);

    Vector ghosted = system.make_ghosted_vector();
    ghosted        = state;
    const EnergyParts e     = system.energy(ghosted, 1.0);
    const double      exact = plane_stress_energy_density(model.loads.mean_strain, model.material) * exact_area;
    if (std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
      std::cout << "    " << domain.mesh_file << ": " << system.n_dofs() << " dofs, stretching rel. error "
                << (e.stretching - exact) / exact << "\n";
    EXPECT_NEAR(e.stretching / exact, 1.0, 1e-10);
    EXPECT_LE(std::abs(e.bending), 1e-12 * exact);
  }
} // namespace

// Timoshenko & Woinowsky-Krieger, Theory of Plates and Shells, 2nd ed. 1959, §15, eq. (62):
// clamped circular plate of radius a under uniform load q, centre deflection w0 = q a⁴ / (64 D).
TEST(GmshMesh, ClampedDrumUnderPressureMatchesClosedForm)
{
  const SheetMaterial plate = SheetMaterial::from_plate(200e9, 0.01, 0.3);
  SheetModel          model;
  model.material               = plate;
  model.geometric_nonlinearity = false;
  model.edges[0]               = {DeflectionCondition::clamped, InPlaneCondition::fixed};
  model.loads.pressure         = 1e3;
  const SheetDomain drum       = mesh_domain("drum.msh", 1.0, 0, false);
  EXPECT_NEAR(drum.center().norm(), 0.0, 1e-3);
  EXPECT_NEAR(drum.area() / M_PI, 1.0, 5e-3); // inscribed polygon

  const auto   solved = test_support::solve_sheet(model, drum);
  const double w0     = solved.system->deflection_at(solved.state, dealii::Point<2>(0, 0));
  const double exact  = model.loads.pressure / (64.0 * plate.bending_rigidity);
  if (std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
    std::cout << "    drum: " << solved.system->n_dofs() << " dofs, w0/exact − 1 = " << w0 / exact - 1.0 << "\n";
  EXPECT_NEAR(w0 / exact, 1.0, 0.01);
}

TEST(GmshMesh, PeriodicSquareCellUnderMeanStrainIsHomogeneous)
{
  // Mesh units scaled by 2: the cell is [0, 2]² m.
  const SheetDomain d = mesh_domain("square_cell.msh", 2.0, 1, true);
  const auto [a1, a2] = d.lattice_vectors();
  EXPECT_NEAR(a1[0], 2.0, 1e-12);
  EXPECT_NEAR(a1[1], 0.0, 1e-12);
  EXPECT_NEAR(a2[0], 0.0, 1e-12);
  EXPECT_NEAR(a2[1], 2.0, 1e-12);
  check_homogeneous_state(d, 4.0);
}

TEST(GmshMesh, PeriodicRhombicCellUnderMeanStrainIsHomogeneous)
{
  const SheetDomain d = mesh_domain("rhombic_cell.msh", 1.0, 1, true);
  const auto [a1, a2] = d.lattice_vectors();
  EXPECT_NEAR(a1[0], 1.0, 1e-12);
  EXPECT_NEAR(a1[1], 0.0, 1e-12);
  EXPECT_NEAR(a2[0], 0.5, 1e-12);
  EXPECT_NEAR(a2[1], 0.5 * std::sqrt(3.0), 1e-12);
  check_homogeneous_state(d, 0.5 * std::sqrt(3.0));
}

TEST(GmshMesh, TrenchFlakeHasTheRectangleBoundaryIds)
{
  const SheetDomain d = mesh_domain("trench_flake.msh", 1.0, 0, false);
  EXPECT_EQ(d.boundary_ids(), (std::vector<dealii::types::boundary_id>{0, 1, 2, 3}));
  EXPECT_NEAR(d.area(), 8.0, 1e-12);
  const auto [lower, upper] = d.bounding_box();
  EXPECT_NEAR(upper[0] - lower[0], 4.0, 1e-12);
  EXPECT_NEAR(upper[1] - lower[1], 2.0, 1e-12);
}

TEST(GmshMesh, MissingMeshFileGivesAnErrorNamingTheFile)
{
  SheetModel  model;
  SheetDomain d = mesh_domain("no_such_mesh.msh", 1.0, 0, false);
  try
    {
      SheetSystem system(model, d, MPI_COMM_WORLD);
      FAIL() << "no exception for a missing mesh file";
    }
  catch (const std::exception &e)
    {
      EXPECT_NE(std::string(e.what()).find("no_such_mesh.msh"), std::string::npos) << e.what();
    }
}

TEST(GmshMesh, TriangleMeshFileIsRejectedWithItsName)
{
  // One triangle, Gmsh format 2.2; written by rank 0 and read by all.
  const std::string file = "gmsh_mesh_test_triangle.msh";
  if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
    std::ofstream(file) << "$MeshFormat\n2.2 0 8\n$EndMeshFormat\n$Nodes\n3\n1 0 0 0\n2 1 0 0\n3 0 1 0\n$EndNodes\n"
                           "$Elements\n1\n1 2 2 1 1 1 2 3\n$EndElements\n";
  MPI_Barrier(MPI_COMM_WORLD);
  SheetModel  model;
  SheetDomain d;
  d.shape     = SheetDomain::Shape::mesh_file;
  d.mesh_file = file;
  try
    {
      SheetSystem system(model, d, MPI_COMM_WORLD);
      FAIL() << "no exception for a triangle mesh";
    }
  catch (const std::exception &e)
    {
      EXPECT_NE(std::string(e.what()).find(file), std::string::npos) << e.what();
      EXPECT_NE(std::string(e.what()).find("quadrilateral"), std::string::npos) << e.what();
    }
  MPI_Barrier(MPI_COMM_WORLD);
  if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
    std::filesystem::remove(file);
}

// The C0IP edge terms need the two sides of every periodic edge to be parametrised in the same
// direction (SheetSystem checks this at setup); the shipped cells satisfy it edge by edge.
TEST(GmshMesh, PeriodicEdgesOfShippedCellsRunInTheSameDirection)
{
  for (const std::string name : {"square_cell.msh", "rhombic_cell.msh"})
    {
      const SheetDomain d = mesh_domain(name, 1.0, 0, true);
      SheetModel        model;
      SheetSystem       system(model, d, MPI_COMM_WORLD);
      const auto [a1, a2] = d.lattice_vectors();
      unsigned int n_periodic = 0, n_reversed = 0;
      for (const auto &cell : system.dof_handler().active_cell_iterators())
        if (cell->is_locally_owned())
          for (const unsigned int f : cell->face_indices())
            if (cell->has_periodic_neighbor(f))
              {
                const auto         id       = cell->face(f)->boundary_id();
                const auto         offset   = id == 0 ? a1 : id == 1 ? -a1 : id == 2 ? a2 : -a2;
                const auto         neighbor = cell->periodic_neighbor(f);
                const unsigned int nf       = cell->periodic_neighbor_face_no(f);
                const dealii::Point<2> start_here  = cell->vertex(dealii::GeometryInfo<2>::face_to_cell_vertices(f, 0));
                const dealii::Point<2> start_there = neighbor->vertex(dealii::GeometryInfo<2>::face_to_cell_vertices(nf, 0));
                ++n_periodic;
                n_reversed += (start_there - start_here - offset).norm() > 1e-9;
              }
      if (std::getenv("NAPPE_TEST_LOG"))
        std::cout << "    " << name << ": " << n_periodic << " periodic faces, " << n_reversed << " reversed\n";
      EXPECT_GT(n_periodic, 0u);
      EXPECT_EQ(n_reversed, 0u);
    }
}
