#pragma once

// The clamped graphene drum of the Newton-step benchmarks (Q2, 100 kPa): a demo scenario.
#include <nappe/geometry/sheet_domain.h>
#include <nappe/physics/sheet_model.h>

namespace nappe::bench
{
  inline SheetModel drum_model()
  {
    SheetModel model;
    model.material.youngs_modulus_2d = 340.0;
    model.material.poisson_ratio     = 0.165;
    model.material.bending_rigidity  = 2.2e-19;
    model.edges[0]                   = {DeflectionCondition::clamped, InPlaneCondition::fixed};
    model.loads.pressure             = 1e5;
    return model;
  }

  /// A disk of radius 500 nm, @p refinements times refined.
  inline SheetDomain drum(unsigned int refinements)
  {
    SheetDomain d;
    d.shape              = SheetDomain::Shape::disk;
    d.radius             = 500e-9;
    d.global_refinements = refinements;
    return d;
  }
} // namespace nappe::bench
