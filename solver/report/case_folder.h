// A results folder that appears whole or not at all, shared by `lentus run` and
// `lentus mesh`: files are written into "<folder>.partial", and commit() replaces
// the folder by it. An earlier folder is replaced only if it was written by the
// same command (it holds the marker file).
#pragma once

#include <mpi.h>

#include <string>

namespace lentus::report
{
  class CaseFolder
  {
  public:
    /// Checks that `folder` is new, empty or holds `marker` (e.g. "summary.json"); else throws
    /// InputError naming `key` (the option or case-file key that chose the folder). Creates the
    /// partial folder. Collective over `communicator`; rank 0 touches the disk.
    CaseFolder(const std::string &folder, const std::string &marker, const std::string &key,
               MPI_Comm communicator);

    /// Removes the partial folder if commit() was not reached (the earlier folder stays as it was).
    ~CaseFolder();

    CaseFolder(const CaseFolder &)            = delete;
    CaseFolder &operator=(const CaseFolder &) = delete;

    /// Where files go until commit(), with a trailing '/'. Every rank may write into it.
    std::string staging() const { return partial + "/"; }

    /// The folder the results end up in.
    const std::string &path() const { return target; }

    /// Writes `name` (relative to the folder) with `content`, atomically, on rank 0 only.
    void write(const std::string &name, const std::string &content) const;

    /// Replaces the folder by the partial one. Collective.
    void commit();

  private:
    std::string target, partial;
    MPI_Comm    comm;
    bool        root;
    bool        committed = false;
  };
} // namespace lentus::report
