// Small text helpers shared by the report writers and the catalogue loader.
#pragma once

#include <algorithm>
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

// "1 part", "3 parts": a count with its noun in the right number.
inline std::string counted(std::size_t n, const std::string& singular, const std::string& plural = "") {
  return std::to_string(n) + " " + (n == 1 ? singular : plural.empty() ? singular + "s" : plural);
}

// Levenshtein distance: the number of single-character insertions, deletions and
// substitutions between a and b. Ranks the "closest" names of an error message.
inline std::size_t edit_distance(const std::string& a, const std::string& b) {
  std::vector<std::size_t> row(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) row[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diag = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      std::size_t up = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diag + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diag = up;
    }
  }
  return row[b.size()];
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

// A report made safe for a terminal or a pager: control characters that users'
// strings (a title, a label) may carry are replaced by U+FFFD, so an escape
// sequence in a scenario file cannot move the cursor, recolour or retitle the
// terminal. Newline and tab stay; so do carriage returns of CRLF line ends.
// C1 controls (U+0080 to U+009F, UTF-8 C2 80 to C2 9F) are replaced too: some
// terminals read U+009B as the start of an escape sequence.
inline std::string without_control_characters(const std::string& text) {
  std::string out;
  out.reserve(text.size());
  for (std::size_t i = 0; i < text.size(); ++i) {
    const unsigned char c = static_cast<unsigned char>(text[i]);
    const bool crlf = c == '\r' && i + 1 < text.size() && text[i + 1] == '\n';
    if ((c < 0x20 && c != '\n' && c != '\t' && !crlf) || c == 0x7F) {
      out += "\xEF\xBF\xBD";
    } else if (c == 0xC2 && i + 1 < text.size() && static_cast<unsigned char>(text[i + 1]) >= 0x80 &&
               static_cast<unsigned char>(text[i + 1]) <= 0x9F) {
      out += "\xEF\xBF\xBD";
      ++i;
    } else {
      out += static_cast<char>(c);
    }
  }
  return out;
}

} // namespace ts
