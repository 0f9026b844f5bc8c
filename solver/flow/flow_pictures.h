// Pictures and the one-page report of a finished case folder, drawn by
// scripts/draw_case.py (Python 3 with matplotlib) after `lentus run`.
#pragma once

#include <string>

namespace lentus::flow
{
  /// Draws the PNG pictures and report.html into the finished case folder `folder` with
  /// draw_case.py, found in $LENTUS_SCRIPTS, else in ../scripts/ beside the lentus
  /// executable, else in the source tree. Never fails the run: a missing Python or
  /// matplotlib, or a drawing failure, is printed as a warning (with how to install
  /// matplotlib) on standard error. Returns true if every picture and the report were drawn.
  /// Call on one rank only.
  bool draw_pictures(const std::string &folder);
} // namespace lentus::flow
