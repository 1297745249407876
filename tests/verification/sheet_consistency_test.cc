// Consistency of the discrete sheet energy with its derivatives (Taylor tests), symmetry of the
// Hessian, and the exact homogeneous state of a periodic cell under a uniform mean strain.
//
// Taylor test (e.g. Farrell et al., SIAM J. Sci. Comput. 35, C369, 2013, §4 "Taylor remainder
// convergence"): for a smooth energy E with gradient R and Hessian H,
//   |E(U+εV) − E(U) − ε R·V|        = O(ε²),
//   ‖R(U+εV) − R(U) − ε H V‖        = O(ε²),
// whereas an inconsistent derivative leaves an O(ε) remainder. The observed order between
// successive ε is checked to be ≈ 2.
#include <deal.II/base/function.h>
#include <deal.II/fe/mapping_cartesian.h>
#include <deal.II/numerics/vector_tools.h>

#include <nappe/physics/fvk_kinematics.h>
#include <nappe/physics/sheet_material.h>
#include <nappe/physics/surface_potential.h>
#include <nappe/solvers/energy_minimizer.h>
#include <nappe/solvers/sheet_system.h>

#include <common/test_substrates.h>
#include <common/thrown_message.h>

#include <gtest/gtest.h>

#include "common/sheet_solve.h"

#include <array>
#include <cmath>
#include <cstdlib>
#include <functional>
#include <iostream>
#include <memory>
#include <string>
#include <vector>

using namespace nappe;
using test_support::reciprocal_vectors;
using test_support::message_of;
using test_support::SpringToTopography;

namespace
{
  using dealii::Point;
  using dealii::Tensor;

  /// The reciprocal vectors b_i of the cell's lattice vectors a_j (b_i·a_j = δ_ij); a field built
  /// from sin/cos of 2π·k·(b_i·x) with integer k is periodic on the cell.
  /// A smooth (ũ_x, ũ_y, w) field, periodic on the cell, with amplitudes @p u_amp and @p w_amp [m];
  /// @p seed shifts the phases so that different seeds give independent fields. It depends on the
  /// position only, so it is the same on every number of ranks.
  class SmoothField : public dealii::Function<2>
  {
  public:
    SmoothField(const SheetDomain &domain, double u_amp, double w_amp, double seed)
      : dealii::Function<2>(3), u_amp_(u_amp), w_amp_(w_amp), seed_(seed)
    {
      std::tie(b1_, b2_) = reciprocal_vectors(domain);
    }
    double value(const Point<2> &p, const unsigned int c) const override
    {
      const double s = 2.0 * M_PI * (b1_ * p), t = 2.0 * M_PI * (b2_ * p);
      const double phi = seed_ + 1.3 * c;
      const double f   = std::sin(s + phi) * std::cos(t + 0.7 * phi) + 0.5 * std::cos(2.0 * s - t + 1.9 * phi) +
                       0.3 * std::sin(s + 2.0 * t + 0.4 * phi) + 0.2 * std::cos(phi);
      return (c == 2 ? w_amp_ : u_amp_) * f;
    }

  private:
    double       u_amp_, w_amp_, seed_;
    Tensor<1, 2> b1_, b2_;
  };

  /// A unit-size sheet with balanced stretching and bending for O(1)-scaled Taylor tests.
  SheetMaterial test_material()
  {
    SheetMaterial m;
    m.youngs_modulus_2d = 1.0;
    m.poisson_ratio     = 0.3;
    m.bending_rigidity  = 1e-3;
    return m;
  }

  SheetDomain rectangle(bool periodic)
  {
    SheetDomain d;
    d.length_x           = 1.0;
    d.length_y           = 0.8;
    d.coarse_cells_x     = 2;
    d.coarse_cells_y     = 1;
    d.global_refinements = 2;
    d.periodic           = periodic;
    return d;
  }

  SheetDomain rhombus(unsigned int refinements)
  {
    SheetDomain d;
    d.shape              = SheetDomain::Shape::rhombus;
    d.length_x           = 1.0;
    d.global_refinements = refinements;
    d.periodic           = true;
    return d;
  }

