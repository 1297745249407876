#include <nappe/base/units.h>

#include <gtest/gtest.h>

// 1 meV/Å² = 1.602176634e-22 J / 1e-20 m² = 0.01602176634 J/m² (CODATA 2018 value of e).
TEST(Units, MevPerSquareAngstromInJoulePerSquareMeter)
{
  EXPECT_NEAR(nappe::units::mev_per_angstrom2, 0.01602176634, 1e-15);
}

// Koenig et al., Nature Nanotechnology 6, 543 (2011): graphene on SiO2, 0.45 J/m² ≈ 28 meV/Å².
TEST(Units, GrapheneOnSilicaAdhesionInTradeUnits)
{
  EXPECT_NEAR(0.45 / nappe::units::mev_per_angstrom2, 28.09, 0.01);
}
