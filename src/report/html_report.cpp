#include "report/html_report.hpp"
#include "report/observation_report.hpp"

#include "figure/figure_data.hpp"
#include "figure/figure_draw.hpp"
#include "geometry/optics_setup_text.hpp"
#include "report/series_text.hpp"
#include "report/html_math.hpp"

#include <sstream>

namespace ts {

namespace {

const char* style_sheet = R"(body{font-family:"DejaVu Serif",Georgia,serif;max-width:62em;margin:2em auto;padding:0 1em;color:#111;line-height:1.45}
h1{font-size:1.6em;margin-bottom:.2em}h2{font-size:1.25em;border-bottom:1px solid #999;margin-top:1.8em}h3{font-size:1.05em}
table{border-collapse:collapse;margin:.6em 0}td,th{border-top:1px solid #bbb;border-bottom:1px solid #bbb;padding:.2em .6em;text-align:left;vertical-align:top}
th{background:#f3f3f3}.formula{font-family:"DejaVu Serif",Georgia,serif}.dim{color:#555}.components{columns:2;margin:.3em 0}
figure{margin:1.2em 0;page-break-inside:avoid}figure svg{max-width:100%;height:auto}figcaption{font-size:.9em;color:#333;max-width:48em}
footer{margin-top:3em;border-top:2px solid #333;padding-top:.6em;font-size:.9em}.warn{font-weight:bold}code{font-size:.95em})";

std::string esc(const std::string& s) { return html_escape(s); }
std::string formula(const std::string& plain) { return "<span class=\"formula\">" + html_formula(plain) + "</span>"; }

std::string group_symbol(const ChainStep& st) { return st.sample_symbol.empty() ? st.id.type->symbol : st.sample_symbol; }

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

void chain_section(const ScenarioResult& r, std::ostream& os) {
  os << "<h2>Symmetry chain</h2>\n<table><tr><th>step</th><th>what</th><th>group</th><th>order</th><th>operations removed</th></tr>\n";
  for (std::size_t i = 0; i < r.chain.size(); ++i) {
    const ChainStep& st = r.chain[i];
    os << "<tr><td>" << i << "</td><td>" << esc(st.label) << "</td><td><b>" << esc(group_symbol(st)) << "</b></td><td>"
       << st.group.order() << "</td><td>" << st.lost.size() << "</td></tr>\n";
  }
  os << "</table>\n";
}

void forms_section(const ScenarioResult& r, std::ostream& os) {
  os << "<h2>Allowed forms (sample frame, last step)</h2>\n";
  for (const auto& p : r.parts) {
    const AllowedForm& form = p.forms.back();
    os << "<h3>" << esc(p.response_name) << " <span class=\"dim\">[" << esc(p.response_id) << "]</span>: "
       << esc(p.part_label) << "</h3>\n<p class=\"dim\">" << esc(p.spec.canonical_text()) << "; independent components by step: ";
    for (std::size_t k = 0; k < p.counts.size(); ++k) os << (k ? ", " : "") << p.counts[k];
    os << "</p>\n";
    if (form.independent() == 0) {
      os << "<p>forbidden: every component vanishes.</p>\n";
      continue;
    }
    int size = 1;
    for (int k = 0; k < form.spec.rank; ++k) size *= 3;
    os << "<div class=\"components\">";
    for (int code = 0; code < size; ++code) {
      std::vector<LinearTerm> v = form.value(code);
      if (v.empty()) continue;
      os << formula(form.component_name(code)) << " = " << formula(combination_text(form, v, TextStyle::plain)) << "<br>";
    }
    os << "</div>\n";
  }
}

void bars_section(const ScenarioResult& r, std::ostream& os) {
  if (r.bars.empty()) return;
  os << "<h2>Hall bars</h2>\n";
  for (const auto& b : r.bars) {
    const BarMeasurement& m = b.measurement;
    os << "<h3>" << esc(m.name) << "</h3>\n<p>current " << esc(m.current_label) << "; field "
       << esc(m.field_label.empty() ? field_geometry_name(m.field) : m.field_label)
       << ". S is the probe's field per power of the drive, E<sub>p</sub> per j<sup>n</sup>; R<sub>n</sub> = L S/(w t)<sup>n</sup> "
          "for the longitudinal and w S/(w t)<sup>n</sup> for the transverse probe.</p>\n"
       << "<table><tr><th>part</th><th>longitudinal S</th><th>transverse S</th></tr>\n";
    for (const auto& s : b.signals) {
      const PartSignal& ps = s.signal;
      const AllowedForm& form = r.parts[s.part].forms.back();
      os << "<tr><td>" << esc(r.parts[s.part].response_id + ": " + r.parts[s.part].part_label) << "</td>";
      for (const ProbeSignal* p : {&ps.longitudinal, &ps.transverse}) {
        if (ps.needs_field) os << "<td class=\"dim\">needs a field</td>";
        else if (!p->reads()) os << "<td>0</td>";
        else {
          os << "<td>" << formula(fourier_series_text(p->terms, form, TextStyle::plain)) << "</td>";
        }
      }
      os << "</tr>\n";
    }
    os << "</table>\n";
  }
}

void optics_section(const ScenarioResult& r, std::ostream& os) {
  if (r.shg.empty() && r.kerr.empty()) return;
  os << "<h2>Optical setups</h2>\n";
  for (const auto& s : r.shg) {
    const OpticalMeasurement& m = s.measurement;
    os << "<h3>Second-harmonic polarimetry: " << esc(m.name) << "</h3>\n<p>" << esc(optical_setup_text(m))
       << ". Channels input-output; amplitudes exact up to one prefactor per source kind; "
       << esc(local_field_text(m)) << ".</p>\n";
    for (const auto& src : s.sources) {
      const PartForms& p = r.parts[src.part];
      const AllowedForm& form = p.forms.back();
      os << "<p><b>" << esc(p.response_id + ": " + p.part_label) << "</b>";
      if (form.independent() == 0) {
        os << ": forbidden in this group.</p>\n";
        continue;
      }
      os << "</p>\n<table><tr><th>channel</th><th>amplitude A</th><th>harmonics of |A|<sup>2</sup></th></tr>\n";
      for (std::size_t c = 0; c < m.channels.size(); ++c) {
        const ChannelAmplitude& a = src.channels[c];
        std::string hs;
        for (const auto& h : product_harmonics(a, a)) hs += (hs.empty() ? "" : ", ") + formula(harmonic_text(h));
        os << "<tr><td>" << esc(m.channels[c].name) << "</td><td>"
           << (a.radiates() ? formula(optical_amplitude_text(optical_terms(a), form, TextStyle::plain)) : "0 (every parameter value)")
           << "</td><td>" << (hs.empty() ? "none" : hs) << "</td></tr>\n";
      }
      os << "</table>\n";
    }
    for (const auto& in : s.interference) {
      os << "<p>Domain contrast: " << esc(r.parts[s.sources[in.i_source].part].part_label) << " with "
         << esc(r.parts[s.sources[in.c_source].part].part_label)
         << ", I<sub>±</sub> = I<sub>i</sub> + I<sub>c</sub> ± 2 Re(A<sub>i</sub> A<sub>c</sub><sup>*</sup>) in ";
      std::string per;
      for (std::size_t c = 0; c < in.cross.size(); ++c)
        if (!in.cross[c].empty()) per += (per.empty() ? "" : ", ") + esc(m.channels[c].name);
      os << per << ".</p>\n";
    }
  }
  for (const auto& k : r.kerr) {
    os << "<h3>Magneto-optics: " << esc(k.name) << "</h3>\n";
    if (k.g_part) {
      const AllowedForm& g = r.parts[*k.g_part].forms.back();
      os << "<table><tr><th>Kerr geometry</th><th>reads</th><th>status</th><th>signal (φ: plane of incidence)</th></tr>\n";
      for (const auto& kr : k.kerr) {
        const std::string sig = kr.terms.empty() ? "" : formula(fourier_series_text(kr.terms, g, TextStyle::plain));
        os << "<tr><td>" << esc(kr.geometry) << "</td><td>" << esc(kr.reads) << "</td><td>"
           << (kr.allowed() ? "allowed" : "forbidden") << "</td><td>" << (sig.empty() ? "0" : sig) << "</td></tr>\n";
      }
      os << "</table>\n";
    }
    if (k.q_part) {
      const AllowedForm& q = r.parts[*k.q_part].forms.back();
      os << "<p>Quadratic terms for the magnetisation " << esc(k.magnetisation_label) << ":</p>\n<table>";
      for (const auto& v : k.voigt) {
        const std::string val = v.terms.empty() ? "" : formula(fourier_series_text(v.terms, q, TextStyle::plain));
        os << "<tr><td>" << (v.indices == "xx-yy" ? std::string("Δε<sub>xx</sub> − Δε<sub>yy</sub>")
                                                  : "Δε<sub>" + esc(v.indices) + "</sub>")
           << "</td><td>" << (val.empty() ? "0" : val) << "</td></tr>\n";
      }
      os << "</table>\n";
    }
  }
}

void figures_section(const ScenarioResult& r, std::ostream& os) {
  std::vector<FigureData> figures = scenario_figures(r, figure_settings(r.scenario.figures));
  if (figures.empty()) return;
  os << "<h2>Figures</h2>\n<p>Parameter values in the figures are illustrative, not predictions.</p>\n";
  for (std::size_t i = 0; i < figures.size(); ++i) {
    os << "<figure id=\"figure-" << i + 1 << "\">\n"
       << inline_svg(render_figure(figures[i], FigureFormat::svg), "f" + std::to_string(i + 1) + "-") << "\n<figcaption><b>Figure "
       << i + 1 << ".</b> " << esc(figures[i].caption) << "</figcaption>\n</figure>\n";
  }
}

void observations_section(const ObservationRun& run, std::ostream& os) {
  os << "<h2>Observations: what the signals prove</h2>\n";
  for (const AnswerText& a : answers_text(run)) {
    os << "<h3>" << esc(a.heading) << "</h3>\n<p>" << esc(a.seen) << "<br>" << esc(a.verdict) << "</p>\n";
    if (a.solutions.empty()) continue;
    os << "<table><tr>";
    for (const auto& c : answer_columns()) os << "<th>" << esc(c) << "</th>";
    os << "<th>produced by</th></tr>\n";
    for (const auto& s : a.solutions)
      os << "<tr><td>" << esc(s.number) << "</td><td><b>" << esc(s.group) << "</b></td><td>" << esc(s.order)
         << "</td><td>" << esc(s.index) << "</td><td>" << esc(s.variants) << "</td><td>" << esc(s.shown_by)
         << "</td><td>" << esc(s.equal_domains) << "</td><td>" << esc(s.produced_by) << "</td></tr>\n";
    os << "</table>\n<p class=\"dim\">" << esc(a.domains_note) << "</p>\n";
  }
}

} // namespace

const char* html_style_sheet() { return style_sheet; }
std::string html_inline_svg(std::string svg, const std::string& prefix) { return inline_svg(std::move(svg), prefix); }

std::string write_scenario_html(const ScenarioResult& r, const ObservationRun* observations) {
  const Scenario& sc = r.scenario;
  const std::string title = sc.title.empty() ? "tensorsieve scenario" : sc.title;
  std::ostringstream os;
  os << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>" << esc(title)
     << "</title>\n<style>" << style_sheet << "</style>\n</head>\n<body>\n<h1>" << esc(title) << "</h1>\n"
     << "<p class=\"dim\">source: " << esc(sc.source);
  if (!r.parent_note.empty()) os << "; parent: " << esc(r.parent_note);
  os << "<br>sample frame: x ∥ " << esc(r.frame_labels[0]) << ", y ∥ " << esc(r.frame_labels[1]) << ", z ∥ "
     << esc(r.frame_labels[2]) << " (right-handed)</p>\n";
  chain_section(r, os);
  forms_section(r, os);
  bars_section(r, os);
  optics_section(r, os);
  if (observations) observations_section(*observations, os);
  figures_section(r, os);
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
