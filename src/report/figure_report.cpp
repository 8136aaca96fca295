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

} // namespace ts
