#include "report/response_report.hpp"
#include "core/text.hpp"

#include "report/json_text.hpp"

#include <algorithm>
#include <sstream>

namespace ts {

namespace {

std::string drives_text(const Response& r) {
  return r.drives.empty() ? "none (equilibrium)" : join(r.drives, ", ");
}

// "h_a, sigma_ab": what the parts are, short enough for a table cell.
std::string parts_text(const Response& r) {
  std::vector<std::string> heads;
  for (const auto& p : r.parts) {
    std::string h = p.spec.name + (p.spec.letters.empty() ? "" : "_" + p.spec.letters);
    if (std::find(heads.begin(), heads.end(), h) == heads.end()) heads.push_back(h);
  }
  return std::to_string(r.parts.size()) + ": " + join(heads, ", ");
}

std::string group_line(const GroupContext& g, const FrameContext& fr) {
  return g.symbol + (g.type_symbol != g.symbol ? " (type " + g.type_symbol + ")" : "") + ", " + g.schoenflies + ", " +
         g.kind + ", order " + std::to_string(g.order) + "; frame x ∥ " + fr.axes[0] + ", y ∥ " + fr.axes[1] +
         ", z ∥ " + fr.axes[2] + (fr.crystal_frame ? " (crystal frame)" : " (sample frame)");
}

std::string part_flags(const ResponsePart& p) {
  return p.hall ? "Hall part: dissipationless, j·E = 0" : "";
}

// "E j j B: response E, driven by a current; second power of the drive (harmonics up to 2ω)".
std::string roles_text(const ResponsePart& p) {
  std::string out = p.indices.empty() ? "(a scalar)" : join(p.indices, " ");
  const bool joule = std::find(p.indices.begin(), p.indices.end(), "joule") != p.indices.end();
  if (joule)
    out += "; answers the heat gradient a driven current makes along the normal (joule: ∂_z T = G I²)";
  else if (p.drive != DriveKind::none)
    out += std::string("; ") + (p.drive == DriveKind::current ? "answers a driven current (E = rho·j)"
                                                             : "answers a driving field (j = sigma·E)");
  if (p.harmonic > 0) out += "; power " + std::to_string(p.harmonic) + " of the drive";
  return out;
}

// Field name and value pairs shared by the text, Markdown and LaTeX layouts.
std::vector<std::pair<std::string, std::string>> fields(const Response& r) {
  std::vector<std::pair<std::string, std::string>> f;
  if (!r.aliases.empty()) f.emplace_back("also known as", join(r.aliases, ", "));
  f.emplace_back("relation", r.relation);
  f.emplace_back("measured", r.response);
  f.emplace_back("drives", drives_text(r));
  f.emplace_back("harmonic", r.harmonic);
  f.emplace_back("time reversal", r.time_reversal);
  f.emplace_back("Onsager", r.onsager);
  f.emplace_back("source", r.source);
  f.emplace_back("status", r.status + " (tag of the first source)");
  return f;
}

toml::array string_array(const std::vector<std::string>& v) {
  toml::array a;
  for (const auto& s : v) a.push_back(s);
  return a;
}

toml::table part_meta_json(const ResponsePart& p) {
  toml::table t{{"label", p.label},
                {"spec", p.spec_text},
                {"canonical_spec", p.spec.canonical_text()},
                {"description", p.spec.description()},
                {"mechanism", p.mechanism},
                {"hall", p.hall},
                {"indices", string_array(p.indices)},
                {"harmonic", static_cast<std::int64_t>(p.harmonic)}};
  if (p.drive != DriveKind::none) t.insert_or_assign("drive", drive_kind_name(p.drive));
  if (p.excluded) t.insert_or_assign("excluded", p.excluded_text);
  return t;
}

} // namespace

void response_json(const Response& r, toml::table& out) {
  out.insert_or_assign("id", r.id);
  out.insert_or_assign("name", r.name);
  out.insert_or_assign("aliases", string_array(r.aliases));
  out.insert_or_assign("relation", r.relation);
  out.insert_or_assign("response", r.response);
  out.insert_or_assign("drives", string_array(r.drives));
  out.insert_or_assign("harmonic", r.harmonic);
  out.insert_or_assign("time_reversal", r.time_reversal);
  out.insert_or_assign("onsager", r.onsager);
  out.insert_or_assign("source", r.source);
  out.insert_or_assign("status", r.status);
}

std::string write_response_list(const std::vector<Response>& responses, Format f) {
  if (f == Format::json) {
    toml::array list;
    for (const auto& r : responses) {
      toml::table t;
      response_json(r, t);
      toml::array parts;
      for (const auto& p : r.parts) parts.push_back(part_meta_json(p));
      t.insert_or_assign("parts", parts);
      list.push_back(t);
    }
    toml::table top{{"count", static_cast<std::int64_t>(responses.size())}, {"responses", list}};
    return json_text(top);
  }
  std::vector<std::vector<std::string>> rows;
  for (const auto& r : responses) {
    std::vector<std::string> row{r.id, r.name, drives_text(r), r.harmonic, parts_text(r)};
    if (f == Format::markdown) row[0] = "`" + row[0] + "`";
    if (f == Format::latex)
      for (auto& c : row) c = latex_escape(c);
    rows.push_back(row);
  }
  const std::vector<std::string> header{"id", "name", "drives", "harmonic", "parts"};
  std::ostringstream os;
  if (f == Format::text) {
    os << responses.size() << " responses; `tensorsieve response ID GROUP` gives the allowed forms in a point group\n";
    os << grid(header, rows, Format::text);
  } else if (f == Format::markdown) {
    os << "# Response catalogue\n\n" << responses.size() << " responses.\n\n" << grid(header, rows, Format::markdown);
  } else {
    os << "% tensorsieve: the response catalogue (" << responses.size() << " responses)\n"
       << grid(header, rows, Format::latex);
  }
  return finish(os.str(), f);
}

std::string write_response(const Response& r, const std::vector<PartForm>& parts, const GroupContext& g,
                           const FrameContext& fr, Format f, View view) {
  if (f == Format::json) {
    toml::table top;
    toml::table meta;
    response_json(r, meta);
    top.insert_or_assign("response", meta);
    toml::array list;
    for (std::size_t i = 0; i < parts.size(); ++i) {
      const PartForm& pf = parts[i];
      toml::table form;
      form_json(pf.form, g, fr, form);
      if (i == 0) {
        if (auto* gt = form["group"].as_table()) top.insert_or_assign("group", *gt);
        if (auto* ft = form["frame"].as_table()) top.insert_or_assign("frame", *ft);
      }
      form.erase("group");
      form.erase("frame");
      toml::table t = part_meta_json(*pf.part);
      t.insert_or_assign("verdict", pf.verdict());
      t.insert_or_assign("allowed", pf.allowed());
      t.insert_or_assign("independent", static_cast<std::int64_t>(pf.independent()));
      if (pf.part->excluded)
        t.insert_or_assign("excluded_independent", static_cast<std::int64_t>(pf.excluded));
      t.insert_or_assign("form", form);
      list.push_back(t);
    }
    top.insert_or_assign("parts", list);
    top.insert_or_assign("allowed_parts", static_cast<std::int64_t>(std::count_if(
                                              parts.begin(), parts.end(), [](const PartForm& p) { return p.allowed(); })));
    return json_text(top);
  }

  std::ostringstream os;
  const auto fs = fields(r);
  std::vector<std::vector<std::string>> verdicts;
  for (std::size_t i = 0; i < parts.size(); ++i) {
    const auto& p = *parts[i].part;
    verdicts.push_back({std::to_string(i + 1), p.label, p.spec.canonical_text(), parts[i].verdict()});
  }
  const std::vector<std::string> vheader{"part", "label", "tensor", "verdict"};

  if (f == Format::text) {
    os << "response " << r.id << ": " << r.name << "\n";
    for (const auto& [k, v] : fs) os << "  " << k << ":" << std::string(16 - k.size(), ' ') << v << "\n";
    os << "\nin " << group_line(g, fr) << "\n\n" << grid(vheader, verdicts, Format::text);
    for (std::size_t i = 0; i < parts.size(); ++i) {
      const PartForm& pf = parts[i];
      const ResponsePart& p = *pf.part;
      os << "\npart " << (i + 1) << ": " << p.label << "\n";
      os << "  indices:   " << roles_text(p) << "\n";
      if (p.hall) os << "  " << part_flags(p) << "\n";
      if (!p.mechanism.empty()) os << "  mechanism (guidance only): " << p.mechanism << "\n";
      if (p.excluded)
        os << "  excluded:  " << p.excluded->canonical_text() << ", " << pf.excluded
           << " independent here; it does not enter the response\n";
      os << "  verdict:   " << pf.verdict() << "\n\n";
      os << write_form(pf.form, g, fr, Format::text, view);
    }
    return finish(os.str(), f);
  }

  if (f == Format::markdown) {
    os << "# Response `" << r.id << "`: " << r.name << "\n\n";
    for (const auto& [k, v] : fs) os << "- " << k << ": " << (k == "relation" ? "`" + v + "`" : v) << "\n";
    os << "\n## In " << g.symbol << "\n\n" << group_line(g, fr) << "\n\n";
    std::vector<std::vector<std::string>> rows = verdicts;
    for (auto& row : rows) row[2] = "`" + row[2] + "`";
    os << grid(vheader, rows, Format::markdown);
    for (std::size_t i = 0; i < parts.size(); ++i) {
      const PartForm& pf = parts[i];
      const ResponsePart& p = *pf.part;
      os << "\n## Part " << (i + 1) << ": " << p.label << "\n\n";
      os << "- indices: " << roles_text(p) << "\n";
      if (p.hall) os << "- " << part_flags(p) << "\n";
      if (!p.mechanism.empty()) os << "- mechanism (guidance only): " << p.mechanism << "\n";
      if (p.excluded)
        os << "- excluded: `" << p.excluded->canonical_text() << "`, " << pf.excluded
           << " independent here; it does not enter the response\n";
      os << "- verdict: **" << pf.verdict() << "**\n\n";
      os << write_form(pf.form, g, fr, Format::markdown, view);
    }
    return finish(os.str(), f);
  }

  // LaTeX: a fragment to \input (amsmath; the catalogue text holds Unicode, so
  // use a Unicode-aware engine such as LuaLaTeX or XeLaTeX).
  os << "% tensorsieve: response " << r.id << " in " << g.symbol << "\n";
  os << "\\paragraph{" << latex_escape(r.name) << " (\\texttt{" << latex_escape(r.id) << "})}\n";
  os << "\\begin{description}\n";
  for (const auto& [k, v] : fs) os << "\\item[" << latex_escape(k) << "] " << latex_escape(v) << "\n";
  os << "\\end{description}\n";
  os << "\\noindent In " << latex_escape(group_line(g, fr)) << ":\n\n";
  std::vector<std::vector<std::string>> rows = verdicts;
  for (auto& row : rows)
    for (auto& c : row) c = latex_escape(c);
  os << grid(vheader, rows, Format::latex);
  for (std::size_t i = 0; i < parts.size(); ++i) {
    const PartForm& pf = parts[i];
    const ResponsePart& p = *pf.part;
    os << "\n\\subparagraph{Part " << (i + 1) << ": " << latex_escape(p.label) << "}\n";
    os << "Indices: " << latex_escape(roles_text(p)) << ". ";
    if (p.hall) os << latex_escape(part_flags(p)) << ". ";
    if (!p.mechanism.empty()) os << "Mechanism (guidance only): " << latex_escape(p.mechanism) << ". ";
    if (p.excluded)
      os << "Excluded: \\texttt{" << latex_escape(p.excluded->canonical_text()) << "}, " << pf.excluded
         << " independent here; it does not enter the response. ";
    os << "Verdict: " << latex_escape(pf.verdict()) << ".\n\n";
    os << write_form(pf.form, g, fr, Format::latex, view);
  }
  return finish(os.str(), f);
}

} // namespace ts
