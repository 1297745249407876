// Rectangular flake [0, 4]×[0, 2] (mesh units) over a trench |x − 2| ≤ 0.5 running along y;
// cells are about 4× smaller over the trench (and its edges) than elsewhere. Quadrilaterals.
// Boundary ids as for nappe's rectangle: 0 left, 1 right, 2 bottom, 3 top.
// Regenerate: gmsh -2 -format msh22 trench_flake.geo
h_out = 0.4;   // cell size away from the trench, before the all-quad subdivision halves it
h_in  = 0.1;   // cell size over the trench, likewise
Lx = 4; Ly = 2; x0 = 1.5; x1 = 2.5; // flake and trench [mesh units]

Point(1) = {0, 0, 0, h_out};
Point(2) = {Lx, 0, 0, h_out};
Point(3) = {Lx, Ly, 0, h_out};
Point(4) = {0, Ly, 0, h_out};
Line(1) = {1, 2}; // bottom
Line(2) = {2, 3}; // right
Line(3) = {3, 4}; // top
Line(4) = {4, 1}; // left
Curve Loop(1) = {1, 2, 3, 4};
Plane Surface(1) = {1};

Field[1] = Box;
Field[1].VIn = h_in;
Field[1].VOut = h_out;
Field[1].XMin = x0 - 0.1;
Field[1].XMax = x1 + 0.1;
Field[1].YMin = -1;
Field[1].YMax = Ly + 1;
Field[1].Thickness = 0.5; // grade from h_in to h_out over this distance
Background Field = 1;
Mesh.MeshSizeExtendFromBoundary = 0;
Mesh.MeshSizeFromPoints = 0;

Physical Curve(0) = {4};
Physical Curve(1) = {2};
Physical Curve(2) = {1};
Physical Curve(3) = {3};
Physical Surface(1) = {1};

Recombine Surface {1};
Mesh.Algorithm = 6;              // Frontal-Delaunay
Mesh.RecombinationAlgorithm = 3; // Blossom full-quad
Mesh.SubdivisionAlgorithm = 1;   // split any remaining triangle: all cells are quads
Mesh.ElementOrder = 1;
