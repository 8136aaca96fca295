#include "lowering/cif_text.hpp"

#include <cstddef>

namespace ts {

namespace {

// Length of the UTF-8 sequence starting at s[i] and its code point; 0 when the
// bytes there are not valid UTF-8.
std::size_t utf8_sequence(const std::string& s, std::size_t i, unsigned* code) {
  const auto b = static_cast<unsigned char>(s[i]);
  std::size_t n = 0;
  unsigned c = 0, min = 0;
  if (b >= 0xC2 && b <= 0xDF) n = 2, c = b & 0x1F, min = 0x80;
  else if (b >= 0xE0 && b <= 0xEF) n = 3, c = b & 0x0F, min = 0x800;
  else if (b >= 0xF0 && b <= 0xF4) n = 4, c = b & 0x07, min = 0x10000;
  else return 0;
  if (i + n > s.size()) return 0;
  for (std::size_t k = 1; k < n; ++k) {
    const auto cont = static_cast<unsigned char>(s[i + k]);
    if ((cont & 0xC0) != 0x80) return 0;
    c = (c << 6) | (cont & 0x3F);
  }
  if (c < min || c > 0x10FFFF || (c >= 0xD800 && c <= 0xDFFF)) return 0;
  *code = c;
  return n;
}

// The ASCII stand-in for a character the grammar refuses.
char stand_in(unsigned code) {
  if (code == 0x2212 || (code >= 0x2010 && code <= 0x2013)) return '-';
  if (code == 0x2018 || code == 0x2019 || code == 0x201B || code == 0x2032) return '\'';
  if (code == 0x201C || code == 0x201D || code == 0x201F || code == 0x2033) return '"';
  if (code == 0xA0) return ' ';
  return '?';
}

bool space(char c) { return c == ' ' || c == '\t' || c == '\r'; }

// End of the value token starting at s[i] (a quoted string ends at its quote
// followed by a blank, CIF 1.1), or npos when a quote is not closed.
std::size_t token_end(const std::string& s, std::size_t i) {
  if (s[i] == '\'' || s[i] == '"') {
    for (std::size_t k = i + 1; k < s.size(); ++k)
      if (s[k] == s[i] && (k + 1 == s.size() || space(s[k + 1]))) return k + 1;
    return std::string::npos;
  }
  while (i < s.size() && !space(s[i])) ++i;
  return i;
}

// A `_tag value...` line the grammar reads as one pair, possibly followed by
// another tag or a comment; false when the value runs on as several words.
bool one_value(const std::string& rest) {
  const std::size_t end = token_end(rest, 0);
  // An open quote (a CIF 2 triple-quoted string, a value going on over lines) is
  // left for the parser, whose message names it.
  if (end == std::string::npos) return true;
  std::size_t next = end;
  while (next < rest.size() && space(rest[next])) ++next;
  return next == rest.size() || rest[next] == '_' || rest[next] == '#';
}

std::string quoted(std::string value) {
  while (!value.empty() && space(value.back())) value.pop_back();
  if (value.find('\'') == std::string::npos) return "'" + value + "'";
  if (value.find('"') == std::string::npos) return "\"" + value + "\"";
  for (char& c : value)
    if (c == '"') c = '\'';
  return "\"" + value + "\"";
}

} // namespace

CifTextRepair repair_cif_text(const std::string& raw) {
  CifTextRepair out;
  out.text.reserve(raw.size());
  int line_number = 0;
  int first_minus = 0, first_other = 0, first_quoted = 0;
  std::size_t others = 0;
  std::string quoted_tag;
  bool in_text_field = false;
  std::size_t start = 0;
  while (start < raw.size()) {
    std::size_t stop = raw.find('\n', start);
    const bool last = stop == std::string::npos;
    if (last) stop = raw.size();
    ++line_number;
    std::string line;
    line.reserve(stop - start);
    for (std::size_t i = start; i < stop; ++i) {
      const auto b = static_cast<unsigned char>(raw[i]);
      if (b >= 0x80) {
        unsigned code = 0;
        const std::size_t n = utf8_sequence(raw, i, &code);
        const char c = n && i + n <= stop ? stand_in(code) : '?';
        if (c == '-') first_minus = first_minus ? first_minus : line_number;
        else if (c == '?') ++others, first_other = first_other ? first_other : line_number;
        line += c;
        if (n && i + n <= stop) i += n - 1;
      } else if ((b < 0x20 && b != '\t' && b != '\r') || b == 0x7F) {
        ++others;
        first_other = first_other ? first_other : line_number;
        line += '?';
      } else {
        line += static_cast<char>(b);
      }
    }
    if (!line.empty() && line[0] == ';') in_text_field = !in_text_field;
    else if (!in_text_field && !line.empty() && line[0] == '_') {
      std::size_t tag_end = 0;
      while (tag_end < line.size() && !space(line[tag_end])) ++tag_end;
      std::size_t value = tag_end;
      while (value < line.size() && space(line[value])) ++value;
      if (value < line.size() && line[value] != '#' && line[value] != ';' && !one_value(line.substr(value))) {
        if (!first_quoted) first_quoted = line_number, quoted_tag = line.substr(0, tag_end);
        line = line.substr(0, tag_end) + " " + quoted(line.substr(value));
      }
    }
    out.text += line;
    if (!last) out.text += '\n';
    start = stop + 1;
  }
  if (first_minus)
    out.notes.push_back("Unicode minus or dash characters read as '-' (first on line " + std::to_string(first_minus) +
                        ")");
  if (others)
    out.notes.push_back(std::to_string(others) +
                        " characters outside printable ASCII (text in another encoding, control characters) read as "
                        "'?' (first on line " +
                        std::to_string(first_other) + ")");
  if (first_quoted)
    out.notes.push_back("the value of " + quoted_tag + " on line " + std::to_string(first_quoted) +
                        " has spaces but no quotes; read as one quoted value");
  return out;
}

} // namespace ts
