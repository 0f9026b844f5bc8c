// A straight stretch of a shape where the flow can become fully developed. Plain C++:
// the die numbers of solver/report use it without deal.II.
#pragma once

#include <string>

namespace lentus::meshes
{
  /// A straight stretch of a shape where the flow can become fully developed
  /// (a die's barrel or land), for developed-flow comparisons such as entrance losses.
  struct StraightSection
  {
    std::string name;   ///< e.g. "barrel", "land"
    bool        pipe;   ///< true: circular (radius), false: slit (half-gap)
    double      size;   ///< radius or half-gap [m]
    double      length; ///< [m]
    double      flow_fraction = 1.; ///< share of the section's flow the mesh carries (0.5: half a slit)
    double      inner = 0.; ///< circular only: radius of a concentric core (mandrel) [m], 0 for none
  };
} // namespace lentus::meshes
