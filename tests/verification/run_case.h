// Runs a case given as text and returns its design numbers.
#pragma once

#include "solver/flow/flow_run.h"
#include "solver/input/case_file.h"
#include "solver/input/case_schema.h"
#include "solver/input/flow_case.h"

#include <string>

namespace lentus::testing
{
  /// Solves `text` (a case file) with its output in build/tests/verification/out/<name>.
  inline flow::RunResult run_case(const std::string &name, const std::string &text)
  {
    const input::CaseFile file = input::CaseFile::parse(text, name + ".prm", input::case_schema(),
                                                        {"Output/Folder=verification_out/" + name});
    return flow::run_flow_case(input::read_flow_case(file), MPI_COMM_WORLD);
  }
} // namespace lentus::testing
