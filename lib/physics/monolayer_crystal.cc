#include <deal.II/base/exceptions.h>

#include <nappe/physics/monolayer_crystal.h>

#include <cmath>

namespace nappe
{
  std::string lattice_type_name(LatticeType type)
  {
    switch (type)
      {
        case LatticeType::honeycomb:
          return "honeycomb";
        case LatticeType::binary_honeycomb:
          return "binary honeycomb";
        case LatticeType::trigonal_prismatic:
          return "1H dichalcogenide";
        case LatticeType::none:
          break;
      }
    return "none";
  }

  LatticeType parse_lattice_type(const std::string &name)
  {
    for (const LatticeType t : {LatticeType::none, LatticeType::honeycomb, LatticeType::binary_honeycomb,
                                LatticeType::trigonal_prismatic})
      if (lattice_type_name(t) == name)
        return t;
    AssertThrow(false, dealii::ExcMessage("lattice type '" + name +
                                          "' is unknown; expected none, honeycomb, binary honeycomb or "
                                          "1H dichalcogenide."));
    return LatticeType::none;
  }

  double MonolayerLattice::bond_length() const { return lattice_constant / std::sqrt(3.0); }

  std::pair<dealii::Tensor<1, 2>, dealii::Tensor<1, 2>> MonolayerLattice::primitive_vectors() const
  {
    const double c = std::cos(orientation), s = std::sin(orientation), a = lattice_constant;
    dealii::Tensor<1, 2> a1, a2;
    a1[0] = a * c;
    a1[1] = a * s;
    // a₂ = a(1/2, √3/2) in the lattice frame, rotated by θ.
    const double x = 0.5 * a, y = 0.5 * std::sqrt(3.0) * a;
    a2[0] = c * x - s * y;
    a2[1] = s * x + c * y;
    return {a1, a2};
  }

  std::pair<double, double> MonolayerLattice::sublattice_offset(int s)
  {
    return s == 0 ? std::pair<double, double>{0.0, 0.0} : std::pair<double, double>{1.0 / 3.0, 1.0 / 3.0};
  }

  std::vector<LatticeSite> MonolayerLattice::basis() const
  {
    switch (type)
      {
        case LatticeType::honeycomb:
        case LatticeType::binary_honeycomb:
          return {{species_a, 0, 0.0}, {species_b, 1, 0.0}};
        case LatticeType::trigonal_prismatic:
          return {{species_a, 0, 0.0}, {species_b, 1, -chalcogen_height}, {species_b, 1, chalcogen_height}};
        case LatticeType::none:
          break;
      }
    return {};
  }
} // namespace nappe
