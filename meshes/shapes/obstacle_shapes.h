// Verification shapes with a round obstacle: a cylinder in a planar channel and
// a sphere on the axis of a tube (axisymmetric).
#pragma once

#include "meshes/geometry.h"

namespace lentus::meshes
{
  ShapeInfo cylinder_in_channel_shape();
  ShapeInfo sphere_in_tube_shape();
} // namespace lentus::meshes
