#include "solver/report/plotting.h"

#include "solver/version.h"

#include <cstdlib>
#include <filesystem>
#include <sys/wait.h>

namespace lentus::report
{
  namespace
  {
    std::string quoted(const std::string &word)
    {
      std::string result = "'";
      for (const char c : word)
        result += c == '\'' ? std::string("'\\''") : std::string(1, c);
      return result + "'";
    }
  } // namespace

  std::string python_interpreter()
  {
    if (const char *chosen = std::getenv("LENTUS_PYTHON"); chosen && *chosen)
      return chosen;
    if (std::filesystem::exists("/usr/bin/python3"))
      return "/usr/bin/python3";
    return "python3";
  }

  std::string script_path(const std::string &name)
  {
    if (const char *folder = std::getenv("LENTUS_SCRIPTS"); folder && *folder)
      return (std::filesystem::path(folder) / name).string();
    return (std::filesystem::path(source_dir) / "scripts" / name).string();
  }

  bool plotting_available()
  {
    const std::string command = quoted(python_interpreter()) + " -c 'import matplotlib' > /dev/null 2>&1";
    return std::system(command.c_str()) == 0;
  }

  int run_script(const std::string &name, const std::vector<std::string> &arguments)
  {
    std::string command = quoted(python_interpreter()) + " " + quoted(script_path(name));
    for (const std::string &argument : arguments)
      command += " " + quoted(argument);
    const int status = std::system(command.c_str());
    return WIFEXITED(status) ? WEXITSTATUS(status) : 1;
  }

  std::string plotting_install_hint()
  {
    return "pictures need Python 3 with matplotlib: run scripts/setup, or apt-get install python3-matplotlib "
           "(or point LENTUS_PYTHON at a Python that has it)";
  }
} // namespace lentus::report
