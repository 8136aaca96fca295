#include "report/bar_report.hpp"

#include "core/text.hpp"
#include "report/expression_text.hpp"
#include "report/report_prose.hpp"
#include "report/series_text.hpp"

#include <algorithm>
#include <map>
#include <set>
#include <sstream>

namespace ts {

namespace {

using namespace prose_text;

std::string heading(const std::string& s, Format f, int level) {
  if (f == Format::markdown) return std::string(level + 1, '#') + " " + s + "\n\n";
  if (f == Format::latex) return std::string(level <= 2 ? "\\subsection*{" : "\\subsubsection*{") + latex_escape(s) + "}\n";
  return s + "\n";
}

std::string function_text(const FourierTerm& t, Format f) {
  return f == Format::latex ? "$" + angle_function_text(t, true) + "$" : angle_function_text(t, false);
}

// The field angles of a part expanded in the magnetisation are the magnetisation's
// (φ_M, θ_M). JSON keeps phiB and thetaB (an observation's signal names them so)
// and gives the role beside them.
std::string with_field_role(const std::string& s, const std::string& role) {
  return role == "M" ? as_magnetisation_angles(s) : s;
}

std::string series_text(const std::vector<FourierTerm>& terms, const AllowedForm& form, Format f,
                        const std::string& role = "") {
  const std::string body = with_field_role(fourier_series_text(terms, form, style_of(f)), role);
  if (f == Format::markdown) return "`" + body + "`";
  return f == Format::latex ? "$" + body + "$" : body;
}

// The geometry of V = R_n I^n for one probe: the probe's length (L along the bar, w
// across it) over (w t)^d for d powers of the current density j = I/(w t), times G
// for each power of the Joule-heating gradient ∂_z T = G I². Text: "L/(w*t)^2",
// "w*G"; LaTeX: "\frac{L}{(w t)^{2}}", "w G".
std::string geometry_factor(const PartSignal& ps, Probe probe, TextStyle style) {
  const std::string length = probe == Probe::longitudinal ? "L" : "w";
  const int d = ps.direction_order(), k = ps.joule_order;
  const bool latex = style == TextStyle::latex;
  std::string top = length;
  if (k > 0) top += (latex ? " G" : "*G") + (k == 1 ? "" : (latex ? "^{" + std::to_string(k) + "}" : "^" + std::to_string(k)));
  if (d == 0) return top;
  if (latex) return "\\frac{" + top + "}{" + (d == 1 ? std::string("w t") : "(w t)^{" + std::to_string(d) + "}") + "}";
  return top + "/" + (d == 1 ? std::string("(w*t)") : "(w*t)^" + std::to_string(d));
}

// The same for people: "L/(w t)^2", "w G".
std::string spaced(std::string s) {
  std::replace(s.begin(), s.end(), '*', ' ');
  return s;
}

// R_n of V = R_n I^n for one probe, in a fixed order (GiNaC orders the terms of a
// sum by hashes that change from run to run, so its printed form is not used):
// "-rho0^3*L/(w*t)^2*(chi_xxy*sin(3*phi))", or the LaTeX of the same.
std::string coefficient_text(const PartSignal& ps, const ProbeSignal& p, const AllowedForm& form, TextStyle style) {
  const int n = ps.current_order;
  const std::string series = fourier_series_text(p.terms, form, style);
  const bool several = p.terms.size() > 1 || (p.terms.size() == 1 && p.terms[0].coefficient.size() > 1);
  const std::string geometry = geometry_factor(ps, p.probe, style);
  if (style == TextStyle::latex) {
    std::string pre = ps.part->drive == DriveKind::field ? "-\\rho_0^{" + std::to_string(n + 1) + "} " : "";
    return pre + geometry + (several ? " \\left(" + series + "\\right)" : " " + series);
  }
  std::string pre = ps.part->drive == DriveKind::field ? "-rho0^" + std::to_string(n + 1) + "*" : "";
  return pre + geometry + "*" + (several ? "(" + series + ")" : series);
}

std::string part_title(const ScenarioResult& r, std::size_t k) { return part_title(r.parts[k]); }

std::string order_text(const PartSignal& ps) {
  std::string s = "order I^" + std::to_string(ps.current_order);
  if (ps.joule_order > 0)
    s += " (through the Joule-heating gradient along the normal, ∂_z T = G I²" +
         std::string(ps.joule_order > 1 ? ", to the power " + std::to_string(ps.joule_order) : "") + ")";
  if (ps.field_order > 0) s += ", " + ps.field_role + "^" + std::to_string(ps.field_order);
  if (ps.field_order % 2 == 1)
    s += " (odd in " + ps.field_role + ": antisymmetrise the readings in ±" + ps.field_role + ")";
  else if (ps.field_order > 0)
    s += " (even in " + ps.field_role + ": symmetrise in ±" + ps.field_role + ")";
  return s;
}

std::string harmonic_name(int k) { return k == 0 ? "DC" : std::to_string(k) + "ω"; }

std::string factor_text(const Surd& s, int n, Format f) {
  if (s.is_zero()) return "0";
  std::string power = n == 1 ? "" : "^" + std::to_string(n);
  std::string rn = f == Format::latex ? "R_" + std::to_string(n) + " I_\\mathrm{rms}" + power
                                      : "R_" + std::to_string(n) + " I_rms" + power;
  std::string c;
  if (s == Surd(Rational(1))) c = "";
  else if (s == Surd(Rational(-1))) c = "-";
  else c = (s.terms().size() == 1 ? surd_text(s, style_of(f)) : "(" + surd_text(s, style_of(f)) + ")") + " ";
  return math(c + rn, f);
}

std::string readings_text(const PartSignal& ps, Format f) {
  std::vector<std::string> out;
  for (const auto& h : ps.harmonics) {
    if (h.harmonic == 0) out.push_back("DC " + factor_text(h.x, ps.current_order, f));
    else
      out.push_back(harmonic_name(h.harmonic) + " X = " + factor_text(h.x, ps.current_order, f) +
                    ", Y = " + factor_text(h.y, ps.current_order, f));
  }
  return join(out, "; ");
}

std::string waveform_text(const BarMeasurement& m, Format f) {
  if (m.waveform == Waveform::sine)
    return "I = √2 I_rms sin ωt; lock-in reference sin(nωt): a reading V_n(t) = √2 V_rms sin(nωt + θ) gives "
           "X = V_rms cos θ, Y = V_rms sin θ";
  (void)f;
  return "I = √2 I_rms cos ωt; lock-in reference cos(nωt): a reading V_n(t) = √2 V_rms cos(nωt + θ) gives "
         "X = V_rms cos θ, Y = V_rms sin θ";
}

std::string zero_text(const std::vector<int>& z) {
  if (z.empty()) return "";
  if (z.size() == 24) return "every azimuth";
  std::vector<std::string> s;
  for (int d : z) s.push_back(std::to_string(d) + "°");
  return "φ = " + join(s, ", ");
}

// The Fourier terms that tell the parts apart (BarResult::separations).
std::string separation_text(const ScenarioResult& r, const BarSeparation& sep, Format f) {
  std::vector<std::vector<std::string>> rows;
  for (const auto& row : sep.rows) {
    std::vector<std::string> names;
    for (std::size_t k : row.parts) names.push_back(r.parts[k].response_id + " / " + r.parts[k].part_label);
    rows.push_back({with_field_role(function_text(FourierTerm{row.k, row.sine, {}}, f), row.field_role),
                    prose(join(names, "; "), f)});
  }
  return grid({"angle function", "parts that show it"}, rows, f);
}

// "magnetisation: in plane, φ_M from sample x" when every part of the bar that meets
// the field direction is an expansion in M; both words when B and M parts share it.
std::string field_heading(const BarResult& b) {
  const BarMeasurement& m = b.measurement;
  const std::string label = m.field_label.empty() ? field_geometry_name(m.field) : m.field_label;
  bool in_b = false, in_m = false;
  for (const auto& s : b.signals)
    if (s.signal.field_order > 0) (s.signal.field_role == "M" ? in_m : in_b) = true;
  if (m.field == FieldGeometry::none || !in_m) return "field: " + label;
  if (!in_b) return "magnetisation: " + with_field_role(label, "M");
  const bool angles = label.find("φ_B") != std::string::npos || label.find("θ_B") != std::string::npos;
  return "field: " + label + (angles ? " (the magnetisation of the parts in M: the same direction, φ_M = φ_B, θ_M = θ_B)"
                                     : " (also the magnetisation direction of the parts in M)");
}

// A part's reading averaged over the domain variants, as a few lines under the
// single-domain reading.
void write_domain_averaged(std::ostream& os, const ScenarioResult& r, const BarPartSignal& s, Format f) {
  std::string populations = "equal populations";
  for (const auto& d : r.domains)
    if (d.part == s.part && !d.fractions.empty()) {
      std::vector<std::string> w;
      for (const auto& x : d.fractions) w.push_back(x.str());
      populations = "volume fractions " + join(w, ", ");
    }
  if (std::none_of(s.domain_averaged.begin(), s.domain_averaged.end(),
                   [](const DomainAveragedSignal& a) { return a.signal.reads(); })) {
    if (!s.domain_averaged.empty())
      os << bullet(f)
         << prose("averaged over the domain variants (" + populations + "): both probes read zero" +
                      (s.domain_averaged.size() > 1 ? ", at zero field and linear in each applied field" : ""),
                  f)
         << line(f);
    return;
  }
  for (const auto& a : s.domain_averaged) {
    const std::string role = a.signal.field_role;
    const std::string which = !a.field_label.empty() ? ", the part linear in the " + a.field_label + ", per unit field"
                              : s.domain_averaged.size() > 1 ? ", at zero field"
                                                             : "";
    os << bullet(f) << prose("averaged over the domain variants (" + populations + ")" + which, f);
    if (!a.signal.reads()) {
      os << ": both probes read zero" << line(f);
      continue;
    }
    os << ":" << line(f);
    for (const ProbeSignal* p : {&a.signal.longitudinal, &a.signal.transverse})
      os << sub_bullet(f)
         << (f == Format::latex ? (p->probe == Probe::longitudinal ? "$\\langle S_\\parallel\\rangle$" : "$\\langle S_\\perp\\rangle$")
                                : (p->probe == Probe::longitudinal ? "⟨S_∥⟩" : "⟨S_⊥⟩"))
         << " = "
         << series_text(p->terms, a.names, f, role) << line(f);
  }
}

// Requested parts that no probe reads, one line per response (a summary line when many).
void write_unread(std::ostream& os, const ScenarioResult& r, const BarResult& b, Format f) {
  struct Group {
    std::string title, reason;
    std::size_t parts = 0;
  };
  std::vector<Group> groups;
  for (const auto& u : b.unread) {
    const PartForms& p = r.parts[u.part];
    const std::string title = p.response_id.empty() ? part_title(p) : p.response_name + " [" + p.response_id + "]";
    if (!groups.empty() && groups.back().title == title && groups.back().reason == u.reason) ++groups.back().parts;
    else groups.push_back({title, u.reason, 1});
  }
  constexpr std::size_t kShownLines = 4;
  if (groups.size() > kShownLines) {
    std::vector<std::string> ids; // each response once, by its id
    for (const auto& u : b.unread) {
      const PartForms& p = r.parts[u.part];
      const std::string id = p.response_id.empty() ? part_title(p) : p.response_id;
      if (std::find(ids.begin(), ids.end(), id) == ids.end()) ids.push_back(id);
    }
    os << bullet(f)
       << prose("not voltages a bar's probes read (their response is not the electric field or current between two "
                "contacts; --format json gives each reason): " + join(ids, "; "),
                f)
       << line(f) << "\n";
    return;
  }
  for (const auto& g : groups)
    os << (f == Format::markdown ? "**" : "") << prose(g.title, f) << (f == Format::markdown ? "**" : "") << line(f)
       << bullet(f)
       << prose((g.parts > 1 ? "its " + std::to_string(g.parts) + " parts are not voltages" : std::string("not a voltage")) +
                    " a bar's probes read: " + g.reason,
                f)
       << line(f) << "\n";
}

} // namespace


std::string part_title(const PartForms& p) {
  if (p.response_id.empty()) return "tensor " + p.spec.canonical_text();
  if (p.field_induced_hall)
    return "Hall effect induced by the applied field (ordinary or in-plane Hall, not spontaneous: no magnetic order of "
           "the scenario allows it) [" + p.response_id + "]: " + p.part_label;
  return p.response_name + " [" + p.response_id + "]: " + p.part_label;
}

std::string write_bars(const ScenarioResult& r, Format f) {
  if (r.bars.empty()) return {};
  std::ostringstream os;
  os << heading("Hall bars", f, 2);
  os << bullet(f) << prose("probes: V_∥ = L u·E (upstream minus downstream contact), V_⊥ = w v·E with v = n × u "
                           "(the contact at -v minus the one at +v); u at azimuth φ from sample x, counterclockwise "
                           "seen from +n", f) << line(f);
  os << bullet(f) << prose("a bar driven by a current reads resistivity-type tensors (E = rho·j + rho^(2):jj + ...): "
                           "parts written for a driving field (j = sigma·E ...) are read through E^(n) = "
                           "-rho0^(n+1) sigma^(n) j^n, to leading order for an isotropic rho0 and a small Hall angle; "
                           "a low-symmetry film needs its full in-plane tensor (two bar orientations) for the "
                           "conversion", f) << line(f);
  os << bullet(f) << prose("V = R_n I^n for the part of order n, with j = I/(w t) and R_n = (L or w) S(angles)/(w t)^n", f)
     << line(f) << "\n";
  for (const auto& b : r.bars) {
    const BarMeasurement& m = b.measurement;
    os << heading(m.name + ": current " + m.current_label + "; " + field_heading(b), f, 3);
    os << bullet(f) << prose("drive: " + waveform_text(m, f), f) << line(f);
    if (m.current_rms && m.length && m.width && m.thickness) {
      char buf[160];
      std::snprintf(buf, sizeof buf, "bar: I_rms = %g A, L = %g m, w = %g m, t = %g m: j_rms = %g A/m^2", *m.current_rms,
                    *m.length, *m.width, *m.thickness, *m.current_density_rms());
      os << bullet(f) << prose(buf, f) << line(f);
    }
    os << "\n";
    for (const auto& s : b.signals) {
      const PartSignal& ps = s.signal;
      const PartForms& pf = r.parts[s.part];
      const AllowedForm& form = pf.forms.back();
      os << (f == Format::markdown ? "**" : "") << prose(part_title(r, s.part), f) << (f == Format::markdown ? "**" : "")
         << line(f);
      os << bullet(f)
         << prose(order_text(ps) + "; " +
                      (ps.joule_order > 0 ? "answers the heat gradient the current makes (E = S·∂T ...; G is set by "
                                            "the device and its substrate)"
                       : ps.part->drive == DriveKind::current ? "answers the driven current (E = rho·j ...)"
                                                            : "answers a driving field (j = sigma·E ...): read through "
                                                              "-rho0^(n+1)"),
                  f)
         << line(f);
      if (pf.counts.back() == 0) {
        os << bullet(f) << "forbidden in the sample's group: both probes read zero" << line(f) << "\n";
        continue;
      }
      const std::string field_word = ps.field_role == "M" ? "magnetisation" : "field";
      if (ps.needs_field) {
        os << bullet(f) << "needs a " << field_word << " direction (this bar has none)" << line(f) << "\n";
        continue;
      }
      if (!ps.reads()) {
        os << bullet(f) << "allowed, not readable in this bar: both probes read zero for every parameter value "
           << "(the allowed components lie out of the plane or need another " << field_word << " direction)" << line(f);
        write_domain_averaged(os, r, s, f);
        os << "\n";
        continue;
      }
      os << bullet(f) << "lock-in readings: " << readings_text(ps, f) << line(f);
      for (const ProbeSignal* p : {&ps.longitudinal, &ps.transverse}) {
        std::string name = p->probe == Probe::longitudinal ? "longitudinal S_∥" : "transverse S_⊥";
        os << bullet(f) << prose(name, f) << " = " << series_text(p->terms, form, f, ps.field_role) << line(f);
        if (p->reads()) {
          std::string rn = std::string("R_") + std::to_string(ps.current_order) +
                           (p->probe == Probe::longitudinal ? "(∥)" : "(⊥)");
          std::string pre = std::string(ps.part->drive == DriveKind::field ? "-rho0^" + std::to_string(ps.current_order + 1) + " " : "") +
                            spaced(geometry_factor(ps, p->probe, TextStyle::plain));
          os << sub_bullet(f) << prose(rn, f) << " = "
             << (f == Format::latex ? "$" + with_field_role(coefficient_text(ps, *p, form, TextStyle::latex), ps.field_role) + "$"
                                    : pre + " × S" + (p->probe == Probe::longitudinal ? "_∥" : "_⊥"))
             << line(f);
        }
        std::string z = zero_text(p->zero_azimuths);
        if (p->reads() && !z.empty()) os << sub_bullet(f) << "reads zero for every parameter value at " << z << line(f);
        if (!p->largest_azimuths.empty()) {
          std::vector<std::string> at;
          for (double d : p->largest_azimuths) {
            char buf[16];
            std::snprintf(buf, sizeof buf, "%.4g°", d);
            at.push_back(buf);
          }
          os << sub_bullet(f) << "largest |signal| at φ = " << join(at, ", ") << line(f);
        }
      }
      if (ps.hall_split && ps.transverse.reads()) {
        os << bullet(f) << prose("Hall test, S_⊥ = S_∥'/" + std::to_string(ps.direction_order() + 1) + " + H: gradient part ", f)
           << series_text(ps.transverse.gradient_terms, form, f, ps.field_role) << "; dissipationless Hall part H = "
           << series_text(ps.transverse.hall_terms, form, f, ps.field_role)
           << (ps.transverse.hall_terms.empty() ? " (the transverse signal follows from the longitudinal one)" : "")
           << line(f);
      }
      write_domain_averaged(os, r, s, f);
      os << "\n";
    }
    write_unread(os, r, b, f);
    for (const auto& sep : b.separations)
      os << (f == Format::markdown ? "*" : "")
         << prose("order I^" + std::to_string(sep.current_order) + ", " + probe_name(sep.probe), f)
         << ": Fourier terms that tell the parts apart" << (f == Format::markdown ? "*" : "") << line(f) << "\n"
         << separation_text(r, sep, f) << "\n";
  }
  return os.str();
}

std::string write_layouts(const ScenarioResult& r, Format f) {
  if (r.layouts.empty()) return {};
  std::ostringstream os;
  os << heading("bar layout", f, 2);
  for (const auto& l : r.layouts) {
    if (l.designs.empty())
      os << bullet(f) << prose(l.spec.response, f) << " at " << harmonic_name(l.spec.harmonic) << ": no part is allowed in "
         << prose(r.chain.back().readable_symbol, f) << " at this harmonic, so there are no bars to design" << line(f) << "\n";
    for (std::size_t i = 0; i < l.designs.size(); ++i) {
      const LayoutDesign& d = l.designs[i];
      const PartForms& pf = r.parts[l.parts[i]];
      const AllowedForm& form = pf.forms.back();
      os << heading(part_title(r, l.parts[i]) + " at " + harmonic_name(l.spec.harmonic), f, 3);
      os << bullet(f) << d.candidates.size() << " candidate bar directions; field per bar: " << join(d.fields, ", ")
         << line(f);
      os << bullet(f) << d.parameters << " independent parameters; " << d.rank_all
         << " can be determined from planar bars";
      if (!d.unreadable.empty()) os << " (no bar reads " << prose(join(d.unreadable, ", "), f) << ")";
      if (d.inseparable() > 0)
        os << "; " << counted(static_cast<std::size_t>(d.inseparable()), "further combination")
           << " cannot be separated by these candidates";
      os << line(f);
      if (d.chosen.empty()) {
        os << bullet(f) << "no bar reads this part" << line(f) << "\n";
        continue;
      }
      char cond[64];
      std::snprintf(cond, sizeof cond, "%.3g", d.condition);
      os << bullet(f) << "design: " << d.chosen.size() << " bar" << (d.chosen.size() == 1 ? "" : "s")
         << (d.exhaustive ? " (the fewest: every smaller set was tried)" : " (greedy choice)")
         << ", rank " << d.rank_chosen << ", condition number " << cond
         << " (rank from Eigen's SVD, singular values below 1e-9 of the largest count as zero)" << line(f) << "\n";
      std::vector<std::vector<std::string>> rows;
      char letter = 'A';
      for (std::size_t c : d.chosen) {
        const LayoutCandidate& cand = d.candidates[c];
        for (const auto& row : d.rows) {
          if (row.candidate != c) continue;
          Combination comb;
          for (int j = 0; j < d.parameters; ++j)
            if (!row.coefficients[j].is_zero()) comb.push_back({j, row.coefficients[j]});
          std::string meas = combination_text(form, comb, style_of(f));
          rows.push_back({std::string(1, letter), cand.label, cand.azimuth,
                          row.probe == Probe::longitudinal ? "∥" : "⊥", prose(row.field, f), math(meas, f)});
        }
        ++letter;
      }
      const auto& ix = pf.catalogue_part->indices;
      const bool in_m = std::find(ix.begin() + 1, ix.end(), "M") != ix.end();
      os << grid({"bar", "current along", "angle from x", "probe", in_m ? "magnetisation" : "field",
                  prose("reads (per j^n, sample frame)", f)},
                 rows, f)
         << "\n";
    }
  }
  return os.str();
}

namespace {

// Per current order and probe read by two parts or more: each angle function and
// the parts (response and part label) that show it.
toml::array separations_json(const ScenarioResult& r, const BarResult& b) {
  toml::array out;
  for (const auto& sep : b.separations) {
    toml::array rows;
    for (const auto& row : sep.rows) {
      toml::array parts;
      for (std::size_t k : row.parts)
        parts.push_back(toml::table{{"response", r.parts[k].response_id}, {"part", r.parts[k].part_label}});
      const FourierTerm function{row.k, row.sine, {}};
      // As in the signals' terms: phiB and thetaB, with the role beside them.
      rows.push_back(toml::table{{"function", angle_function_text(function, false)},
                                 {"function_latex", angle_function_text(function, true)},
                                 {"field_angles_of", row.field_role == "M" ? "magnetisation" : "field"},
                                 {"parts", parts}});
    }
    out.push_back(toml::table{{"current_order", sep.current_order},
                              {"probe", sep.probe == Probe::longitudinal ? "longitudinal" : "transverse"},
                              {"rows", rows}});
  }
  return out;
}

// The bar's current and size as the scenario gives them (SI units), and j_rms: what
// turns the exact signals into volts; an empty table when none is given.
toml::table dimensions_json(const BarMeasurement& m) {
  toml::table t;
  if (m.current_rms) t.insert("current_rms_A", *m.current_rms);
  if (m.length) t.insert("length_m", *m.length);
  if (m.width) t.insert("width_m", *m.width);
  if (m.thickness) t.insert("thickness_m", *m.thickness);
  if (auto j = m.current_density_rms()) t.insert("current_density_rms_A_per_m2", *j);
  return t;
}

} // namespace

toml::array bars_json(const ScenarioResult& r) {
  toml::array out;
  for (const auto& b : r.bars) {
    toml::array sigs;
    for (const auto& s : b.signals) {
      const PartSignal& ps = s.signal;
      const AllowedForm& form = r.parts[s.part].forms.back();
      toml::table t{{"response", r.parts[s.part].response_id},
                    {"part", r.parts[s.part].part_label},
                    {"current_order", ps.current_order},
                    {"joule_order", ps.joule_order},
                    {"field_order", ps.field_order},
                    {"field_role", ps.field_role},
                    {"drive", drive_kind_name(ps.part->drive)},
                    {"needs_field", ps.needs_field},
                    {"field_angles_of", ps.field_role == "M" ? "magnetisation" : "field"},
                    {"reads", ps.reads()}};
      toml::array averaged;
      for (const auto& a : s.domain_averaged)
        averaged.push_back(toml::table{{"field", a.field_label},
                                       {"longitudinal", fourier_terms_json(a.signal.longitudinal.terms, a.names)},
                                       {"transverse", fourier_terms_json(a.signal.transverse.terms, a.names)}});
      if (!s.domain_averaged.empty()) t.insert("domain_averaged", averaged);
      toml::array harm;
      for (const auto& h : ps.harmonics)
        harm.push_back(toml::table{{"harmonic", h.harmonic},
                                   {"x_factor", surd_text(h.x)},
                                   {"y_factor", surd_text(h.y)}});
      t.insert("lock_in", harm);
      for (const ProbeSignal* p : {&ps.longitudinal, &ps.transverse}) {
        toml::array zeros;
        for (int z : p->zero_azimuths) zeros.push_back(z);
        toml::array largest;
        for (double d : p->largest_azimuths) largest.push_back(d);
        toml::table pt{{"terms", fourier_terms_json(p->terms, form)}, {"zero_azimuths_deg", zeros}, {"largest_azimuths_deg", largest}};
        if (p->reads()) {
          pt.insert("R_n", coefficient_text(ps, *p, form, TextStyle::plain));
          pt.insert("R_n_latex", coefficient_text(ps, *p, form, TextStyle::latex));
        }
        if (p->probe == Probe::transverse && ps.hall_split) {
          pt.insert("gradient_terms", fourier_terms_json(p->gradient_terms, form));
          pt.insert("hall_terms", fourier_terms_json(p->hall_terms, form));
        }
        t.insert(p->probe == Probe::longitudinal ? "longitudinal" : "transverse", pt);
      }
      sigs.push_back(t);
    }
    const BarMeasurement& m = b.measurement;
    toml::array unread;
    for (const auto& u : b.unread)
      unread.push_back(toml::table{{"response", r.parts[u.part].response_id},
                                   {"part", r.parts[u.part].part_label},
                                   {"reason", u.reason}});
    out.push_back(toml::table{{"name", m.name},
                              {"not_read", unread},
                              {"current", m.current_label},
                              {"field", field_geometry_name(m.field)},
                              {"field_label", m.field_label},
                              {"waveform", m.waveform == Waveform::sine ? "sine" : "cosine"},
                              {"dimensions", dimensions_json(m)},
                              {"signals", sigs},
                              {"separations", separations_json(r, b)}});
  }
  return out;
}

toml::array layouts_json(const ScenarioResult& r) {
  toml::array out;
  for (const auto& l : r.layouts)
    for (std::size_t i = 0; i < l.designs.size(); ++i) {
      const LayoutDesign& d = l.designs[i];
      const AllowedForm& form = r.parts[l.parts[i]].forms.back();
      toml::array bars, unread;
      for (const auto& u : d.unreadable) unread.push_back(u);
      for (std::size_t c : d.chosen) {
        toml::array reads;
        for (const auto& row : d.rows) {
          if (row.candidate != c) continue;
          Combination comb;
          for (int j = 0; j < d.parameters; ++j)
            if (!row.coefficients[j].is_zero()) comb.push_back({j, row.coefficients[j]});
          reads.push_back(toml::table{{"probe", row.probe == Probe::longitudinal ? "longitudinal" : "transverse"},
                                      {"field", row.field},
                                      {"reads", combination_text(form, comb, TextStyle::plain)}});
        }
        bars.push_back(toml::table{{"current", d.candidates[c].label},
                                   {"azimuth", d.candidates[c].azimuth},
                                   {"readings", reads}});
      }
      out.push_back(toml::table{{"response", r.parts[l.parts[i]].response_id},
                                {"part", r.parts[l.parts[i]].part_label},
                                {"harmonic", l.spec.harmonic},
                                {"parameters", d.parameters},
                                {"rank", d.rank_all},
                                {"unreadable", unread},
                                {"inseparable", d.inseparable()},
                                {"candidates", static_cast<std::int64_t>(d.candidates.size())},
                                {"exhaustive", d.exhaustive},
                                {"condition_number", d.condition},
                                {"bars", bars}});
    }
  return out;
}

} // namespace ts
