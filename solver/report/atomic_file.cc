#include "solver/report/atomic_file.h"

#include <filesystem>
#include <fstream>
#include <stdexcept>
#include <unistd.h>

namespace lentus::report
{
  std::string temporary_name_for(const std::string &path)
  {
    const std::filesystem::path target(path);
    return (target.parent_path() / ("." + target.filename().string() + ".tmp-" + std::to_string(::getpid())))
      .string();
  }

  void rename_file(const std::string &from, const std::string &to)
  {
    std::error_code error;
    std::filesystem::rename(from, to, error);
    if (error)
      {
        std::filesystem::remove(from, error);
        throw std::runtime_error("cannot rename " + from + " to " + to + ": " + error.message());
      }
  }

  void write_file_atomically(const std::string &path, const std::string &content)
  {
    const std::string temporary = temporary_name_for(path);
    {
      std::ofstream output(temporary, std::ios::binary);
      output << content;
      output.close();
      if (!output)
        {
          std::error_code ignored;
          std::filesystem::remove(temporary, ignored);
          throw std::runtime_error("cannot write " + path);
        }
    }
    rename_file(temporary, path);
  }
} // namespace lentus::report
