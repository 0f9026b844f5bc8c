#include "solver/flow/flow_pictures.h"

#include "solver/report/plotting.h"

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <system_error>

namespace lentus::flow
{
  namespace
  {
    const char *script_name = "draw_case.py";

    /// This program's own path (Linux), or empty.
    std::filesystem::path executable_path()
    {
      std::error_code error;
      const std::filesystem::path path = std::filesystem::read_symlink("/proc/self/exe", error);
      return error ? std::filesystem::path() : path;
    }

    /// $LENTUS_SCRIPTS/draw_case.py, else build/lentus -> ../scripts/draw_case.py, else the source tree's.
    std::filesystem::path drawing_script(const std::filesystem::path &executable)
    {
      if (const char *folder = std::getenv("LENTUS_SCRIPTS"); folder && *folder)
        return std::filesystem::path(folder) / script_name;
      if (!executable.empty())
        {
          const std::filesystem::path beside = executable.parent_path().parent_path() / "scripts" / script_name;
          if (std::filesystem::exists(beside))
            return beside;
        }
      return report::script_path(script_name);
    }

    void warn(const std::string &text)
    {
      std::fprintf(stderr, "lentus: warning: %s\n", text.c_str());
      std::fflush(stderr);
    }
  } // namespace

  bool draw_pictures(const std::string &folder)
  {
    std::fflush(stdout);
    const std::filesystem::path executable = executable_path();
    const std::filesystem::path script     = drawing_script(executable);
    if (!std::filesystem::exists(script))
      {
        warn("no pictures: the drawing script " + script.string() + " is missing; the results are complete without "
             "them");
        return false;
      }
    // The script evaluates the flow curve with this very program.
    if (!executable.empty())
      setenv("LENTUS_EXECUTABLE", executable.c_str(), 1);
    // An absolute script path: report::script_path leaves it as it is.
    const int status = report::run_script(std::filesystem::absolute(script).string(), {folder});
    const std::string unchanged = "; the results in " + folder + " are complete without pictures";
    if (status == 127)
      warn("no pictures: cannot start Python (" + report::python_interpreter() + "); " +
           report::plotting_install_hint() + unchanged);
    else if (status == 4)
      warn("no pictures: " + report::plotting_install_hint() + unchanged);
    else if (status == 1)
      warn("some pictures could not be drawn (see the messages above and report.html)");
    else if (status != 0)
      warn("drawing the pictures failed (" + script.string() + " exited with " + std::to_string(status) + ")" +
           unchanged);
    if (status == 0 || status == 1)
      std::printf("Report: %s\n", (std::filesystem::path(folder) / "report.html").c_str());
    std::fflush(stdout);
    return status == 0;
  }
} // namespace lentus::flow
