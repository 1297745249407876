#pragma once

#include <string>

namespace nappe
{
  /**
   * Checks that @p filename is a Gmsh mesh that nappe can use, before deal.II's GridIn reads it (GridIn
   * trusts the file: a wrong count or a truncated file can make it read out of bounds or wait for input
   * forever, and several of its checks are compiled out of release builds). Accepted: the ASCII .msh
   * formats 2.2 (also 2.0, 2.1) and 4.1 as described in the Gmsh reference manual (C. Geuzaine and
   * J.-F. Remacle, "Gmsh: a 3-D finite element mesh generator with built-in pre- and post-processing
   * facilities", Int. J. Numer. Meth. Engng 79, 1309–1331 (2009); file format section of the manual), with
   * the sections in the order GridIn reads them ($MeshFormat, optional $PhysicalNames, optional $Entities
   * in 4.1, $Nodes, $Elements; anything after $EndElements is ignored, as GridIn does).
   *
   * Required of the content: every count matches the entries that follow, every number is a finite
   * decimal number and every tag a non-negative integer, element node lists refer to declared nodes, the
   * elements are first-order quadrilaterals (type 3) with boundary lines (type 1) and points (type 15)
   * only, at least one quadrilateral, each quadrilateral strictly convex with four different nodes (listed
   * either way round), no quadrilateral repeated, an edge shared by at most two quadrilaterals, and every
   * boundary line an edge on the mesh boundary.
   *
   * Throws one line naming the file, the line and what was expected; returns normally otherwise.
   */
  void check_gmsh_file(const std::string &filename);
} // namespace nappe