  /// An owned vector with the field interpolated and the (homogeneous) constraints applied.
  Vector feasible_field(const SheetSystem &system, const SmoothField &f)
  {
    Vector v = system.make_owned_vector();
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), f, v);
    system.constraints().distribute(v);
    return v;
  }

  Vector ghosted(const SheetSystem &system, const Vector &owned)
  {
    Vector g = system.make_ghosted_vector();
    g        = owned;
    return g;
  }

  struct TaylorResult
  {
    std::vector<double> eps, energy_remainder, residual_remainder;
  };

  /// The Taylor remainders of energy and residual at U along V for ε = 10⁻²…10⁻⁵ (U, V of similar size).
  TaylorResult taylor_remainders(SheetSystem &system, const Vector &U, const Vector &V)
  {
    const auto  &constraints = system.constraints();
    Vector       R0 = system.make_owned_vector(), R = system.make_owned_vector();
    SparseMatrix &H = system.hessian_matrix();
    const double E0 = system.assemble(ghosted(system, U), 1.0, R0, &H).total();
    // H acts on the unconstrained entries only: its constrained rows and columns are a diagonal
    // placeholder, and the residual has zeros there.
    Vector Vz = V, HV = system.make_owned_vector();
    constraints.set_zero(Vz);
    H.vmult(HV, Vz);
    constraints.set_zero(HV);
    const double RV = R0 * V;

    TaylorResult out;
    for (const double eps : {1e-2, 1e-3, 1e-4, 1e-5})
      {
        Vector Ue = U;
        Ue.add(eps, V);
        const double E = system.assemble(ghosted(system, Ue), 1.0, R, nullptr).total();
        R -= R0;
        R.add(-eps, HV);
        out.eps.push_back(eps);
        out.energy_remainder.push_back(std::abs(E - E0 - eps * RV));
        out.residual_remainder.push_back(R.l2_norm());
      }
    return out;
  }

  void expect_second_order(const std::vector<double> &eps, const std::vector<double> &remainder,
                           const std::string &what)
  {
    for (unsigned int k = 0; k + 1 < eps.size(); ++k)
      {
        const double order = std::log(remainder[k] / remainder[k + 1]) / std::log(eps[k] / eps[k + 1]);
        if (std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
          std::cout << "    " << what << ": eps " << eps[k + 1] << " remainder " << remainder[k + 1] << " order "
                    << order << "\n";
        EXPECT_NEAR(order, 2.0, 0.1) << what << " between eps = " << eps[k] << " and " << eps[k + 1]
                                     << " (remainders " << remainder[k] << ", " << remainder[k + 1] << ")";
      }
  }

  /// Refines the cells whose centre lies left of x = 0.3·L_x, twice (an adapted mesh: hanging nodes,
  /// edges between cells of different levels, on a periodic cell also across the periodic edge x = 0).
  void refine_left_strip(SheetSystem &system, const SheetDomain &domain)
  {
    for (unsigned int pass = 0; pass < 2; ++pass)
      {
        for (const auto &cell : system.mesh().active_cell_iterators())
          if (cell->is_locally_owned() && cell->center()[0] < 0.3 * domain.length_x)
            cell->set_refine_flag();
        Vector state = system.make_owned_vector();
        system.adapt(state);
      }
  }

  /// Taylor tests of energy → residual → Hessian at a nonlinear state, and Hessian symmetry; on an
  /// adapted mesh (refine_left_strip) if @p adapted.
  void check_consistency(const SheetModel &model, const SheetDomain &domain, bool adapted = false)
  {
    SheetSystem  system(model, domain, MPI_COMM_WORLD);
    if (adapted)
      {
        refine_left_strip(system, domain);
        ASSERT_FALSE(system.uniform_mesh());
      }
    const double L = domain.length_x;
    const Vector U = feasible_field(system, SmoothField(domain, 0.01 * L, 0.05 * L, 0.3));
    const Vector V = feasible_field(system, SmoothField(domain, 0.01 * L, 0.05 * L, 2.1));

    const TaylorResult t = taylor_remainders(system, U, V);
    expect_second_order(t.eps, t.energy_remainder, "energy remainder");
    expect_second_order(t.eps, t.residual_remainder, "residual remainder");

    // u·Hv = v·Hu on the full matrix (including the constrained placeholder rows), for fields that
    // ignore the constraints.
    SparseMatrix &H = system.hessian_matrix();
    Vector        R = system.make_owned_vector();
    system.assemble(ghosted(system, U), 1.0, R, &H);
    Vector a = system.make_owned_vector(), b = system.make_owned_vector();
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), SmoothField(domain, 0.3, 1.0, 0.9), a);
    dealii::VectorTools::interpolate(system.mapping(), system.dof_handler(), SmoothField(domain, 1.0, 0.2, 4.4), b);
    Vector Ha = system.make_owned_vector(), Hb = system.make_owned_vector();
    H.vmult(Ha, a);
    H.vmult(Hb, b);
    const double aHb = a * Hb, bHa = b * Ha;
    EXPECT_LE(std::abs(aHb - bHa), 1e-12 * a.l2_norm() * Hb.l2_norm()) << "a·Hb = " << aHb << ", b·Ha = " << bHa;
  }
} // namespace

