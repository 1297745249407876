// Adhesion laws: closed-form landmarks, derivative consistency, behaviour under penetration,
// and the "Adhesion" parameter subsection.
#include <deal.II/base/exceptions.h>
#include <deal.II/base/parameter_handler.h>

#include <nappe/base/units.h>
#include <nappe/physics/adhesion_law_factory.h>
#include <nappe/physics/exponential_cohesive_law.h>
#include <nappe/physics/vdw_93_law.h>

#include <common/thrown_message.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <memory>
#include <sstream>
#include <string>

using nappe::test_support::message_of;

namespace
{
  using namespace nappe;

  // Graphene on SiO2 (Koenig et al., Nature Nanotechnology 6, 543, 2011) with an illustrative h0.
  constexpr double Gamma = 0.45;   // J/m^2
  constexpr double h0    = 0.6e-9; // m
  constexpr double delta = 0.1e-9; // m, exponential law only

  struct Values
  {
    double phi, dphi, d2phi;
  };

  Values evaluate(const AdhesionLaw &law, const double g)
  {
    Values v{};
    law.evaluate(g, v.phi, v.dphi, v.d2phi);
    return v;
  }

  // Maximiser of f on [a, b] by golden-section search (f unimodal there), to a relative width of ~1e-12.
  double locate_maximum(const std::function<double(double)> &f, double a, double b)
  {
    const double r = 0.5 * (std::sqrt(5.0) - 1.0);
    double       c = b - r * (b - a), d = a + r * (b - a);
    while (b - a > 1e-12 * std::abs(b))
      {
        if (f(c) > f(d))
          b = d;
        else
          a = c;
        c = b - r * (b - a);
        d = a + r * (b - a);
      }
    return 0.5 * (a + b);
  }

  // Checks dphi and d2phi against central differences of phi and dphi at gap g.
  void expect_derivatives_match_finite_differences(const AdhesionLaw &law, const double g)
  {
    const double step  = 1e-6 * h0;
    const Values v     = evaluate(law, g);
    const Values plus  = evaluate(law, g + step);
    const Values minus = evaluate(law, g - step);
    const double fd1   = (plus.phi - minus.phi) / (2 * step);
    const double fd2   = (plus.dphi - minus.dphi) / (2 * step);
    // Scales: the largest term of each quantity in the neighbourhood, so zeros of dphi are handled.
    const double scale1 = std::abs(v.dphi) + Gamma / h0;
    const double scale2 = std::abs(v.d2phi) + Gamma / (h0 * h0);
    EXPECT_NEAR(v.dphi, fd1, 1e-6 * scale1) << law.name() << " at g/h0 = " << g / h0;
    EXPECT_NEAR(v.d2phi, fd2, 1e-6 * scale2) << law.name() << " at g/h0 = " << g / h0;
  }

  std::unique_ptr<AdhesionLaw> parse(const std::string &text)
  {
    dealii::ParameterHandler prm;
    declare_adhesion_parameters(prm);
    prm.parse_input_from_string(text);
    return parse_adhesion_parameters(prm);
  }
} // namespace

// ---------------------------------------------------------------------------------------------
// van der Waals 9-3 law
// ---------------------------------------------------------------------------------------------

TEST(Vdw93Law, EnergyIsMinusWorkOfAdhesionAtEquilibriumGap)
{
  const Vdw93Law law(Gamma, h0);
  const Values   v = evaluate(law, h0);
  EXPECT_NEAR(v.phi, -Gamma, 1e-15 * Gamma);
  EXPECT_NEAR(v.dphi, 0.0, 1e-15 * Gamma / h0);
  EXPECT_DOUBLE_EQ(law.work_of_adhesion(), Gamma);
  EXPECT_DOUBLE_EQ(law.equilibrium_gap(), h0);
}

