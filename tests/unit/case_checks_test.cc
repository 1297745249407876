// The checks a case gets before it is solved (io/case_checks.h): the resolution report (elements per
// feature of the topography, the adhesion front) and the plausibility warnings.
#include <deal.II/base/parameter_handler.h>

#include <nappe/base/units.h>
#include <nappe/io/case_checks.h>
#include <nappe/io/case_file.h>
#include <nappe/io/parameter_override.h>

#include <gtest/gtest.h>

#include <cmath>
#include <regex>

using namespace nappe;

namespace
{
  // Graphene (D = 1.4 eV from the catalogue) on a 20 nm grating, a periodic strip of 16 coarse cells.
  const char *grating_strip = R"(
subsection Sheet
  set Material = graphene
end
subsection Domain
  set Shape = rectangle
  set Length y = 1.25
  set Periodic = true
  set Periods per cell = 1
  set Coarse cells x = 16
  set Coarse cells y = 1
  set Global refinements = 0
end
subsection Edges
  set Conditions =
end
subsection Substrate
  set Enabled = true
end
subsection Topography
  set Type = sinusoidal grating
  subsection Sinusoidal grating
    set Amplitude = 1
    set Wavelength = 20
  end
end
subsection Adhesion
  set Work of adhesion = 0.45
  set Equilibrium separation = 0.5
end
)";

  SheetCase parse(const std::vector<std::string> &overrides = {})
  {
    dealii::ParameterHandler prm;
    declare_sheet_case_parameters(prm);
    read_parameter_text(prm, grating_strip, "test case");
    for (const auto &o : overrides)
      apply_override(prm, o);
    return parse_sheet_case(prm);
  }

  /// The first number after @p label in the report's lines.
  double number_after(const ResolutionReport &r, const std::string &label)
  {
    for (const auto &line : r.lines)
      if (const auto at = line.find(label); at != std::string::npos)
        return std::stod(line.substr(at + label.size()));
    ADD_FAILURE() << "no line with '" << label << "'";
    return NAN;
  }

  bool warns_about(const ResolutionReport &r, const std::string &what)
  {
    for (const auto &w : r.warnings)
      if (w.find(what) != std::string::npos)
        return true;
    return false;
  }
} // namespace

// A plate on an elastic foundation of stiffness k has the decay length ℓ = (4D/k)^¼ (Hetényi, Beams on
// Elastic Foundation, 1946, ch. II); the 9-3 law's well has k = 27Γ/h₀² (second derivative of
// φ(g) = Γ[(h₀/g)⁹/2 − 3(h₀/g)³/2] at g = h₀), so ℓ = (4Dh₀²/27Γ)^¼ = 0.369 nm for graphene, Γ = 0.45 J/m²,
// h₀ = 0.5 nm.
TEST(ResolutionReport, AdhesionFrontLengthIsThePlateOnFoundationDecayLength)
{
  const double D = 1.4 * units::electronvolt, h0 = 0.5e-9, gamma = 0.45;
  const double expected = std::pow(4 * D * h0 * h0 / (27 * gamma), 0.25);
  const ResolutionReport r = resolution_report(parse());
  // The report prints three significant digits: 0.3686 nm reads 0.369 nm.
  EXPECT_NEAR(number_after(r, "(4D/k)^(1/4) = "), expected / 1e-9, 0.0005);
}

// 16 Q2 cells on 20 nm: 1.25 nm elements, 16 per wavelength (8 needed); node spacing 0.625 nm > ℓ.
TEST(ResolutionReport, CountsElementsPerFeatureAndWarnsOnlyWhenTooFew)
{
  const ResolutionReport fine = resolution_report(parse());
  EXPECT_NEAR(fine.element_size, 1.25e-9, 1e-12);
  EXPECT_NEAR(number_after(fine, "wavelength 20 nm: "), 16, 1e-9);
  EXPECT_FALSE(warns_about(fine, "wavelength"));
  EXPECT_TRUE(warns_about(fine, "adhesion front"));

  const ResolutionReport coarse = resolution_report(parse({"Domain/Coarse cells x=2"}));
  EXPECT_NEAR(number_after(coarse, "wavelength 20 nm: "), 2, 1e-9);
  EXPECT_TRUE(warns_about(coarse, "wavelength (20 nm) is resolved by 2 elements, fewer than 8"));

  // Exactly the elements needed is enough (8 × 2.5 nm = 20 nm): no warning from rounding.
  const ResolutionReport exact = resolution_report(parse({"Domain/Coarse cells x=8"}));
  EXPECT_FALSE(warns_about(exact, "wavelength"));
}

TEST(ResolutionReport, WarnsThatThePseudoMagneticFieldNeedsFourElementsPerFeatureOfAHoneycombSheet)
{
  // Graphene has a pseudo-magnetic field (β known): 2 elements per wavelength are too few for it.
  EXPECT_TRUE(warns_about(resolution_report(parse({"Domain/Coarse cells x=2"})), "pseudo-magnetic field"));
  EXPECT_FALSE(warns_about(resolution_report(parse({"Domain/Coarse cells x=4"})), "pseudo-magnetic field"));
  // MoS2 has no pseudo-gauge coupling in the catalogue: no such warning at any resolution.
  EXPECT_FALSE(warns_about(resolution_report(parse({"Domain/Coarse cells x=2", "Sheet/Material=MoS2",
                                                    "Adhesion/Work of adhesion=0.22"})),
                           "pseudo-magnetic field"));
}

TEST(ResolutionReport, CountsTheUnknownsOfASquareMeshExactly)
{
  // 4 x 4 cells refined once: 8 x 8 Q2 cells, (2·8 + 1)² nodes, three fields (u_x, u_y, w).
  const ResolutionReport r = resolution_report(
    parse({"Domain/Periods per cell=0", "Domain/Periodic=false", "Domain/Length x=20", "Domain/Length y=20",
           "Domain/Coarse cells x=4", "Domain/Coarse cells y=4", "Domain/Global refinements=1"}));
  EXPECT_EQ(r.cells, 64u);
  EXPECT_EQ(r.unknowns, 3u * 17u * 17u);
  EXPECT_GT(r.memory, 0.0);
  EXPECT_GT(r.step_time, 0.0);
}

TEST(PlausibilityWarnings, AWorkOfAdhesionBeyondTheTradesRangeIsFlaggedWithItsLikelyCause)
{
  EXPECT_TRUE(plausibility_warnings(parse()).empty());
  const auto w = plausibility_warnings(parse({"Adhesion/Work of adhesion=8"}));
  ASSERT_EQ(w.size(), 1u);
  EXPECT_NE(w[0].find("Adhesion/Work of adhesion"), std::string::npos) << w[0];
}
