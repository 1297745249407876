#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/tensor.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/grid/grid_tools.h>

#include <string>
#include <vector>

namespace nappe
{
  /**
   * The reference (flat) domain of the sheet and its mesh. Boundary ids:
   *  - rectangle [0, Lx]×[0, Ly]: 0 left, 1 right, 2 bottom, 3 top;
   *  - rhombus spanned by a1 = (a, 0) and a2 = (a/2, a√3/2) (the unit cell of a hexagonal
   *    array): 0 and 1 the edges parallel to a2, 2 and 3 those parallel to a1;
   *  - disk of radius R centred at the origin: 0.
   * A periodic domain identifies 0 with 1 and 2 with 3 (rectangle and rhombus only).
   */
  struct SheetDomain
  {
    enum class Shape
    {
      rectangle,
      rhombus,
      disk
    };

    Shape  shape    = Shape::rectangle;
    double length_x = 1.0; ///< rectangle side along x, or the rhombus lattice constant a [m]
    double length_y = 1.0; ///< rectangle side along y [m]
    double radius   = 1.0; ///< disk radius [m]
    /// Coarse cells along x and y (rectangle and rhombus), before global refinement.
    unsigned int coarse_cells_x = 1;
    unsigned int coarse_cells_y = 1;
    unsigned int global_refinements = 3;
    bool periodic = false;

    /// The two lattice vectors of a periodic cell [m].
    std::pair<dealii::Tensor<1, 2>, dealii::Tensor<1, 2>> lattice_vectors() const;
    /// Area of the flat domain [m²].
    double area() const;
    /// A point in the middle of the domain, a mesh vertex after one refinement.
    dealii::Point<2> center() const;
    /// "rectangle", "rhombus" or "disk".
    static Shape parse_shape(const std::string &name);
  };

  /// Builds the mesh of @p domain into the (empty) triangulation, with periodicity registered.
  void make_sheet_mesh(dealii::parallel::distributed::Triangulation<2> &tria, const SheetDomain &domain);

  /// The periodic face pairs of @p tria's coarse mesh as deal.II collects them (empty if not periodic).
  std::vector<dealii::GridTools::PeriodicFacePair<
    typename dealii::parallel::distributed::Triangulation<2>::cell_iterator>>
  collect_periodic_pairs(dealii::parallel::distributed::Triangulation<2> &tria, const SheetDomain &domain);
} // namespace nappe