// d²φ/dg² = (9Γ/2g²)(10x⁹ − 4x³), x = h0/g; at x = 1: (9/2)·6 Γ/h0² = 27 Γ/h0².
TEST(Vdw93Law, InterfaceStiffnessIs27GammaOverH0SquaredAtEquilibrium)
{
  const Vdw93Law law(Gamma, h0);
  EXPECT_NEAR(evaluate(law, h0).d2phi, 27.0 * Gamma / (h0 * h0), 1e-14 * 27.0 * Gamma / (h0 * h0));
}

// Attractive traction dφ/dg = (9Γ/2h0)(x⁴ − x¹⁰); d/dx: 4x³ − 10x⁹ = 0 ⇒ x⁶ = 2/5, so
// g* = (5/2)^{1/6} h0 = 1.16499 h0 and the peak is (9/2)(2/5)^{2/3}(1 − 2/5) Γ/h0 = (27/10)(2/5)^{2/3} Γ/h0
// = 1.46578 Γ/h0. (Note: (5/2)^{1/6}, not 3^{1/6} = 1.2009.)
TEST(Vdw93Law, PeakAttractiveTractionMatchesClosedFormInValueAndLocation)
{
  const Vdw93Law law(Gamma, h0);
  const double   g_closed = std::pow(2.5, 1.0 / 6.0) * h0;
  const double   t_closed = 2.7 * std::pow(0.4, 2.0 / 3.0) * Gamma / h0;

  // The closed forms agree with the rounded values quoted in the literature.
  EXPECT_NEAR(g_closed / h0, 1.1650, 5e-5);
  EXPECT_NEAR(t_closed * h0 / Gamma, 1.4658, 5e-5);

  // The law reports the closed form.
  EXPECT_NEAR(law.peak_traction_gap(), g_closed, 1e-15 * h0);
  EXPECT_NEAR(law.peak_traction(), t_closed, 1e-14 * t_closed);

  // A numerical search for the maximum finds it there too.
  const double g_numeric =
    locate_maximum([&](double g) { return law.attractive_traction(g); }, h0, 2.0 * h0);
  EXPECT_NEAR(g_numeric, g_closed, 1e-6 * h0); // flat maximum: location accurate to ~sqrt(eps)
  EXPECT_NEAR(law.attractive_traction(g_numeric), t_closed, 1e-12 * t_closed);
  // The stiffness vanishes at the peak (inflection of φ).
  EXPECT_NEAR(evaluate(law, g_closed).d2phi, 0.0, 1e-12 * Gamma / (h0 * h0));
}

TEST(Vdw93Law, DerivativesMatchCentralFiniteDifferences)
{
  const Vdw93Law law(Gamma, h0);
  for (const double x : {-2.0, -0.3, 0.0, 0.2, 0.45, 0.55, 0.8, 1.0, 1.1650, 1.5, 3.0, 10.0})
    expect_derivatives_match_finite_differences(law, x * h0);
}

TEST(Vdw93Law, IsContinuousWithContinuousDerivativesAtRegularizationGap)
{
  const Vdw93Law law(Gamma, h0);
  const double   g_min = law.regularization_gap();
  EXPECT_DOUBLE_EQ(g_min, 0.5 * h0);
  const Values below = evaluate(law, g_min * (1.0 - 1e-13));
  const Values above = evaluate(law, g_min * (1.0 + 1e-13));
  EXPECT_NEAR(below.phi, above.phi, 1e-9 * std::abs(above.phi));
  EXPECT_NEAR(below.dphi, above.dphi, 1e-9 * std::abs(above.dphi));
  EXPECT_NEAR(below.d2phi, above.d2phi, 1e-9 * std::abs(above.d2phi));
}

TEST(Vdw93Law, StaysFiniteConvexAndRepulsiveForZeroAndNegativeGaps)
{
  const Vdw93Law law(Gamma, h0);
  double         previous_phi = evaluate(law, 0.4 * h0).phi;
  for (const double x : {0.0, -1e-3, -0.5, -1.0, -10.0, -1e3})
    {
      const Values v = evaluate(law, x * h0);
      EXPECT_TRUE(std::isfinite(v.phi) && std::isfinite(v.dphi) && std::isfinite(v.d2phi)) << "g/h0 = " << x;
      EXPECT_LT(v.dphi, 0.0) << "repulsive at g/h0 = " << x;
      EXPECT_GT(v.d2phi, 0.0) << "convex at g/h0 = " << x;
      EXPECT_GT(v.phi, previous_phi) << "energy grows with penetration at g/h0 = " << x;
      previous_phi = v.phi;
    }
  // Penetrating costs more than the whole well depth already at g = 0.
  EXPECT_GT(evaluate(law, 0.0).phi, 0.0);
}

