#include "figure/figure_data.hpp"

#include "core/error.hpp"
#include "core/text.hpp"
#include "geometry/optics_setup_text.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <set>
#include <sstream>

namespace ts {

namespace {

constexpr double pi = 3.14159265358979323846;
constexpr int samples = 361; // 1° steps, both ends included

// Illustrative values for the parameters the user did not set, taken in order of
// first use: distinct, of both magnitudes around 1, and with three free digits, so
// that no small combination with the exact coefficients (rationals and square roots)
// cancels. One value per name in every figure of a report. A channel that vanishes
// all the same is labelled on the figure, never left as an empty panel.
const double kIllustrative[] = {1.0, 0.731, 1.297, 0.583, 1.162, 0.419, 1.511, 0.857, 1.073, 0.647, 1.389, 0.523};

// Illustrative parameter values, recording which names were used.
class Values {
public:
  explicit Values(const FigureSettings& s) : s_(s) {}
  double of(const std::string& name) {
    used_.insert(name);
    auto it = s_.values.find(name);
    if (it != s_.values.end()) return it->second;
    auto [at, fresh] = assigned_.emplace(name, 0.0);
    if (fresh) {
      const std::size_t n = assigned_.size() - 1, size = sizeof kIllustrative / sizeof kIllustrative[0];
      at->second = kIllustrative[n % size] + 0.041 * static_cast<double>(n / size);
    }
    return at->second;
  }
  // "chi_xxy = 1, chi_zzz = 0.5" for the parameters of one form.
  std::string listed(const AllowedForm& form) {
    std::ostringstream os;
    for (int j = 0; j < form.independent(); ++j) os << (j ? ", " : "") << form.parameter_name(j) << " = " << of(form.parameter_name(j));
    return os.str();
  }
  const std::set<std::string>& used() const { return used_; }

private:
  const FigureSettings& s_;
  std::set<std::string> used_;
  std::map<std::string, double> assigned_;
};

// Below this fraction of the figure's largest value a sampled curve counts as zero.
constexpr double kVanishes = 1e-9;

double peak_of(const Curve& c) {
  double p = 0;
  for (double v : c.y) p = std::max(p, std::abs(v));
  return p;
}

std::string slug(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (std::isalnum(static_cast<unsigned char>(c))) out += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    else if (!out.empty() && out.back() != '-') out += '-';
    if (out.size() >= 40) break;
  }
  while (!out.empty() && out.back() == '-') out.pop_back();
  return out;
}

double series_value(const std::vector<FourierTerm>& terms, const AllowedForm& form, Values& v,
                    const std::array<double, angle_count>& radians) {
  double sum = 0;
  for (const auto& t : terms) {
    double c = 0;
    for (const auto& lt : t.coefficient) c += lt.coefficient.to_double() * v.of(form.parameter_name(lt.parameter));
    sum += c * angle_function_double(t, radians);
  }
  return sum;
}

// Azimuth from sample x of the in-plane part of an exact direction, in degrees.
double in_plane_deg(const std::array<Surd, 3>& v) {
  return std::atan2(v[1].to_double(), v[0].to_double()) * 180 / pi;
}

const char* illustrative_note = "Illustrative parameter values, not predictions";

std::string figure_local_field_text(const OpticalMeasurement& m) {
  std::string s = local_field_text(m);
  s[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(s[0])));
  if (m.local_field.applied && !m.local_field.indices) s += "; the curves take every factor as 1";
  return s;
}

