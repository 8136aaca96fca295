#include "report/json_text.hpp"

#include <sstream>

namespace ts {

std::string json_text(const toml::table& t) {
  // Every document says which version wrote it, so a saved result can be traced.
  toml::table doc = t;
  doc.insert_or_assign("version", TENSORSIEVE_VERSION);
  std::ostringstream os;
  os << toml::json_formatter{doc} << "\n";
  return os.str();
}

std::string json_line(const toml::table& t) {
  // JSON strings hold no raw newlines (they are escaped), so every newline and
  // the indentation after it belong to the layout and can go.
  const std::string pretty = json_text(t);
  std::string line;
  for (std::size_t i = 0; i < pretty.size(); ++i) {
    if (pretty[i] != '\n') {
      line += pretty[i];
      continue;
    }
    while (i + 1 < pretty.size() && pretty[i + 1] == ' ') ++i;
  }
  return line + "\n";
}

} // namespace ts
