// Escaping text for XML and HTML (&, <, >, "), shared by the SVG text of the figures
// and the HTML page.
#pragma once

#include <string>

namespace ts {

inline std::string markup_escape(const std::string& s) {
  std::string out;
  for (char c : s) {
    switch (c) {
    case '&': out += "&amp;"; break;
    case '<': out += "&lt;"; break;
    case '>': out += "&gt;"; break;
    case '"': out += "&quot;"; break;
    default: out += c;
    }
  }
  return out;
}

} // namespace ts