void shg_figures(const ScenarioResult& r, const FigureSettings& settings, Values& values, std::vector<FigureData>& out) {
  for (std::size_t si = 0; si < r.shg.size(); ++si) {
    const ShgResult& s = r.shg[si];
    const OpticalMeasurement& m = s.measurement;
    const int theta_deg = m.incidence_deg ? *m.incidence_deg : settings.incidence_deg;
    const double theta = theta_deg * pi / 180;
    // Factors without indices have no numbers: the curves take them as 1, and say so.
    std::array<Complex, local_field_symbol_count> factors;
    factors.fill(Complex(1, 0));
    if (m.local_field.indices) factors = m.local_field.values;
    for (const auto& src : s.sources) {
      const PartForms& p = r.parts[src.part];
      const AllowedForm& form = p.forms.back();
      bool any = false;
      for (const auto& c : src.channels) any = any || c.radiates();
      if (!any) continue;
      // Turning sample: polar plot against φ; fixed sample: the rotating-polariser channels against α_in.
      FigureData f;
      f.kind = m.azimuth_rotating ? FigureKind::polar : FigureKind::line;
      f.stem = "shg-" + std::to_string(si + 1) + "-" + slug(p.response_id) + "-" + slug(p.part_label);
      f.title = "SHG intensity, " + p.part_label;
      f.x_label = m.azimuth_rotating ? "sample azimuth φ (deg)" : "polariser angle α_in (deg)";
      f.y_label = "SH intensity (arb. units)";
      std::vector<std::string> skipped;
      for (std::size_t c = 0; c < m.channels.size(); ++c) {
        const OpticalChannel& ch = m.channels[c];
        if (m.azimuth_rotating == ch.in.rotating) {
          skipped.push_back(ch.name);
          continue;
        }
        Curve curve;
        curve.label = ch.name;
        const bool forbidden = !src.channels[c].radiates();
        for (int i = 0; i < samples && !forbidden; ++i) {
          const double x = i * 360.0 / (samples - 1), rad = x * pi / 180;
          std::array<double, angle_count> angles{};
          angles[static_cast<int>(m.azimuth_rotating ? Angle::phi : Angle::polariser)] = rad;
          if (!m.azimuth_rotating) angles[static_cast<int>(Angle::phi)] = m.azimuth_deg * pi / 180;
          Complex amp = 0;
          for (int j = 0; j < form.independent(); ++j)
            amp += values.of(form.parameter_name(j)) *
                   theta_trig_value(src.channels[c].per_parameter[j], theta, angles, factors);
          curve.x.push_back(x);
          curve.y.push_back(std::norm(amp));
        }
        if (forbidden) { // drawn as a flat zero, and said so
          for (int i = 0; i < samples; ++i) {
            curve.x.push_back(i * 360.0 / (samples - 1));
            curve.y.push_back(0);
          }
        }
        if (f.kind == FigureKind::polar) {
          f.panel_titles.push_back(ch.name);
          f.panels.push_back({curve});
          f.panel_notes.push_back(forbidden ? "forbidden by symmetry" : "");
        } else {
          if (f.panels.empty()) f.panels.emplace_back();
          if (forbidden) curve.label += " (0: forbidden by symmetry)";
          f.panels[0].push_back(curve);
        }
      }
      if (f.panels.empty()) continue;
      // An allowed channel that is flat at these values is not forbidden: label it so.
      // Panels whose maxima differ by more than 3 get their own radial scales.
      double top = 0, low = 0;
      for (const auto& panel : f.panels)
        for (const auto& c : panel) top = std::max(top, peak_of(c));
      std::vector<std::string> zero_at_values;
      for (std::size_t k = 0; k < f.panels.size(); ++k)
        for (auto& c : f.panels[k]) {
          const bool noted = f.kind == FigureKind::polar ? !f.panel_notes[k].empty()
                                                         : c.label.find("forbidden") != std::string::npos;
          if (noted) continue;
          if (peak_of(c) <= kVanishes * top || top == 0) {
            zero_at_values.push_back(c.label);
            if (f.kind == FigureKind::polar) f.panel_notes[k] = "zero at these values (allowed)";
            else c.label += " (0 at these values; allowed)";
          } else {
            low = low == 0 ? peak_of(c) : std::min(low, peak_of(c));
          }
        }
      f.own_scales = f.kind == FigureKind::polar && low > 0 && top > 3 * low;
      const std::string theta_text = "θ = " + std::to_string(theta_deg) + "°" + (m.incidence_deg ? "" : " (illustrative)");
      f.note = std::string(illustrative_note) + " (listed in the caption); " + theta_text +
               (!m.local_field.applied ? ""
                : m.local_field.indices ? "; local-field factors from n(ω) = " + m.local_field.indices->omega.text +
                                              ", n(2ω) = " + m.local_field.indices->two_omega.text
                                        : "; local-field factors 1") +
               ".";
      std::ostringstream cap;
      cap << "Second-harmonic intensity of the source '" << p.part_label << "' (" << p.response_id << ") in "
          << optical_setup_text(m) << ", at " << theta_text << ", "
          << (m.azimuth_rotating ? "against the sample azimuth φ, one panel per polariser-analyser channel (input-output)"
                                 : "against the polariser angle α_in at the sample azimuth " + std::to_string(m.azimuth_deg) + "°")
          << (f.kind != FigureKind::polar ? ". The curves share one scale"
              : f.own_scales ? ". Each panel is scaled to its own maximum, printed under its title (the maxima differ by "
                               "more than a factor of 3)"
                             : ". Every panel is scaled to the largest intensity of the figure")
          << ". The parameter values are illustrative, not predictions, distinct so that allowed terms do not cancel: "
          << values.listed(form)
          << " (real values; set them with [figures] values or --figure-value). " << figure_local_field_text(m)
          << ". The exact amplitudes are in the report.";
      for (std::size_t k = 0; k < f.panel_notes.size(); ++k)
        if (f.panel_notes[k] == "forbidden by symmetry")
          cap << " " << f.panel_titles[k] << " is forbidden by symmetry: zero for every parameter value.";
      if (!zero_at_values.empty())
        cap << " " << join(zero_at_values, ", ") << (zero_at_values.size() == 1 ? " is" : " are")
            << " allowed but zero at these illustrative values; other values (--figure-value) give a signal.";
      if (!skipped.empty()) {
        cap << " Not drawn here (the sample and the polariser cannot both turn in one plot): ";
        for (std::size_t i = 0; i < skipped.size(); ++i) cap << (i ? ", " : "") << skipped[i];
        cap << ".";
      }
      f.caption = cap.str();
      out.push_back(std::move(f));
    }
  }
}

