#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/tensor.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/grid/grid_tools.h>

#include <string>
#include <utility>
#include <vector>

namespace nappe
{
  /**
   * The reference (flat) domain of the sheet and its mesh. Boundary ids:
   *  - rectangle [0, Lx]×[0, Ly]: 0 left, 1 right, 2 bottom, 3 top;
   *  - rhombus spanned by a1 = (a, 0) and a2 = (a/2, a√3/2) (the unit cell of a hexagonal
   *    array): 0 and 1 the edges parallel to a2, 2 and 3 those parallel to a1;
   *  - disk of radius R centred at the origin: 0;
   *  - mesh file: the physical line tags of a Gmsh quadrilateral mesh (see meshes/README.md).
   * A periodic domain identifies 0 with 1 and 2 with 3 (rectangle, rhombus and mesh file).
   *
   * A mesh file (Gmsh .msh, ASCII format 2.2 or 4.1, quadrilaterals only) is read with deal.II's
   * GridIn and scaled by mesh_scale. Its boundary stays polygonal under refinement (no curved
   * manifold is attached), so a curved edge must be resolved by the file's own boundary nodes.
   * For a periodic mesh file the opposite edges 0/1 and 2/3 must match node for node (Gmsh
   * `Periodic Curve`); the lattice vectors are taken from the mesh: a1 = c₁ − c₀ and a2 = c₃ − c₂,
   * where c_i is the length-weighted centroid of the edges with boundary id i. This gives the
   * translation that maps edge 0 onto edge 1 for any parallelogram cell (square, rectangle, rhombus).
   * Geometric queries on a mesh-file domain (area, center, lattice vectors, bounding box, boundary
   * ids) read the file once and cache the result per (path, scale, modification time).
   */
  struct SheetDomain
  {
    enum class Shape
    {
      rectangle,
      rhombus,
      disk,
      mesh_file
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
    /// Gmsh mesh (Shape::mesh_file): path, absolute or relative to the working directory.
    std::string mesh_file;
    /// Metres per mesh unit (Shape::mesh_file); the coordinates in the file are multiplied by it [m].
    double mesh_scale = 1.0;

    /// The two lattice vectors of a periodic cell [m]. For a mesh file see the class comment; a
    /// non-periodic mesh file (or one without the ids 0..3) gives the bounding box sides along x and y.
    std::pair<dealii::Tensor<1, 2>, dealii::Tensor<1, 2>> lattice_vectors() const;
    /// Area of the flat domain [m²]; for a mesh file the sum of its (scaled) cell measures.
    double area() const;
    /// A point in the middle of the domain, a mesh vertex after one refinement; for a mesh file
    /// the area centroid of its cells (not necessarily a vertex) [m].
    dealii::Point<2> center() const;
    /// Lower-left and upper-right corners of the axis-aligned box around the flat domain [m].
    std::pair<dealii::Point<2>, dealii::Point<2>> bounding_box() const;
    /// The boundary ids of the domain's non-periodic edges (a periodic cell's 0..3 excluded), sorted.
    std::vector<dealii::types::boundary_id> boundary_ids() const;
    /// "rectangle", "rhombus", "disk" or "mesh file".
    static Shape parse_shape(const std::string &name);
  };

  /**
   * Builds the mesh of @p domain into the (empty) triangulation, with periodicity registered.
   * A mesh file is read on every rank (p4est needs the whole coarse mesh everywhere); throws
   * with the file's name if it is missing, unreadable, not all quadrilaterals, or if its
   * periodic edges do not match.
   */
  void make_sheet_mesh(dealii::parallel::distributed::Triangulation<2> &tria, const SheetDomain &domain);

  /// The periodic face pairs of @p tria's coarse mesh as deal.II collects them (empty if not periodic).
  std::vector<dealii::GridTools::PeriodicFacePair<
    typename dealii::parallel::distributed::Triangulation<2>::cell_iterator>>
  collect_periodic_pairs(dealii::parallel::distributed::Triangulation<2> &tria, const SheetDomain &domain);
} // namespace nappe