// Clamped edges (Nitsche slope terms), a fixed and a free in-plane edge, a simply supported and a
// free edge; pressure.
TEST(SheetConsistency, ResidualAndHessianAreDerivativesOnClampedRectangle)
{
  SheetModel model;
  model.material       = test_material();
  model.edges[0]       = {DeflectionCondition::clamped, InPlaneCondition::fixed};
  model.edges[1]       = {DeflectionCondition::clamped, InPlaneCondition::free};
  model.edges[2]       = {DeflectionCondition::simply_supported, InPlaneCondition::fixed};
  model.edges[3]       = {DeflectionCondition::free, InPlaneCondition::free};
  model.loads.pressure = 0.1;
  check_consistency(model, rectangle(false));
}

// Periodic faces (interior-penalty terms across them), nonzero mean strain and eigenstrain.
TEST(SheetConsistency, ResidualAndHessianAreDerivativesOnPeriodicRectangleWithMeanStrain)
{
  SheetModel model;
  model.material = test_material();
  model.loads.mean_strain[0][0] = 0.01;
  model.loads.mean_strain[1][1] = -0.004;
  model.loads.mean_strain[0][1] = 0.003;
  model.loads.eigenstrain[0][0] = 0.002;
  model.loads.eigenstrain[1][1] = 0.005;
  model.loads.eigenstrain[0][1] = -0.001;
  check_consistency(model, rectangle(true));
}

// A nonlinear substrate potential and a point load on a periodic rectangle.
TEST(SheetConsistency, ResidualAndHessianAreDerivativesWithSubstrateAndPointLoad)
{
  const SheetDomain domain = rectangle(true);
  SheetModel        model;
  model.material  = test_material();
  model.substrate = std::make_shared<SpringToTopography>(domain, 0.5, 20.0, 0.03);
  model.loads.point_loads.push_back({Point<2>(0.3, 0.5), 0.02});
  model.loads.point_loads.push_back({domain.center(), -0.01});
  model.loads.eigenstrain[0][0] = model.loads.eigenstrain[1][1] = 0.003;
  check_consistency(model, domain);
}

// An adapted mesh: edges between cells of different levels (sub-edge terms, hanging nodes), on a
// clamped rectangle and on a periodic cell refined along one periodic edge, with a substrate.
TEST(SheetConsistency, ResidualAndHessianAreDerivativesOnAdaptedMeshes)
{
  SheetModel clamped;
  clamped.material       = test_material();
  clamped.edges[0]       = {DeflectionCondition::clamped, InPlaneCondition::fixed};
  clamped.edges[2]       = {DeflectionCondition::clamped, InPlaneCondition::free};
  clamped.loads.pressure = 0.1;
  check_consistency(clamped, rectangle(false), true);

  const SheetDomain periodic = rectangle(true);
  SheetModel        on_substrate;
  on_substrate.material  = test_material();
  on_substrate.substrate = std::make_shared<SpringToTopography>(periodic, 0.5, 20.0, 0.03);
  on_substrate.loads.mean_strain[0][1] = 0.004;
  check_consistency(on_substrate, periodic, true);
}

