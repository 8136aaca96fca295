#include "report/markdown_html.hpp"

#include "core/text.hpp"
#include "report/html_math.hpp"

#include <algorithm>
#include <sstream>

namespace ts {

namespace {

// **bold** and `code` in one line of text; code spans hold symbols and formulas.
std::string inline_html(const std::string& s) {
  std::string out;
  for (std::size_t i = 0; i < s.size();) {
    if (s[i] == '`') {
      const std::size_t end = s.find('`', i + 1);
      if (end != std::string::npos) {
        // A tensor spec ("sigma_ab: polar, time-odd") is words, not a formula: kept as typed.
        const std::string span = s.substr(i + 1, end - i - 1);
        out += "<code>" + (span.find(": ") != std::string::npos ? html_escape(span) : html_formula(span)) + "</code>";
        i = end + 1;
        continue;
      }
    }
    if (s.compare(i, 2, "**") == 0) {
      const std::size_t end = s.find("**", i + 2);
      if (end != std::string::npos) {
        out += "<b>" + inline_html(s.substr(i + 2, end - i - 2)) + "</b>";
        i = end + 2;
        continue;
      }
    }
    const std::size_t next = s.find_first_of("`*", i + 1);
    out += html_escape(s.substr(i, next == std::string::npos ? std::string::npos : next - i));
    i = next == std::string::npos ? s.size() : next;
  }
  return out;
}

std::vector<std::string> cells(const std::string& row) {
  std::string inner = row;
  if (!inner.empty() && inner.front() == '|') inner.erase(0, 1);
  if (!inner.empty() && inner.back() == '|') inner.pop_back();
  // A cell's own '|' is written "\|" (as GitHub's tables want): not a border.
  std::vector<std::string> out;
  std::string c;
  auto close = [&] {
    const std::size_t a = c.find_first_not_of(' '), b = c.find_last_not_of(' ');
    out.push_back(a == std::string::npos ? "" : c.substr(a, b - a + 1));
    c.clear();
  };
  for (std::size_t i = 0; i < inner.size(); ++i) {
    if (inner[i] == '\\' && i + 1 < inner.size() && inner[i + 1] == '|') {
      c += '|';
      ++i;
    } else if (inner[i] == '|') {
      close();
    } else {
      c += inner[i];
    }
  }
  close();
  return out;
}

bool is_rule(const std::string& row) { return row.find_first_not_of("|- :") == std::string::npos && row.find('-') != std::string::npos; }

} // namespace

std::string markdown_to_html(const std::string& md, int shift) {
  std::ostringstream os;
  const std::vector<std::string> lines = split(md, '\n');
  bool list = false, paragraph = false;
  auto close = [&] {
    if (list) os << "</ul>\n";
    if (paragraph) os << "</p>\n";
    list = paragraph = false;
  };
  for (std::size_t i = 0; i < lines.size(); ++i) {
    const std::string& l = lines[i];
    if (l.empty()) {
      close();
      continue;
    }
    if (l.compare(0, 3, "```") == 0) { // a fenced block: matrices and aligned text, kept as they are
      close();
      os << "<pre>";
      for (++i; i < lines.size() && lines[i].compare(0, 3, "```") != 0; ++i) os << html_escape(lines[i]) << "\n";
      os << "</pre>\n";
      continue;
    }
    if (l[0] == '#') {
      close();
      const std::size_t level = l.find_first_not_of('#');
      const int h = std::min(6, static_cast<int>(level) + shift);
      os << "<h" << h << ">" << inline_html(l.substr(std::min(l.size(), level + 1))) << "</h" << h << ">\n";
      continue;
    }
    if (l[0] == '|' && i + 1 < lines.size() && is_rule(lines[i + 1])) {
      close();
      os << "<table><tr>";
      for (const auto& c : cells(l)) os << "<th>" << inline_html(c) << "</th>";
      os << "</tr>\n";
      for (i += 2; i < lines.size() && !lines[i].empty() && lines[i][0] == '|'; ++i) {
        os << "<tr>";
        for (const auto& c : cells(lines[i])) os << "<td>" << inline_html(c) << "</td>";
        os << "</tr>\n";
      }
      os << "</table>\n";
      --i;
      continue;
    }
    const std::size_t indent = l.find_first_not_of(' ');
    if (indent != std::string::npos && l.compare(indent, 2, "- ") == 0) { // a nested bullet is indented
      if (paragraph) os << "</p>\n";
      paragraph = false;
      if (!list) os << "<ul>\n";
      list = true;
      os << (indent ? "<li class=\"sub\">" : "<li>") << inline_html(l.substr(indent + 2)) << "</li>\n";
      continue;
    }
    if (list) os << "</ul>\n";
    list = false;
    os << (paragraph ? "<br>\n" : "<p>") << inline_html(l.substr(std::min(l.find_first_not_of(' '), l.size())));
    paragraph = true;
  }
  close();
  return os.str();
}

} // namespace ts
