#pragma once

// Test helper: periodic cells of MoS2 (catalogue) on SiO2 topographies, scenarios of our own shared
// by the adaptive-mesh suites. Γ = 0.22 J/m², h₀ = 0.5 nm, one load step, 4 × 4 coarse cells.
#include <nappe/geometry/lattice_array.h>
#include <nappe/geometry/radial_features.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/material_catalogue.h>
#include <nappe/physics/vdw_93_law.h>
#include <nappe/solvers/sheet_problem.h>

#include <cmath>
#include <memory>

namespace nappe::test_support
{
  /// MoS2 on @p topography in a square periodic cell of side @p cell [m].
  inline SheetProblem mos2_periodic_cell(std::shared_ptr<const Topography> topography, double cell)
  {
    const MaterialCatalogue catalogue;
    SheetProblem            p;
    p.model.material        = catalogue.material("MoS2");
    p.domain.length_x       = p.domain.length_y = cell;
    p.domain.coarse_cells_x = p.domain.coarse_cells_y = 4;
    p.domain.periodic                                 = true;
    p.model.substrate = std::make_shared<AdhesionPotential>(topography, std::make_shared<Vdw93Law>(0.22, 0.5e-9),
                                                            GapMeasure::normal);
    p.stepping.load_steps = 1;
    return p;
  }

  /// MoS2 laid on a square array of rounded SiO2 pillars: height 5 nm, radius 12 nm, edge and foot
  /// radii 2 nm, sidewalls at 70°, pitch 60 nm (one pillar per cell).
  inline SheetProblem mos2_on_pillar_array()
  {
    const double nm = 1e-9, pitch = 60 * nm;
    auto         pillar = std::make_shared<Pillar>(5 * nm, 12 * nm, 2 * nm, 2 * nm, 70.0 * M_PI / 180.0);
    SheetProblem p      = mos2_periodic_cell(LatticeArray::square(pillar, pitch), pitch);
    p.start             = StartProtocol::laid_down;
    return p;
  }
} // namespace nappe::test_support
