// Pipe of radius 1 and length 1 in the meridional plane (x = r, y = z), meshed with
// unstructured quadrilaterals. Written by  gmsh -2 -format msh41 pipe.geo -o pipe.msh
size = 0.25;
Point(1) = {0, 0, 0, size};
Point(2) = {1, 0, 0, size};
Point(3) = {1, 1, 0, size};
Point(4) = {0, 1, 0, size};
Line(1) = {1, 2};
Line(2) = {2, 3};
Line(3) = {3, 4};
Line(4) = {4, 1};
Curve Loop(1) = {1, 2, 3, 4};
Plane Surface(1) = {1};
Mesh.Algorithm = 6;
Mesh.RecombineAll = 1;
Physical Curve("inlet") = {1};
Physical Curve("wall") = {2};
Physical Curve("outlet") = {3};
Physical Curve("axis") = {4};
Physical Surface("melt") = {1};
