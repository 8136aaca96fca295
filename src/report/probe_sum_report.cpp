#include "report/probe_sum_report.hpp"

#include "core/text.hpp"
#include "report/expression_text.hpp"
#include "report/report_prose.hpp"
#include "report/series_text.hpp"

#include <algorithm>
#include <sstream>

namespace ts {

namespace {

using namespace prose_text;

std::string heading(const std::string& s, Format f, int level) { return section_heading(s, f, level); }
std::string harmonic_name(int k) { return k == 0 ? "DC" : std::to_string(k) + "ω"; }
std::string plural(std::size_t n, const std::string& one, const std::string& many) {
  return std::to_string(n) + " " + (n == 1 ? one : many);
}

const AllowedForm& form_of(const ScenarioResult& r, const SumMechanism& m) {
  return (m.background ? r.background : r.parts)[m.part].forms.back();
}

std::string lock_in_text(const SumTerm& t, int n, Format f) {
  auto one = [&](const char* name, const Surd& s) {
    std::string c = s == Surd(Rational(1)) ? "" : s == Surd(Rational(-1)) ? "-" : surd_text(s, style_of(f)) + " ";
    return std::string(name) + " = " + c + (f == Format::latex ? "R_{" + std::to_string(n) + "}" : "R_" + std::to_string(n));
  };
  if (t.quadrature == Quadrature::x) return math(one("X", t.x), f);
  if (t.quadrature == Quadrature::y) return math(one("Y", t.y), f);
  return math(one("X", t.x) + ", " + one("Y", t.y), f);
}

std::string type_text(const SumMechanism& m) {
  std::string s = m.onsager_form ? "i+c" : m.c_type ? "c" : "i";
  if (m.thermal) s += ", thermal";
  if (m.background) s += ", background";
  return s;
}

std::string signal_text(const ScenarioResult& r, const SumMechanism& m, const SumTerm& t, Format f,
                        bool magnetisation_angles) {
  std::string pre = m.field_driven ? (f == Format::latex ? "-\\rho_0^{" + std::to_string(m.current_order + 1) + "} "
                                                         : "-rho0^" + std::to_string(m.current_order + 1) + " × ")
                                   : "";
  if (m.thermal) pre += f == Format::latex ? "G\\," : "G × ";
  std::string body = fourier_series_text(t.terms, form_of(r, m), style_of(f));
  if (magnetisation_angles) body = as_magnetisation_angles(body);
  const bool several = t.terms.size() > 1 || (t.terms.size() == 1 && t.terms[0].coefficient.size() > 1);
  if (!pre.empty() && several) body = (f == Format::latex ? "\\left(" + body + "\\right)" : "(" + body + ")");
  return math(pre + body, f);
}

std::string combination_text(const MeasurementPlan& p, const PlanCombination& c, Format f) {
  std::string out;
  for (const auto& [col, coef] : c) {
    std::string name = symbol_text(p.columns[col].name, style_of(f));
    const int sign = coef.sign();
    const Surd mag = sign < 0 ? -coef : coef;
    std::string factor = mag == Surd(Rational(1)) ? "" : (mag.terms().size() > 1 ? "(" + surd_text(mag, style_of(f)) + ")"
                                                                                  : surd_text(mag, style_of(f))) +
                                                             (f == Format::latex ? "\\," : "·");
    if (out.empty()) out = (sign < 0 ? "-" : "") + factor + name;
    else out += (sign < 0 ? " - " : " + ") + factor + name;
  }
  return math(out, f);
}

} // namespace

std::string write_probe_sums(const ScenarioResult& r, Format f) {
  bool any = false;
  for (const auto& b : r.bars) any = any || !b.sum.readings.empty() || !b.sum.silent.empty();
  if (!any) return {};
  std::ostringstream os;
  os << heading("what each probe reads: every mechanism together", f, 2);
  os << bullet(f)
     << prose("a lock-in on one probe pair reads the sum of every allowed mechanism at its harmonic, asked for or "
              "not; the Joule-heating background (joule-heating-nernst) is always included. Each term: V = R_n "
              "I_rms^n with R_n = (L or w)/(w t)^n × S for the probe's signal S below; B and M say how the term "
              "changes when the applied field or the magnetisation is reversed alone; type i+c is an Onsager-Kleiner "
              "form that holds both characters",
              f)
     << line(f) << "\n";
  for (const auto& b : r.bars) {
    const BarMeasurement& m = b.measurement;
    const ProbeSum& s = b.sum;
    // With the field and the magnetisation along one direction, its angles are named
    // after the magnetisation (the field only saturates it), as in the bar section.
    const bool m_only = s.angles_of_magnetisation();
    const std::string direction = m.field_label.empty() ? field_geometry_name(m.field) : m.field_label;
    os << heading(m.name + ": current " + m.current_label + "; " +
                      (m_only ? "field and magnetisation " + as_magnetisation_angles(direction) : "field " + direction) +
                      "; " + (m.waveform == Waveform::sine ? "sine" : "cosine") + " drive",
                  f, 3);
    if (s.magnetisation_follows_field)
      os << bullet(f)
         << prose("the bar's one direction carries both the field and the saturated magnetisation: φ_M, the "
                  "magnetisation's angle, is also the field's",
                  f)
         << line(f);
    for (const auto& silent : s.silent) os << bullet(f) << prose("not read here: " + silent, f) << line(f);
    if (!s.silent.empty()) os << "\n";
    for (const auto& rd : s.readings) {
      os << (f == Format::markdown ? "**" : "")
         << prose(std::string(probe_name(rd.probe)) + " at " + harmonic_name(rd.harmonic) + (rd.with_dc ? " and DC" : ""), f)
         << ": " << plural(rd.terms.size(), "term", "terms") << (f == Format::markdown ? "**" : "") << line(f) << "\n";
      std::vector<std::vector<std::string>> rows;
      for (std::size_t i = 0; i < rd.terms.size(); ++i) {
        const SumTerm& t = rd.terms[i];
        const SumMechanism& mech = s.mechanisms[t.mechanism];
        const std::string power = std::to_string(mech.current_order);
        rows.push_back({std::to_string(t.mechanism + 1), prose(mech.label, f),
                        f == Format::latex ? math("I^{" + power + "}", f) : "I^" + power,
                        parity_text(mech.field_parity), parity_text(mech.magnetisation_parity), type_text(mech),
                        lock_in_text(t, mech.current_order, f) +
                            (rd.with_dc ? "; DC " + math((t.dc == Surd(Rational(1)) ? std::string() : surd_text(t.dc, style_of(f)) + " ") +
                                                             (f == Format::latex ? "R_{" + power + "}" : "R_" + power), f)
                                        : std::string()),
                        signal_text(r, mech, t, f, m_only)});
      }
      if (f == Format::latex) {
        // A list on the page: each term's formula wraps with the text instead of
        // widening a table column.
        os << "\\begin{itemize}\n";
        for (const auto& row : rows)
          os << "\\item[" << row[0] << "] " << row[1] << ": " << row[2] << "; B " << row[3] << ", M " << row[4]
             << "; type " << row[5] << "; lock-in " << row[6] << ";\\\\ S = " << row[7] << "\n";
        os << "\\end{itemize}\n";
      } else {
        os << grid({"#", "mechanism", "order", "B", "M", "type", "lock-in", "S"}, rows, f) << "\n";
      }
      if (rd.separations.empty()) continue;
      std::vector<std::vector<std::string>> sep;
      std::vector<std::string> notes; // what tells apart beyond symmetry, each once
      for (const auto& x : rd.separations) {
        std::string detail = x.detail;
        if (x.handle == Handle::none) {
          auto at = std::find(notes.begin(), notes.end(), x.other_handle);
          if (at == notes.end()) at = notes.insert(notes.end(), x.other_handle);
          detail += "; beyond symmetry: (" + std::string(1, static_cast<char>('a' + (at - notes.begin()))) + ")";
        }
        sep.push_back({std::to_string(x.a + 1) + " and " + std::to_string(x.b + 1), handle_text(x.handle),
                       prose(detail, f)});
      }
      os << (f == Format::markdown ? "*" : "") << "what separates them" << (f == Format::markdown ? "*" : "") << line(f)
         << "\n"
         << grid({"terms", "first handle", "why"}, sep, f) << "\n";
      for (std::size_t i = 0; i < notes.size(); ++i)
        os << bullet(f) << "(" << static_cast<char>('a' + i) << ") " << prose(notes[i], f) << line(f);
      if (!notes.empty()) os << "\n";
    }
  }
  return os.str();
}

std::string write_plans(const ScenarioResult& r, Format f) {
  if (r.layouts.empty()) return {};
  std::ostringstream os;
  os << heading("measurement plans: every mechanism a probe reads, together", f, 2);
  for (const auto& l : r.layouts) {
    const MeasurementPlan& p = l.plan;
    os << heading("plan at " + harmonic_name(p.harmonic), f, 3);
    if (p.columns.empty()) {
      os << bullet(f) << "no allowed mechanism reaches a probe at " << harmonic_name(p.harmonic)
         << ": nothing to separate" << line(f) << "\n";
      continue;
    }
    os << bullet(f) << prose("unknowns: " + plural(p.columns.size(), "parameter", "parameters") + " of " +
                                 plural(p.mechanisms.size(), "mechanism", "mechanisms") + ", " +
                                 std::to_string(p.columns.size() - p.unseen.size()) + " of them seen by some reading",
                             f)
       << line(f);
    os << bullet(f)
       << prose("readings: " + plural(p.candidates.size(), "candidate bar direction", "candidate bar directions") +
                    " × field " + join(p.fields, ", ") + " × both probes × lock-in X and Y, with the field and the "
                    "magnetisation reversed and the current scaled where that tells terms apart",
                f)
       << line(f);
    for (const auto& u : p.unread) os << bullet(f) << prose("no candidate reads " + u, f) << line(f);
    if (p.chosen.empty()) {
      os << bullet(f) << "no candidate reading sees any of them" << line(f) << "\n";
      continue;
    }
    char cond[64];
    std::snprintf(cond, sizeof cond, "%.3g", p.condition);
    os << bullet(f)
       << prose("rank " + std::to_string(p.rank_all) + " of " + std::to_string(p.columns.size() - p.unseen.size()) +
                    " for every candidate together, decided exactly; the plan, " +
                    plural(p.chosen.size(), "bar", "bars") + " (greedy choice with exchange), has the same rank, "
                    "condition number " + cond + " (floating point, from the readings as taken)",
                f)
       << line(f);
    if (!p.handles.empty()) os << bullet(f) << prose("the plan needs: " + join(p.handles, ", "), f) << line(f);
    os << "\n";
    std::vector<std::vector<std::string>> rows;
    char letter = 'A';
    for (std::size_t c : p.chosen) {
      const LayoutCandidate& cand = p.candidates[c];
      rows.push_back({std::string(1, letter++), cand.label, cand.azimuth, prose(join(p.fields_needed, ", "), f)});
    }
    os << grid({"bar", "current along", "angle from x", "fields"}, rows, f) << "\n";
    std::vector<std::string> sep, not_sep;
    for (std::size_t i : p.separated) sep.push_back(p.mechanisms[i].label);
    for (std::size_t i : p.not_separated) not_sep.push_back(p.mechanisms[i].label);
    if (!sep.empty()) os << bullet(f) << prose("separated: " + join(sep, "; "), f) << line(f);
    if (!not_sep.empty()) os << bullet(f) << prose("not separated: " + join(not_sep, "; "), f) << line(f);
    if (!p.unseen.empty()) {
      std::vector<std::string> names;
      for (std::size_t c : p.unseen) names.push_back(p.columns[c].name);
      os << bullet(f) << prose("no reading sees (out of the plane, or needing another geometry): " + join(names, ", "), f)
         << line(f);
    }
    if (!p.undetermined.empty()) {
      os << bullet(f)
         << prose("undetermined: changing the parameters along these directions changes no reading of the plan", f)
         << line(f);
      for (const auto& c : p.undetermined)
        os << bullet(f) << (f == Format::text ? "  " : "") << combination_text(p, c, f) << line(f);
    }
    os << "\n";
  }
  return os.str();
}

toml::array probe_sums_json(const ScenarioResult& r) {
  toml::array out;
  for (const auto& b : r.bars) {
    const ProbeSum& s = b.sum;
    toml::array mechanisms, readings, silent;
    for (const auto& m : s.mechanisms)
      mechanisms.push_back(toml::table{{"response", m.response_id},
                                       {"label", m.label},
                                       {"mechanism", m.mechanism},
                                       {"current_order", m.current_order},
                                       {"field_order", m.field_order},
                                       {"magnetisation_order", m.magnetisation_order},
                                       {"field_parity", parity_text(m.field_parity)},
                                       {"magnetisation_parity", parity_text(m.magnetisation_parity)},
                                       {"type", m.onsager_form ? "i and c" : m.c_type ? "c" : "i"},
                                       {"thermal", m.thermal},
                                       {"background", m.background},
                                       {"field_driven", m.field_driven}});
    for (const auto& rd : s.readings) {
      toml::array terms, seps;
      for (const auto& t : rd.terms)
        terms.push_back(toml::table{{"mechanism", static_cast<std::int64_t>(t.mechanism)},
                                    {"quadrature", quadrature_text(t.quadrature)},
                                    {"x_factor", surd_text(t.x)},
                                    {"y_factor", surd_text(t.y)},
                                    {"terms", fourier_terms_json(t.terms, form_of(r, s.mechanisms[t.mechanism]))}});
      for (const auto& x : rd.separations)
        seps.push_back(toml::table{{"a", static_cast<std::int64_t>(x.a)},
                                   {"b", static_cast<std::int64_t>(x.b)},
                                   {"handle", handle_text(x.handle)},
                                   {"detail", x.detail},
                                   {"same_parities", x.same_parities},
                                   {"same_angle_functions", x.same_angle_functions},
                                   {"angles_separate_in_part", x.angles_overlap_partly},
                                   {"beyond_symmetry", x.other_handle}});
      readings.push_back(toml::table{{"probe", rd.probe == Probe::longitudinal ? "longitudinal" : "transverse"},
                                     {"harmonic", rd.harmonic},
                                     {"terms", terms},
                                     {"separations", seps}});
    }
    for (const auto& x : s.silent) silent.push_back(x);
    out.push_back(toml::table{{"bar", b.measurement.name},
                              {"mechanisms", mechanisms},
                              {"readings", readings},
                              {"not_read", silent},
                              {"magnetisation_follows_field", s.magnetisation_follows_field},
                              {"field_angles_of", s.angles_of_magnetisation() ? "magnetisation" : "field"}});
  }
  return out;
}

toml::array plans_json(const ScenarioResult& r) {
  toml::array out;
  for (const auto& l : r.layouts) {
    const MeasurementPlan& p = l.plan;
    toml::array columns, bars, handles, sep, not_sep, undetermined, fields;
    for (const auto& c : p.columns)
      columns.push_back(toml::table{{"mechanism", p.mechanisms[c.mechanism].label}, {"parameter", c.name}});
    for (std::size_t c : p.chosen)
      bars.push_back(toml::table{{"current", p.candidates[c].label}, {"azimuth", p.candidates[c].azimuth}});
    for (const auto& h : p.handles) handles.push_back(h);
    for (const auto& x : p.fields_needed) fields.push_back(x);
    for (std::size_t i : p.separated) sep.push_back(p.mechanisms[i].label);
    for (std::size_t i : p.not_separated) not_sep.push_back(p.mechanisms[i].label);
    for (const auto& c : p.undetermined) undetermined.push_back(combination_text(p, c, Format::text));
    toml::array unseen;
    for (std::size_t c : p.unseen) unseen.push_back(p.columns[c].name);
    out.push_back(toml::table{{"harmonic", p.harmonic},
                              {"unknowns", columns},
                              {"candidates", static_cast<std::int64_t>(p.candidates.size())},
                              {"rank_all", p.rank_all},
                              {"rank", p.rank_chosen},
                              {"condition_number", p.condition},
                              {"bars", bars},
                              {"fields", fields},
                              {"needs", handles},
                              {"separated", sep},
                              {"not_separated", not_sep},
                              {"unseen", unseen},
                              {"undetermined", undetermined}});
  }
  return out;
}

} // namespace ts
