// Die shapes: the axisymmetric round die and the planar flat-sheet slit die.
#pragma once

#include "meshes/geometry.h"

namespace lentus::meshes
{
  ShapeInfo round_die_shape();
  ShapeInfo slit_die_shape();
} // namespace lentus::meshes
