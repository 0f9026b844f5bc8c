// The subcommands of `lentus`. Each takes the words after its name and
// returns an exit code; bad input is thrown as InputError.
#pragma once

namespace lentus::cli
{
  int laws_command(int argc, const char *const *argv, int first);
  int flow_curve_command(int argc, const char *const *argv, int first);
  int check_command(int argc, const char *const *argv, int first);
  int fit_command(int argc, const char *const *argv, int first);
  int run_command(int argc, const char *const *argv, int first);
  int starter_command(int argc, const char *const *argv, int first);
  int mesh_command(int argc, const char *const *argv, int first);
  int sweep_command(int argc, const char *const *argv, int first);
  int collect_command(int argc, const char *const *argv, int first);
} // namespace lentus::cli