TEST(Vdw93Law, IsAttractiveAboveAndRepulsiveBelowEquilibriumAndVanishesFarAway)
{
  const Vdw93Law law(Gamma, h0);
  EXPECT_GT(law.attractive_traction(1.01 * h0), 0.0);
  EXPECT_LT(law.attractive_traction(0.99 * h0), 0.0);
  EXPECT_NEAR(law.energy(1e3 * h0), 0.0, 1e-8 * Gamma);
}

TEST(Vdw93Law, RejectsNonPositiveParametersWithAMessage)
{
  EXPECT_NE(message_of([] { const Vdw93Law law(0.0, h0); }).find("work of adhesion"), std::string::npos);
  EXPECT_NE(message_of([] { const Vdw93Law law(Gamma, -h0); }).find("equilibrium gap"), std::string::npos);
  EXPECT_NE(message_of([] { const Vdw93Law law(Gamma, h0, 1.0); }).find("regularization gap fraction"), std::string::npos);
}

// ---------------------------------------------------------------------------------------------
// Exponential cohesive law
// ---------------------------------------------------------------------------------------------

TEST(ExponentialCohesiveLaw, EnergyIsMinusWorkOfAdhesionAtEquilibriumAndZeroFarAway)
{
  const ExponentialCohesiveLaw law(Gamma, h0, delta);
  EXPECT_NEAR(law.energy(h0), -Gamma, 1e-15 * Gamma);
  EXPECT_NEAR(law.energy(h0 + 60.0 * delta), 0.0, 1e-20);
}

TEST(ExponentialCohesiveLaw, PeakTractionIsGammaOverEDeltaAtOneDeltaBeyondEquilibrium)
{
  const ExponentialCohesiveLaw law(Gamma, h0, delta);
  const double                 t_closed = Gamma / (std::exp(1.0) * delta);
  EXPECT_NEAR(law.peak_traction_gap(), h0 + delta, 1e-15 * h0);
  EXPECT_NEAR(law.peak_traction(), t_closed, 1e-14 * t_closed);
  const double g_numeric =
    locate_maximum([&](double g) { return law.attractive_traction(g); }, h0, h0 + 5.0 * delta);
  EXPECT_NEAR(g_numeric, h0 + delta, 1e-6 * delta);
  EXPECT_NEAR(law.attractive_traction(g_numeric), t_closed, 1e-12 * t_closed);
}

TEST(ExponentialCohesiveLaw, IsC1AtEquilibriumGapAndC2ForUnitPenaltyFactor)
{
  for (const double kappa : {1.0, 50.0})
    {
      const ExponentialCohesiveLaw law(Gamma, h0, delta, kappa);
      const Values                 below = evaluate(law, h0 * (1.0 - 1e-14));
      const Values                 above = evaluate(law, h0);
      EXPECT_NEAR(below.phi, above.phi, 1e-14 * Gamma) << "kappa = " << kappa;
      EXPECT_NEAR(below.dphi, above.dphi, 1e-10 * Gamma / delta) << "kappa = " << kappa;
      EXPECT_NEAR(above.d2phi, Gamma / (delta * delta), 1e-14 * Gamma / (delta * delta));
      EXPECT_NEAR(below.d2phi, kappa * Gamma / (delta * delta), 1e-14 * kappa * Gamma / (delta * delta));
    }
}

TEST(ExponentialCohesiveLaw, DerivativesMatchCentralFiniteDifferences)
{
  const ExponentialCohesiveLaw law(Gamma, h0, delta, 10.0);
  for (const double x : {-1.0, 0.0, 0.5, 0.99, 1.01, 1.1, 1.1667, 1.5, 3.0})
    expect_derivatives_match_finite_differences(law, x * h0);
}

