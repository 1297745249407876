#pragma once

#include <nappe/physics/monolayer_crystal.h>

#include <string>

namespace nappe
{
  /**
   * Elastic constants of a thin isotropic sheet, in SI.
   *
   * A monolayer is described by its 2D constants directly (Y in N/m, D in J), not by a bulk
   * modulus and a thickness: for atomically thin crystals D is not E·t³/12(1−ν²) with any
   * sensible t. For a continuum plate of thickness t use from_plate(). A monolayer from the catalogue
   * also carries its lattice and electron–strain coupling constants (monolayer_crystal.h).
   */
  struct SheetMaterial
  {
    std::string name = "sheet";
    /// 2D Young's modulus Y = E·t [N/m].
    double youngs_modulus_2d = 0.0;
    /// Poisson's ratio ν [-].
    double poisson_ratio = 0.0;
    /// Bending rigidity D [J].
    double bending_rigidity = 0.0;
    /// Nominal thickness, used only to report bulk-equivalent stresses [m].
    double nominal_thickness = 0.0;
    /// Strain at which the sheet is expected to fracture; 0 means unknown [-].
    double fracture_strain = 0.0;
    /// Crystal lattice and its orientation θ on the sheet (type none for a continuum plate).
    MonolayerLattice lattice;
    /// Electron–strain coupling constants with their sources (0 = unknown).
    ElectronicCoupling electronic;

    /// Membrane stiffness Y/(1−ν²) [N/m].
    double membrane_stiffness() const
    {
      return youngs_modulus_2d / (1.0 - poisson_ratio * poisson_ratio);
    }

    /// A continuum plate: Y = E·t, D = E·t³/(12(1−ν²)) (Timoshenko & Woinowsky-Krieger 1959, eq. 3).
    static SheetMaterial from_plate(double youngs_modulus, double thickness, double poisson_ratio)
    {
      SheetMaterial m;
      m.name              = "plate";
      m.youngs_modulus_2d = youngs_modulus * thickness;
      m.poisson_ratio     = poisson_ratio;
      m.bending_rigidity =
        youngs_modulus * thickness * thickness * thickness / (12.0 * (1.0 - poisson_ratio * poisson_ratio));
      m.nominal_thickness = thickness;
      return m;
    }
  };
} // namespace nappe
