// The caution every output that can reach equipment carries, in one place.
#pragma once

namespace lentus::report
{
  /// The full caution, the same words as the README's.
  inline constexpr const char *caution =
    "Results are estimates from a model of an idealized fluid and geometry. Check them against measurements on "
    "the real material and equipment before relying on them. They never replace pressure-relief devices, the "
    "local pressure-equipment and machinery codes, or review by a licensed engineer. Die pressures and vessel "
    "loads feed equipment that can fail and hurt people.";
} // namespace lentus::report
