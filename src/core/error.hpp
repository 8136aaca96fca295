// One error type for everything the user can get wrong. It carries what was
// wrong, where (file:line:column, option or field), and what would be valid,
// so the CLI can print a message a physicist can act on. See docs/cli.md for
// the exit codes.
#pragma once

#include <stdexcept>
#include <string>

namespace ts {

// Exit codes of the tensorsieve executable, one per kind of failure.
enum class ErrorKind : int {
  usage = 2,        // command line not understood
  unknown_name = 3, // unknown group, response, tensor name
  bad_spec = 4,     // malformed tensor spec or operation symbol
  bad_file = 5,     // unreadable or malformed TOML / data file
  bad_group = 6,    // generators that do not form a crystallographic group
  bad_geometry = 7, // impossible cut, frame or direction
  too_large = 8,    // request beyond the supported size (rank > 6, ...)
  internal = 70,    // a bug: an internal consistency check failed
};

class Error : public std::runtime_error {
public:
  Error(ErrorKind kind, std::string what, std::string where = {}, std::string valid = {})
      : std::runtime_error(compose(what, where, valid)), kind_(kind), what_(std::move(what)),
        where_(std::move(where)), valid_(std::move(valid)) {}

  ErrorKind kind() const { return kind_; }
  int exit_code() const { return static_cast<int>(kind_); }
  const std::string& problem() const { return what_; }   // what was wrong
  const std::string& location() const { return where_; } // file:line:col, option, field
  const std::string& valid() const { return valid_; }    // what would be accepted

private:
  static std::string compose(const std::string& what, const std::string& where,
                             const std::string& valid) {
    std::string s = where.empty() ? what : where + ": " + what;
    if (!valid.empty()) s += "\n  valid: " + valid;
    return s;
  }
  ErrorKind kind_;
  std::string what_, where_, valid_;
};

[[noreturn]] inline void fail(ErrorKind kind, std::string what, std::string where = {},
                              std::string valid = {}) {
  throw Error(kind, std::move(what), std::move(where), std::move(valid));
}

} // namespace ts
