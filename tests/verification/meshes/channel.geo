// Straight channel, length 2 and height 1 (mesh units), meshed with unstructured
// quadrilaterals (frontal-Delaunay triangles recombined into quadrilaterals), so that cells are neither
// rectangles nor aligned with the flow. Written by
//   gmsh -2 -format msh22 channel.geo -o channel_msh22.msh
//   gmsh -2 -format msh41 channel.geo -o channel_msh41.msh
size = 0.3;
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
Mesh.Algorithm = 6;
Mesh.RecombineAll = 1;
Physical Curve("inlet") = {4};
Physical Curve("outlet") = {2};
Physical Curve("bottom wall") = {1};
Physical Curve("top wall") = {3};
Physical Surface("fluid") = {1};
