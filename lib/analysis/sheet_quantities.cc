#include <nappe/analysis/sheet_quantities.h>
#include <nappe/base/units.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/fvk_kinematics.h>

#include <cmath>

namespace nappe
{
  namespace
  {
    using P = PointState;

    double principal_1(const P &p) { return principal_values(p.strain).first; }
    double principal_2(const P &p) { return principal_values(p.strain).second; }
    SymTensor curvature(const P &p) { return dealii::symmetrize(p.hess_w); }
    SymTensor stress(const P &p) { return membrane_stress(p.strain, p.model->material); }
    const AdhesionPotential &adhesion(const P &p) { return *p.model->adhesion(); }
    double gap(const P &p) { return adhesion(p).gap(p.x, p.w); }

    /// The adhesion traction on the sheet, positive towards the substrate: c·∂ψ/∂w [Pa].
    double traction(const P &p)
    {
      double psi, dpsi, d2psi;
      adhesion(p).evaluate(p.x, p.w, psi, dpsi, d2psi);
      return p.level.adhesion * dpsi;
    }

    const double nm = units::nanometer, per_nm = 1.0 / units::nanometer;

    SheetQuantity quantity(std::string name, std::string unit, double si_per_unit, std::string description,
                           std::function<double(const P &)> evaluate)
    {
      SheetQuantity q;
      q.name        = std::move(name);
      q.unit        = std::move(unit);
      q.si_per_unit = si_per_unit;
      q.description = std::move(description);
      q.evaluate    = std::move(evaluate);
      return q;
    }

    SheetQuantity extreme(SheetQuantity q, Extreme kind, std::string key, std::string histogram_label = "")
    {
      q.extreme         = kind;
      q.extreme_key     = std::move(key);
      q.histogram_label = std::move(histogram_label);
      return q;
    }

    /// A quantity defined only on an adhesion substrate.
    SheetQuantity on_substrate(SheetQuantity q)
    {
      q.needs_adhesion = true;
      return q;
    }

    std::vector<SheetQuantity> make_table()
    {
      return {
        extreme(quantity("w", "nm", nm, "deflection", [](const P &p) { return p.w; }), Extreme::largest_magnitude,
                "max_deflection"),
        quantity("u_x", "nm", nm, "in-plane displacement λE·x + ũ, x", [](const P &p) { return p.displacement()[0]; }),
        quantity("u_y", "nm", nm, "in-plane displacement λE·x + ũ, y", [](const P &p) { return p.displacement()[1]; }),
        quantity("strain_xx", "1", 1, "membrane strain ε_xx", [](const P &p) { return p.strain[0][0]; }),
        quantity("strain_yy", "1", 1, "membrane strain ε_yy", [](const P &p) { return p.strain[1][1]; }),
        quantity("strain_xy", "1", 1, "membrane strain ε_xy (tensor shear)", [](const P &p) { return p.strain[0][1]; }),
        extreme(quantity("principal_strain_1", "1", 1, "larger principal membrane strain", principal_1),
                Extreme::largest, "max_principal_strain", "max principal strain"),
        extreme(quantity("principal_strain_2", "1", 1, "smaller principal membrane strain", principal_2),
                Extreme::smallest, "min_principal_strain"),
        extreme(quantity("areal_strain", "1", 1, "areal (biaxial) strain tr ε",
                         [](const P &p) { return principal_1(p) + principal_2(p); }),
                Extreme::largest_magnitude, "max_areal_strain", "areal strain"),
        extreme(quantity("shear_strain", "1", 1, "maximum shear strain (ε₁ − ε₂)/2",
                         [](const P &p) { return 0.5 * (principal_1(p) - principal_2(p)); }),
                Extreme::largest, "max_shear_strain"),
        quantity("N_xx", "N/m", 1, "membrane stress resultant N_xx", [](const P &p) { return stress(p)[0][0]; }),
        quantity("N_yy", "N/m", 1, "membrane stress resultant N_yy", [](const P &p) { return stress(p)[1][1]; }),
        quantity("N_xy", "N/m", 1, "membrane stress resultant N_xy", [](const P &p) { return stress(p)[0][1]; }),
        quantity("curvature_xx", "1/nm", per_nm, "curvature ∂²w/∂x²", [](const P &p) { return p.hess_w[0][0]; }),
        quantity("curvature_yy", "1/nm", per_nm, "curvature ∂²w/∂y²", [](const P &p) { return p.hess_w[1][1]; }),
        quantity("curvature_xy", "1/nm", per_nm, "curvature ∂²w/∂x∂y", [](const P &p) { return p.hess_w[0][1]; }),
        extreme(quantity("curvature_max", "1/nm", per_nm, "largest principal curvature magnitude",
                         [](const P &p) {
                           const auto [k1, k2] = principal_values(curvature(p));
                           return std::max(std::abs(k1), std::abs(k2));
                         }),
                Extreme::largest, "max_curvature"),
        on_substrate(quantity("gap", "nm", nm, "gap to the substrate along the gap measure", gap)),
        on_substrate(quantity("substrate_height", "nm", nm, "substrate height s(x)",
                              [](const P &p) { return adhesion(p).topography().height(p.x); })),
        on_substrate(quantity("adhesion_traction", "MPa", units::megapascal,
                              "adhesion traction on the sheet (+ towards the substrate)", traction)),
        on_substrate(quantity("conformed", "1", 1,
                              "1 where the gap is within the attractive range up to the peak traction",
                              [](const P &p) { return adhesion(p).conformed(gap(p)) ? 1.0 : 0.0; })),
      };
    }
  } // namespace

  bool SheetQuantity::applies_to(const SheetModel &model) const { return !needs_adhesion || model.adhesion(); }

  std::string SheetQuantity::unit_suffix() const
  {
    if (unit == "1")
      return "";
    std::string slug = unit;
    if (slug.rfind("1/", 0) == 0)
      slug = "per_" + slug.substr(2);
    for (std::size_t k = slug.find('/'); k != std::string::npos; k = slug.find('/'))
      slug.replace(k, 1, "_per_");
    return "_" + slug;
  }

  const std::vector<SheetQuantity> &sheet_quantities()
  {
    static const std::vector<SheetQuantity> table = make_table();
    return table;
  }

  std::vector<const SheetQuantity *> quantities_for(const SheetModel &model)
  {
    std::vector<const SheetQuantity *> out;
    for (const auto &q : sheet_quantities())
      if (q.applies_to(model))
        out.push_back(&q);
    return out;
  }
} // namespace nappe
