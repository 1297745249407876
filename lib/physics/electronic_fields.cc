#include <deal.II/base/exceptions.h>

#include <nappe/base/physical_constants.h>
#include <nappe/physics/electronic_fields.h>

#include <cmath>

namespace nappe
{
  namespace
  {
    [[noreturn]] void missing(const SheetMaterial &m, const std::string &entry, const std::string &what)
    {
      AssertThrow(false, dealii::ExcMessage("material '" + m.name + "' has no " + what +
                                            " (catalogue entry Materials/" + m.name + "/" + entry +
                                            " is 0 = unknown); give a published value or leave this field out."));
      throw;
    }
  } // namespace

  double PseudoGaugeCoupling::prefactor() const
  {
    return constants::hbar_over_e * hopping_decay / (2.0 * bond_length);
  }

  PseudoGaugeCoupling PseudoGaugeCoupling::of(const SheetMaterial &m)
  {
    const auto &lattice = m.lattice;
    if (lattice.type != LatticeType::honeycomb && lattice.type != LatticeType::binary_honeycomb)
      missing(m, "Lattice/Type", "honeycomb lattice (the pseudo-gauge field is defined for honeycomb lattices)");
    if (!(m.electronic.hopping_decay > 0.0))
      missing(m, "Electronic/Hopping decay beta", "published hopping decay β = −∂ln t/∂ln d");
    return {m.electronic.hopping_decay, lattice.bond_length(), lattice.orientation};
  }

  dealii::Tensor<1, 2> pseudo_vector_potential(const dealii::SymmetricTensor<2, 2> &e, const PseudoGaugeCoupling &c)
  {
    // A_x + iA_y = c e^{3iθ}(d − is), d = ε_xx − ε_yy, s = 2ε_xy.
    const double C = std::cos(3.0 * c.orientation), S = std::sin(3.0 * c.orientation);
    const double d = e[0][0] - e[1][1], s = 2.0 * e[0][1], k = c.prefactor();
    dealii::Tensor<1, 2> A;
    A[0] = k * (C * d + S * s);
    A[1] = k * (S * d - C * s);
    return A;
  }

  double pseudo_magnetic_field(const dealii::Tensor<3, 2> &g, const PseudoGaugeCoupling &c)
  {
    // Differentiating A above: B = c[S ∂_x d − C ∂_x s − C ∂_y d − S ∂_y s].
    const double C = std::cos(3.0 * c.orientation), S = std::sin(3.0 * c.orientation);
    const double d_x = g[0][0][0] - g[1][1][0], d_y = g[0][0][1] - g[1][1][1];
    const double s_x = 2.0 * g[0][1][0], s_y = 2.0 * g[0][1][1];
    return c.prefactor() * (S * d_x - C * s_x - C * d_y - S * s_y);
  }

  double deformation_potential(const dealii::SymmetricTensor<2, 2> &strain, double g)
  {
    return g * dealii::trace(strain);
  }

  double band_gap_shift(const dealii::SymmetricTensor<2, 2> &strain, const GapStrainCoefficient &biaxial)
  {
    return 0.5 * biaxial.value * dealii::trace(strain);
  }

  double trace_model_uniaxial_coefficient(const GapStrainCoefficient &biaxial, double transverse_ratio)
  {
    return 0.5 * biaxial.value * (1.0 - transverse_ratio);
  }

  double deformation_potential_constant(const SheetMaterial &m)
  {
    if (m.electronic.deformation_potential == 0.0)
      missing(m, "Electronic/Deformation potential", "published deformation potential g");
    return m.electronic.deformation_potential;
  }

  const GapStrainCoefficient &biaxial_gap_coefficient(const SheetMaterial &m)
  {
    if (!m.electronic.biaxial_gap.known())
      missing(m, "Electronic/Biaxial gap coefficient", "published biaxial band-gap strain coefficient");
    return m.electronic.biaxial_gap;
  }
} // namespace nappe