// The rhombic (hexagonal) unit cell: skewed cells and periodic faces along a2.
TEST(SheetConsistency, ResidualAndHessianAreDerivativesOnRhombicCell)
{
  const SheetDomain domain = rhombus(2);
  SheetModel        model;
  model.material                = test_material();
  model.substrate               = std::make_shared<SpringToTopography>(domain, 0.5, 20.0, 0.03);
  model.loads.mean_strain[0][1] = 0.004;
  model.loads.eigenstrain[0][0] = 0.002;
  check_consistency(model, domain);
}

// Axis-parallel rectangular cells take the Cartesian mapping (the bilinear map is affine there), skewed
// ones the bilinear mapping; the Taylor tests above check the derivatives with each.
TEST(SheetConsistency, RectangularCellsUseTheCartesianMappingAndSkewedCellsTheBilinearOne)
{
  SheetModel model;
  model.material = test_material();
  const SheetSystem rectangular(model, rectangle(true), MPI_COMM_WORLD);
  const SheetSystem skewed(model, rhombus(1), MPI_COMM_WORLD);
  EXPECT_NE(dynamic_cast<const dealii::MappingCartesian<2> *>(&rectangular.mapping()), nullptr);
  EXPECT_EQ(dynamic_cast<const dealii::MappingCartesian<2> *>(&skewed.mapping()), nullptr);
}

// The adhesion factor c of a LoadLevel scales the substrate potential and nothing else (sheet_model.h):
// the substrate energy, its gradient and its Hessian are c times those at c = 1, and the other energies
// are unchanged. Exact up to round-off, since ψ enters linearly.
TEST(SheetConsistency, AdhesionFactorScalesOnlyTheSubstrateTerms)
{
  const SheetDomain domain = rectangle(true);
  SheetModel        model;
  model.material  = test_material();
  model.substrate = std::make_shared<SpringToTopography>(domain, 0.5, 20.0, 0.03);
  SheetSystem       system(model, domain, MPI_COMM_WORLD);
  const Vector U = ghosted(system, feasible_field(system, SmoothField(domain, 0.01, 0.05, 0.3)));
  const double c = 0.37;

  Vector R1 = system.make_owned_vector(), Rc = system.make_owned_vector(), R0 = system.make_owned_vector();
  const EnergyParts e1 = system.assemble(U, LoadLevel(1.0, 1.0), R1, nullptr);
  const EnergyParts ec = system.assemble(U, LoadLevel(1.0, c), Rc, nullptr);
  const EnergyParts e0 = system.assemble(U, LoadLevel(1.0, 0.0), R0, nullptr);
  EXPECT_EQ(e0.substrate, 0.0);
  EXPECT_NEAR(ec.substrate, c * e1.substrate, 1e-13 * std::abs(e1.substrate));
  EXPECT_DOUBLE_EQ(ec.stretching, e1.stretching);
  EXPECT_DOUBLE_EQ(ec.bending, e1.bending);
  // R(c) = R(0) + c·(R(1) − R(0)): the gradient is affine in c.
  Vector expected = R1;
  expected -= R0;
  expected *= c;
  expected += R0;
  Vector difference = Rc;
  difference -= expected;
  EXPECT_LE(difference.l2_norm(), 1e-12 * R1.l2_norm());
}

