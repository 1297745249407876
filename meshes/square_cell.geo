// Square unit cell [0, 1]² of a periodic array (mesh units), unstructured quadrilaterals.
// Opposite edges are meshed node for node (Periodic Curve) so that deal.II can identify them.
// Boundary ids as in nappe's sheet_domain.h: 0 left, 1 right (parallel to a2 = (0, 1)),
// 2 bottom, 3 top (parallel to a1 = (1, 0)). Regenerate: gmsh -2 -format msh22 square_cell.geo
h = 0.25; // target cell size before the all-quad subdivision, which halves it [mesh units]

Point(1) = {0, 0, 0, h};
Point(2) = {1, 0, 0, h};
Point(3) = {1, 1, 0, h};
Point(4) = {0, 1, 0, h};
Line(1) = {1, 2}; // bottom
Line(2) = {2, 3}; // right
Line(3) = {4, 3}; // top (same direction as bottom)
Line(4) = {1, 4}; // left (same direction as right)
Curve Loop(1) = {1, 2, -3, -4};
Plane Surface(1) = {1};

Periodic Curve {2} = {4} Translate {1, 0, 0};
Periodic Curve {3} = {1} Translate {0, 1, 0};

Physical Curve(0) = {4};
Physical Curve(1) = {2};
Physical Curve(2) = {1};
Physical Curve(3) = {3};
Physical Surface(1) = {1};

Recombine Surface {1};
Mesh.Algorithm = 6;              // Frontal-Delaunay (8, "for quads", crashes in Gmsh 4.8.4 here)
Mesh.RecombinationAlgorithm = 3; // Blossom full-quad
Mesh.SubdivisionAlgorithm = 1;   // split any remaining triangle: all cells are quads
Mesh.ElementOrder = 1;
