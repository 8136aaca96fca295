// Small text helpers shared by the report writers and the catalogue loader.
#pragma once

#include <string>
#include <vector>

namespace ts {

inline std::string join(const std::vector<std::string>& items, const std::string& separator) {
  std::string s;
  for (std::size_t i = 0; i < items.size(); ++i) s += (i ? separator : "") + items[i];
  return s;
}

// "a:b::c" -> {"a", "b", "", "c"}: every field, empty ones included.
inline std::vector<std::string> split(const std::string& text, char separator) {
  std::vector<std::string> fields;
  std::size_t start = 0;
  while (true) {
    std::size_t at = text.find(separator, start);
    fields.push_back(text.substr(start, at == std::string::npos ? std::string::npos : at - start));
    if (at == std::string::npos) return fields;
    start = at + 1;
  }
}

// An error message made safe for a terminal: invalid UTF-8 (a quoted fragment of a
// multi-byte character, binary input) becomes '?', control characters other than
// newline become '?', and each line is cut to max_line bytes at a character boundary,
// so hostile input is never echoed at length.
inline std::string printable_message(const std::string& text, std::size_t max_line = 480) {
  std::string out;
  std::size_t line = 0;
  bool cut = false;
  for (std::size_t i = 0; i < text.size();) {
    unsigned char c = static_cast<unsigned char>(text[i]);
    std::size_t len = c < 0x80 ? 1 : (c >> 5) == 0x6 ? 2 : (c >> 4) == 0xE ? 3 : (c >> 3) == 0x1E ? 4 : 0;
    bool valid = len > 0 && i + len <= text.size();
    for (std::size_t k = 1; valid && k < len; ++k)
      if ((static_cast<unsigned char>(text[i + k]) & 0xC0) != 0x80) valid = false;
    if (c == '\n') {
      out += '\n';
      line = 0;
      cut = false;
      ++i;
      continue;
    }
    std::string piece = !valid ? "?" : (len == 1 && (c < 0x20 || c == 0x7F)) ? "?" : text.substr(i, len);
    i += valid ? len : 1;
    if (cut) continue;
    if (line + piece.size() > max_line) {
      out += "...";
      cut = true;
      continue;
    }
    out += piece;
    line += piece.size();
  }
  return out;
}

} // namespace ts