// On a mesh split between ranks, cells read their neighbours' dofs from a state's ghost entries. A state
// without them — the owned vector, or a returned one moved into a ghosted vector, which takes its layout —
// is refused with a message instead of assembled into a wrong energy; on one rank it is a valid state.
// A state of another mesh is refused on any number of ranks.
TEST(SheetConsistency, AStateWithoutGhostEntriesIsRefusedWhereTheMeshIsSplit)
{
  const SheetDomain domain = rectangle(true);
  SheetModel        model;
  model.material = test_material();
  SheetSystem        system(model, domain, MPI_COMM_WORLD);
  const SmoothField  field(domain, 0.01, 0.05, 0.3);
  const double       energy = system.energy(ghosted(system, feasible_field(system, field)), 1.0).total();
  Vector             moved_in = system.make_ghosted_vector();
  moved_in                    = feasible_field(system, field);
  const std::string  refusal  = message_of([&] { system.energy(moved_in, 1.0); });
  if (dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD) == 1)
    {
      EXPECT_EQ(refusal, "");
      EXPECT_DOUBLE_EQ(system.energy(moved_in, 1.0).total(), energy);
    }
  else
    EXPECT_NE(refusal.find("without ghost entries"), std::string::npos) << refusal;

  SheetDomain coarser        = domain;
  coarser.global_refinements = domain.global_refinements - 1;
  const SheetSystem other(model, coarser, MPI_COMM_WORLD);
  const std::string mismatch = message_of([&] { system.energy(other.make_ghosted_vector(), 1.0); });
  EXPECT_NE(mismatch.find("another mesh"), std::string::npos) << mismatch;
}

// The linear Kirchhoff model has a quadratic energy: the residual is exactly linear, so its Taylor
// remainder is at round-off and the energy remainder is exactly ε²·V·HV/2.
TEST(SheetConsistency, LinearModelHasExactlyLinearResidual)
{
  SheetModel model;
  model.material               = test_material();
  model.geometric_nonlinearity = false;
  model.edges[0]               = {DeflectionCondition::clamped, InPlaneCondition::fixed};
  model.edges[2]               = {DeflectionCondition::clamped, InPlaneCondition::fixed};
  model.loads.pressure         = 0.1;
  const SheetDomain domain     = rectangle(false);
  SheetSystem       system(model, domain, MPI_COMM_WORLD);
  const Vector      U = feasible_field(system, SmoothField(domain, 0.01, 0.05, 0.3));
  const Vector      V = feasible_field(system, SmoothField(domain, 0.01, 0.05, 2.1));
  const TaylorResult t = taylor_remainders(system, U, V);

  Vector R = system.make_owned_vector();
  system.assemble(ghosted(system, U), 1.0, R, &system.hessian_matrix());
  Vector Vz = V, HV = system.make_owned_vector();
  system.constraints().set_zero(Vz);
  system.hessian_matrix().vmult(HV, Vz);
  const double VHV = Vz * HV;
  for (unsigned int k = 0; k < t.eps.size(); ++k)
    {
      const double eps = t.eps[k];
      EXPECT_LE(t.residual_remainder[k], 1e-12 * (R.l2_norm() + eps * HV.l2_norm())) << "eps = " << eps;
      EXPECT_NEAR(t.energy_remainder[k] / (0.5 * eps * eps * VHV), 1.0, 1e-4) << "eps = " << eps;
    }
}

namespace
{
  /// ½ ε:C:ε per area with the plane-stress law N = Y/(1−ν²)[(1−ν)ε + ν tr(ε) I] written out in
  /// components (Timoshenko & Goodier, Theory of Elasticity, 2nd ed. 1951, §8, plane stress).
  double plane_stress_energy_density(const SymTensor &e, const SheetMaterial &m)
  {
    const double nu = m.poisson_ratio, trace = e[0][0] + e[1][1];
    return 0.5 * m.youngs_modulus_2d / (1.0 - nu * nu) *
           ((1.0 - nu) * (e[0][0] * e[0][0] + e[1][1] * e[1][1] + 2.0 * e[0][1] * e[0][1]) + nu * trace * trace);
  }

