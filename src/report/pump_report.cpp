#include "report/pump_report.hpp"

#include "report/series_text.hpp"

#include <sstream>

namespace ts {

namespace {

const char* axis_name[] = {"x", "y", "z"};

std::string series(const std::vector<FourierTerm>& terms, const AllowedForm& form, Format f) {
  if (terms.empty()) return "0";
  if (f == Format::latex) return "$" + fourier_series_text(terms, form, TextStyle::latex) + "$";
  const std::string s = fourier_series_text(terms, form, TextStyle::plain);
  return f == Format::markdown ? "`" + s + "`" : s;
}

std::string yes_no(bool b) { return b ? "yes" : "no"; }

std::string setup_text(const PumpSetup& s) {
  std::string t = "pump at " + std::to_string(s.incidence_deg) + "° from the normal (plane of incidence xz of the lab), ";
  t += s.azimuth_rotating ? "sample azimuth phi a variable" : "sample azimuth fixed at " + std::to_string(s.azimuth_deg) + "°";
  t += "; the polarisation angle (alpha for linear, beta for elliptical light, written alpha_in in the expressions) is "
       "measured from P towards S; circular+ is the helicity whose spin i(E × E*) points along the beam";
  return t;
}

std::string reading_text(bool order, bool moment) {
  if (order && moment) return "yes (turn and dynamic moment)";
  if (order) return "yes (the turn)";
  if (moment) return "yes (dynamic moment)";
  return "no";
}

std::vector<ReportTable> phase_tables(const PumpPhase& ph, std::size_t number, Format f) {
  const std::string u1 = axis_name[ph.deviation_axes[0]], u2 = axis_name[ph.deviation_axes[1]];
  ReportTable pump;
  pump.title = "phase " + std::to_string(number) + ": " + ph.label + " (group " + ph.group + ", order vector l0 " +
               ph.order_label + ")";
  pump.note = "The pump's effective field H (sample frame) and its torque l0 × H, which turns l0 towards " + u1 +
              " or " + u2 + ". Parts driven by the light's spin reverse with helicity; parts forbidden in the phase "
              "are left out.";
  pump.header = {"pump", "part", "H_x", "H_y", "H_z", "torque turning l0 towards " + u1, "towards " + u2};
  for (const auto& d : ph.drives)
    for (std::size_t k = 0; k < ph.forms.size(); ++k) {
      const AllowedForm& form = ph.forms[k];
      std::vector<std::string> row{d.polarisation, ph.part_titles[k]};
      for (int i = 0; i < 3; ++i) row.push_back(series(d.field[k][static_cast<std::size_t>(i)], form, f));
      for (int u = 0; u < 2; ++u) row.push_back(series(d.torque[k][static_cast<std::size_t>(u)], form, f));
      pump.rows.push_back(row);
    }
  ReportTable summary;
  summary.title = "phase " + std::to_string(number) + ": what each probe sees";
  summary.note = "A probe reads the precession when it reads, to first order, the turn of l0 (through the gyration "
                 "vector of the turned state) or the dynamic moment l0 × δl that comes with it; it sees what a pump "
                 "starts when the pump drives a turn it reads.";
  summary.header = {"probe", "reads", "turn towards " + u1, "turn towards " + u2};
  for (const auto& d : ph.drives) summary.header.push_back("sees " + d.polarisation);
  {
    std::vector<std::string> row{"pump torque", "l0 × H"};
    for (int u = 0; u < 2; ++u) {
      bool any = false;
      for (const auto& d : ph.drives) any = any || d.drives[static_cast<std::size_t>(u)];
      row.push_back(any ? "driven" : "not driven");
    }
    for (const auto& d : ph.drives)
      row.push_back(d.drives[0] || d.drives[1]
                        ? std::string("drives ") + (d.drives[0] ? u1 : "") + (d.drives[0] && d.drives[1] ? ", " : "") +
                              (d.drives[1] ? u2 : "")
                        : "no torque");
    summary.rows.push_back(row);
  }
  for (const auto& p : ph.probes) {
    std::vector<std::string> row{p.probe, p.reads, reading_text(p.order[0], p.moment[0]), reading_text(p.order[1], p.moment[1])};
    for (bool s : p.sees) row.push_back(yes_no(s));
    summary.rows.push_back(row);
  }
  return {pump, summary};
}

std::string prose(const std::string& s, Format f) { return f == Format::latex ? latex_escape(s) : s; }

std::string write_tables(const std::vector<std::pair<std::string, std::vector<ReportTable>>>& questions, Format f) {
  std::ostringstream os;
  for (const auto& [heading, tables] : questions) {
    os << section_heading(heading, f, 3);
    for (const auto& t : tables) {
      if (!t.title.empty()) os << (f == Format::markdown ? "**" : "") << prose(t.title, f) << (f == Format::markdown ? "**" : "") << "\n\n";
      if (!t.note.empty()) os << prose(t.note, f) << "\n\n";
      if (!t.header.empty()) os << (f == Format::latex ? row_list(t.header, t.rows) : grid(t.header, t.rows, f)) << "\n";
    }
  }
  return os.str();
}

// The beam's keys of a question, with its own array under `key`.
toml::table beam_json(const PumpSetup& s, const char* key, toml::array items) {
  return toml::table{{"name", s.name},
                     {"incidence_deg", static_cast<std::int64_t>(s.incidence_deg)},
                     {"azimuth", s.azimuth_rotating ? std::string("rotating") : std::to_string(s.azimuth_deg)},
                     {key, std::move(items)}};
}

toml::array terms_json(const VectorTerms& v, const AllowedForm& form) {
  toml::array a;
  for (const auto& t : v) a.push_back(fourier_terms_json(t, form));
  return a;
}

} // namespace

std::vector<std::pair<std::string, std::vector<ReportTable>>> pump_probe_tables(const ScenarioResult& r, Format f) {
  std::vector<std::pair<std::string, std::vector<ReportTable>>> out;
  for (const auto& pp : r.pump_probe) {
    std::vector<ReportTable> tables;
    ReportTable intro;
    intro.note = setup_text(pp.setup) + ".";
    tables.push_back(intro);
    for (std::size_t i = 0; i < pp.phases.size(); ++i)
      for (auto& t : phase_tables(pp.phases[i], i + 1, f)) tables.push_back(std::move(t));
    out.push_back({"Pump-probe: " + pp.setup.name, std::move(tables)});
  }
  return out;
}

std::vector<std::pair<std::string, std::vector<ReportTable>>> photocurrent_tables(const ScenarioResult& r, Format f) {
  std::vector<std::pair<std::string, std::vector<ReportTable>>> out;
  for (const auto& pc : r.photocurrents) {
    ReportTable currents;
    currents.note = setup_text(pc.setup) + ". The in-plane current in the sample frame, read by electrodes along "
                    "sample x (the x pair) and along sample y (the y pair); parts driven by the light's spin reverse "
                    "with helicity; parts forbidden in the final group are left out" +
                    std::string(pc.parts.empty() ? ", and here that is every part: no photocurrent flows." : ".");
    currents.header = {"pump", "part", "j_x", "j_y", "reverses with helicity"};
    for (const auto& row : pc.rows)
      for (std::size_t k = 0; k < pc.parts.size(); ++k) {
        const AllowedForm& form = r.parts[pc.parts[k]].forms.back();
        currents.rows.push_back({row.polarisation, r.parts[pc.parts[k]].response_id + ": " + r.parts[pc.parts[k]].part_label,
                                 series(row.current[k][0], form, f), series(row.current[k][1], form, f),
                                 pc.helicity_odd[k] ? "yes" : "no"});
      }
    ReportTable pairs;
    pairs.title = "electrode pairs";
    pairs.header = {"pump", "x pair reads", "y pair reads", "helicity-odd part read by"};
    for (const auto& row : pc.rows) {
      std::string odd;
      if (row.odd_pair_reads[0]) odd = "x pair";
      if (row.odd_pair_reads[1]) odd += odd.empty() ? "y pair" : ", y pair";
      pairs.rows.push_back({row.polarisation, yes_no(row.pair_reads[0]), yes_no(row.pair_reads[1]), odd.empty() ? "none" : odd});
    }
    out.push_back({"Photocurrents: " + pc.setup.name, {currents, pairs}});
  }
  return out;
}

std::string write_light_driven(const ScenarioResult& r, Format f) {
  return write_tables(pump_probe_tables(r, f), f) + write_tables(photocurrent_tables(r, f), f);
}

toml::array pump_probe_json(const ScenarioResult& r) {
  toml::array out;
  for (const auto& pp : r.pump_probe) {
    toml::array phases;
    for (const auto& ph : pp.phases) {
      toml::array drives;
      for (const auto& d : ph.drives) {
        toml::array parts;
        for (std::size_t k = 0; k < ph.forms.size(); ++k) {
          toml::array torque;
          for (const auto& t : d.torque[k]) torque.push_back(fourier_terms_json(t, ph.forms[k]));
          parts.push_back(toml::table{{"part", ph.part_titles[k]},
                                      {"reverses_with_helicity", static_cast<bool>(ph.helicity_odd[k])},
                                      {"field", terms_json(d.field[k], ph.forms[k])},
                                      {"torque", torque}});
        }
        drives.push_back(toml::table{{"polarisation", d.polarisation},
                                     {"drives", toml::array{d.drives[0], d.drives[1]}},
                                     {"parts", parts}});
      }
      toml::array probes;
      for (const auto& p : ph.probes) {
        toml::array sees;
        for (bool s : p.sees) sees.push_back(s);
        probes.push_back(toml::table{{"probe", p.probe},
                                     {"reads", p.reads},
                                     {"reads_turn", toml::array{p.order[0], p.order[1]}},
                                     {"reads_dynamic_moment", toml::array{p.moment[0], p.moment[1]}},
                                     {"sees", sees}});
      }
      phases.push_back(toml::table{{"label", ph.label},
                                   {"group", ph.group},
                                   {"order_vector", ph.order_label},
                                   {"deviation_axes", toml::array{axis_name[ph.deviation_axes[0]], axis_name[ph.deviation_axes[1]]}},
                                   {"pump", drives},
                                   {"probes", probes}});
    }
    out.push_back(beam_json(pp.setup, "phases", std::move(phases)));
  }
  return out;
}

toml::array photocurrent_json(const ScenarioResult& r) {
  toml::array out;
  for (const auto& pc : r.photocurrents) {
    toml::array rows;
    for (const auto& row : pc.rows) {
      toml::array parts;
      for (std::size_t k = 0; k < pc.parts.size(); ++k) {
        const PartForms& p = r.parts[pc.parts[k]];
        parts.push_back(toml::table{{"part", p.response_id + ": " + p.part_label},
                                    {"reverses_with_helicity", static_cast<bool>(pc.helicity_odd[k])},
                                    {"j_x", fourier_terms_json(row.current[k][0], p.forms.back())},
                                    {"j_y", fourier_terms_json(row.current[k][1], p.forms.back())}});
      }
      rows.push_back(toml::table{{"polarisation", row.polarisation},
                                 {"x_pair_reads", row.pair_reads[0]},
                                 {"y_pair_reads", row.pair_reads[1]},
                                 {"helicity_odd_x_pair", row.odd_pair_reads[0]},
                                 {"helicity_odd_y_pair", row.odd_pair_reads[1]},
                                 {"parts", parts}});
    }
    out.push_back(beam_json(pc.setup, "rows", std::move(rows)));
  }
  return out;
}

} // namespace ts
