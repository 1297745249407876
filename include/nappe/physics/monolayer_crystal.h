#pragma once

#include <deal.II/base/tensor.h>

#include <string>
#include <utility>
#include <vector>

namespace nappe
{
  /// The atomic structure of a monolayer, as far as the electronic estimates and the lattice export need it.
  enum class LatticeType
  {
    none,              ///< no lattice data (a continuum sheet)
    honeycomb,         ///< two identical atoms per cell (graphene)
    binary_honeycomb,  ///< two different atoms per cell (hBN: B and N)
    trigonal_prismatic ///< 1H MX₂: metal M in the middle plane, chalcogen X above and below it
  };

  /// "none", "honeycomb", "binary honeycomb" or "1H dichalcogenide".
  std::string lattice_type_name(LatticeType type);
  /// The inverse of lattice_type_name(); throws naming the accepted spellings.
  LatticeType parse_lattice_type(const std::string &name);

  /// One atom of the primitive cell: species, in-plane position in lattice coordinates (f₁ a₁ + f₂ a₂)
  /// and height above the sheet's middle plane [m].
  struct LatticeSite
  {
    std::string species;
    int         sublattice = 0; ///< 0 (A: C, B, the metal) or 1 (B: C, N, the chalcogens)
    double      height     = 0.0;
  };

  /**
   * The hexagonal lattice of a monolayer and its orientation on the sheet.
   *
   * Lattice frame (x' along a zigzag direction): a₁ = a(1, 0), a₂ = a(1/2, √3/2); sublattice A at
   * the origin, sublattice B at (a₁ + a₂)/3, so the three nearest-neighbour bonds A→B point at 30°,
   * 150° and 270° from the zigzag direction and have the length d = a/√3. The sheet's frame is the
   * lattice frame rotated by θ (the angle from the x axis to that zigzag direction, counter-clockwise).
   * θ and θ + 60° describe the same honeycomb with the sublattices exchanged; θ + 120° is the same
   * lattice. For a 1H dichalcogenide the metal sits on A and both chalcogens on B, at ±h.
   */
  struct MonolayerLattice
  {
    LatticeType type = LatticeType::none;
    /// Lattice constant a = |a₁| [m].
    double lattice_constant = 0.0;
    /// Height h of each chalcogen plane above/below the metal plane (1H dichalcogenides) [m].
    double chalcogen_height = 0.0;
    /// Species on sublattice A and B, e.g. "C", "C"; "B", "N"; "Mo", "S".
    std::string species_a, species_b;
    /// θ: angle from the x axis to the zigzag direction a₁ [rad] (a case input, 0 in the catalogue).
    double orientation = 0.0;

    bool defined() const { return type != LatticeType::none; }
    /// In-plane nearest-neighbour (A–B) distance d = a/√3 [m] (the C–C bond of graphene).
    double bond_length() const;
    /// a₁, a₂ in the sheet's frame (rotated by θ) [m].
    std::pair<dealii::Tensor<1, 2>, dealii::Tensor<1, 2>> primitive_vectors() const;
    /// The atoms of one primitive cell: 2 for honeycombs, 3 for a 1H dichalcogenide (A, then B below, B above).
    std::vector<LatticeSite> basis() const;
    /// In-plane lattice coordinates (f₁, f₂) of sublattice @p s: (0, 0) or (1/3, 1/3).
    static std::pair<double, double> sublattice_offset(int s);
  };

  /// A published coefficient of the optical band gap's strain dependence, with what it measures.
  struct GapStrainCoefficient
  {
    /// dE/dε [J per unit strain]; 0 means unknown. For biaxial strain ε is the strain along each axis.
    double value = 0.0;
    /// e.g. "measured optical A exciton (photoluminescence)" or "computed (DFT) direct gap at K".
    std::string kind;
    /// Authors, journal, volume, page, year.
    std::string source;

    bool known() const { return value != 0.0; }
  };

  /**
   * Electron–strain coupling constants of a monolayer (0 = unknown), each with its source.
   * Used by electronic_fields.h; the catalogue (share/materials.prm) holds the values.
   */
  struct ElectronicCoupling
  {
    /// β = −∂ln t/∂ln d of the nearest-neighbour hopping t of a honeycomb lattice [-].
    double hopping_decay = 0.0;
    std::string hopping_decay_source;
    /// Scalar deformation potential g in V = g·tr ε [J].
    double deformation_potential = 0.0;
    std::string deformation_potential_source;
    /// Optical gap change under equibiaxial strain (calibrates the gap-shift model).
    GapStrainCoefficient biaxial_gap;
    /// Optical gap change under uniaxial strain (reported for comparison only, not used by the model).
    GapStrainCoefficient uniaxial_gap;
  };
} // namespace nappe
