// Stirred-vessel shapes: the axisymmetric vessel with a disk impeller on a shaft and
// the planar cross-section of a vessel with a bladed impeller.
#pragma once

#include "meshes/geometry.h"

namespace lentus::meshes
{
  ShapeInfo disk_impeller_vessel_shape();
  ShapeInfo bladed_impeller_vessel_shape();
} // namespace lentus::meshes
