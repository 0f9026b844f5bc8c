// Exceptions that main() maps to exit codes: InputError -> 2, NoConvergence -> 3.
#pragma once

#include <stdexcept>
#include <string>

namespace lentus
{
  /// Bad input: a case file, a data file or a command-line argument. The place (file, line,
  /// key) is kept in fields, so that a caller can point elsewhere (a sweep names the line of its
  /// own file that set a value) without reading the message back.
  /// what() reads "file:line: section/key = value: what is wrong; allowed: ...".
  class InputError : public std::runtime_error
  {
  public:
    /// Stands for the file when a value came from `--set` on the command line.
    static constexpr const char *command_line_overrides = "command line (--set)";

    explicit InputError(const std::string &message)
      : std::runtime_error(message)
      , detail_text(message)
    {}

    /// "file:line: message" (line 0: "file: message").
    InputError(const std::string &file, int line, const std::string &message)
      : InputError(file, line, "", message)
    {}

    /// The same for a problem with one key ("Section/.../Key"); `message` names it.
    InputError(const std::string &file, int line, const std::string &key, const std::string &message)
      : std::runtime_error(file + (line > 0 ? ":" + std::to_string(line) : std::string()) + ": " + message)
      , file_name(file)
      , line_number(line)
      , key_path(key)
      , detail_text(message)
    {}

    /// The file, "command line", command_line_overrides, or "" when no place is known.
    const std::string &file() const { return file_name; }
    /// The line in file() (1-based); 0 when not known or not a file.
    int line() const { return line_number; }
    /// The case-file key "Section/.../Key" the problem is about; "" when none.
    const std::string &key() const { return key_path; }
    /// The message without the place.
    const std::string &detail() const { return detail_text; }
    /// True when the offending value came from `--set`.
    bool from_overrides() const { return file_name == command_line_overrides; }

  private:
    std::string file_name;
    int         line_number = 0;
    std::string key_path;
    std::string detail_text;
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
