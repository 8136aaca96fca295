#include "report/scenario_report.hpp"
#include "core/text.hpp"

#include "report/bar_report.hpp"
#include "report/probe_sum_report.hpp"
#include "report/expression_text.hpp"
#include "report/form_report.hpp"
#include "report/json_text.hpp"
#include "report/figure_report.hpp"
#include "report/optics_report.hpp"
#include "report/pump_report.hpp"

#include <algorithm>
#include <sstream>

namespace ts {

namespace {


std::string code(const std::string& s, Format f) { return inline_code(s, f); }

// What a person reads: the type with its elements in words for a non-standard setting
// (JSON keeps the setting symbol itself, sample_frame_symbol).
std::string group_name(const ChainStep& st) { return st.readable_symbol; }

std::string standard_axes(const ChainStep& st, LatticeKind lattice) {
  std::string out;
  const char* n[3] = {"x", "y", "z"};
  for (int i = 0; i < 3; ++i) {
    std::array<long, 3> uvw{};
    std::string d = cartesian_to_lattice_direction(st.id.standard_axes[i], lattice, &uvw)
                        ? direction_str(uvw) : vec_str(st.id.standard_axes[i]);
    out += std::string(i ? ", " : "") + n[i] + "_std ∥ " + d;
  }
  return out;
}

GroupContext context_of(const ChainStep& st, LatticeKind lattice) {
  GroupContext c;
  c.symbol = group_name(st);
  c.type_symbol = st.id.type->symbol;
  c.schoenflies = st.id.type->schoenflies;
  c.kind = magnetic_kind_name(st.id.type->kind);
  c.order = st.group.order();
  c.setting = st.sample_symbol.empty() ? "standard setting at " + standard_axes(st, lattice) + " (crystal axes)"
                                       : group_name(st) + " in the sample frame";
  for (const auto& op : st.group.operations()) c.operations.push_back(op.symbol(lattice));
  return c;
}

std::string relation_text(const BrokenRelation& b, Format f) {
  TextStyle style = f == Format::latex ? TextStyle::latex : TextStyle::plain;
  std::string factor;
  if (b.factor == Surd(Rational(1))) factor = "";
  else if (b.factor == Surd(Rational(-1))) factor = "-";
  else factor = (b.factor.terms().size() == 1 ? surd_text(b.factor, style) : "(" + surd_text(b.factor, style) + ")") +
                (style == TextStyle::latex ? " " : "*");
  return symbol_text(b.component, style) + " = " + factor + symbol_text(b.anchor, style);
}

// Components named by `form`, values in the parameters of `params` (the same form, or a field
// expansion's); with `reference`, only those that differ from it (a domain variant against
// variant 1), so a table shows what changes.
// "h_z⁽³⁾": a component of domain variant 3, kept apart from the parameters of
// variant 1 that the right-hand sides are written in.
std::string variant_component(const std::string& symbol, std::size_t variant, TextStyle style) {
  if (variant == 0) return symbol;
  if (style == TextStyle::latex) return symbol + "^{(" + std::to_string(variant) + ")}";
  static const char* const digits[] = {"⁰", "¹", "²", "³", "⁴", "⁵", "⁶", "⁷", "⁸", "⁹"};
  std::string sup;
  for (char ch : std::to_string(variant)) sup += digits[ch - '0'];
  return symbol + "⁽" + sup + "⁾";
}

// Every component of a tensor as a relation "T_ij = combination", or with a
// reference tensor only those that differ from it; a one-item list saying so when
// there are none.
std::vector<std::string> tensor_component_relations(const ParamTensor& t, const AllowedForm& form, Format f,
                                                    const AllowedForm* params = nullptr,
                                                    const ParamTensor* reference = nullptr, std::size_t variant = 0) {
  TextStyle style = f == Format::latex ? TextStyle::latex : TextStyle::plain;
  auto lhs = [&](int c) { return variant_component(symbol_text(form.component_name(c), style), variant, style); };
  std::vector<std::string> parts;
  for (int r = 0; r < form.symmetry->size(); ++r) {
    int c = form.symmetry->rep_code(r);
    if (reference && reference->is_zero(c) == t.is_zero(c) &&
        (t.is_zero(c) || reference->components[c] == t.components[c]))
      continue;
    if (t.is_zero(c)) {
      if (reference) parts.push_back(style == TextStyle::latex ? "$" + lhs(c) + " = 0$" : lhs(c) + " = 0");
      continue;
    }
    std::string relation = lhs(c) + " = " + combination_text(params ? *params : form, t.components[c], style);
    parts.push_back(style == TextStyle::latex ? "$" + relation + "$" : relation); // math mode inside a table cell
  }
  if (parts.empty()) parts.push_back(reference ? "as variant 1" : "all components vanish");
  return parts;
}

std::string tensor_components_text(const ParamTensor& t, const AllowedForm& form, Format f,
                                   const AllowedForm* params = nullptr) {
  return join(tensor_component_relations(t, form, f, params), "; ");
}

// A rank-6 tensor over 96 variants would print a gigabyte: a person reads the first
// relations of a cell or an average, the rest (and every component) is in --format
// json. The cap counts relations, so every format shows the same ones.
constexpr std::size_t kShownRelations = 40;

std::vector<std::string> first_relations(std::vector<std::string> relations) {
  if (relations.size() <= kShownRelations) return relations;
  const std::size_t more = relations.size() - kShownRelations;
  relations.resize(kShownRelations);
  relations.push_back("... " + counted(more, "more relation") + "; --format json lists every component");
  return relations;
}

// A tensor given as combinations of parameters, written as a form: components with
// the same combination (or its negative) share one line, ⟨A⟩ = ⟨B⟩ = -⟨C⟩ = expr.
// `averaged` puts the components in angle brackets, so the average's components are
// not mistaken for the parameters of variant 1 they are expressed in; without it a
// component that is its own parameter is not repeated (T_xx = T_yy, not T_xx = T_yy = T_xx).
std::vector<std::string> grouped_form_relations(const ParamTensor& t, const AllowedForm& form, Format f, bool averaged,
                                                const AllowedForm* params = nullptr) {
  const TextStyle style = f == Format::latex ? TextStyle::latex : TextStyle::plain;
  struct Line {
    Combination value;
    std::vector<std::pair<bool, int>> members; // negated?, component code
  };
  std::vector<Line> lines;
  bool some_zero = false;
  for (int r = 0; r < form.symmetry->size(); ++r) {
    const int c = form.symmetry->rep_code(r);
    if (t.is_zero(c)) {
      some_zero = true;
      continue;
    }
    Combination negated = t.components[c];
    for (auto& term : negated) term.coefficient = -term.coefficient;
    auto same = std::find_if(lines.begin(), lines.end(), [&](const Line& l) { return l.value == t.components[c]; });
    auto opposite = std::find_if(lines.begin(), lines.end(), [&](const Line& l) { return l.value == negated; });
    if (same != lines.end()) same->members.push_back({false, c});
    else if (opposite != lines.end()) opposite->members.push_back({true, c});
    else lines.push_back({t.components[c], {{false, c}}});
  }
  if (lines.empty()) return {"all components vanish"};
  const AllowedForm& named = params ? *params : form;
  auto component = [&](int c) {
    const std::string s = symbol_text(form.component_name(c), style);
    if (!averaged) return s;
    return style == TextStyle::latex ? "\\langle " + s + "\\rangle" : "⟨" + s + "⟩";
  };
  std::vector<std::string> parts;
  for (const auto& l : lines) {
    std::vector<std::string> names;
    for (const auto& [neg, c] : l.members) names.push_back((neg ? "-" : "") + component(c));
    const std::string value = combination_text(named, l.value, style);
    const bool is_own_parameter = !averaged && value == symbol_text(form.component_name(l.members.front().second), style);
    std::string relation = join(names, " = ") + (is_own_parameter ? "" : " = " + value);
    parts.push_back(style == TextStyle::latex ? "$" + relation + "$" : relation);
  }
  if (some_zero) parts.push_back("all others vanish");
  return parts;
}

// The average after "average over ...:": on the same line when it is short, else one
// relation a line (LaTeX wraps a paragraph itself), at most kShownRelations of them.
std::string average_text(const std::vector<std::string>& relations, Format f) {
  constexpr std::size_t kShortLine = 100;
  const std::vector<std::string> shown = first_relations(relations);
  const std::string one_line = join(shown, "; ");
  if (f == Format::latex || one_line.size() <= kShortLine) return " " + one_line + "\n";
  std::string out = "\n";
  for (const auto& relation : shown) out += (f == Format::markdown ? "- " : "  ") + relation + "\n";
  return out;
}

std::string fractions_text(const DomainReport& d) {
  std::vector<std::string> w;
  for (const auto& x : d.fractions) w.push_back(x.str());
  return d.fractions.empty() ? "equal populations" : "volume fractions " + join(w, ", ");
}

} // namespace

toml::table scenario_json(const ScenarioResult& r, const ReportFigures& figures) {
  const auto& sc = r.scenario;
  const LatticeKind lattice = r.chain.front().group.lattice();
  toml::table root;
  root.insert("title", sc.title);
  root.insert("source", sc.source);
  root.insert("parent_note", r.parent_note);
  root.insert("frame", toml::table{{"x", r.frame_labels[0]}, {"y", r.frame_labels[1]}, {"z", r.frame_labels[2]}});
  toml::array chain;
  for (std::size_t i = 0; i < r.chain.size(); ++i) {
    const auto& st = r.chain[i];
    toml::array ops, lost;
    for (const auto& op : st.group.operations()) ops.push_back(op.symbol(lattice));
    for (const auto& l : st.lost) lost.push_back(l);
    chain.push_back(toml::table{{"step", static_cast<std::int64_t>(i)},
                                {"label", st.label},
                                {"quantity", st.quantity},
                                {"type", st.id.type->symbol},
                                {"schoenflies", st.id.type->schoenflies},
                                {"sample_frame_symbol", st.sample_symbol},
                                {"standard_setting", standard_axes(st, lattice)},
                                {"order", static_cast<std::int64_t>(st.group.order())},
                                {"operations", ops},
                                {"lost", lost}});
  }
  root.insert("chain", chain);
  toml::array parts;
  for (std::size_t k = 0; k < r.parts.size(); ++k) {
    const auto& p = r.parts[k];
    toml::array counts;
    for (int c : p.counts) counts.push_back(static_cast<std::int64_t>(c));
    toml::table final_form;
    FrameContext fc{r.frame_labels, false};
    form_json(p.forms.back(), context_of(p.evaluated_in ? *p.evaluated_in : r.chain.back(), lattice), fc, final_form);
    toml::array changes;
    for (const auto& ch : r.changes) {
      if (ch.part != k) continue;
      toml::array on, broken;
      for (const auto& s : ch.switched_on) on.push_back(s);
      for (const auto& b : ch.broken) broken.push_back(relation_text(b, Format::text));
      changes.push_back(toml::table{{"step", static_cast<std::int64_t>(ch.step)},
                                    {"independent_before", ch.before},
                                    {"independent_after", ch.after},
                                    {"switched_on", on},
                                    {"relations_broken", broken}});
    }
    toml::array planar, skipped;
    for (auto v : p.planar) planar.push_back(planar_reading_text(v));
    for (bool v : p.field_step_skipped) skipped.push_back(v);
    toml::array verdicts;
    for (const auto& v : p.verdicts) verdicts.push_back(v);
    toml::table entry{{"planar_bar_by_step", planar},
                      {"verdict_by_step", verdicts},
                      {"field_step_not_applied", skipped},
                      {"induced_by_applied_field", p.induced_by_field},
                      {"field_induced_hall", p.field_induced_hall},
                      {"response", p.response_id},
                      {"response_name", p.response_name},
                      {"part", p.part_label},
                      {"spec", p.spec.canonical_text()},
                      {"independent_by_step", counts},
                      {"final", final_form},
                      {"changes", changes}};
    if (p.switched_on_at) entry.insert("switched_on_by_step", static_cast<std::int64_t>(*p.switched_on_at));
    for (const auto& d : r.domains) {
      if (d.part != k) continue;
      toml::array vars;
      for (const auto& v : d.analysis.variants)
        vars.push_back(toml::table{{"representative", v.representative.symbol(lattice)},
                                   {"components", tensor_components_text(v.tensor, d.form, Format::text)}});
      toml::array fractions, fields;
      for (const auto& w : d.fractions) fractions.push_back(w.str());
      for (const auto& t : d.in_field) {
        toml::array per;
        for (std::size_t v = 0; v < t.variants.size(); ++v)
          per.push_back(toml::table{{"representative", d.analysis.variants[v].representative.symbol(lattice)},
                                    {"components", tensor_components_text(t.variants[v], d.form, Format::text, &t.form)}});
        fields.push_back(toml::table{{"field", t.field.label},
                                     {"expansion", t.expansion.name + ": " + t.expansion.description()},
                                     {"expansion_independent", t.form.independent()},
                                     {"variants", per},
                                     {"average", tensor_components_text(t.average, d.form, Format::text, &t.form)}});
      }
      entry.insert("domains", toml::table{{"from_step", static_cast<std::int64_t>(d.from_step)},
                                          {"variants", vars},
                                          {"domain_group", d.domain_symbol},
                                          {"fractions", fractions},
                                          {"in_field", fields},
                                          {"average", tensor_components_text(d.analysis.average, d.form, Format::text)}});
    }
    parts.push_back(entry);
  }
  root.insert("parts", parts);
  root.insert("bars", bars_json(r));
  root.insert("layouts", layouts_json(r));
  root.insert("probe_sums", probe_sums_json(r));
  root.insert("plans", plans_json(r));
  if (!r.shg.empty()) root.insert("shg", shg_json(r));
  if (!r.kerr.empty()) root.insert("magneto_optics", kerr_json(r));
  if (!r.pump_probe.empty()) root.insert("pump_probe", pump_probe_json(r));
  if (!r.photocurrents.empty()) root.insert("photocurrents", photocurrent_json(r));
  if (figures) root.insert("figures", figures_json(*figures));
  return root;
}

std::string write_scenario(const ScenarioResult& r, const ReportFigures& figures, Format f) {
  const auto& sc = r.scenario;
  const LatticeKind lattice = r.chain.front().group.lattice();
  const std::string frame_text = "x ∥ " + r.frame_labels[0] + ", y ∥ " + r.frame_labels[1] + ", z ∥ " + r.frame_labels[2];
  if (f == Format::json) return json_text(scenario_json(r, figures));

  std::ostringstream os;
  os << section_heading(sc.title.empty() ? "tensorsieve scenario" : sc.title, f, 1);
  if (f == Format::text) os << "source: " << sc.source << "\n";
  if (!r.parent_note.empty())
    os << (f == Format::latex ? "\\noindent " : "") << "parent: " << as_text(r.parent_note, f) << "\n";
  os << (f == Format::latex ? "\n\\noindent " : "") << "sample frame: " << frame_text << " (right-handed, y = z × x)\n\n";

  os << section_heading("symmetry chain", f);
  std::vector<std::vector<std::string>> rows;
  for (std::size_t i = 0; i < r.chain.size(); ++i) {
    const auto& st = r.chain[i];
    std::string setting = st.sample_symbol.empty() ? standard_axes(st, lattice) : "as written, in the sample frame";
    rows.push_back({std::to_string(i), as_text(st.label, f), code(group_name(st), f), st.id.type->schoenflies,
                    std::to_string(st.group.order()), setting});
  }
  os << grid({"step", "imposed", "group", "Schoenflies", "order", "setting"}, rows, f);
  for (std::size_t i = 1; i < r.chain.size(); ++i) {
    const auto& lost = r.chain[i].lost;
    if (lost.empty()) {
      // Say so: a step that keeps every operation usually means the imposed quantity
      // or group already agreed with the sample (or was written in other axes than meant).
      os << (f == Format::markdown ? "- " : "  ") << "step " << i << " changes nothing: every operation of step "
         << i - 1 << " keeps what it imposes" << (f == Format::latex ? "\\\\" : "") << "\n";
      continue;
    }
    std::vector<std::string> shown;
    for (const auto& l : lost) shown.push_back(code(l, f));
    os << (f == Format::markdown ? "- " : "  ") << "step " << i << " removes " << lost.size() << " of "
       << counted(r.chain[i - 1].group.order(), "operation")
       << (lost.size() <= 16 ? ": " + join(shown, ", ") : " (all listed in --format json)")
       << (f == Format::latex ? "\\\\" : "") << "\n";
  }
  os << "\n";

  // Many responses at once (--response all, a family): the verdicts first, one line each.
  if (r.parts.size() > 3 && r.chain.size() > 1) {
    const std::size_t last = r.chain.size() - 1;
    os << section_heading("summary: what the last step (" + r.chain[last].label + ") switched on", f);
    std::vector<std::string> on, allowed, forbidden;
    for (const auto& p : r.parts) {
      const std::string name =
          as_text((p.response_id.empty() ? "tensor " + p.spec.canonical_text() : p.response_id + ": " + p.part_label) +
                      (p.field_induced_hall ? ", induced by the applied field, not spontaneous" : ""),
                  f);
      const int before = p.counts[last - 1], after = p.counts[last];
      if (before == 0 && after > 0) on.push_back(name + " (" + std::to_string(after) + " independent)");
      else (after > 0 ? allowed : forbidden).push_back(name);
    }
    const char* bullet = f == Format::markdown ? "- " : "  ";
    const char* end = f == Format::latex ? "\\\\\n" : "\n";
    if (on.empty()) os << bullet << "nothing new: every part allowed now was allowed before" << end;
    for (const auto& n : on) os << bullet << "switched on: " << n << end;
    os << bullet << "allowed before and after: " << (allowed.empty() ? "none" : counted(allowed.size(), "part"))
       << end << bullet << "forbidden after the last step: "
       << (forbidden.empty() ? "none" : counted(forbidden.size(), "part")) << end
       << bullet << "the details of every part follow" << end << "\n";
  }

  for (std::size_t k = 0; k < r.parts.size(); ++k) {
    const auto& p = r.parts[k];
    os << section_heading(part_title(p), f);
    std::vector<std::vector<std::string>> counts;
    for (std::size_t i = 0; i < r.chain.size(); ++i) {
      int n = p.counts[i];
      const std::string& verdict = p.verdicts[i];
      std::string group = p.field_step_skipped[i] ? "as step " + std::to_string(i - 1) + " (field not applied)"
                                                  : code(group_name(r.chain[i]), f);
      counts.push_back({std::to_string(i), group, std::to_string(n), verdict});
    }
    os << grid({"step", "group", "independent", "verdict"}, counts, f) << "\n";
    if (std::find(p.field_step_skipped.begin(), p.field_step_skipped.end(), true) != p.field_step_skipped.end())
      os << (f == Format::markdown ? "- " : "  ") << "this part is an expansion in the field (or magnetisation): "
         << "the field enters through its powers and the bar's field direction, so the steps that apply it are not "
         << "applied again here: the form below is that of " << code(group_name(p.evaluated_in ? *p.evaluated_in : r.chain.back()), f)
         << ", the group without them" << (f == Format::latex ? "\\" : "") << "\n";
    if (std::find(p.planar.begin(), p.planar.end(), PlanarReading::not_readable) != p.planar.end())
      os << (f == Format::markdown ? "- " : "  ") << "\"not readable in a planar bar\": the allowed components give zero "
         << "on both probes for every in-plane current direction and every field direction"
         << (f == Format::latex ? "\\" : "") << "\n";
    for (const auto& ch : r.changes) {
      if (ch.part != k || (ch.switched_on.empty() && ch.broken.empty())) continue;
      std::string on;
      for (const auto& s : ch.switched_on) on += (on.empty() ? "" : ", ") + code(s, f);
      std::vector<std::string> br;
      for (const auto& b : ch.broken) br.push_back(code(relation_text(b, f == Format::latex ? Format::text : f), f));
      os << (f == Format::markdown ? "- " : "  ") << "step " << ch.step << " (" << as_text(r.chain[ch.step].label, f) << "): "
         << ch.before << " → " << ch.after << " independent";
      if (!on.empty()) os << "; switched on: " << on;
      if (!br.empty()) os << "; relations broken: " << join(br, ", ");
      os << (f == Format::latex ? "\\\\" : "") << "\n";
    }
    os << "\n";
    FrameContext fc{r.frame_labels, false};
    if (p.excluded)
      os << (f == Format::latex ? "% " : "  ") << "note: the response does not see the " << p.excluded->name << " piece ("
         << p.excluded->description() << ") of this tensor; the counts above leave it out, the form below includes it\n\n";
    os << write_form(p.forms.back(), context_of(p.evaluated_in ? *p.evaluated_in : r.chain.back(), lattice), fc, f,
                     View::automatic)
       << "\n";
    for (const auto& d : r.domains) {
      if (d.part != k) continue;
      const std::string& dg = d.domain_symbol;
      os << section_heading("domains: " + std::to_string(d.analysis.variants.size()) + " variants of " + dg + " in " +
                        group_name(r.chain[d.from_step]) + " (spontaneous steps only; applied fields form no domains)",
                    f, 3);
      constexpr std::size_t kShownVariants = 8; // the rest, like the relations beyond kShownRelations, in JSON
      // With applied fields, what the variants show in the field comes first: the
      // zero-field rows (often all zero) would otherwise read as the verdict.
      const std::size_t shown = std::min(d.analysis.variants.size(), kShownVariants);
      for (const auto& t : d.in_field) {
        const std::string field_symbol = t.expansion.name.substr(p.spec.name.size());
        os << section_heading("every variant in the lab-frame " + t.field.label + ": the part linear in the field, per unit " +
                          field_symbol + " (" + t.expansion.name + " = d" + p.spec.name + "/d" + field_symbol + ", " +
                          std::to_string(t.form.independent()) + " independent in " + dg + ")",
                      f, 3);
        std::vector<std::vector<std::string>> frows;
        for (std::size_t v = 0; v < t.variants.size() && v < shown; ++v)
          frows.push_back({std::to_string(v + 1), code(d.analysis.variants[v].representative.symbol(lattice), f),
                           join(first_relations(tensor_component_relations(t.variants[v], d.form, f, &t.form)), "; ")});
        os << grid({"variant", f == Format::latex ? "g\\_i" : "g_i", "components (sample frame)"}, frows, f);
        os << "\n" << (f == Format::markdown ? "**" : "") << "average over " << fractions_text(d) << " in the field:"
           << (f == Format::markdown ? "**" : "")
           << average_text(grouped_form_relations(t.average, d.form, f, true, &t.form), f) << "\n";
      }
      const bool in_field = !d.in_field.empty();
      if (in_field) os << section_heading("every variant at zero field (the spontaneous steps alone)", f, 3);
      std::vector<std::vector<std::string>> vrows;
      for (std::size_t v = 0; v < shown; ++v)
        vrows.push_back({std::to_string(v + 1), code(d.analysis.variants[v].representative.symbol(lattice), f),
                         join(first_relations(v ? tensor_component_relations(d.analysis.variants[v].tensor, d.form, f,
                                                                             nullptr, &d.analysis.variants[0].tensor, v + 1)
                                                : grouped_form_relations(d.analysis.variants[0].tensor, d.form, f, false)),
                              "; ")});
      os << grid({"variant", f == Format::latex ? "g\\_i" : "g_i",
                  "components of variant i in the parameters of variant 1 (from variant 2 on: only what differs)"},
                 vrows, f);
      if (shown < d.analysis.variants.size())
        os << (f == Format::latex ? "\n\\noindent " : "  ") << "variants " << shown + 1 << " to "
           << d.analysis.variants.size() << " are not printed here; --format json lists them all\n";
      os << "\n" << (f == Format::markdown ? "**" : "") << "average over " << fractions_text(d)
         << (in_field ? " at zero field:" : ":") << (f == Format::markdown ? "**" : "")
         << average_text(grouped_form_relations(d.analysis.average, d.form, f, true), f) << "\n";
    }
  }
  os << write_bars(r, f) << write_probe_sums(r, f) << write_plans(r, f) << write_layouts(r, f) << write_shg(r, f)
     << write_kerr(r, f) << write_light_driven(r, f);
  if (figures) os << write_figures_list(*figures, f);
  return finish(os.str(), f);
}

} // namespace ts
