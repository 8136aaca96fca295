// The Markdown the report writers produce, as HTML: headings, pipe tables, bullet
// lists, bold, code spans and paragraphs, with formulas in code spans and table cells
// set by html_formula. The HTML page shows the report through this, so every section
// the writers print reaches the page without a second writer to keep in step.
#pragma once

#include <string>

namespace ts {

// `shift` lowers every heading level (a "## " section becomes <h(2+shift)>).
std::string markdown_to_html(const std::string& markdown, int shift = 0);

} // namespace ts