void bar_figures(const ScenarioResult& r, Values& values, std::vector<FigureData>& out) {
  for (std::size_t bi = 0; bi < r.bars.size(); ++bi) {
    const BarResult& b = r.bars[bi];
    const BarMeasurement& m = b.measurement;
    const bool field_turns = m.field == FieldGeometry::in_plane || m.field == FieldGeometry::any;
    if (!m.rotating && !field_turns) continue;
    for (const auto& s : b.signals) {
      const PartSignal& ps = s.signal;
      if (!ps.reads() || ps.needs_field) continue;
      const PartForms& p = r.parts[s.part];
      const AllowedForm& form = p.forms.back();
      FigureData f;
      f.kind = FigureKind::line;
      f.stem = "bar-" + std::to_string(bi + 1) + "-" + slug(p.response_id) + "-" + slug(p.part_label);
      f.title = p.response_name + ": " + p.part_label;
      f.x_label = m.rotating ? "current angle φ from sample x (deg)" : "field angle φ_B from sample x (deg)";
      f.y_label = "probe signal S (arb. units)";
      f.panels.emplace_back();
      f.sketch.present = true;
      f.sketch.current_rotating = m.rotating;
      f.sketch.current_deg = m.rotating ? 30 : in_plane_deg(m.u);
      f.sketch.axis_labels = {r.frame_labels[0], r.frame_labels[1]};
      // The field as the curves take it: along sample x when the current turns, drawn
      // at 60° when the field itself turns, else its own direction.
      switch (m.field) {
      case FieldGeometry::none: break;
      case FieldGeometry::normal: f.sketch.field_normal = true; break;
      case FieldGeometry::along_current: f.sketch.field_deg = f.sketch.current_deg; break;
      case FieldGeometry::across_current: f.sketch.field_deg = f.sketch.current_deg + 90; break;
      case FieldGeometry::fixed:
        if (std::abs(m.b[0].to_double()) + std::abs(m.b[1].to_double()) < 1e-12) f.sketch.field_normal = true;
        else f.sketch.field_deg = in_plane_deg(m.b);
        break;
      default: f.sketch.field_deg = m.rotating ? 0.0 : 60.0;
      }
      for (const ProbeSignal* probe : {&ps.longitudinal, &ps.transverse}) {
        Curve c;
        c.label = probe_name(probe->probe);
        if (!probe->reads()) c.label += " (0: forbidden by symmetry)";
        for (int i = 0; i < samples; ++i) {
          const double x = i * 360.0 / (samples - 1), rad = x * pi / 180;
          std::array<double, angle_count> angles{};
          angles[static_cast<int>(Angle::theta_b)] = pi / 2; // a field of free direction is drawn in the plane
          angles[static_cast<int>(m.rotating ? Angle::phi : Angle::phi_b)] = rad;
          c.x.push_back(x);
          c.y.push_back(series_value(probe->terms, form, values, angles));
        }
        f.panels[0].push_back(c);
      }
      const double top = std::max(peak_of(f.panels[0][0]), peak_of(f.panels[0][1]));
      for (Curve& c : f.panels[0])
        if (c.label.find("forbidden") == std::string::npos && peak_of(c) <= kVanishes * top)
          c.label += " (0 at these values; allowed)";
      f.note = std::string(illustrative_note) + " (listed in the caption).";
      std::ostringstream cap;
      cap << "Signal per power of the current, E_p per j^" << ps.current_order << " in the part's own convention, of the "
          << "longitudinal and transverse probes of the bar '" << m.name << "' (current " << m.current_label << ", field "
          << (m.field_label.empty() ? field_geometry_name(m.field) : m.field_label) << ") for '" << p.part_label << "' ("
          << p.response_id << ")"
          << (m.rotating ? ", against the current angle φ" : ", against the field angle φ_B")
          << (m.rotating && field_turns ? ", with the field along sample x (φ_B = 0) and in the plane" : "")
          << (!m.rotating && m.field == FieldGeometry::any ? ", with the field in the plane (θ_B = 90°)" : "")
          << ". The parameter values are illustrative, not predictions, distinct so that allowed terms do not "
             "cancel: "
          << values.listed(form) << ". The sketch shows the bar with its current pads and voltage probes, the current j"
          << (m.rotating ? " at an angle φ" : "") << " and the field B"
          << (m.field == FieldGeometry::none ? " (none)" : "") << ". The exact series are in the report.";
      f.caption = cap.str();
      out.push_back(std::move(f));
    }
  }
}

