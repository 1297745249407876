#pragma once

#include <deal.II/base/symmetric_tensor.h>
#include <deal.II/base/tensor.h>

#include <nappe/physics/monolayer_crystal.h>
#include <nappe/physics/sheet_material.h>

/**
 * @file First-order continuum estimates of what a strain field does to a monolayer's electrons.
 * Pure pointwise functions of the membrane strain ε (a point state's `strain`) and its gradient
 * (strain_gradient.h), in SI. They are estimates to confirm with electronic-structure calculations
 * and measurement, not band structures.
 *
 * Pseudo-gauge field of a honeycomb lattice (graphene; hBN if β is known). With the zigzag direction
 * along x the strain-induced vector potential of valley K is
 *   A = (ħβ/(2ed)) (ε_xx − ε_yy, −2ε_xy),
 * d = a/√3 the nearest-neighbour distance and β = −∂ln t/∂ln d (Vozmediano, Katsnelson & Guinea,
 * Phys. Rep. 496, 109 (2010); Guinea, Katsnelson & Geim, Nature Physics 6, 30 (2010); prefactor
 * convention from memory, fixed here so that the triaxial field below is −4ħβu₀/(ed)). For a lattice
 * whose zigzag direction makes the angle θ with x, rotating the strain into the lattice frame and A back
 * gives, with complex notation,
 *   A_x + iA_y = (ħβ/(2ed)) e^{3iθ} (ε_xx − ε_yy − 2iε_xy),
 * so θ → θ + 60° flips the sign and θ → θ + 120° leaves A unchanged. The pseudo-magnetic field is
 * B = ∂_x A_y − ∂_y A_x; valley K′ has −A and −B (time reversal), so |B| is valley independent.
 * ε_xy is the tensor shear (half the engineering shear).
 *
 * Scalar deformation potential: V = g·(ε_xx + ε_yy) (Suzuura & Ando, Phys. Rev. B 65, 235412 (2002),
 * from memory; screened g from first-principles work-function shifts, Choi, Jhi & Son, Phys. Rev. B 81,
 * 081407(R) (2010)).
 *
 * Optical gap shift of a semiconducting monolayer, trace-only model calibrated on the biaxial value:
 *   ΔE = κ_b · (ε_xx + ε_yy)/2,
 * κ_b the measured shift per unit equibiaxial strain (ε along each axis), so an equibiaxial strain
 * reproduces κ_b exactly. Why only the trace: at the K point of a 1H dichalcogenide (point group
 * C3h) the traceless (shear) part of the strain transforms like an in-plane vector pair and cannot shift
 * a non-degenerate band edge to first order (a group-theory argument; used in k·p theories of strained
 * TMDs, e.g. Rostami et al., Phys. Rev. B 92, 195402 (2015), from memory). The model predicts for a
 * uniaxial strain ε with transverse strain −ν_t ε the coefficient κ_b(1 − ν_t)/2; docs/electronics.md
 * compares that with the measured uniaxial value.
 */
namespace nappe
{
  /// What the pseudo-gauge field of a honeycomb lattice needs: β, the bond length d and the orientation θ.
  struct PseudoGaugeCoupling
  {
    double hopping_decay = 0.0; ///< β [-]
    double bond_length   = 0.0; ///< d [m]
    double orientation   = 0.0; ///< θ [rad]

    /// ħβ/(2ed) [T m = Wb/m].
    double prefactor() const;

    /// From a sheet material; throws, naming the material and the missing entry, if it has no honeycomb
    /// lattice or no published β.
    static PseudoGaugeCoupling of(const SheetMaterial &material);
  };

  /// Strain-induced vector potential of valley K [T m]; valley K′ has the opposite sign.
  dealii::Tensor<1, 2> pseudo_vector_potential(const dealii::SymmetricTensor<2, 2> &strain,
                                               const PseudoGaugeCoupling &coupling);

  /// Pseudo-magnetic field B = ∂_x A_y − ∂_y A_x of valley K [T] from the strain gradient
  /// g[i][j][k] = ∂ε_ij/∂x_k [1/m]; valley K′ has −B.
  double pseudo_magnetic_field(const dealii::Tensor<3, 2> &strain_gradient, const PseudoGaugeCoupling &coupling);

  /// Scalar deformation potential V = g·tr ε [J] for a deformation-potential constant @p g [J].
  double deformation_potential(const dealii::SymmetricTensor<2, 2> &strain, double g);

  /// Optical gap shift ΔE = κ_b·tr ε/2 [J] (trace-only model calibrated on the biaxial coefficient).
  double band_gap_shift(const dealii::SymmetricTensor<2, 2> &strain, const GapStrainCoefficient &biaxial);

  /// The model's coefficient dE/dε [J] for a uniaxial strain ε with transverse strain −ν_t·ε.
  double trace_model_uniaxial_coefficient(const GapStrainCoefficient &biaxial, double transverse_ratio);

  /// Throws, naming the material and the missing catalogue entry, unless @p material has a deformation potential.
  double deformation_potential_constant(const SheetMaterial &material);

  /// Throws, naming the material and the missing catalogue entry, unless @p material has a biaxial gap coefficient.
  const GapStrainCoefficient &biaxial_gap_coefficient(const SheetMaterial &material);
} // namespace nappe
