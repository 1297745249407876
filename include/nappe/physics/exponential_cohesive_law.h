#pragma once

#include <deal.II/base/parameter_handler.h>

#include <nappe/physics/adhesion_law.h>

#include <memory>
#include <string>

namespace nappe
{
  /**
   * Exponential cohesive law in the normal-separation form of Xu & Needleman,
   * J. Mech. Phys. Solids 42, 1397 (1994), shifted so that the unloaded interface sits at the
   * equilibrium gap h₀. With Δ = g − h₀ and s = Δ/δ:
   *
   *   g ≥ h₀ (opening):      φ(g) = −Γ (1 + s) e^{−s},
   *                          dφ/dg = (Γ/δ) s e^{−s},   d²φ/dg² = (Γ/δ²)(1 − s) e^{−s};
   *   g < h₀ (penetration):  φ(g) = −Γ + ½ k Δ²,   dφ/dg = k Δ,   d²φ/dg² = k,
   *                          with k = κ Γ/δ² (κ = penalty_stiffness_factor, default 1).
   *
   * φ(h₀) = −Γ and φ → 0 as g → ∞, so Γ is the work of separation. The attractive traction
   * peaks at Δ = δ (g* = h₀ + δ) with value Γ/(e δ). φ and dφ/dg are continuous at h₀ for every
   * κ (dφ/dg = 0 from both sides), so the law is C1; d²φ/dg² jumps from κΓ/δ² to Γ/δ² there,
   * and the default κ = 1 makes the law C2. The penalty branch is convex and repulsive
   * (dφ/dg < 0) for every g < h₀, including g ≤ 0; a larger κ lets the sheet penetrate less.
   */
  class ExponentialCohesiveLaw : public AdhesionLaw
  {
  public:
    /**
     * @param work_of_adhesion Γ > 0 [J/m²].
     * @param equilibrium_gap h₀ > 0 [m].
     * @param characteristic_length δ > 0 [m]: distance from h₀ to the peak of the traction.
     * @param penalty_stiffness_factor κ > 0 [-]: the penetration stiffness is κ Γ/δ².
     * Throws (AssertThrow) if an argument is out of range.
     */
    ExponentialCohesiveLaw(double work_of_adhesion, double equilibrium_gap, double characteristic_length,
                           double penalty_stiffness_factor = 1.0);

    void evaluate(double gap, double &phi, double &dphi, double &d2phi) const override;

    double work_of_adhesion() const override { return gamma; }
    double equilibrium_gap() const override { return h0; }
    /// h₀ + δ [m].
    double peak_traction_gap() const override { return h0 + delta; }
    std::string name() const override { return registered_name; }

    /// δ [m].
    double characteristic_length() const { return delta; }
    /// Penetration stiffness k = κ Γ/δ² [Pa/m].
    double penalty_stiffness() const { return k_penalty; }

    /// Registry name: "exponential-cohesive".
    static constexpr const char *registered_name = "exponential-cohesive";

    /// Declares the law's own entries (inside its subsection, entered by the caller).
    static void declare_parameters(dealii::ParameterHandler &prm);

    /// Creates the law from Γ [J/m²], h₀ [m] and the law's own entries (subsection entered).
    static std::unique_ptr<AdhesionLaw>
    parse_parameters(double work_of_adhesion, double equilibrium_gap, const dealii::ParameterHandler &prm);

  private:
    double gamma;
    double h0;
    double delta;
    double k_penalty;
  };
} // namespace nappe
