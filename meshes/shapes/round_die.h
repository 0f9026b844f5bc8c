// The axisymmetric round die shape.
#pragma once

#include "meshes/geometry.h"

namespace lentus::meshes
{
  ShapeInfo round_die_shape();
} // namespace lentus::meshes
