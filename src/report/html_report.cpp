#include "report/html_report.hpp"
#include "report/brief_report.hpp"
#include "report/markdown_html.hpp"
#include "report/observation_report.hpp"
#include "report/scenario_report.hpp"

#include "figure/figure_data.hpp"
#include "figure/figure_draw.hpp"
#include "report/html_math.hpp"

#include <sstream>

namespace ts {

namespace {

const char* style_sheet = R"(body{font-family:"DejaVu Serif",Georgia,serif;max-width:62em;margin:2em auto;padding:0 1em;color:#111;line-height:1.45}
h1{font-size:1.6em;margin-bottom:.2em}h2{font-size:1.25em;border-bottom:1px solid #999;margin-top:1.8em}h3{font-size:1.05em}
table{border-collapse:collapse;margin:.6em 0}td,th{border-top:1px solid #bbb;border-bottom:1px solid #bbb;padding:.2em .6em;text-align:left;vertical-align:top}
th{background:#f3f3f3}.formula{font-family:"DejaVu Serif",Georgia,serif}.dim{color:#555}.components{columns:2;margin:.3em 0}
figure{margin:1.2em 0;page-break-inside:avoid}figure svg{max-width:100%;height:auto}figcaption{font-size:.9em;color:#333;max-width:48em}
pre{font-size:.9em;overflow-x:auto}li.sub{margin-left:1.6em;list-style:circle}footer{margin-top:3em;border-top:2px solid #333;padding-top:.6em;font-size:.9em}.warn{font-weight:bold}code{font-size:.95em})";

std::string esc(const std::string& s) { return html_escape(s); }

// A path as the page shows it: the file's name only, never where it lives on this machine.
std::string file_name(const std::string& path) {
  const std::size_t slash = path.find_last_of('/');
  return slash == std::string::npos ? path : path.substr(slash + 1);
}

// A Markdown report without its title (the page has its own) and the closing pointer
// of the short report to the long one, which follows on the page.
std::string without_title(std::string md) {
  if (!md.empty() && md.front() == '#') md.erase(0, md.find('\n') + 1);
  const std::size_t pointer = md.find("The full report (without --brief)");
  if (pointer != std::string::npos) md.erase(pointer, md.find('\n', pointer) - pointer);
  return md;
}

// Make the ids of one inline SVG unique in the page (cairo numbers its glyphs
// and clips from 1 in every document), and drop the XML declaration.
std::string inline_svg(std::string svg, const std::string& prefix) {
  std::size_t start = svg.find("<svg");
  if (start != std::string::npos) svg = svg.substr(start);
  auto replace_all = [&](const std::string& from, const std::string& to) {
    for (std::size_t at = svg.find(from); at != std::string::npos; at = svg.find(from, at + to.size()))
      svg.replace(at, from.size(), to);
  };
  replace_all("id=\"", "id=\"" + prefix);
  replace_all("href=\"#", "href=\"#" + prefix);
  replace_all("url(#", "url(#" + prefix);
  return svg;
}

void figures_section(const std::vector<FigureData>& figures, std::ostream& os) {
  if (figures.empty()) return;
  os << "<h2>Figures</h2>\n<p>Parameter values in the figures are illustrative, not predictions.</p>\n";
  for (std::size_t i = 0; i < figures.size(); ++i) {
    os << "<figure id=\"figure-" << i + 1 << "\">\n"
       << inline_svg(render_figure(figures[i], FigureFormat::svg), "f" + std::to_string(i + 1) + "-") << "\n<figcaption><b>Figure "
       << i + 1 << ".</b> " << esc(figures[i].caption) << "</figcaption>\n</figure>\n";
  }
}

} // namespace

const char* html_style_sheet() { return style_sheet; }
std::string html_stamp(const HtmlStamp& stamp) {
  return std::string("tensorsieve ") + TENSORSIEVE_VERSION + (stamp.date.empty() ? "" : ", " + esc(stamp.date)) +
         (stamp.command.empty() ? "" : "; command: <code>" + esc(stamp.command) + "</code>");
}
std::string html_inline_svg(std::string svg, const std::string& prefix) { return inline_svg(std::move(svg), prefix); }

std::string write_scenario_html(const ScenarioResult& r, const std::vector<FigureData>& figures,
                                const ObservationRun* observations, const HtmlStamp& stamp) {
  const Scenario& sc = r.scenario;
  const std::string title = sc.title.empty() ? "tensorsieve scenario" : sc.title;
  std::ostringstream os;
  os << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>" << esc(title)
     << "</title>\n<style>" << style_sheet << "</style>\n</head>\n<body>\n<h1>" << esc(title) << "</h1>\n"
     << "<p class=\"dim\" id=\"stamp\">" << html_stamp(stamp) << "<br>source: " << esc(file_name(sc.source)) << "</p>\n";
  // The page shows what the Markdown writers print, section by section: the short
  // report (chain and verdicts) first, then the whole report. One writer each, so
  // the page has every section the text has (domains, lock-in readings, the Hall
  // test, layouts, observations) and cannot fall behind it.
  os << "<section id=\"summary\">\n<h2>Summary and verdicts</h2>\n"
     << markdown_to_html(without_title(write_scenario_brief(r, Format::markdown, observations)), 1) << "</section>\n";
  // The page draws the figures itself, so the Markdown report is asked for none.
  const std::string full = observations ? write_scenario_with_observations(*observations, std::nullopt, Format::markdown)
                                        : write_scenario(r, std::nullopt, Format::markdown);
  figures_section(figures, os); // the pictures before the long report, where a reader looks first
  os << "<section id=\"report\">\n<h2>Report</h2>\n" << markdown_to_html(without_title(full), 1) << "</section>\n";
  os << "<footer>\n<p class=\"warn\">Safety</p>\n<p>Optical experiments of this kind use class 3B and class 4 lasers, "
        "often pulsed and invisible: wear eye protection rated for the wavelengths and powers in use, keep beams "
        "enclosed and below eye level, keep the interlocks working and never look into a beam or its reflection. "
        "Transport measurements may involve cryogens, high magnetic fields and currents through small devices. "
        "Local safety rules, laser-safety officers and trained staff take precedence over anything in this report.</p>\n"
        "<p class=\"dim\">Written by tensorsieve. Every component shown as nonzero is provably allowed by symmetry; "
        "its size is not predicted.</p>\n</footer>\n</body>\n</html>\n";
  return os.str();
}

} // namespace ts
