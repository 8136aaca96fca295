#include "report/figure_report.hpp"

namespace ts {

namespace {

const char* kind_name(FigureKind k) {
  switch (k) {
  case FigureKind::polar: return "polar";
  case FigureKind::line: return "line";
  case FigureKind::rosette: return "rosette";
  }
  return "";
}

} // namespace

toml::array figures_json(const std::vector<FigureData>& figures) {
  toml::array out;
  for (const auto& f : figures) {
    toml::array panels;
    for (std::size_t p = 0; p < f.panels.size(); ++p) {
      toml::array curves;
      for (const auto& c : f.panels[p]) {
        toml::array y;
        for (double v : c.y) y.push_back(v);
        // Samples are equally spaced: x = x_from + i·x_step (degrees).
        const double step = c.x.size() > 1 ? c.x[1] - c.x[0] : 0;
        curves.push_back(toml::table{{"label", c.label},
                                     {"x_from_deg", c.x.empty() ? 0.0 : c.x.front()},
                                     {"x_step_deg", step},
                                     {"y", y}});
      }
      panels.push_back(toml::table{{"title", p < f.panel_titles.size() ? f.panel_titles[p] : std::string()},
                                   {"empty_because", p < f.panel_notes.size() ? f.panel_notes[p] : std::string()},
                                   {"curves", curves}});
    }
    toml::array bars;
    for (const auto& b : f.bars) bars.push_back(toml::table{{"azimuth_deg", b.azimuth}, {"label", b.label}});
    out.push_back(toml::table{{"file_stem", f.stem},
                              {"kind", kind_name(f.kind)},
                              {"title", f.title},
                              {"x_label", f.x_label},
                              {"y_label", f.y_label},
                              {"note", f.note},
                              {"caption", f.caption},
                              {"panels", panels},
                              {"own_scales", f.own_scales},
                              {"bars", bars}});
  }
  return out;
}

namespace {

// A file name in code type; in LaTeX it may break after each hyphen, since a
// figure's name runs to sixty characters and a typewriter word never breaks.
std::string file_stem_text(const std::string& stem, Format f) {
  if (f != Format::latex) return inline_code(stem, f);
  std::string out;
  for (char c : inline_code(stem, f)) out += c == '-' ? std::string("-\\allowbreak{}") : std::string(1, c);
  return out;
}

} // namespace

std::string write_figures_list(const std::vector<FigureData>& figures, Format f) {
  std::string out = "\n" + section_heading("figures", f);
  if (figures.empty())
    return out + as_text("no figure: nothing in this scenario is drawn against an angle", f) + "\n";
  std::vector<std::vector<std::string>> rows;
  for (std::size_t i = 0; i < figures.size(); ++i)
    rows.push_back({std::to_string(i + 1), file_stem_text(figures[i].stem, f), as_text(figures[i].title, f)});
  const std::vector<std::string> header = {"figure", "file name (without extension)", "shows"};
  // A long file name cannot break inside a LaTeX table cell: one list item per figure there.
  out += f == Format::latex ? row_list(header, rows) : grid(header, rows, f);
  out += "\n" + std::string(f == Format::latex ? "\\noindent " : "") +
         as_text("Parameter values in the figures are illustrative, not predictions; each figure's caption lists them.",
                 f) +
         "\n";
  return out;
}

} // namespace ts
