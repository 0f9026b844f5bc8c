// Exceptions that main() maps to exit codes: InputError -> 2, NoConvergence -> 3.
#pragma once

#include <stdexcept>
#include <string>

namespace lentus
{
  /// Bad input: a case file, a data file or a command-line argument.
  /// what() reads "file:line: section/key = value: what is wrong; allowed: ...".
  class InputError : public std::runtime_error
  {
  public:
    explicit InputError(const std::string &message)
      : std::runtime_error(message)
    {}

    /// "file:line: message" (line 0: "file: message").
    InputError(const std::string &file, int line, const std::string &message)
      : std::runtime_error(file + (line > 0 ? ":" + std::to_string(line) : std::string()) + ": " + message)
    {}
  };

  /// The nonlinear solver did not converge.
  class NoConvergence : public std::runtime_error
  {
  public:
    explicit NoConvergence(const std::string &message)
      : std::runtime_error(message)
    {}
  };

  /// Exit codes of `lentus`.
  namespace exit_code
  {
    inline constexpr int success        = 0;
    inline constexpr int failure        = 1;
    inline constexpr int bad_input      = 2;
    inline constexpr int no_convergence = 3;
  } // namespace exit_code
} // namespace lentus
