#include "report/fit_html.hpp"

#include "figure/figure_draw.hpp"
#include "report/fit_report.hpp"
#include "report/html_math.hpp"
#include "report/markdown_html.hpp"

#include <sstream>

namespace ts {

std::string write_fits_html(const FitRun& run, const std::vector<std::vector<FigureData>>& fit_figures,
                            const HtmlStamp& stamp) {
  const std::string title = run.scenario.scenario.title.empty() ? "tensorsieve scan fits" : run.scenario.scenario.title;
  std::ostringstream os;
  os << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>" << html_escape(title)
     << "</title>\n<style>" << html_style_sheet() << "</style>\n</head>\n<body>\n<h1>Scan fits: " << html_escape(title)
     << "</h1>\n<p class=\"dim\" id=\"stamp\">" << html_stamp(stamp) << "</p>\n";
  // Each fit as the Markdown writer prints it (ranking, verdict, the models with their
  // coefficients), then its figures: one writer, so the page cannot fall behind the text.
  for (std::size_t i = 0; i < run.fits.size(); ++i) {
    const FitResult& r = run.fits[i];
    const std::string n = std::to_string(i + 1);
    os << "<section id=\"fit-" << n << "\">\n"
       << markdown_to_html(section_heading("fit: " + r.name, Format::markdown, 2) +
                               write_fit_section(r, Format::markdown),
                           -1);
    const std::vector<FigureData>& figures = fit_figures.at(i);
    for (std::size_t k = 0; k < figures.size(); ++k)
      os << "<figure>\n"
         << html_inline_svg(render_figure(figures[k], FigureFormat::svg), "fit" + n + "-" + std::to_string(k + 1) + "-")
         << "\n<figcaption>" << html_escape(figures[k].caption) << "</figcaption>\n</figure>\n";
    os << "</section>\n";
  }
  os << "<footer>\n<p class=\"warn\">Safety</p>\n<p>Transport scans put currents through small devices, often with "
        "cryogens and in high fields; SHG scans use class 3B or 4 lasers. Local safety rules, laser-safety officers "
        "and trained staff take precedence over anything in this report.</p>\n</footer>\n</body>\n</html>\n";
  return os.str();
}

} // namespace ts
