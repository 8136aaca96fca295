// Reading the TOML data files (group settings, the response catalogue, scenarios,
// crystal structures) with one position format and one message style: every error
// is ts::Error(bad_file) at `file:line:column` (the file alone for a table built in
// memory, such as a Python dict), names the key and the table it sits in, and says
// what would be valid. Only the loaders include this header, and with it toml++.
#pragma once

#include "core/error.hpp"

#include <toml++/toml.h>

#include <optional>
#include <set>
#include <string>
#include <vector>

namespace ts::toml_read {

// "file:line:column" of a node, or `file` when the node was not read from text.
std::string at(const std::string& file, const toml::source_region& s);
// Where a key sits in its table; the table's own position when the key is absent.
std::string position_of(const toml::table& t, const char* key, const std::string& file);

// Parses TOML text read from `file`; a syntax error names file:line:column.
// `valid` says what the file should hold (its schema).
toml::table parse_text(const std::string& text, const std::string& file, const std::string& valid);
// Reads and parses a file. `what` names it in messages ("scenario file"); a
// missing file, a directory or an unreadable file is a clean error.
toml::table parse_file(const std::string& path, const std::string& what, const std::string& valid);

// "a string", "an integer", ... for a message that says what was found.
const char* type_name(const toml::node& n);

// The typed readers below name a key as 'key' and, when `table` is given,
// "'key' in [sample]": the field path a person finds in the file. Messages read
// "'key' in table must be a string", "missing key 'key' in table", "unknown key
// 'key' in table", and Table::error gives "'key' in table: problem".
std::string field(const char* key, const std::string& table);

// A string; missing is an error when `required`, else "".
std::string get_string(const toml::table& t, const char* key, const std::string& file, bool required,
                       const std::string& valid, const std::string& table = {});
// A required value of type T (std::string, bool, std::int64_t, double); `expected`
// says what it should be ("true or false") in the message and as what is valid.
template <typename T>
T get_required(const toml::table& t, const char* key, const std::string& file, const std::string& expected,
               const std::string& table = {}) {
  const toml::node* node = t.get(key);
  if (!node) fail(ErrorKind::bad_file, "missing key " + field(key, table), at(file, t.source()), expected);
  auto v = node->value<T>();
  if (!v) fail(ErrorKind::bad_file, field(key, table) + " must be " + expected, at(file, node->source()), expected);
  return *v;
}
// A string or an array of strings (a single string is a list of one when `single`).
std::vector<std::string> get_strings(const toml::table& t, const char* key, const std::string& file,
                                     bool required = false, const std::string& table = {}, bool single = true);
// true or false; nullopt when absent.
std::optional<bool> get_bool(const toml::table& t, const char* key, const std::string& file,
                             const std::string& table = {});
// Every key of t must be one of `allowed`; the message lists them (and `more`,
// e.g. where the schema is documented).
void check_keys(const toml::table& t, const std::set<std::string>& allowed, const std::string& file,
                const std::string& table, const std::string& more = {});

// One table of a file with the name messages give it ("response 'pockels', part 2").
class Table {
public:
  Table(const toml::table& t, std::string file, std::string name)
      : t_(t), file_(std::move(file)), name_(std::move(name)) {}

  std::string at() const { return toml_read::at(file_, t_.source()); }
  std::string at(const char* key) const { return position_of(t_, key, file_); }
  [[noreturn]] void error(const char* key, const std::string& problem, const std::string& valid = {}) const {
    fail(ErrorKind::bad_file, field(key, name_) + ": " + problem, at(key), valid);
  }
  void only_keys(const std::set<std::string>& allowed, const std::string& more = {}) const {
    check_keys(t_, allowed, file_, name_, more);
  }
  // A string; when `needed`, also not blank.
  std::string text(const char* key, bool needed = true) const;
  bool flag(const char* key) const { return get_bool(t_, key, file_, name_).value_or(false); }
  std::vector<std::string> list(const char* key, bool needed) const {
    return get_strings(t_, key, file_, needed, name_, false);
  }
  const toml::table& table() const { return t_; }
  const std::string& file() const { return file_; }

private:
  const toml::table& t_;
  std::string file_, name_;
};

// Runs a check of a value where it was read, so its error names the file,
// line and column of that value (in front of whatever the check located).
template <typename Check>
void check_at(const std::string& where, Check check) {
  try {
    check();
  } catch (const Error& e) {
    fail(e.kind(), e.problem(), e.location().empty() ? where : where + ": " + e.location(), e.valid());
  }
}

} // namespace ts::toml_read
