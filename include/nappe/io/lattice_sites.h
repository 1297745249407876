#pragma once

#include <deal.II/base/mpi.h>
#include <deal.II/base/point.h>
#include <deal.II/base/symmetric_tensor.h>
#include <deal.II/base/tensor.h>

#include <nappe/physics/monolayer_crystal.h>

#include <array>
#include <cstdint>
#include <vector>

namespace nappe
{
  /**
   * The supercell of a monolayer lattice nearest to a periodic sheet cell (L₁, L₂): integers n with
   * L_i ≈ n_i1 a₁ + n_i2 a₂ (rounded lattice coordinates of L_i), and the homogeneous deformation F
   * that makes the lattice fit exactly, F (n_i1 a₁ + n_i2 a₂) = L_i. The residual strain
   * ½(FᵀF − I) is what the exported atoms carry beyond the solved strain field.
   */
  struct CommensurateCell
  {
    std::array<std::array<long long, 2>, 2> n{}; ///< n[i][k]: coordinate of L_i along a_k
    dealii::Tensor<2, 2>          deformation;   ///< F [-]
    dealii::SymmetricTensor<2, 2> residual_strain; ///< ½(FᵀF − I) [-]

    /// Number of primitive cells in the supercell, |det n| (0 if L₁ and L₂ round to parallel vectors).
    long long n_primitive_cells() const;
    /// Largest |principal value| of the residual strain [-].
    double largest_residual_strain() const;
  };

  /// The nearest commensurate supercell of @p lattice (at its orientation) for the cell (@p L1, @p L2) [m].
  CommensurateCell nearest_commensurate_cell(const MonolayerLattice &lattice, const dealii::Tensor<1, 2> &L1,
                                             const dealii::Tensor<1, 2> &L2);

  /// Reference (undeformed, flat) atom sites: in-plane position X [m] and the index of the site in lattice.basis().
  struct LatticeSites
  {
    std::vector<dealii::Point<2>> positions;
    std::vector<std::uint8_t>     basis_index;

    std::size_t size() const { return positions.size(); }
  };

  /**
   * This rank's share of the atoms of one periodic cell with corner at the origin: every site whose
   * lattice coordinates with respect to (L₁, L₂) lie in [0, 1)², decided in exact integer arithmetic so
   * that no atom is duplicated across cell edges. The lattice is deformed by cell.deformation to fit.
   * Shares are contiguous in a fixed order (rows of a₁, then a₂, then basis), so concatenating the
   * ranks' shares in rank order gives the same list on any number of ranks; the total is
   * n_primitive_cells() × basis size.
   */
  LatticeSites periodic_cell_sites(const MonolayerLattice &lattice, const CommensurateCell &cell, MPI_Comm comm);

  /**
   * This rank's share of the atoms of the undeformed lattice (origin at x = 0) inside the polygon
   * @p region (vertices in order [m], even–odd rule; a box is a 4-vertex polygon), in the same fixed
   * order as periodic_cell_sites().
   */
  LatticeSites region_sites(const MonolayerLattice &lattice, const std::vector<dealii::Point<2>> &region,
                            MPI_Comm comm);

  /// Whether @p p lies inside the polygon @p polygon (even–odd rule).
  bool inside_polygon(const std::vector<dealii::Point<2>> &polygon, const dealii::Point<2> &p);
} // namespace nappe
