#pragma once

/**
 * @file Physical constants in SI (CODATA 2018; e and h are exact by the 2019 SI definition,
 * ħ = h/2π). Tiesinga, Mohr, Newell & Taylor, "CODATA recommended values of the fundamental
 * physical constants: 2018", Rev. Mod. Phys. 93, 025010 (2021) (from memory; the exact values of
 * e and h are those fixed by the SI and also used for nappe::units::electronvolt).
 */
namespace nappe::constants
{
  /// Elementary charge e [C] (exact).
  constexpr double elementary_charge = 1.602176634e-19;
  /// Planck constant h [J s] (exact).
  constexpr double planck = 6.62607015e-34;
  /// Reduced Planck constant ħ = h/2π [J s].
  constexpr double reduced_planck = planck / (2.0 * 3.14159265358979323846);
  /// Magnetic flux quantum scale ħ/e [Wb = T m²]: the unit of the strain gauge field times a length.
  constexpr double hbar_over_e = reduced_planck / elementary_charge;
} // namespace nappe::constants
