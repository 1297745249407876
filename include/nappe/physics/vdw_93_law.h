#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/physics/adhesion_law.h>

#include <memory>
#include <string>

namespace nappe
{
  /**
   * Van der Waals 9-3 adhesion law (Lennard-Jones 6-12 pair potential integrated over a
   * half-space substrate and a thin sheet), in the form of Aitken & Huang, J. Appl. Phys.
   * 107, 123531 (2010):
   *
   *     φ(g) = −Γ [ (3/2) (h₀/g)³ − (1/2) (h₀/g)⁹ ]                          for g ≥ g_min.
   *
   * With x = h₀/g:  dφ/dg = (9Γ/2g)(x³ − x⁹),  d²φ/dg² = (9Γ/2g²)(10x⁹ − 4x³).
   * Closed-form landmarks (checked in tests/unit/adhesion_law_test.cc):
   *   - φ(h₀) = −Γ, dφ/dg(h₀) = 0, d²φ/dg²(h₀) = 27 Γ/h₀²;
   *   - the attractive traction (9Γ/2h₀)(x⁴ − x¹⁰) peaks where x⁶ = 2/5, i.e. at
   *     g* = (5/2)^{1/6} h₀ ≈ 1.16499 h₀, with value (27/10)(2/5)^{2/3} Γ/h₀ ≈ 1.46578 Γ/h₀.
   *
   * Regularisation for small and negative gaps. The exact law diverges as g → 0⁺ and is
   * undefined for g ≤ 0, which a Newton iterate may visit. Below g_min = f·h₀ (f =
   * regularization_gap_fraction, default 0.5, 0 < f < 1) the law continues as its second-order
   * Taylor expansion about g_min:
   *
   *     φ(g) = φ(g_min) + φ'(g_min)(g − g_min) + ½ φ''(g_min)(g − g_min)²   for g < g_min.
   *
   * φ, φ' and φ'' are continuous at g_min (the law is C2 there; φ''' jumps). Because
   * φ'(g_min) < 0 and φ''(g_min) > 0 for any f < 1, the continuation is convex and repulsive:
   * the energy and the repulsive traction keep growing as the sheet penetrates further. At
   * f = 0.5 the continuation stiffness is φ''(g_min) = 91584 Γ/h₀², about 3400 times the
   * equilibrium stiffness, so penetration is strongly penalised but finite.
   */
  class Vdw93Law : public AdhesionLaw
  {
  public:
    /**
     * @param work_of_adhesion Γ > 0 [J/m²].
     * @param equilibrium_gap h₀ > 0 [m].
     * @param regularization_gap_fraction f with 0 < f < 1: the law is regularised below f·h₀.
     * Throws (AssertThrow) if an argument is out of range.
     */
    Vdw93Law(double work_of_adhesion, double equilibrium_gap, double regularization_gap_fraction = 0.5);

    void evaluate(double gap, double &phi, double &dphi, double &d2phi) const override;

    double work_of_adhesion() const override { return gamma; }
    double equilibrium_gap() const override { return h0; }
    /// (5/2)^{1/6} h₀ [m].
    double peak_traction_gap() const override;
    std::string name() const override { return registered_name; }

    /// Gap g_min below which the quadratic continuation is used [m].
    double regularization_gap() const { return g_min; }

    /// Registry name: "vdw-9-3".
    static constexpr const char *registered_name = "vdw-9-3";

    /// Declares the law's own entries (inside its subsection, entered by the caller).
    static void declare_parameters(dealii::ParameterHandler &prm);

    /// Creates the law from Γ [J/m²], h₀ [m] and the law's own entries (subsection entered).
    static std::unique_ptr<AdhesionLaw>
    parse_parameters(double work_of_adhesion, double equilibrium_gap, const dealii::ParameterHandler &prm);

  private:
    /// The unregularised 9-3 law and its derivatives.
    void evaluate_exact(double gap, double &phi, double &dphi, double &d2phi) const;

    double gamma;
    double h0;
    double g_min;
    double phi_min, dphi_min, d2phi_min; // φ, φ', φ'' at g_min
  };
} // namespace nappe
