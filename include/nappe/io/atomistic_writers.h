#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/tensor.h>

#include <array>
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

namespace nappe
{
  /**
   * Atoms with a cell and per-atom columns, as written to extended XYZ and CIF. SI inside (m);
   * the writers print Å. A column is a name that carries its unit ("strain_xx", "pseudo_magnetic_field_K_T", "deformation_potential_eV").
   */
  struct AtomTable
  {
    std::vector<std::string>        species_names; ///< chemical symbols; atoms refer to them by index
    std::vector<std::uint8_t>       species;       ///< per atom: index into species_names
    std::vector<dealii::Point<3>>   positions;     ///< per atom [m]
    std::vector<std::string>        column_names;  ///< per-atom real columns, e.g. "strain_xx", "pseudo_magnetic_field_K_T"
    std::vector<double>             columns;       ///< atom-major: columns[a * n_columns + k], in the named unit
    std::array<dealii::Tensor<1, 3>, 3> cell;      ///< cell vectors [m]
    std::array<bool, 3>             pbc{};         ///< periodic along each cell vector
    std::vector<std::pair<std::string, std::string>> info; ///< extra key=value pairs (no spaces in keys)

    std::size_t size() const { return positions.size(); }
    std::size_t n_columns() const { return column_names.size(); }
  };

  /**
   * Extended XYZ: the atom count, then one comment line with Lattice="…" (cell vectors in Å, row by row),
   * Properties=species:S:1:pos:R:3:<column>:R:1…, pbc="T T F" and the info pairs, then one line per atom
   * (symbol, x y z in Å, the columns). The format as read by general-purpose atomistic libraries
   * (e.g. ASE's extxyz reader). Written atomically.
   */
  void write_extended_xyz(const std::string &path, const AtomTable &atoms);

  /**
   * CIF 1.1 in space group P 1 (International Union of Crystallography, Hall, Allen & Brown,
   * Acta Cryst. A47, 655 (1991), from memory): cell lengths [Å] and angles [°] from the cell vectors,
   * one loop of unique labels, type symbols and fractional coordinates. Per-atom columns are not part
   * of the core dictionary and are left to the extended XYZ file. Written atomically.
   */
  void write_cif(const std::string &path, const AtomTable &atoms, const std::string &title);
} // namespace nappe
