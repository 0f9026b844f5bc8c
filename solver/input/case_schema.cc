#include "solver/input/case_schema.h"

#include "solver/input/flow_case.h"
#include "solver/input/fluid_section.h"

namespace lentus::input
{
  const CaseSchema &case_schema()
  {
    static const CaseSchema schema = [] {
      CaseSchema declared;
      declare_fluid(declared);
      declare_flow_case(declared);
      return declared;
    }();
    return schema;
  }
} // namespace lentus::input
