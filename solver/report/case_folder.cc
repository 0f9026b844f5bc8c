#include "solver/report/case_folder.h"

#include "solver/errors.h"
#include "solver/report/atomic_file.h"

#include <filesystem>

namespace lentus::report
{
  CaseFolder::CaseFolder(const std::string &folder, const std::string &marker, const std::string &key,
                         MPI_Comm communicator)
    : target(folder)
    , partial(folder + ".partial")
    , comm(communicator)
  {
    int rank = 0;
    MPI_Comm_rank(comm, &rank);
    root = rank == 0;
    const std::filesystem::path path(folder);
    if (std::filesystem::exists(path) &&
        (!std::filesystem::is_directory(path) ||
         (!std::filesystem::is_empty(path) && !std::filesystem::exists(path / marker))))
      throw InputError(key + " = " + folder + ": exists and is not a Lentus results folder (no " + marker +
                       "); it would be replaced; allowed: a new folder, or one that Lentus wrote");
    if (root)
      {
        std::filesystem::remove_all(partial);
        std::filesystem::create_directories(partial);
      }
    MPI_Barrier(comm);
  }

  CaseFolder::~CaseFolder()
  {
    if (root && !committed)
      {
        std::error_code ignored;
        std::filesystem::remove_all(partial, ignored);
      }
  }

  void CaseFolder::write(const std::string &name, const std::string &content) const
  {
    if (root)
      write_file_atomically(partial + "/" + name, content);
  }

  void CaseFolder::commit()
  {
    MPI_Barrier(comm);
    if (root)
      {
        const std::filesystem::path path(target);
        std::filesystem::remove_all(path);
        if (path.has_parent_path())
          std::filesystem::create_directories(path.parent_path());
        std::filesystem::rename(partial, path);
      }
    committed = true;
    MPI_Barrier(comm);
  }
} // namespace lentus::report
