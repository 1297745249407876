#pragma once

#include <string>

namespace nappe
{
  /**
   * Interface of an adhesion (traction–separation) law between a sheet and its substrate.
   *
   * A law gives the interface energy per unit area φ(g) [J/m²] as a function of the local
   * gap g [m] between the sheet and the substrate surface, measured along the substrate
   * normal (g > 0: sheet above the surface). Every law in nappe satisfies
   *   - φ(g) → 0 as g → ∞ (a detached sheet carries no interface energy);
   *   - φ has its minimum −Γ at g = h₀, where Γ = work_of_adhesion() and h₀ = equilibrium_gap();
   *   - φ is at least C1 on the whole real line, including g ≤ 0, so that a Newton iterate
   *     that lets the sheet penetrate the substrate still gets a finite, repulsive energy.
   *
   * Sign convention. The normal traction exerted by the substrate on the sheet, counted
   * positive in the direction of increasing gap (away from the substrate), is
   *     p(g) = −dφ/dg  [Pa].
   * Hence dφ/dg > 0 (p < 0) means the interface pulls the sheet towards the substrate:
   * *attractive*, which is the case for g > h₀; dφ/dg < 0 (p > 0) means it pushes the sheet
   * away: *repulsive*, the case for g < h₀. The magnitude of the attractive traction is
   * dφ/dg itself; attractive_traction() returns it. d²φ/dg² [Pa/m] is the interface stiffness
   * that enters the tangent matrix.
   *
   * Γ-linearity contract. At fixed shape parameters (h₀ and the law's own entries) a law is linear
   * in its work of adhesion: φ_Γ(g) = Γ·f(g), with f independent of Γ. Continuation in Γ relies on
   * it: it scales the whole substrate potential by the adhesion factor c = Γ/Γ_case of the LoadLevel
   * (sheet_model.h) instead of rebuilding the law, which is exact only under this contract. A law
   * whose shape depends on Γ (say, a range set by Γ over a peak stress) breaks it and must not be
   * registered as it stands; tests/unit/adhesion_law_test.cc checks the contract for every
   * registered law.
   *
   * Laws are immutable after construction and evaluate() is const and re-entrant, so one law
   * object may be shared by all threads assembling a system.
   */
  class AdhesionLaw
  {
  public:
    virtual ~AdhesionLaw() = default;

    /**
     * Energy per area φ(g) [J/m²], its derivative dφ/dg [J/m³ = Pa] and its second derivative
     * d²φ/dg² [Pa/m] at the gap @p gap [m], computed together (they share most of the work).
     * Defined for every finite gap, including gap ≤ 0.
     */
    virtual void evaluate(double gap, double &phi, double &dphi, double &d2phi) const = 0;

    /// Work of adhesion Γ = −min φ = −φ(h₀) [J/m²].
    virtual double work_of_adhesion() const = 0;

    /// Equilibrium gap h₀, where φ is minimal and the traction vanishes [m].
    virtual double equilibrium_gap() const = 0;

    /**
     * Gap g* > h₀ at which the attractive traction dφ/dg is largest [m]. A point of the sheet
     * with h₀ ≤ g ≤ g* sits inside the attractive well; analyses use g ≤ g* to call a point
     * "conformed" to the substrate.
     */
    virtual double peak_traction_gap() const = 0;

    /// Name under which the law is registered in the adhesion law factory.
    virtual std::string name() const = 0;

    /// φ(g) alone [J/m²]; convenience for post-processing, not for assembly loops.
    double energy(double gap) const;

    /// dφ/dg [Pa]: positive when the interface attracts the sheet (see the sign convention above).
    double attractive_traction(double gap) const;

    /// Largest attractive traction, dφ/dg at peak_traction_gap() [Pa].
    double peak_traction() const;
  };
  namespace internal
  {
    /// Throws "<law> adhesion law: the <quantity> must be a positive number [<unit>], but <value> was given."
    /// unless @p value is finite and positive. Shared by the laws' constructors.
    void require_positive(const std::string &law, const std::string &quantity, const std::string &unit,
                          double value);
  } // namespace internal
} // namespace nappe
