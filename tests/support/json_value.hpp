// A strict JSON reader (RFC 8259) for checking the CLI's json output: it
// rejects what a lenient reader would let through (trailing commas, bare
// words, leading zeros, control characters in strings, text after the value,
// repeated keys) and keeps whether a number was written as an integer.
#pragma once

#include <cstddef>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace ts::test {

struct JsonValue {
  enum class Type { null, boolean, number, string, array, object };
  Type type = Type::null;
  bool boolean = false;
  double number = 0;
  bool integer = false; // number written without fraction or exponent
  std::string text;     // string value, or the number as written
  std::vector<JsonValue> items;
  std::vector<std::pair<std::string, JsonValue>> members; // in document order

  bool is_object() const { return type == Type::object; }
  bool is_array() const { return type == Type::array; }
  bool is_string() const { return type == Type::string; }
  bool is_integer() const { return type == Type::number && integer; }
  bool has(const std::string& key) const { return find(key) != nullptr; }
  const JsonValue* find(const std::string& key) const {
    for (const auto& [k, v] : members)
      if (k == key) return &v;
    return nullptr;
  }
  const JsonValue& at(const std::string& key) const {
    if (const JsonValue* v = find(key)) return *v;
    throw std::runtime_error("no key '" + key + "'");
  }
};

class JsonReader {
public:
  explicit JsonReader(const std::string& text) : s_(text) {}

  // Throws std::runtime_error naming the byte offset of the first problem.
  JsonValue parse() {
    skip_ws();
    JsonValue v = value(0);
    skip_ws();
    if (p_ != s_.size()) error("text after the JSON value");
    return v;
  }

private:
  [[noreturn]] void error(const std::string& what) const {
    throw std::runtime_error("invalid JSON at byte " + std::to_string(p_) + ": " + what);
  }
  bool at_end() const { return p_ >= s_.size(); }
  char peek() const { return at_end() ? '\0' : s_[p_]; }
  void expect(char c) {
    if (peek() != c) error(std::string("expected '") + c + "'");
    ++p_;
  }
  void skip_ws() {
    while (!at_end() && (s_[p_] == ' ' || s_[p_] == '\t' || s_[p_] == '\n' || s_[p_] == '\r')) ++p_;
  }
  void literal(const char* word) {
    for (const char* w = word; *w; ++w) {
      if (peek() != *w) error(std::string("expected '") + word + "'");
      ++p_;
    }
  }

  JsonValue value(int depth) {
    if (depth > 200) error("nesting too deep");
    JsonValue v;
    switch (peek()) {
    case '{': object(v, depth); break;
    case '[': array(v, depth); break;
    case '"':
      v.type = JsonValue::Type::string;
      v.text = string();
      break;
    case 't':
      literal("true");
      v.type = JsonValue::Type::boolean;
      v.boolean = true;
      break;
    case 'f':
      literal("false");
      v.type = JsonValue::Type::boolean;
      break;
    case 'n': literal("null"); break;
    default: number(v);
    }
    return v;
  }

  void object(JsonValue& v, int depth) {
    v.type = JsonValue::Type::object;
    expect('{');
    skip_ws();
    if (peek() == '}') {
      ++p_;
      return;
    }
    for (;;) {
      skip_ws();
      if (peek() != '"') error("expected a string key");
      std::string key = string();
      if (v.has(key)) error("repeated key '" + key + "'");
      skip_ws();
      expect(':');
      skip_ws();
      v.members.emplace_back(std::move(key), value(depth + 1));
      skip_ws();
      if (peek() == ',') {
        ++p_;
        continue;
      }
      expect('}');
      return;
    }
  }

  void array(JsonValue& v, int depth) {
    v.type = JsonValue::Type::array;
    expect('[');
    skip_ws();
    if (peek() == ']') {
      ++p_;
      return;
    }
    for (;;) {
      skip_ws();
      v.items.push_back(value(depth + 1));
      skip_ws();
      if (peek() == ',') {
        ++p_;
        continue;
      }
      expect(']');
      return;
    }
  }

  static bool hex(char c) { return (c >= '0' && c <= '9') || (c >= 'a' && c <= 'f') || (c >= 'A' && c <= 'F'); }

  std::string string() {
    expect('"');
    std::string out;
    for (;;) {
      if (at_end()) error("unterminated string");
      const char c = s_[p_++];
      if (c == '"') return out;
      if (static_cast<unsigned char>(c) < 0x20) error("control character in a string");
      if (c != '\\') {
        out += c;
        continue;
      }
      if (at_end()) error("unterminated escape");
      const char e = s_[p_++];
      switch (e) {
      case '"': out += '"'; break;
      case '\\': out += '\\'; break;
      case '/': out += '/'; break;
      case 'b': out += '\b'; break;
      case 'f': out += '\f'; break;
      case 'n': out += '\n'; break;
      case 'r': out += '\r'; break;
      case 't': out += '\t'; break;
      case 'u':
        for (int i = 0; i < 4; ++i)
          if (at_end() || !hex(s_[p_++])) error("bad \\u escape");
        out += '?'; // the code point itself is not needed by the checks
        break;
      default: error(std::string("bad escape \\") + e);
      }
    }
  }

  void number(JsonValue& v) {
    const std::size_t start = p_;
    auto digits = [&] {
      std::size_t n = 0;
      while (!at_end() && s_[p_] >= '0' && s_[p_] <= '9') ++p_, ++n;
      return n;
    };
    if (peek() == '-') ++p_;
    if (peek() == '0') {
      ++p_;
      if (peek() >= '0' && peek() <= '9') error("leading zero");
    } else if (digits() == 0) {
      error("expected a value");
    }
    bool integer = true;
    if (peek() == '.') {
      ++p_;
      integer = false;
      if (digits() == 0) error("digits expected after '.'");
    }
    if (peek() == 'e' || peek() == 'E') {
      ++p_;
      integer = false;
      if (peek() == '+' || peek() == '-') ++p_;
      if (digits() == 0) error("digits expected in the exponent");
    }
    v.type = JsonValue::Type::number;
    v.integer = integer;
    v.text = s_.substr(start, p_ - start);
    v.number = std::stod(v.text);
  }

  const std::string& s_;
  std::size_t p_ = 0;
};

inline JsonValue parse_json(const std::string& text) { return JsonReader(text).parse(); }

} // namespace ts::test
