// Linear Kirchhoff plates against the classical tables of Timoshenko & Woinowsky-Krieger,
// Theory of Plates and Shells, 2nd ed., McGraw-Hill 1959 (cited as T&WK below).
#include <nappe/physics/sheet_material.h>

#include "common/sheet_solve.h"

#include <cmath>

using namespace nappe;

namespace
{
  // A steel-like plate in consistent SI; only D enters the linear answers.
  const SheetMaterial plate = SheetMaterial::from_plate(200e9, 0.01, 0.3);

  SheetModel linear_plate(DeflectionCondition edge, std::vector<dealii::types::boundary_id> ids)
  {
    SheetModel model;
    model.material               = plate;
    model.geometric_nonlinearity = false;
    for (const auto id : ids)
      model.edges[id] = {edge, InPlaneCondition::fixed};
    return model;
  }

  SheetDomain unit_square(unsigned int refinements)
  {
    SheetDomain d;
    d.length_x = d.length_y = 1.0;
    d.global_refinements = refinements;
    return d;
  }

  SheetDomain disk(unsigned int refinements)
  {
    SheetDomain d;
    d.shape              = SheetDomain::Shape::disk;
    d.radius             = 1.0;
    d.global_refinements = refinements;
    return d;
  }
} // namespace

// T&WK §15, eq. (62): clamped circular plate under uniform load, w0 = q a⁴ / (64 D).
TEST(LinearPlate, ClampedCircularPlateUnderPressureMatchesClosedForm)
{
  SheetModel model     = linear_plate(DeflectionCondition::clamped, {0});
  model.loads.pressure = 1e3;
  const auto solved    = test_support::solve_sheet(model, disk(4));
  const double w0      = solved.system->deflection_at(solved.state, dealii::Point<2>(0, 0));
  const double exact   = model.loads.pressure / (64.0 * plate.bending_rigidity);
  EXPECT_NEAR(w0 / exact, 1.0, 0.01);
}

// T&WK §30, Table 8 (Navier solution, ν = 0.3): simply supported square plate under uniform
// load, w_max = 0.00406 q a⁴ / D at the centre.
TEST(LinearPlate, SimplySupportedSquarePlateMatchesNavierTable)
{
  SheetModel model     = linear_plate(DeflectionCondition::simply_supported, {0, 1, 2, 3});
  model.loads.pressure = 1e3;
  const auto solved    = test_support::solve_sheet(model, unit_square(5));
  const double w0      = solved.system->deflection_at(solved.state, dealii::Point<2>(0.5, 0.5));
  EXPECT_NEAR(w0 / (0.00406 * model.loads.pressure / plate.bending_rigidity), 1.0, 0.01);
}

// T&WK §44, Table 35: clamped square plate under uniform load, w_max = 0.00126 q a⁴ / D.
TEST(LinearPlate, ClampedSquarePlateMatchesTable)
{
  SheetModel model     = linear_plate(DeflectionCondition::clamped, {0, 1, 2, 3});
  model.loads.pressure = 1e3;
  const auto solved    = test_support::solve_sheet(model, unit_square(5));
  const double w0      = solved.system->deflection_at(solved.state, dealii::Point<2>(0.5, 0.5));
  EXPECT_NEAR(w0 / (0.00126 * model.loads.pressure / plate.bending_rigidity), 1.0, 0.01);
}

// T&WK §19, eq. (92): clamped circular plate under a central point load P, w0 = P a² / (16 π D).
TEST(LinearPlate, ClampedCircularPlateUnderPointLoadMatchesClosedForm)
{
  SheetModel model = linear_plate(DeflectionCondition::clamped, {0});
  model.loads.point_loads.push_back({dealii::Point<2>(0, 0), 1e3});
  const auto   solved = test_support::solve_sheet(model, disk(5));
  const double w0     = solved.system->deflection_at(solved.state, dealii::Point<2>(0, 0));
  EXPECT_NEAR(w0 / (1e3 / (16.0 * M_PI * plate.bending_rigidity)), 1.0, 0.01);
}
