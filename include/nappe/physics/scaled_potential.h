#pragma once

#include <nappe/physics/surface_potential.h>

#include <memory>

namespace nappe
{
  /**
   * A surface potential multiplied by an adjustable factor: ψ_c(x, w) = c·ψ(x, w). Both built-in
   * adhesion laws are linear in the work of adhesion at fixed shape (φ_Γ = Γ·f(g; h₀, …)), so
   * scaling the adhesion potential by c = Γ/Γ_case changes Γ and nothing else; continuation in Γ
   * uses this to vary Γ without rebuilding the finite element system.
   *
   * The factor is set between solves by the owner (set_factor); evaluate() is const and re-entrant.
   */
  class ScaledPotential : public SurfacePotential
  {
  public:
    explicit ScaledPotential(std::shared_ptr<const SurfacePotential> base, double factor = 1.0);

    void   set_factor(double factor);
    double factor() const { return factor_; }

    void evaluate(const dealii::Point<2> &x, double w, double &psi, double &dpsi_dw, double &d2psi_dw2) const override;
    std::vector<std::string> field_names() const override { return base_->field_names(); }
    void fields(const dealii::Point<2> &x, double w, std::vector<double> &values) const override
    {
      base_->fields(x, w, values);
    }

  private:
    std::shared_ptr<const SurfacePotential> base_;
    double                                  factor_;
  };
} // namespace nappe
