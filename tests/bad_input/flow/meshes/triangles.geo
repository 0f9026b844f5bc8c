// A channel meshed with triangles (no recombination): Lentus must refuse it and say how
// to get quadrilaterals. Written by  gmsh -2 -format msh22 triangles.geo -o triangles.msh
size = 0.5;
Point(1) = {0, 0, 0, size};
Point(2) = {2, 0, 0, size};
Point(3) = {2, 1, 0, size};
Point(4) = {0, 1, 0, size};
Line(1) = {1, 2};
Line(2) = {2, 3};
Line(3) = {3, 4};
Line(4) = {4, 1};
Curve Loop(1) = {1, 2, 3, 4};
Plane Surface(1) = {1};
Physical Curve("inlet") = {4};
Physical Curve("outlet") = {2};
Physical Curve("wall") = {1, 3};
Physical Surface("fluid") = {1};
