// Small pieces of report text that every section writer uses alike: prose and
// math in the three text formats, line ends and bullets.
#pragma once

#include "report/expression_text.hpp"
#include "report/report_format.hpp"

#include <string>

namespace ts::prose_text {

inline TextStyle style_of(Format f) { return f == Format::latex ? TextStyle::latex : TextStyle::plain; }
// Prose in LaTeX text mode: _ ^ & ... escaped; the Unicode symbols become commands in finish().
inline std::string prose(const std::string& s, Format f) { return f == Format::latex ? latex_escape(s) : s; }
inline std::string math(const std::string& s, Format f) {
  return f == Format::latex ? "$" + s + "$" : f == Format::markdown ? "`" + s + "`" : s;
}
inline std::string line(Format f) { return f == Format::latex ? "\\\\\n" : "\n"; }
inline std::string bullet(Format f) { return f == Format::markdown ? "- " : (f == Format::latex ? "" : "  "); }
// A line under the previous bullet: nested in Markdown, indented in text.
inline std::string sub_bullet(Format f) { return f == Format::markdown ? "  - " : (f == Format::latex ? "\\quad " : "    "); }

} // namespace ts::prose_text
