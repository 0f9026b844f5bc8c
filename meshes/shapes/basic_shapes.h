// The simple shapes of the solver core: channel, pipe, annular gap, cavity.
#pragma once

#include "meshes/geometry.h"

namespace lentus::meshes
{
  std::vector<ShapeInfo> basic_shapes();
} // namespace lentus::meshes
