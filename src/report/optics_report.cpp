#include "report/optics_report.hpp"

#include "core/text.hpp"
#include "geometry/optics_setup_text.hpp"
#include "report/series_text.hpp"

#include <sstream>

namespace ts {

namespace {

std::string math(const std::string& s, Format f) { return f == Format::latex ? "$" + s + "$" : s; }
std::string prose(const std::string& s, Format f) { return f == Format::latex ? latex_escape(s) : s; }
std::string line(Format f) { return f == Format::latex ? "\\\\\n" : "\n"; }
std::string bullet(Format f) { return f == Format::markdown ? "- " : (f == Format::latex ? "" : "  "); }

std::string heading(const std::string& s, Format f) {
  if (f == Format::markdown) return "### " + s + "\n\n";
  if (f == Format::latex) return "\\subsection*{" + latex_escape(s) + "}\n";
  return s + "\n";
}

std::string harmonics_text(const std::vector<Harmonic>& hs, Format f) {
  if (hs.empty()) return "none";
  std::string s;
  for (const auto& h : hs) s += (s.empty() ? "" : ", ") + math(harmonic_text(h, f == Format::latex), f);
  return s;
}

// What the final group allows for the moment, in words: "along sample x ∥ [100]",
// "in the plane of sample x and y ([100], [010])", or its components.
std::string allowed_moment_text(const AllowedForm& mf, const std::array<std::string, 3>& axes) {
  static const char* const n[3] = {"x", "y", "z"};
  if (mf.independent() == 0) return "nowhere: the group allows no net moment";
  if (mf.independent() == 3) return "in any direction";
  std::vector<int> nonzero;
  for (int i = 0; i < 3; ++i)
    if (!mf.is_zero(i)) nonzero.push_back(i);
  if (mf.independent() == 1 && nonzero.size() == 1)
    return std::string("along sample ") + n[nonzero[0]] + " ∥ " + axes[nonzero[0]];
  if (mf.independent() == 2 && nonzero.size() == 2)
    return std::string("in the plane of sample ") + n[nonzero[0]] + " and " + n[nonzero[1]] + " (" + axes[nonzero[0]] +
           ", " + axes[nonzero[1]] + ")";
  std::vector<std::string> parts;
  for (int i = 0; i < 3; ++i)
    parts.push_back(mf.component_name(i) + " = " + combination_text(mf, mf.value(i), TextStyle::plain));
  return "as " + join(parts, ", ");
}

std::string source_title(const ScenarioResult& r, const ShgSource& s) {
  const PartForms& p = r.parts[s.part];
  return p.response_id + ": " + p.part_label;
}

std::string amplitude_text(const ScenarioResult& r, const ShgSource& s, std::size_t channel, Format f) {
  const AllowedForm& form = r.parts[s.part].forms.back();
  const std::vector<OpticalTerm>& terms = s.signals[channel].terms;
  return f == Format::latex ? "$" + optical_amplitude_text(terms, form, TextStyle::latex) + "$"
                            : optical_amplitude_text(terms, form, TextStyle::plain);
}

std::string terms_text(const std::vector<FourierTerm>& terms, const AllowedForm& form, Format f) {
  return math(fourier_series_text(terms, form, f == Format::latex ? TextStyle::latex : TextStyle::plain), f);
}

std::string delta_eps_name(const std::string& indices, Format f) {
  if (f == Format::latex)
    return indices == "xx-yy" ? "$\\Delta\\varepsilon_{xx} - \\Delta\\varepsilon_{yy}$" : "$\\Delta\\varepsilon_{" + indices + "}$";
  return indices == "xx-yy" ? "Δeps_xx - Δeps_yy" : "Δeps_" + indices;
}

} // namespace

std::string write_shg(const ScenarioResult& r, Format f) {
  std::ostringstream os;
  for (const auto& s : r.shg) {
    const OpticalMeasurement& m = s.measurement;
    os << heading("Second-harmonic polarimetry: " + m.name, f);
    os << prose(optical_setup_text(m), f) << "." << line(f);
    os << prose("Channels are named input-output (PS: P-polarised in, S-polarised analysed); a polariser angle is "
                "measured from P towards S. Amplitudes are exact up to one prefactor per source kind; ", f)
       << (f == Format::latex ? local_field_text(m, latex_escape) : local_field_text(m))
       << prose(". The intensity is the squared modulus of A, with complex parameters.", f) << "\n\n";
    for (const auto& src : s.sources) {
      os << (f == Format::markdown ? "**" : "") << prose(source_title(r, src), f) << (f == Format::markdown ? "**" : "")
         << "\n\n";
      if (r.parts[src.part].forms.back().independent() == 0) {
        os << bullet(f) << prose("forbidden in this group: no allowed component, dark in every channel", f) << line(f)
           << "\n";
        continue;
      }
      std::vector<std::vector<std::string>> rows;
      for (std::size_t c = 0; c < m.channels.size(); ++c) {
        const ChannelAmplitude& a = src.channels[c];
        if (!a.radiates()) {
          rows.push_back({m.channels[c].name, math("0", f) + prose(" (every parameter value)", f), "none", "none"});
          continue;
        }
        std::string amp = amplitude_text(r, src, c, f);
        if (f == Format::markdown) amp = "`" + amp + "`";
        rows.push_back({m.channels[c].name, amp, harmonics_text(src.signals[c].amplitude_harmonics, f),
                        harmonics_text(src.signals[c].intensity_harmonics, f)});
      }
      os << grid({"channel", "amplitude A", "harmonics of A", "harmonics of the intensity"}, rows, f) << "\n";
    }
    os << bullet(f) << prose("dark for every source and every parameter value: ", f)
       << (s.dark_channels.empty() ? std::string("none") : join(s.dark_channels, ", ")) << line(f);
    if (s.interference.empty())
      os << bullet(f) << prose("no i-type and c-type sources radiate into the same channel: no domain contrast", f)
         << line(f);
    for (const auto& in : s.interference) {
      os << bullet(f) << prose("domain contrast, " + source_title(r, s.sources[in.i_source]) + " with " +
                                   source_title(r, s.sources[in.c_source]) +
                                   ": I± = I_i + I_c ± 2 Re(A_i conj(A_c)), the sign following the 180° domain; "
                                   "cross term in ",
                               f);
      std::string per;
      for (std::size_t c = 0; c < in.cross.size(); ++c)
        if (!in.cross[c].empty())
          per += (per.empty() ? "" : "; ") + prose(m.channels[c].name, f) + " (" + harmonics_text(in.cross[c], f) + ")";
      os << per << line(f);
    }
    os << "\n";
  }
  return os.str();
}

std::string write_kerr(const ScenarioResult& r, Format f) {
  std::ostringstream os;
  for (const auto& k : r.kerr) {
    os << heading("Magneto-optics: " + k.name, f);
    if (k.magnetisation_outside_group)
      os << bullet(f)
         << prose("warning: the magnetisation " + as_magnetisation_angles(k.magnetisation_label) +
                      " is not one the final group " + r.chain.back().readable_symbol +
                      " allows: there the moment (an axial time-odd vector) points " +
                      allowed_moment_text(*k.moment_form, r.frame_labels) +
                      ". The Kerr geometries below are those of the final group; the quadratic terms are evaluated for "
                      "the direction asked for all the same. For a magnetisation along that direction, put it into the "
                      "chain (a moment or magnetic-field step along it).",
                  f)
         << line(f) << "\n";
    if (k.g_part) {
      const AllowedForm& g = r.parts[*k.g_part].forms.back();
      os << prose("Kerr geometries from the gyration vector g in the final group (plane of incidence at the azimuth "
                  "phi from sample x):", f)
         << "\n\n";
      std::vector<std::vector<std::string>> rows;
      for (const auto& kr : k.kerr)
        rows.push_back({kr.geometry, prose(kr.reads, f), kr.allowed() ? "allowed" : "forbidden", terms_text(kr.terms, g, f)});
      os << grid({"geometry", "reads", "status", "signal"}, rows, f) << "\n";
      if (!k.gyration_allowed())
        os << bullet(f)
           << prose("the group forbids a gyration vector: no Kerr rotation and no Faraday rotation in any geometry, "
                    "whatever the order (a grey group, or an antiferromagnet whose group admits no net moment)", f)
           << line(f) << "\n";
    }
    if (k.q_part) {
      const AllowedForm& q = r.parts[*k.q_part].forms.back();
      os << prose("Quadratic (Voigt-type) terms: the change of eps_ij is q_ijkl m_k m_l for the magnetisation (or the "
                      "antiferromagnetic order vector) " +
                      as_magnetisation_angles(k.magnetisation_label) + "; the first row is the linear birefringence seen at normal incidence:", f)
         << "\n\n";
      std::vector<std::vector<std::string>> rows;
      for (const auto& v : k.voigt)
        rows.push_back({delta_eps_name(v.indices, f), as_magnetisation_angles(terms_text(v.terms, q, f))});
      os << grid({"component", "value"}, rows, f) << "\n";
    }
  }
  return os.str();
}

toml::array kerr_json(const ScenarioResult& r) {
  toml::array out;
  for (const auto& k : r.kerr) {
    toml::table t{{"name", k.name},
                  {"magnetisation", k.magnetisation_label},
                  {"field_angles_of", "magnetisation"},
                  {"magnetisation_outside_group", k.magnetisation_outside_group}};
    if (k.moment_form) t.insert("group_allows_moment", allowed_moment_text(*k.moment_form, r.frame_labels));
    if (k.g_part) {
      toml::array geo;
      for (const auto& kr : k.kerr)
        geo.push_back(toml::table{{"geometry", kr.geometry},
                                  {"reads", kr.reads},
                                  {"allowed", kr.allowed()},
                                  {"terms", fourier_terms_json(kr.terms, r.parts[*k.g_part].forms.back())}});
      t.insert("kerr", geo);
      t.insert("gyration_allowed", k.gyration_allowed());
    }
    if (k.q_part) {
      toml::array v;
      for (const auto& q : k.voigt)
        v.push_back(toml::table{{"component", q.indices}, {"terms", fourier_terms_json(q.terms, r.parts[*k.q_part].forms.back())}});
      t.insert("quadratic", v);
    }
    out.push_back(t);
  }
  return out;
}

namespace {

toml::table local_field_json(const LocalFieldSetting& lf) {
  toml::array symbols, symbols_latex;
  for (int i = 0; i < local_field_symbol_count; ++i) {
    symbols.push_back(local_field_symbol_name(i));
    symbols_latex.push_back(local_field_symbol_name(i, true));
  }
  toml::table t{{"symbols", symbols}, {"symbols_latex", symbols_latex}};
  if (!lf.indices) return t;
  toml::table values;
  for (int i = 0; i < local_field_symbol_count; ++i)
    values.insert(local_field_symbol_name(i), toml::table{{"re", lf.values[i].real()}, {"im", lf.values[i].imag()}});
  t.insert("model", "two-medium Fresnel transmission");
  t.insert("n_ambient", lf.indices->ambient.text);
  t.insert("n_omega", lf.indices->omega.text);
  t.insert("n_2omega", lf.indices->two_omega.text);
  t.insert("values", values);
  return t;
}

} // namespace

toml::array shg_json(const ScenarioResult& r) {
  toml::array out;
  for (const auto& s : r.shg) {
    const OpticalMeasurement& m = s.measurement;
    auto harmonics_json = [](const std::vector<Harmonic>& hs) {
      toml::array a;
      for (const auto& h : hs) a.push_back(harmonic_text(h));
      return a;
    };
    toml::array sources;
    for (const auto& src : s.sources) {
      const AllowedForm& form = r.parts[src.part].forms.back();
      toml::array channels;
      for (std::size_t c = 0; c < m.channels.size(); ++c) {
        const ShgChannelSignal& signal = src.signals[c];
        channels.push_back(toml::table{{"channel", m.channels[c].name},
                                       {"radiates", src.channels[c].radiates()},
                                       {"amplitude", optical_amplitude_text(signal.terms, form, TextStyle::plain)},
                                       {"amplitude_latex", optical_amplitude_text(signal.terms, form, TextStyle::latex)},
                                       {"amplitude_harmonics", harmonics_json(signal.amplitude_harmonics)},
                                       {"intensity_harmonics", harmonics_json(signal.intensity_harmonics)}});
      }
      sources.push_back(toml::table{{"response", r.parts[src.part].response_id},
                                    {"part", r.parts[src.part].part_label},
                                    {"channels", channels}});
    }
    toml::array interference;
    for (const auto& in : s.interference) {
      toml::array per;
      for (std::size_t c = 0; c < in.cross.size(); ++c)
        per.push_back(toml::table{{"channel", m.channels[c].name}, {"cross_term_harmonics", harmonics_json(in.cross[c])}});
      interference.push_back(toml::table{{"i_type", source_title(r, s.sources[in.i_source])},
                                         {"c_type", source_title(r, s.sources[in.c_source])},
                                         {"channels", per}});
    }
    toml::array dark;
    for (const auto& d : s.dark_channels) dark.push_back(d);
    toml::table t{{"name", m.name},
                  {"geometry", optics_mode_name(m.mode)},
                  {"azimuth", m.azimuth_rotating ? std::string("rotating") : std::to_string(m.azimuth_deg)},
                  {"local_field_factors", m.local_field.applied},
                  {"sources", sources},
                  {"interference", interference},
                  {"dark_channels", dark}};
    if (m.incidence_deg) t.insert("incidence_deg", static_cast<std::int64_t>(*m.incidence_deg));
    else t.insert("incidence_deg", "any");
    if (m.local_field.applied) t.insert("local_field", local_field_json(m.local_field));
    out.push_back(t);
  }
  return out;
}

} // namespace ts
