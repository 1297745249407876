// Circular drum: the disk of radius 1 centred at the origin (mesh units), unstructured
// quadrilaterals. Boundary id 0 on the circle. The boundary is polygonal in nappe (no curved
// manifold), so the circle is resolved here: about 84 boundary edges.
// Regenerate: gmsh -2 -format msh22 drum.geo
h = 0.15; // target cell size before the all-quad subdivision, which halves it [mesh units]

Point(1) = {0, 0, 0, h};
Point(2) = {1, 0, 0, h};
Point(3) = {0, 1, 0, h};
Point(4) = {-1, 0, 0, h};
Point(5) = {0, -1, 0, h};
Circle(1) = {2, 1, 3};
Circle(2) = {3, 1, 4};
Circle(3) = {4, 1, 5};
Circle(4) = {5, 1, 2};
Curve Loop(1) = {1, 2, 3, 4};
Plane Surface(1) = {1};

Physical Curve(0) = {1, 2, 3, 4};
Physical Surface(1) = {1};

Recombine Surface {1};
Mesh.Algorithm = 6;              // Frontal-Delaunay
Mesh.RecombinationAlgorithm = 3; // Blossom full-quad
Mesh.SubdivisionAlgorithm = 1;   // split any remaining triangle: all cells are quads
Mesh.ElementOrder = 1;
