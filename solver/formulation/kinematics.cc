#include "solver/formulation/kinematics.h"

namespace lentus
{
  std::string to_string(const FormulationKind kind)
  {
    switch (kind)
      {
        case FormulationKind::planar:
          return "planar";
        case FormulationKind::axisymmetric:
          return "axisymmetric";
        case FormulationKind::swirl:
          return "axisymmetric with swirl";
      }
    return "";
  }
} // namespace lentus