void rosette_figures(const ScenarioResult& r, std::vector<FigureData>& out) {
  for (std::size_t li = 0; li < r.layouts.size(); ++li) {
    const LayoutResult& l = r.layouts[li];
    for (std::size_t i = 0; i < l.designs.size(); ++i) {
      const LayoutDesign& d = l.designs[i];
      if (d.chosen.empty()) continue;
      const PartForms& p = r.parts[l.parts[i]];
      FigureData f;
      f.kind = FigureKind::rosette;
      f.stem = "layout-" + std::to_string(li + 1) + "-" + slug(p.response_id) + "-" + slug(p.part_label);
      f.title = "Bars to pattern: " + p.part_label;
      f.axis_labels = {r.frame_labels[0], r.frame_labels[1]};
      for (std::size_t c : d.chosen) f.bars.push_back({d.candidates[c].azimuth_deg, d.candidates[c].label});
      f.note = "Sketch, not to scale; crystal directions of the sample axes marked.";
      std::ostringstream cap;
      cap << "Rosette of "
          << (d.chosen.size() == 1 ? std::string("the bar that reads")
                                   : "the " + counted(d.chosen.size(), "bar") + " that together read")
          << " every parameter of '" << p.part_label
          << "' (" << p.response_id << ") the candidates can read, at harmonic " << l.spec.harmonic
          << "; sample x ∥ " << r.frame_labels[0] << ", y ∥ " << r.frame_labels[1] << ". Bars: ";
      for (std::size_t k = 0; k < f.bars.size(); ++k) cap << (k ? ", " : "") << f.bars[k].label;
      cap << ". Drawn as a sketch, not to scale.";
      f.caption = cap.str();
      out.push_back(std::move(f));
    }
  }
}

} // namespace

FigureSettings figure_settings(const FigureSpec& spec) {
  FigureSettings s;
  s.values = spec.values;
  if (spec.incidence) s.incidence_deg = *spec.incidence;
  s.where = spec.where.empty() ? "[figures]" : spec.where;
  return s;
}

std::vector<FigureData> scenario_figures(const ScenarioResult& r, const FigureSettings& settings) {
  if (settings.incidence_deg < 0 || settings.incidence_deg >= 90)
    fail(ErrorKind::usage, "illustrative angle of incidence " + std::to_string(settings.incidence_deg) + "° is outside 0-89°",
         settings.where, "an angle from the normal such as 45");
  Values values(settings);
  std::vector<FigureData> out;
  shg_figures(r, settings, values, out);
  bar_figures(r, values, out);
  rosette_figures(r, out);
  for (auto& f : out) f.column = settings.column;
  for (const auto& [name, v] : settings.values)
    if (!values.used().count(name)) {
      std::string known;
      for (const auto& u : values.used()) known += (known.empty() ? "" : ", ") + u;
      fail(ErrorKind::usage, "no figure has a parameter '" + name + "'", settings.where,
           known.empty() ? std::string("no figure has parameters") : "one of " + known);
    }
  return out;
}

ReportFigures report_figures(const ScenarioResult& r, bool page) {
  if (!r.scenario.figures.present && !page) return std::nullopt;
  return scenario_figures(r, figure_settings(r.scenario.figures));
}

} // namespace ts
