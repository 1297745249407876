#include <nappe/analysis/sheet_quantities.h>
#include <nappe/base/units.h>
#include <nappe/physics/adhesion_potential.h>
#include <nappe/physics/electronic_fields.h>
#include <nappe/physics/fvk_kinematics.h>
#include <nappe/physics/strain_gradient.h>

#include <algorithm>
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
    const double tesla_nm = units::nanometer, mev = 1e-3 * units::electronvolt;

    // Electronic estimates (electronic_fields.h): first-order continuum fields, defined where the catalogue
    // gives the material a lattice and a published coupling constant.
    bool has_pseudo_gauge_field(const SheetModel &m)
    {
      const auto type = m.material.lattice.type;
      return (type == LatticeType::honeycomb || type == LatticeType::binary_honeycomb) &&
             m.material.electronic.hopping_decay > 0.0;
    }
    bool has_deformation_potential(const SheetModel &m) { return m.material.electronic.deformation_potential != 0; }
    bool has_gap_coefficient(const SheetModel &m) { return m.material.electronic.biaxial_gap.known(); }

    dealii::Tensor<1, 2> vector_potential(const P &p)
    {
      return pseudo_vector_potential(p.strain, PseudoGaugeCoupling::of(p.model->material));
    }

    /// B of valley K from the strain gradient of the solved fields' second derivatives (strain_gradient.h).
    double field_of_valley_k(const P &p)
    {
      const auto gradient = membrane_strain_gradient(p.hess_u, p.grad_w, p.hess_w, p.model->geometric_nonlinearity);
      return pseudo_magnetic_field(gradient, PseudoGaugeCoupling::of(p.model->material));
    }

    double potential(const P &p)
    {
      return deformation_potential(p.strain, p.model->material.electronic.deformation_potential);
    }
    double gap_shift(const P &p) { return band_gap_shift(p.strain, p.model->material.electronic.biaxial_gap); }

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

    /// A quantity defined only for models that pass @p test.
    SheetQuantity needing(std::function<bool(const SheetModel &)> test, SheetQuantity q)
    {
      q.needs_model = std::move(test);
      return q;
    }

    /// A second extreme of a field already in the table (not written as a field again).
    SheetQuantity other_extreme(SheetQuantity q, Extreme kind, std::string key)
    {
      q.field = false;
      return extreme(std::move(q), kind, std::move(key));
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
        needing(has_pseudo_gauge_field,
                quantity("pseudo_vector_potential_x", "T nm", tesla_nm,
                         "strain pseudo-vector potential of valley K, x (valley K' has -A)",
                         [](const P &p) { return vector_potential(p)[0]; })),
        needing(has_pseudo_gauge_field,
                quantity("pseudo_vector_potential_y", "T nm", tesla_nm,
                         "strain pseudo-vector potential of valley K, y (valley K' has -A)",
                         [](const P &p) { return vector_potential(p)[1]; })),
        needing(has_pseudo_gauge_field,
                extreme(quantity("pseudo_magnetic_field_K", "T", 1,
                                 "pseudo-magnetic field of valley K (valley K' has -B; |B| is the same in both)",
                                 field_of_valley_k),
                        Extreme::largest_magnitude, "max_pseudo_magnetic_field_K")),
        needing(has_deformation_potential,
                extreme(quantity("deformation_potential", "eV", units::electronvolt,
                                 "scalar deformation potential g tr(strain)", potential),
                        Extreme::largest, "max_deformation_potential")),
        needing(has_deformation_potential,
                other_extreme(quantity("deformation_potential", "eV", units::electronvolt,
                                       "scalar deformation potential g tr(strain)", potential),
                              Extreme::smallest, "min_deformation_potential")),
        needing(has_gap_coefficient,
                extreme(quantity("gap_shift", "meV", mev,
                                 "optical band-gap shift, trace model calibrated on the biaxial coefficient",
                                 gap_shift),
                        Extreme::largest, "max_gap_shift")),
        needing(has_gap_coefficient,
                other_extreme(quantity("gap_shift", "meV", mev,
                                       "optical band-gap shift, trace model calibrated on the biaxial coefficient",
                                       gap_shift),
                              Extreme::smallest, "min_gap_shift")),
      };
    }
  } // namespace

  bool SheetQuantity::applies_to(const SheetModel &model) const
  {
    return (!needs_adhesion || model.adhesion()) && (!needs_model || needs_model(model));
  }

  std::string SheetQuantity::unit_suffix() const
  {
    if (unit == "1")
      return "";
    std::string slug = unit;
    if (slug.rfind("1/", 0) == 0)
      slug = "per_" + slug.substr(2);
    for (std::size_t k = slug.find('/'); k != std::string::npos; k = slug.find('/'))
      slug.replace(k, 1, "_per_");
    std::replace(slug.begin(), slug.end(), ' ', '_');
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
