// Rhombic unit cell of a hexagonal array with lattice constant 1 (mesh units), spanned by
// a1 = (1, 0) and a2 = (1/2, √3/2); unstructured quadrilaterals. Opposite edges are meshed node
// for node (Periodic Curve). Boundary ids as in nappe's sheet_domain.h: 0 and 1 the edges
// parallel to a2 (0 through the origin), 2 and 3 those parallel to a1 (2 through the origin).
// Regenerate: gmsh -2 -format msh22 rhombic_cell.geo
h = 0.25; // target cell size before the all-quad subdivision, which halves it [mesh units]
s = Sqrt(3) / 2;

Point(1) = {0, 0, 0, h};
Point(2) = {1, 0, 0, h};
Point(3) = {1.5, s, 0, h};
Point(4) = {0.5, s, 0, h};
Line(1) = {1, 2}; // id 2
Line(2) = {2, 3}; // id 1
Line(3) = {4, 3}; // id 3 (same direction as line 1)
Line(4) = {1, 4}; // id 0 (same direction as line 2)
Curve Loop(1) = {1, 2, -3, -4};
Plane Surface(1) = {1};

Periodic Curve {2} = {4} Translate {1, 0, 0};
Periodic Curve {3} = {1} Translate {0.5, s, 0};

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
