#include "report/fit_html.hpp"

#include "figure/figure_draw.hpp"
#include "figure/fit_figure.hpp"
#include "report/html_math.hpp"
#include "report/html_report.hpp"

#include <cmath>
#include <cstdio>
#include <sstream>

namespace ts {

namespace {

std::string esc(const std::string& s) { return html_escape(s); }

std::string num(double v, int digits = 4) {
  if (!std::isfinite(v)) return v > 0 ? "inf" : "nan";
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", digits, v);
  return buf;
}

void fit_section(const FitResult& r, std::size_t index, std::ostream& os) {
  os << "<h2>" << esc(r.name) << "</h2>\n<p class=\"dim\">data: " << esc(r.data) << " (" << r.points << " points; "
     << (r.uncertainties ? "uncertainties given" : "no uncertainties: residual RMS") << ")<br>measurement: "
     << esc(r.measurement) << "<br>hypotheses: the scenario's chain and the subgroups of " << esc(r.parent)
     << "; significance level " << num(r.alpha, 3)
     << ". Fits are floating point: they rank models that were derived exactly and decide no symmetry zero.</p>\n";
  os << "<h3>Verdict</h3>\n<p><b>highest symmetry not rejected: "
     << esc(r.verdict.accepted.empty() ? "none" : r.verdict.accepted) << "</b></p>\n<ul>\n";
  for (const auto& s : r.verdict.breaking) os << "<li>symmetry breaking: " << esc(s) << "</li>\n";
  for (const auto& s : r.verdict.undecided) os << "<li>cannot be decided: " << esc(s) << "</li>\n";
  os << "</ul>\n<h3>Ranking</h3>\n<table><tr><th>#</th><th>hypothesis</th><th>order</th><th>k</th><th>"
     << (r.uncertainties ? "χ²/dof" : "RMS")
     << "</th><th>AIC</th><th>BIC</th><th>weight</th><th>F-test</th><th>status</th></tr>\n";
  int n = 0;
  for (const auto& h : r.hypotheses) {
    os << "<tr><td>" << ++n << "</td><td>" << esc(h.hypothesis.symbol);
    if (!h.same_model.empty()) os << " <span class=\"dim\">(+" << h.same_model.size() << " same model)</span>";
    os << "</td><td>" << h.groups.front().order() << "</td>";
    if (!h.fitted) {
      os << "<td colspan=\"6\" class=\"dim\">" << esc(h.not_fitted) << "</td><td>not fitted</td></tr>\n";
      continue;
    }
    os << "<td>" << h.k << "</td><td>" << num(r.uncertainties ? h.chi2_per_dof : h.rms) << "</td><td>" << num(h.aic)
       << "</td><td>" << num(h.bic) << "</td><td>" << num(h.weight, 3) << "</td><td>"
       << (h.nested ? "P = " + num(h.nested->p, 3) : std::string("-")) << "</td><td>"
       << (h.rejected ? "rejected" : "not rejected") << "</td></tr>\n";
  }
  os << "</table>\n";
  const auto figures = fit_figures(r, "fit-" + std::to_string(index));
  for (std::size_t i = 0; i < figures.size(); ++i)
    os << "<figure>\n"
       << html_inline_svg(render_figure(figures[i], FigureFormat::svg),
                          "fit" + std::to_string(index) + "-" + std::to_string(i + 1) + "-")
       << "\n<figcaption>" << esc(figures[i].caption) << "</figcaption>\n</figure>\n";
}

} // namespace

std::string write_fits_html(const FitRun& run) {
  const std::string title = run.scenario.scenario.title.empty() ? "tensorsieve scan fits" : run.scenario.scenario.title;
  std::ostringstream os;
  os << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>" << esc(title)
     << "</title>\n<style>" << html_style_sheet() << "</style>\n</head>\n<body>\n<h1>Scan fits: " << esc(title)
     << "</h1>\n";
  for (std::size_t i = 0; i < run.fits.size(); ++i) fit_section(run.fits[i], i + 1, os);
  os << "<footer>\n<p class=\"warn\">Safety</p>\n<p>Transport scans put currents through small devices, often with "
        "cryogens and in high fields; SHG scans use class 3B or 4 lasers. Local safety rules, laser-safety officers "
        "and trained staff take precedence over anything in this report.</p>\n</footer>\n</body>\n</html>\n";
  return os.str();
}

} // namespace ts
