// The complete case-file schema: every section and key Lentus reads.
#pragma once

#include "solver/input/case_file.h"

namespace lentus::input
{
  /// Every section and key of a case file, declared by their owners.
  const CaseSchema &case_schema();
} // namespace lentus::input
