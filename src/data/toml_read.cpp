#include "data/toml_read.hpp"

#include <filesystem>
#include <fstream>
#include <sstream>

namespace ts::toml_read {

std::string at(const std::string& file, const toml::source_region& s) {
  if (s.begin.line == 0) return file; // a table built in memory has no lines
  return file + ":" + std::to_string(s.begin.line) + ":" + std::to_string(s.begin.column);
}

std::string position_of(const toml::table& t, const char* key, const std::string& file) {
  const toml::node* n = t.get(key);
  return at(file, n ? n->source() : t.source());
}

toml::table parse_text(const std::string& text, const std::string& file, const std::string& valid) {
  try {
    return toml::parse(text, file);
  } catch (const toml::parse_error& e) {
    fail(ErrorKind::bad_file, std::string(e.description()), at(file, e.source()), valid);
  }
}

toml::table parse_file(const std::string& path, const std::string& what, const std::string& valid) {
  std::error_code ec;
  auto status = std::filesystem::status(path, ec);
  if (ec || !std::filesystem::exists(status)) fail(ErrorKind::bad_file, "no such file", path, "the path of a " + what);
  if (!std::filesystem::is_regular_file(status))
    fail(ErrorKind::bad_file,
         std::filesystem::is_directory(status) ? "is a directory, not a " + what : std::string("is not a regular file"),
         path, "the path of a " + what);
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  if (!in) fail(ErrorKind::bad_file, "cannot read the file", path, "a readable " + what);
  return parse_text(text.str(), path, valid);
}

const char* type_name(const toml::node& n) {
  switch (n.type()) {
  case toml::node_type::table: return "a table";
  case toml::node_type::array: return "an array";
  case toml::node_type::string: return "a string";
  case toml::node_type::integer: return "an integer";
  case toml::node_type::floating_point: return "a float";
  case toml::node_type::boolean: return "a boolean";
  case toml::node_type::date: return "a date";
  case toml::node_type::time: return "a time";
  case toml::node_type::date_time: return "a date-time";
  case toml::node_type::none: break;
  }
  return "nothing";
}

std::string field(const char* key, const std::string& table) {
  return "'" + std::string(key) + "'" + (table.empty() ? "" : " in " + table);
}

std::string get_string(const toml::table& t, const char* key, const std::string& file, bool required,
                       const std::string& valid, const std::string& table) {
  const toml::node* node = t.get(key);
  if (!node) {
    if (required) fail(ErrorKind::bad_file, "missing key " + field(key, table), at(file, t.source()), valid);
    return {};
  }
  auto v = node->value<std::string>();
  if (!v) fail(ErrorKind::bad_file, field(key, table) + " must be a string", at(file, node->source()), valid);
  return *v;
}

std::vector<std::string> get_strings(const toml::table& t, const char* key, const std::string& file, bool required,
                                     const std::string& table, bool single) {
  std::vector<std::string> out;
  const toml::node* node = t.get(key);
  const std::string expected = single ? "a string or an array of strings" : "an array of strings";
  if (!node) {
    if (required) fail(ErrorKind::bad_file, "missing key " + field(key, table), at(file, t.source()), expected);
    return out;
  }
  if (single)
    if (auto s = node->value<std::string>()) return {*s};
  const toml::array* arr = node->as_array();
  if (!arr) fail(ErrorKind::bad_file, field(key, table) + " must be " + expected, at(file, node->source()), "[\"...\", \"...\"]");
  for (const auto& el : *arr) {
    auto s = el.value<std::string>();
    if (!s) fail(ErrorKind::bad_file, field(key, table) + " must hold strings", at(file, el.source()));
    out.push_back(*s);
  }
  return out;
}

std::optional<bool> get_bool(const toml::table& t, const char* key, const std::string& file, const std::string& table) {
  const toml::node* node = t.get(key);
  if (!node) return std::nullopt;
  auto v = node->value<bool>();
  if (!v) fail(ErrorKind::bad_file, field(key, table) + " must be true or false", at(file, node->source()));
  return *v;
}

void check_keys(const toml::table& t, const std::set<std::string>& allowed, const std::string& file,
                const std::string& table, const std::string& more) {
  for (const auto& [k, v] : t)
    if (!allowed.count(std::string(k.str()))) {
      std::string list;
      for (const auto& a : allowed) list += (list.empty() ? "" : ", ") + a;
      if (!more.empty()) list += " " + more;
      fail(ErrorKind::bad_file, "unknown key " + field(std::string(k.str()).c_str(), table),
           at(file, k.source().begin.line ? k.source() : v.source()), list);
    }
}

std::string Table::text(const char* key, bool needed) const {
  std::string v = get_string(t_, key, file_, needed, "a quoted TOML string", name_);
  if (needed && v.find_first_not_of(" \t") == std::string::npos) error(key, "is empty", "a non-empty string");
  return v;
}

} // namespace ts::toml_read
