// Large deflection of a clamped circular plate with an immovable edge (w = ∂w/∂n = 0, u = 0 at r = a) under
// uniform pressure q, in the nonlinear Föppl–von Kármán theory, ν = 0.3, for the load parameter
// P = q a⁴/(E h⁴) ∈ {1, 10, 30, 60}: from the nearly linear plate to the membrane-dominated regime.
//
// References:
//  - nappe::reference::solve_clamped_plate (tests/reference/axisymmetric_fvk.h): the axisymmetric FvK equations
//    solved by shooting to ~1e-10, independent of the library; the finite-element centre deflection must agree
//    within 1 %.
//  - S. Timoshenko & S. Woinowsky-Krieger, Theory of Plates and Shells, 2nd ed., McGraw-Hill 1959, §97, eq. (232)
//    (energy method with an assumed deflection shape, after S. Way, Trans. ASME 56, 627, 1934):
//      w0/h + 0.488 (w0/h)³ = q a⁴/(64 D h).
//    An approximation; the exact solution deviates from it by 0.16 % at P = 1, 3.1 % at P = 10 and 6.45 % at
//    P = 60 (tests/unit/axisymmetric_reference_test.cc). The check against it uses the deviation observed here.
#include <deal.II/base/mpi.h>

#include <nappe/physics/sheet_material.h>

#include "common/sheet_solve.h"
#include "reference/axisymmetric_fvk.h"

#include <cmath>
#include <iomanip>
#include <iostream>

using namespace nappe;

namespace
{
  constexpr double a = 1.0, h = 0.01, E = 200e9, nu = 0.3; // [m], [m], [Pa], [-]

  struct Result
  {
    double fe;         ///< finite-element centre deflection [m]
    double exact;      ///< axisymmetric shooting solution [m]
    double timoshenko; ///< T&W approximate formula [m]
  };

  Result solve(const double P, const unsigned int refinements, const unsigned int load_steps)
  {
    SheetModel model;
    model.material       = SheetMaterial::from_plate(E, h, nu);
    model.edges[0]       = {DeflectionCondition::clamped, InPlaneCondition::fixed};
    model.loads.pressure = P * E * std::pow(h, 4) / std::pow(a, 4);

    SheetDomain domain;
    domain.shape              = SheetDomain::Shape::disk;
    domain.radius             = a;
    domain.global_refinements = refinements;

    const auto solved = test_support::solve_sheet(model, domain, load_steps);
    const double D    = model.material.bending_rigidity;
    Result r;
    r.fe    = solved.system->deflection_at(solved.state, dealii::Point<2>(0, 0));
    r.exact = reference::solve_clamped_plate({a, model.material.youngs_modulus_2d, nu, D}, model.loads.pressure)
                .centre_deflection;
    r.timoshenko = reference::timoshenko_clamped_plate_centre_deflection(a, h, D, model.loads.pressure);
    if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
      std::cout << std::fixed << std::setprecision(4) << "P = " << P << ": w0/h FE " << r.fe / h << ", exact "
                << r.exact / h << " (FE/exact − 1 = " << 100.0 * (r.fe / r.exact - 1.0) << " %), T&W "
                << r.timoshenko / h << " (T&W/FE − 1 = " << 100.0 * (r.timoshenko / r.fe - 1.0) << " %)\n";
    return r;
  }
} // namespace

TEST(LargeDeflectionPlate, ClampedImmovableCircularPlateMatchesAxisymmetricFvKWithinOnePercent)
{
  // Deviation T&W/exact − 1 of the approximate formula from the shooting solution at each P, as computed with
  // nappe::reference (0.16 %, 3.1 %, 5.2 %, 6.45 %; see tests/unit/axisymmetric_reference_test.cc). The FE value
  // must reproduce it to within the FE tolerance of 1 %.
  // Observed at 4 refinements of the 12-cell disk (Q2): FE/exact − 1 = −0.13 %, −0.07 %, −0.06 %, −0.06 % and
  // T&W/FE − 1 = 0.29 %, 3.14 %, 5.28 %, 6.52 % at P = 1, 10, 30, 60 (at 3 refinements: −0.52 % … −0.23 %; the
  // error is mostly the polygonal boundary of the Q1 mapping and falls as h²).
  const std::vector<std::pair<double, double>> loads_and_tw_deviation = {
    {1.0, 0.0016}, {10.0, 0.031}, {30.0, 0.052}, {60.0, 0.0645}};
  for (const auto &[P, tw_deviation] : loads_and_tw_deviation)
    {
      const Result r = solve(P, 4, P > 10.0 ? 2 : 1);
      EXPECT_NEAR(r.fe / r.exact, 1.0, 0.01) << "P = " << P;
      EXPECT_NEAR(r.timoshenko / r.exact - 1.0, tw_deviation, 0.001) << "P = " << P; // the reference itself
      EXPECT_NEAR(r.timoshenko / r.fe - 1.0, tw_deviation, 0.01) << "P = " << P;
    }
}
