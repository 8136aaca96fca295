// tensorsieve fit SCENARIO.toml [--data SCAN.csv --bar ... --probe ... --harmonic N]
#include "cli/commands.hpp"
#include "core/error.hpp"
#include "core/output_file.hpp"
#include "figure/figure_draw.hpp"
#include "figure/fit_figure.hpp"
#include "fit/scan_fit.hpp"
#include "report/fit_html.hpp"
#include "report/fit_report.hpp"

#include <memory>

namespace ts::cli {

void setup_fit(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    std::string file;
    FitSpec spec;
    std::string bar_option, shg_option, figures;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("fit", "fit a measured scan against every symmetry hypothesis of a scenario and "
                                        "say which symmetry the data require");
  cmd->add_option("scenario", o->file, "scenario TOML file (docs/scenarios.md); its [[fit]] tables name the scans")
      ->required();
  cmd->add_option("--data", o->spec.data, "a scan file (CSV, TSV or columns, docs/fit.md) instead of the [[fit]] tables");
  cmd->add_option("--bar", o->spec.bar, "the scenario's bar the scan was measured on: its name or number (default: the first)");
  cmd->add_option("--bar-geometry", o->bar_option, "a bar CURRENT[:FIELD] instead of the scenario's bars, as for `sample --bar`");
  cmd->add_option("--shg", o->spec.shg, "the scenario's SHG setup of an optical scan: its name or number (default: the first)");
  cmd->add_option("--shg-geometry", o->shg_option, "an SHG setup GEOMETRY:INCIDENCE instead of the scenario's, as for `sample --shg`");
  cmd->add_option("--probe", o->spec.probe, "longitudinal or transverse (default)");
  cmd->add_option("--harmonic", o->spec.harmonic, "lock-in harmonic of the drive, 0 for DC (default 1)");
  cmd->add_option("--reading", o->spec.reading, "x, y or auto (default: the output the bar's parts give)");
  cmd->add_option("--floor", o->spec.floor, "smallest group order among the hypotheses (default 1: every subgroup)");
  cmd->add_flag("--offset", o->spec.offset, "fit an unknown offset phi0 between the stage angle and sample x");
  cmd->add_option("--alpha", o->spec.alpha, "significance level of the rejections (default 0.01)");
  cmd->add_option("--figures", o->figures,
                  "write the figures (data with the best fits, residuals; SVG and PDF) into this directory");
  add_output_options(*cmd, o->out, true);
  cmd->callback([o] {
    const bool html = o->out.format == "html";
    const Format f = html ? Format::text : parse_format(o->out.format);
    Scenario sc = load_scenario(o->file);
    if (!o->bar_option.empty()) sc.bars = {parse_bar_option(o->bar_option, "--bar-geometry " + o->bar_option)};
    if (!o->shg_option.empty()) sc.shg = {parse_shg_option(o->shg_option, "--shg-geometry " + o->shg_option)};
    if (!o->spec.data.empty()) {
      FitSpec spec = o->spec;
      spec.name = "fit of " + spec.data;
      spec.data_as_written = spec.data;
      spec.where = "--data " + spec.data;
      spec.bad_value = ErrorKind::usage;
      if (spec.harmonic < 0 || spec.harmonic > 5)
        fail(ErrorKind::usage, "--harmonic " + std::to_string(spec.harmonic) + " is out of range", "--harmonic", "0 to 5");
      if (spec.floor < 1) fail(ErrorKind::usage, "--floor must be at least 1", "--floor", "a group order, 1 to 192");
      if (!(spec.alpha > 0 && spec.alpha < 0.5))
        fail(ErrorKind::usage, "--alpha must lie between 0 and 0.5", "--alpha", "0.01");
      sc.fits = {spec};
    }
    const FitRun run = run_fits(sc);
    // The figures of every fit, computed once: the page draws them and --figures writes them.
    std::vector<std::vector<FigureData>> per_fit;
    if (html || !o->figures.empty())
      for (std::size_t i = 0; i < run.fits.size(); ++i) per_fit.push_back(fit_figures(run.fits[i], "fit-" + std::to_string(i + 1)));
    const std::string report = html ? write_fits_html(run, per_fit, {report_date(), command_line()}) : write_fits(run, f);
    if (!o->figures.empty()) {
      std::vector<FigureData> figures;
      for (const auto& fs : per_fit) figures.insert(figures.end(), fs.begin(), fs.end());
      // Figures first, all together: a figure that cannot be written leaves none half-written.
      OutputBatch batch;
      write_figures(figures, o->figures, {FigureFormat::svg, FigureFormat::pdf}, &batch);
      batch.commit();
    }
    emit(o->out, report);
  });
}

} // namespace ts::cli
