// Parsing a sweep file given as text against the Carreau pipe verification case, for the sweep
// unit tests.
#pragma once

#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/sweep/sweep_file.h"

#include <string>
#include <vector>

namespace lentus::testing
{
  inline const std::string sweep_base_case =
    std::string(LENTUS_SOURCE_DIR) + "/tests/verification/cases/carreau_pipe.prm";

  /// The plan of `text` after a `base case` line naming sweep_base_case, with `sets` (--set).
  inline sweep::SweepPlan parse_sweep(const std::string &text, const std::vector<std::string> &sets = {})
  {
    sweep::SweepSettings settings;
    settings.sets = sets;
    return sweep::parse_sweep_file("base case = " + sweep_base_case + "\n" + text, "test.sweep", settings,
                                   input::case_schema());
  }

  /// The InputError message of parse_sweep(text), or "(no error)".
  inline std::string sweep_error_of(const std::string &text)
  {
    try
      {
        parse_sweep(text);
      }
    catch (const InputError &error)
      {
        return error.what();
      }
    return "(no error)";
  }
} // namespace lentus::testing