TEST(ExponentialCohesiveLaw, PenaltyIsFiniteAndRepulsiveForZeroAndNegativeGaps)
{
  const ExponentialCohesiveLaw law(Gamma, h0, delta);
  for (const double x : {0.5, 0.0, -1.0, -100.0})
    {
      const Values v = evaluate(law, x * h0);
      EXPECT_TRUE(std::isfinite(v.phi));
      EXPECT_LT(v.dphi, 0.0) << "g/h0 = " << x;
      EXPECT_GT(v.phi, -Gamma) << "g/h0 = " << x;
    }
}

// ---------------------------------------------------------------------------------------------
// Registry and the "Adhesion" parameter subsection
// ---------------------------------------------------------------------------------------------

TEST(AdhesionLawFactory, ListsBothBuiltInLaws)
{
  const auto names = adhesion_law_names();
  EXPECT_NE(std::find(names.begin(), names.end(), "vdw-9-3"), names.end());
  EXPECT_NE(std::find(names.begin(), names.end(), "exponential-cohesive"), names.end());
}

TEST(AdhesionLawFactory, DefaultsGiveA93LawForGrapheneOnSilica)
{
  const auto law = parse("");
  EXPECT_EQ(law->name(), "vdw-9-3");
  EXPECT_DOUBLE_EQ(law->work_of_adhesion(), 0.45);
  EXPECT_NEAR(law->equilibrium_gap(), 0.6e-9, 1e-24);
}

// 1 meV/Å² = 1e-3 · 1.602176634e-19 J / 1e-20 m² = 0.01602176634 J/m² (CODATA 2018 value of e).
TEST(AdhesionLawFactory, ConvertsWorkOfAdhesionFromMevPerSquareAngstrom)
{
  const auto law = parse("subsection Adhesion\n"
                         "  set Work of adhesion unit = meV/A^2\n"
                         "  set Work of adhesion = 28\n"
                         "end\n");
  EXPECT_NEAR(law->work_of_adhesion(), 28.0 * 0.01602176634, 1e-15);

  const auto same = parse("subsection Adhesion\n"
                          "  set Work of adhesion unit = J/m^2\n"
                          "  set Work of adhesion = 0.44860945752\n"
                          "end\n");
  EXPECT_NEAR(same->work_of_adhesion(), law->work_of_adhesion(), 1e-12);
}

TEST(AdhesionLawFactory, ReadsEquilibriumSeparationAndLawEntriesInNanometers)
{
  const auto law = parse("subsection Adhesion\n"
                         "  set Law = exponential-cohesive\n"
                         "  set Equilibrium separation = 0.4\n"
                         "  subsection exponential-cohesive\n"
                         "    set Characteristic length = 0.25\n"
                         "    set Penalty stiffness factor = 4\n"
                         "  end\n"
                         "end\n");
  ASSERT_EQ(law->name(), "exponential-cohesive");
  EXPECT_NEAR(law->equilibrium_gap(), 0.4e-9, 1e-24);
  EXPECT_NEAR(law->peak_traction_gap(), 0.65e-9, 1e-24);
  const auto &exp_law = dynamic_cast<const ExponentialCohesiveLaw &>(*law);
  EXPECT_NEAR(exp_law.penalty_stiffness(), 4.0 * 0.45 / (0.25e-9 * 0.25e-9), 1e-12 * exp_law.penalty_stiffness());
}

TEST(AdhesionLawFactory, ZeroWorkOfAdhesionIsRejectedNamingTheParameter)
{
  const std::string msg = message_of([] {
    parse("subsection Adhesion\n"
          "  set Work of adhesion = 0\n"
          "end\n");
  });
  EXPECT_NE(msg.find("Adhesion/Work of adhesion"), std::string::npos) << msg;
  EXPECT_NE(msg.find("outside the admissible range"), std::string::npos) << msg;
  EXPECT_NE(msg.find("1e-05 to 50 J/m^2"), std::string::npos) << msg;
}

