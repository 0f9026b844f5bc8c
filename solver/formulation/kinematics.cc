#include "solver/formulation/formulation.h"
#include "solver/formulation/kinematics.h"

namespace lentus
{
  const char *velocity_components(const FormulationKind kind)
  {
    switch (kind)
      {
        case FormulationKind::planar:
          return "x y";
        case FormulationKind::axisymmetric:
          return "r z";
        case FormulationKind::swirl:
          return "r z theta";
      }
    return "";
  }
} // namespace lentus