  /// A periodic cell under mean strain E and eigenstrain ε₀ (flat, no pressure) is in the homogeneous
  /// state ũ = 0, w = 0 with stretching energy ½(E−ε₀):C:(E−ε₀)·area. Newton starts from a
  /// smooth in-plane perturbation; with w = 0 the problem is linear in ũ, so one step is exact.
  /// The perturbation is kept small (strains ≪ E−ε₀) so that the sheet stays in tension everywhere
  /// and the Hessian positive definite.
  void check_homogeneous_state(const SheetDomain &domain, const SymTensor &mean_strain, const SymTensor &eigenstrain,
                               double exact_area)
  {
    SheetModel model;
    model.material          = SheetMaterial::from_plate(70e9, 1e-3, 0.33);
    model.loads.mean_strain = mean_strain;
    model.loads.eigenstrain = eigenstrain;
    SheetSystem system(model, domain, MPI_COMM_WORLD);

    const double L = domain.length_x;
    Vector       state = feasible_field(system, SmoothField(domain, 1e-6 * L, 0.0, 1.7));
    EnergyMinimizer minimizer(system, MinimizerSettings(), std::getenv("NAPPE_TEST_LOG") ? &std::cout : nullptr,
                              test_support::test_solvers(system));
    const double    force_scale = model.material.youngs_modulus_2d * mean_strain.norm() * L;
    const MinimizerReport report = minimizer.minimize(state, 1.0, force_scale);

    ASSERT_TRUE(report.converged) << report.message;
    EXPECT_LE(report.iterations, 2u);
    EXPECT_EQ(report.negative_pivots, 0u);
    // Both ũ and w vanish: the whole state vector is zero to round-off with a direct solve; an
    // iterative one removes the perturbation (amplitude 1e-6 L) to its relative tolerance, with a
    // factor 10 for the conditioning of the error against the residual.
    const SolverSettings used = resolved(test_support::test_solver_settings(), system.n_dofs());
    const double round_off = 1e-12 * (mean_strain - eigenstrain).norm() * L;
    const double iterative = used.linear_solver == "direct LDLT" ? 0.0 : 10 * used.multilevel.relative_tolerance * 1e-6 * L;
    EXPECT_LE(state.linfty_norm(), round_off + iterative);

    const double exact = plane_stress_energy_density(mean_strain - eigenstrain, model.material) * exact_area;
    const EnergyParts e = system.energy(ghosted(system, state), 1.0);
    if (std::getenv("NAPPE_TEST_LOG") && dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
      std::cout << "    homogeneous state: iterations " << report.iterations << ", |state|_inf " << state.linfty_norm()
                << ", stretching rel. error " << (e.stretching - exact) / exact << "\n";
    EXPECT_NEAR(e.stretching / exact, 1.0, 1e-10);
    EXPECT_LE(std::abs(e.bending), 1e-12 * exact);
    EXPECT_NEAR(e.total() / exact, 1.0, 1e-10);
  }

  SymTensor strain(double xx, double yy, double xy)
  {
    SymTensor s;
    s[0][0] = xx;
    s[1][1] = yy;
    s[0][1] = xy;
    return s;
  }
} // namespace

TEST(PeriodicCell, UniformMeanStrainGivesHomogeneousStateOnSquare)
{
  SheetDomain d;
  d.periodic           = true;
  d.global_refinements = 3;
  check_homogeneous_state(d, strain(2e-3, 1e-3, 5e-4), SymTensor(), 1.0);
  check_homogeneous_state(d, strain(2e-3, 1e-3, 5e-4), strain(-1e-3, 5e-4, 2e-4), 1.0);
}

TEST(PeriodicCell, UniformMeanStrainGivesHomogeneousStateOnRectangle)
{
  SheetDomain d;
  d.length_x = 2.0;
  d.length_y = 0.5;
  d.coarse_cells_x = 4;
  d.periodic           = true;
  d.global_refinements = 2;
  check_homogeneous_state(d, strain(1e-3, 3e-3, -8e-4), SymTensor(), 1.0);
  check_homogeneous_state(d, strain(1e-3, 3e-3, -8e-4), strain(-2e-3, -1e-3, 0.0), 1.0);
}

TEST(PeriodicCell, UniformMeanStrainGivesHomogeneousStateOnRhombicCell)
{
  const SheetDomain d = rhombus(3);
  const double      area = 0.5 * std::sqrt(3.0); // a²·√3/2 for a = 1
  check_homogeneous_state(d, strain(1.5e-3, 2e-3, 7e-4), SymTensor(), area);
  check_homogeneous_state(d, strain(1.5e-3, 2e-3, 7e-4), strain(-5e-4, 1e-3, -3e-4), area);
}