TEST(AdhesionLawFactory, NegativeEquilibriumSeparationIsRejectedNamingTheParameter)
{
  const std::string msg = message_of([] {
    parse("subsection Adhesion\n"
          "  set Equilibrium separation = -0.3\n"
          "end\n");
  });
  EXPECT_NE(msg.find("Equilibrium separation"), std::string::npos) << msg;
}

TEST(AdhesionLawFactory, ZeroCharacteristicLengthIsRejectedNamingTheParameter)
{
  const std::string msg = message_of([] {
    parse("subsection Adhesion\n"
          "  set Law = exponential-cohesive\n"
          "  subsection exponential-cohesive\n"
          "    set Characteristic length = 0\n"
          "  end\n"
          "end\n");
  });
  EXPECT_NE(msg.find("Characteristic length"), std::string::npos) << msg;
}

TEST(AdhesionLawFactory, CreatesLawByNameAndRejectsUnknownNamesListingKnownOnes)
{
  const auto law = create_adhesion_law("exponential-cohesive", Gamma, h0, {{"Characteristic length", "0.2"}});
  EXPECT_NEAR(law->work_of_adhesion(), Gamma, 1e-15);
  EXPECT_NEAR(law->equilibrium_gap(), h0, 1e-15 * h0);
  EXPECT_NEAR(law->peak_traction_gap(), h0 + 0.2e-9, 1e-15 * h0);

  const std::string msg = message_of([] { create_adhesion_law("lennard-jones", Gamma, h0); });
  EXPECT_NE(msg.find("lennard-jones"), std::string::npos) << msg;
  EXPECT_NE(msg.find("vdw-9-3"), std::string::npos) << msg;
  EXPECT_NE(msg.find("exponential-cohesive"), std::string::npos) << msg;
}

TEST(AdhesionLawFactory, AcceptsAUserRegisteredLaw)
{
  AdhesionLawInfo info;
  info.name               = "test-scaled-9-3";
  info.description        = "a 9-3 law registered by this test";
  info.declare_parameters = [](dealii::ParameterHandler &) {};
  info.create             = [](double g, double h, const dealii::ParameterHandler &) {
    return std::unique_ptr<AdhesionLaw>(std::make_unique<Vdw93Law>(g, h));
  };
  register_adhesion_law(info);
  EXPECT_THROW(register_adhesion_law(info), dealii::ExceptionBase);

  const auto law = parse("subsection Adhesion\n  set Law = test-scaled-9-3\nend\n");
  EXPECT_DOUBLE_EQ(law->work_of_adhesion(), 0.45);
}

// The Γ-linearity contract of AdhesionLaw (adhesion_law.h): at fixed shape, φ_{cΓ}(g) = c·φ_Γ(g), and
// so for its derivatives; continuation in Γ scales the substrate potential by c on this ground. Checked
// for every registered law at gaps through penetration, the well and the tail, to round-off.
TEST(AdhesionLawContract, EveryRegisteredLawIsLinearInTheWorkOfAdhesionAtFixedShape)
{
  for (const std::string &name : adhesion_law_names())
    for (const double c : {0.01, 0.37, 3.0})
      {
        const auto base   = create_adhesion_law(name, Gamma, h0);
        const auto scaled = create_adhesion_law(name, c * Gamma, h0);
        for (const double g : {-0.3e-9, 0.0, 0.3e-9, h0, 0.8e-9, 1.5e-9, 4e-9})
          {
            const Values a = evaluate(*base, g), b = evaluate(*scaled, g);
            EXPECT_NEAR(b.phi, c * a.phi, 1e-12 * std::abs(c * a.phi) + 1e-300) << name << " g = " << g;
            EXPECT_NEAR(b.dphi, c * a.dphi, 1e-12 * std::abs(c * a.dphi) + 1e-300) << name << " g = " << g;
            EXPECT_NEAR(b.d2phi, c * a.d2phi, 1e-12 * std::abs(c * a.d2phi) + 1e-300) << name << " g = " << g;
          }
      }
}
