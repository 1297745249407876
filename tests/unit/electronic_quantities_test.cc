// The electronic estimates as entries of the quantity table (analysis/sheet_quantities.h): which materials get
// them, what they are called in fields and summary/sweep columns, and their values at a point state against
// the published coefficients of the catalogue (share/materials.prm).
#include <deal.II/base/mpi.h>

#include <nappe/analysis/sheet_quantities.h>
#include <nappe/analysis/state_summary.h>
#include <nappe/base/units.h>
#include <nappe/physics/electronic_fields.h>
#include <nappe/physics/material_catalogue.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

namespace
{
  using namespace nappe;

  SheetModel model_of(const std::string &material)
  {
    SheetModel m;
    m.material = MaterialCatalogue().material(material);
    return m;
  }

  /// The names the table offers for @p model, with their unit suffix (as fields and map columns).
  std::vector<std::string> field_names(const SheetModel &model)
  {
    std::vector<std::string> names;
    for (const SheetQuantity *q : quantities_for(model))
      if (q->field)
        names.push_back(q->name + q->unit_suffix());
    return names;
  }

  bool contains(const std::vector<std::string> &names, const std::string &name)
  {
    return std::find(names.begin(), names.end(), name) != names.end();
  }

  const SheetQuantity &entry(const SheetModel &model, const std::string &name)
  {
    for (const SheetQuantity *q : quantities_for(model))
      if (q->name == name)
        return *q;
    throw std::runtime_error("no quantity " + name);
  }

  /// A point state with a uniform strain (no strain gradient).
  PointState uniform(const SheetModel &model, double xx, double yy, double xy)
  {
    PointState p;
    p.model        = &model;
    p.strain[0][0] = xx, p.strain[1][1] = yy, p.strain[0][1] = xy;
    return p;
  }
} // namespace

TEST(ElectronicQuantities, GrapheneGetsPseudoGaugeFieldsAndPotentialButNoGapShift)
{
  const SheetModel graphene = model_of("graphene");
  const auto       names    = field_names(graphene);
  for (const char *name : {"pseudo_vector_potential_x_T_nm", "pseudo_vector_potential_y_T_nm",
                           "pseudo_magnetic_field_K_T", "deformation_potential_eV"})
    EXPECT_TRUE(contains(names, name)) << name;
  EXPECT_FALSE(contains(names, "gap_shift_meV"));
}

TEST(ElectronicQuantities, DichalcogenideGetsTheGapShiftOnly)
{
  const auto names = field_names(model_of("MoS2"));
  EXPECT_TRUE(contains(names, "gap_shift_meV"));
  EXPECT_FALSE(contains(names, "pseudo_magnetic_field_K_T")); // not a honeycomb of identical atoms with β
  EXPECT_FALSE(contains(names, "deformation_potential_eV"));  // no published g in the catalogue
}

TEST(ElectronicQuantities, ContinuumPlateAndHbnWithoutConstantsGetNone)
{
  SheetModel plate;
  plate.material = SheetMaterial::from_plate(200e9, 1e-6, 0.3); // a continuum plate: no lattice
  for (const SheetModel &m : {plate, model_of("hBN")}) // hBN: no verified constants in the catalogue
    for (const auto &name : field_names(m))
      EXPECT_TRUE(name.find("pseudo") == std::string::npos && name.find("potential") == std::string::npos &&
                  name.find("gap_shift") == std::string::npos)
        << m.material.name << ": " << name;
}

TEST(ElectronicQuantities, ExtremesBecomeSummaryAndSweepColumnsWithUnits)
{
  const auto graphene = summary_columns(model_of("graphene"));
  for (const char *column : {"max_pseudo_magnetic_field_K_T", "max_deformation_potential_eV",
                             "min_deformation_potential_eV"})
    EXPECT_TRUE(contains(graphene, column)) << column;
  const auto mos2 = summary_columns(model_of("MoS2"));
  for (const char *column : {"max_gap_shift_meV", "min_gap_shift_meV"})
    EXPECT_TRUE(contains(mos2, column)) << column;
}

TEST(ElectronicQuantities, BiaxialStrainOnMoS2GivesThePublishedShiftInMeV)
{
  // 1 % equibiaxial strain: −99 meV (Lloyd et al., Nano Letters 16, 5836 (2016): 99 meV per % of biaxial strain;
  // the catalogue's calibration of the trace model).
  const SheetModel mos2 = model_of("MoS2");
  EXPECT_NEAR(entry(mos2, "gap_shift").reported(uniform(mos2, 0.01, 0.01, 0.0)), -99.0, 1e-9);
  // A pure shear leaves the gap unchanged in the trace model.
  EXPECT_NEAR(entry(mos2, "gap_shift").reported(uniform(mos2, 0.0, 0.0, 0.01)), 0.0, 1e-12);
}

TEST(ElectronicQuantities, DeformationPotentialIsGTimesTraceInEV)
{
  // g = 4 eV (catalogue; Choi, Jhi & Son, Phys. Rev. B 81, 081407(R) (2010), value from memory).
  const SheetModel graphene = model_of("graphene");
  EXPECT_NEAR(entry(graphene, "deformation_potential").reported(uniform(graphene, 0.01, 0.005, 0.003)),
              4.0 * 0.015, 1e-12);
}

TEST(ElectronicQuantities, VectorPotentialIsReportedInTeslaNanometre)
{
  // θ = 0, uniaxial ε_xx = 1 %: A = (ħβ/(2ed))(ε_xx, 0) (electronic_fields.h), reported in T nm.
  const SheetModel graphene = model_of("graphene");
  const PointState p        = uniform(graphene, 0.01, 0.0, 0.0);
  const double     expected = PseudoGaugeCoupling::of(graphene.material).prefactor() * 0.01 / units::nanometer;
  EXPECT_NEAR(entry(graphene, "pseudo_vector_potential_x").reported(p), expected, 1e-12 * expected);
  EXPECT_NEAR(entry(graphene, "pseudo_vector_potential_y").reported(p), 0.0, 1e-12 * expected);
  // Order of magnitude: ħ/e = 6.582e-16 T m² (CODATA), β = 3.37, d = 0.142 nm: about 78 T nm at 1 % strain.
  EXPECT_NEAR(expected, 6.582e-16 * 3.37 / (2 * 0.142e-9) * 0.01 / 1e-9, 0.01 * expected);
  // A uniform strain has no pseudo-magnetic field.
  EXPECT_EQ(entry(graphene, "pseudo_magnetic_field_K").evaluate(p), 0.0);
}
