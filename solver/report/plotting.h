// Pictures are drawn by Python scripts (matplotlib) in scripts/.
#pragma once

#include <string>
#include <vector>

namespace lentus::report
{
  /// The Python interpreter used for pictures: $LENTUS_PYTHON, else
  /// /usr/bin/python3 (Debian's, where python3-matplotlib installs), else python3.
  std::string python_interpreter();

  /// Full path of scripts/<name>: from $LENTUS_SCRIPTS if set, else the source tree.
  std::string script_path(const std::string &name);

  /// True if the interpreter can import matplotlib.
  bool plotting_available();

  /// Runs `python script arguments...`; returns its exit status.
  int run_script(const std::string &name, const std::vector<std::string> &arguments);

  /// How to get pictures working, for messages.
  std::string plotting_install_hint();
} // namespace lentus::report
