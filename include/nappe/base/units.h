#pragma once

/**
 * @file Unit conversions. nappe computes in SI throughout; these factors convert the units
 * of the trade into SI at the input boundary and back for reports. Multiply a value in the
 * named unit by the factor to get SI; divide an SI value by it to print in that unit.
 */
namespace nappe::units
{
  // Length [m].
  constexpr double meter     = 1.0;
  constexpr double nanometer = 1.0e-9;
  constexpr double angstrom  = 1.0e-10;
  constexpr double micrometer = 1.0e-6;

  // Energy [J]. CODATA 2018: 1 eV = 1.602176634e-19 J exactly.
  constexpr double joule        = 1.0;
  constexpr double electronvolt = 1.602176634e-19;

  // Energy per strain [J per unit strain]: a gap coefficient of 1 meV per % of strain is 0.1 eV per unit strain.
  constexpr double mev_per_percent = 1.0e-3 * electronvolt / 0.01;

  // Energy per area [J/m^2]. 1 meV/Å² = 1e-3 eV / 1e-20 m² = 16.02176634e-3 J/m².
  constexpr double joule_per_m2     = 1.0;
  constexpr double mev_per_angstrom2 = 1.0e-3 * electronvolt / (angstrom * angstrom);

  // Force [N] and line tension / 2D modulus [N/m].
  constexpr double newton     = 1.0;
  constexpr double nanonewton = 1.0e-9;
  constexpr double newton_per_m = 1.0;

  // Pressure [Pa].
  constexpr double pascal      = 1.0;
  constexpr double kilopascal  = 1.0e3;
  constexpr double megapascal  = 1.0e6;
} // namespace nappe::units
