// The scenario report as one self-contained HTML page (`--format html` of
// `run` and `sample`): the summary and verdicts, then the whole report as the
// Markdown writers print it (chain, forms, domains, Hall bars, layouts, optics,
// observations), and the figures inline as SVG, with formulas in HTML sub- and
// superscripts. No script, no external file, no web font: the page opens
// offline in any browser. The footer carries the safety notes.
#pragma once

#include "figure/figure_data.hpp"
#include "scenario/observation_run.hpp"
#include "scenario/scenario_run.hpp"

#include <string>

namespace ts {

// What the page says about itself: the program's version, the date it was written
// and the command that wrote it (file arguments by their names, no machine paths).
struct HtmlStamp {
  std::string date, command;
};

// `figures` are the page's pictures (report_figures(r, true)). With `observations`
// (a run of a scenario with [[observation]] tables, whose scenario is `r`), the
// page also answers them.
std::string write_scenario_html(const ScenarioResult& r, const std::vector<FigureData>& figures,
                                const ObservationRun* observations = nullptr, const HtmlStamp& stamp = {});

// The style sheet of the pages, the stamp line (version, date, command; HTML), and
// an SVG made safe to inline in a page (its ids prefixed), shared with the page of
// scan fits (fit_html.hpp).
const char* html_style_sheet();
std::string html_stamp(const HtmlStamp& stamp);
std::string html_inline_svg(std::string svg, const std::string& prefix);

} // namespace ts
