// Backward-facing step of a planar channel (an invented demo: a cream filling passing a
// step in a depositor's feed channel). Upstream channel 5 mm high and 20 mm long, then a
// 5 mm step down into a 10 mm high channel, 100 mm long. Lengths in mm: the case sets
// Geometry/Gmsh mesh/Scale = 0.001. Quadrilaterals from transfinite, recombined surfaces.
// Written to demo_step.msh by:  gmsh -2 -format msh22 demo_step.geo -o demo_step.msh
step = 5;       // step height = upstream channel height [mm]
height = 10;    // downstream channel height [mm]
upstream = 20;  // upstream channel length [mm]
downstream = 100;
across = 5;     // nodes across each 5 mm layer
along = 9;      // nodes along the upstream channel
after = 25;     // nodes along the downstream channel, closer near the step
grading = 1.08;

Point(1) = {0, step, 0};
Point(2) = {upstream, step, 0};
Point(3) = {upstream, height, 0};
Point(4) = {0, height, 0};
Point(5) = {upstream, 0, 0};
Point(6) = {upstream + downstream, 0, 0};
Point(7) = {upstream + downstream, step, 0};
Point(8) = {upstream + downstream, height, 0};

Line(1) = {1, 2};   // upstream bottom wall
Line(2) = {2, 3};   // between the upstream channel and the upper downstream block
Line(3) = {3, 4};   // upstream top wall
Line(4) = {4, 1};   // inlet
Line(5) = {2, 7};   // between the two downstream blocks
Line(6) = {7, 8};   // outlet, upper half
Line(7) = {3, 8};   // downstream top wall
Line(8) = {5, 6};   // downstream bottom wall
Line(9) = {6, 7};   // outlet, lower half
Line(10) = {2, 5};  // step face

Curve Loop(1) = {1, 2, 3, 4};
Plane Surface(1) = {1};
Curve Loop(2) = {5, 6, -7, -2};
Plane Surface(2) = {2};
Curve Loop(3) = {8, 9, -5, 10};
Plane Surface(3) = {3};

Transfinite Curve{2, 4, 6, 9, 10} = across;
Transfinite Curve{1, 3} = along;
Transfinite Curve{5, 7, 8} = after Using Progression grading;
Transfinite Surface{1, 2, 3};
Recombine Surface{1, 2, 3};

Physical Curve("inlet") = {4};
Physical Curve("outlet") = {6, 9};
Physical Curve("wall") = {1, 3, 7, 8, 10};
Physical Surface("upstream channel") = {1};
Physical Surface("downstream channel") = {2, 3};
