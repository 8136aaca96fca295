// Output formats shared by every report writer, and the JSON/text helpers
// they use. Writers never compute physics: they format result values.
#pragma once

#include <string>
#include <vector>

namespace ts {

enum class Format { text, markdown, latex, json };
Format parse_format(const std::string& name); // throws Error(usage)
const char* format_name(Format f);

// A section heading: level 1 is the report title, 2 a section, 3 a subsection.
std::string section_heading(const std::string& s, Format f, int level = 2);

// The width of text reports in columns, 0 for none (files and pipes: lines as long as
// they come). The CLI sets it from --width or the terminal before a writer runs; text
// tables then wrap their widest columns to fit, and wrap_text breaks the other lines.
void set_text_width(std::size_t columns);
std::size_t text_width();
// Every line longer than `columns` broken at spaces, the continuation indented by two
// more than the line; 0 leaves the text as it is.
std::string wrap_text(const std::string& text, std::size_t columns);

// A simple aligned table for text and Markdown, or a LaTeX tabular.
std::string grid(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                 Format f);

// A LaTeX list with one item per row, each cell after its column's name: for tables
// with many wide columns of formulas, which wrap as text where a tabular cannot.
std::string row_list(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows);

// A symbol or command set in code type: `x` in Markdown, \texttt{x} in LaTeX, plain in text.
std::string inline_code(const std::string& s, Format f);

// Escape &, %, _, #, $ ... for LaTeX text mode.
std::string latex_escape(const std::string& s);
// Text from a user or the catalogue (a step label, a part's description, a file
// name) as a line of this format: LaTeX gets it with its special characters
// escaped, so "x_1 at 50%" or "\\input{...}" prints as written and runs nothing.
std::string as_text(const std::string& s, Format f);

// The report as the writer produced it, or, for LaTeX, with the Unicode symbols
// the reports use (∥ ⊥ × → · ω μ ...) replaced by \ensuremath{...} commands, so
// that the fragment compiles with pdflatex as well as LuaLaTeX.
std::string finish(std::string text, Format f);

} // namespace ts
