// The figure and HTML options shared by `run` and `sample`: where to write the
// figures, in which formats, the illustrative values, and the report writer
// that knows the html format besides the four text formats.
#pragma once

#include "cli/commands.hpp"
#include "core/error.hpp"
#include "core/text.hpp"
#include "figure/figure_draw.hpp"
#include "report/brief_report.hpp"
#include "report/html_report.hpp"
#include "report/observation_report.hpp"
#include "report/scenario_report.hpp"

#include <CLI/CLI.hpp>

#include <cmath>
#include <iostream>
#include <string>
#include <vector>

namespace ts::cli {

struct FigureOptions {
  std::string directory, incidence, column;
  std::vector<std::string> formats, values;
  int dpi = 0;
};

inline void add_figure_options(CLI::App& cmd, FigureOptions& o) {
  cmd.add_option("--figures", o.directory, "write the figures (with a caption file each) into this directory");
  cmd.add_option("--figure-format", o.formats, "figure formats: svg, pdf, png (default svg,pdf)")->delimiter(',');
  cmd.add_option("--figure-value", o.values,
                 "illustrative value of a parameter in the figures, NAME=VALUE (repeatable; default 1 for all)")
      ->allow_extra_args(false);
  cmd.add_option("--figure-column", o.column,
                 "journal column the figures are sized for: single (3.4 in) or double (7 in); default by figure");
  cmd.add_option("--figure-dpi", o.dpi, "resolution of PNG figures in pixels per inch (default 300)");
  cmd.add_option("--figure-incidence", o.incidence,
                 "illustrative angle of incidence in degrees for SHG setups whose angle is a variable (default 45)");
}

// The options override the scenario's [figures] table.
inline void apply_figure_options(const FigureOptions& o, Scenario& sc) {
  FigureSpec& f = sc.figures;
  const bool any = !o.directory.empty() || !o.formats.empty() || !o.values.empty() || !o.incidence.empty();
  if (!any) return;
  f.present = true;
  if (f.where.empty()) f.where = "--figure-value";
  if (!o.directory.empty()) f.directory = o.directory;
  if (!o.column.empty() && o.column != "single" && o.column != "double")
    fail(ErrorKind::usage, "unknown column '" + o.column + "'", "--figure-column", "single or double");
  if (o.dpi != 0 && (o.dpi < 50 || o.dpi > 1200))
    fail(ErrorKind::usage, "--figure-dpi " + std::to_string(o.dpi) + " is out of range", "--figure-dpi", "50 to 1200");
  for (const auto& name : o.formats) parse_figure_format(name, "--figure-format");
  if (!o.formats.empty()) f.formats = o.formats;
  for (const auto& v : o.values) {
    const std::string where = "--figure-value " + v;
    std::size_t eq = v.find('=');
    double d = 0;
    std::size_t used = 0;
    bool ok = eq != std::string::npos && eq > 0 && eq + 1 < v.size();
    if (ok) try {
        d = std::stod(v.substr(eq + 1), &used);
        ok = used == v.size() - eq - 1 && std::isfinite(d);
      } catch (const std::exception&) {
        ok = false;
      }
    if (!ok) fail(ErrorKind::usage, "'" + v + "' is not NAME=VALUE", where, "e.g. --figure-value chi_xxy=0.5");
    f.values[v.substr(0, eq)] = d;
    f.where = where;
  }
  if (!o.incidence.empty()) {
    bool ok = o.incidence.size() <= 2 && o.incidence.find_first_not_of("0123456789") == std::string::npos;
    if (!ok) fail(ErrorKind::usage, "'" + o.incidence + "' is not an angle of incidence", "--figure-incidence", "0 to 89 (degrees)");
    f.incidence = std::stoi(o.incidence);
  }
}

// Report in the requested format, then the figure files; every figure is
// drawn before anything is written, so a bad value leaves no file behind.
// With `observations` (whose scenario is `r`), the report also answers them; `brief`
// asks for the chain and the verdicts only.
inline void emit_scenario(const OutputOptions& out, const ScenarioResult& r, const ObservationRun* observations = nullptr,
                          bool brief = false, const FigureOptions& look = {}) {
  const FigureSpec& spec = r.scenario.figures;
  std::vector<FigureFormat> formats;
  for (const auto& name : spec.formats) formats.push_back(parse_figure_format(name, spec.where));
  if (formats.empty()) formats = {FigureFormat::svg, FigureFormat::pdf};
  // Computed once: every writer prints the same figures, and the files are drawn from them.
  ReportFigures figures = report_figures(r, out.format == "html");
  if (figures)
    for (auto& f : *figures)
      f.column = look.column == "single" ? FigureColumn::single
                 : look.column == "double" ? FigureColumn::double_column
                                           : FigureColumn::automatic;
  std::string report;
  if (out.format == "html") report = write_scenario_html(r, *figures, observations, {report_date(), command_line()});
  else if (brief) report = write_scenario_brief(r, parse_format(out.format), observations);
  else if (observations) report = write_scenario_with_observations(*observations, figures, parse_format(out.format));
  else report = write_scenario(r, figures, parse_format(out.format));
  if (spec.directory.empty()) {
    emit(out, report);
    return;
  }
  // The report and the figures are committed together: a figure that cannot be
  // written leaves the old report in place as well.
  OutputBatch batch;
  std::vector<std::string> written = write_figures(*figures, spec.directory, formats, &batch, look.dpi ? look.dpi : 300);
  batch.add(out.output, out.format == "text" ? wrap_text(report, text_width()) : report);
  batch.commit();
  if (out.output != "-") std::cerr << "tensorsieve: wrote " << out.output << "\n";
  std::cerr << "tensorsieve: wrote " << counted(figures->size(), "figure") << ", " << counted(written.size(), "file") << ", into "
            << spec.directory << "\n";
}

} // namespace ts::cli
