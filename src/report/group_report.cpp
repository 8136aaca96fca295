#include "report/group_report.hpp"

#include "report/json_text.hpp"

#include <sstream>

namespace ts {

namespace {

std::string code(const std::string& s, Format f) { return inline_code(s, f); }

std::string heading(const std::string& s, Format f) {
  if (f == Format::markdown) return "### " + s + "\n\n";
  if (f == Format::latex) return "% tensorsieve: " + s + "\n";
  return s + "\n";
}

std::string direction_of(const Vec3& v, LatticeKind lattice) {
  std::array<long, 3> uvw{};
  if (cartesian_to_lattice_direction(v, lattice, &uvw)) return direction_str(uvw);
  return vec_str(v);
}

} // namespace

std::string write_group_list(const std::vector<const NamedGroup*>& groups, Format f) {
  if (f == Format::json) {
    toml::array arr;
    for (const auto* g : groups)
      arr.push_back(toml::table{{"symbol", g->symbol},
                                {"type", g->type_symbol},
                                {"schoenflies", g->schoenflies},
                                {"kind", magnetic_kind_name(g->kind)},
                                {"family", g->family},
                                {"system", g->crystal->system},
                                {"order", static_cast<std::int64_t>(g->group.order())},
                                {"setting", g->crystal->setting}});
    return json_text(toml::table{{"groups", arr}, {"count", static_cast<std::int64_t>(groups.size())}});
  }
  std::vector<std::vector<std::string>> rows;
  for (const auto* g : groups)
    rows.push_back({code(g->symbol, f), g->schoenflies, magnetic_kind_name(g->kind), g->crystal->system,
                    std::to_string(g->group.order()), g->crystal->setting});
  std::ostringstream os;
  os << heading(std::to_string(groups.size()) + " point groups", f);
  os << grid({"symbol", "Schoenflies", "kind", "system", "order", "setting"}, rows, f);
  return finish(os.str(), f);
}

std::string write_group_description(const GroupDescription& d, Format f) {
  const NamedGroup& g = *d.group;
  const PointGroup& G = g.group;
  if (f == Format::json) {
    toml::array ops, subarr;
    for (const auto& o : G.operations()) ops.push_back(o.symbol(G.lattice()));
    for (const auto& sub : d.subgroups) {
      const PointGroup& H = sub.group;
      toml::array hops;
      for (const auto& o : H.operations()) hops.push_back(o.symbol(G.lattice()));
      subarr.push_back(toml::table{{"symbol", sub.symbol},
                                   {"type", sub.type_symbol},
                                   {"order", static_cast<std::int64_t>(H.order())},
                                   {"index", static_cast<std::int64_t>(G.order() / H.order())},
                                   {"operations", hops}});
    }
    toml::table t{{"symbol", g.symbol},
                  {"type", g.type_symbol},
                  {"schoenflies", g.schoenflies},
                  {"kind", magnetic_kind_name(g.kind)},
                  {"family", g.family},
                  {"system", g.crystal->system},
                  {"laue", g.crystal->laue},
                  {"order", static_cast<std::int64_t>(G.order())},
                  {"setting", g.crystal->setting},
                  {"full_symbol", g.crystal->full},
                  {"centrosymmetric", g.crystal->centrosymmetric},
                  {"operations", ops}};
    if (d.with_subgroups) t.insert("subgroups", subarr);
    return json_text(t);
  }
  std::ostringstream os;
  os << heading("point group " + g.symbol, f);
  std::vector<std::vector<std::string>> facts{
      {"type", code(g.type_symbol, f)},
      {"Schoenflies", g.schoenflies},
      {"kind", magnetic_kind_name(g.kind)},
      {"crystal class", code(g.family, f) + " (full " + code(g.crystal->full, f) + "), " + g.crystal->system +
                            ", Laue class " + code(g.crystal->laue, f)},
      {"order", std::to_string(G.order())},
      {"setting", g.crystal->setting},
      {"centrosymmetric", g.crystal->centrosymmetric ? "yes" : "no"}};
  os << grid({"property", "value"}, facts, f);
  os << "\n" << heading("operations", f);
  std::vector<std::vector<std::string>> rows;
  for (const auto& o : G.operations()) rows.push_back({code(o.symbol(G.lattice()), f), o.R.str()});
  os << grid({"operation", "matrix (Cartesian, rows)"}, rows, f);
  if (d.with_subgroups) {
    os << "\n" << heading("subgroups (* = not in a tabulated setting)", f);
    std::vector<std::vector<std::string>> srows;
    for (const auto& sub : d.subgroups) {
      const PointGroup& H = sub.group;
      std::string ops;
      for (const auto& o : H.operations()) ops += (ops.empty() ? "" : ", ") + o.symbol(G.lattice());
      srows.push_back({code(sub.symbol, f), std::to_string(H.order()), std::to_string(G.order() / H.order()), ops});
    }
    os << grid({"subgroup", "order", "index", "operations"}, srows, f);
  }
  return finish(os.str(), f);
}

std::string write_survey(const TensorSpec& spec, const std::vector<SurveyRow>& rows, Format f) {
  int allowed = 0;
  for (const auto& r : rows) allowed += r.independent > 0;
  if (f == Format::json) {
    toml::array arr;
    for (const auto& r : rows)
      arr.push_back(toml::table{{"group", r.group->symbol},
                                {"schoenflies", r.group->schoenflies},
                                {"kind", magnetic_kind_name(r.group->kind)},
                                {"independent", r.independent},
                                {"allowed", r.independent > 0}});
    return json_text(toml::table{{"tensor", toml::table{{"spec", spec.canonical_text()},
                                                        {"description", spec.description()},
                                                        {"jahn", spec.jahn}}},
                                 {"groups", arr},
                                 {"allowed_in", allowed},
                                 {"count", static_cast<std::int64_t>(rows.size())}});
  }
  std::ostringstream os;
  os << heading("survey of " + spec.canonical_text() + " over " + std::to_string(rows.size()) + " groups", f);
  std::vector<std::vector<std::string>> table;
  for (const auto& r : rows)
    table.push_back({code(r.group->symbol, f), r.group->schoenflies, magnetic_kind_name(r.group->kind),
                     std::to_string(r.independent), r.independent > 0 ? "allowed" : "forbidden"});
  os << grid({"group", "Schoenflies", "kind", "independent", "verdict"}, table, f);
  os << "\n" << (f == Format::latex ? "% " : "") << "allowed in " << allowed << " of " << rows.size() << " groups\n";
  return finish(os.str(), f);
}

std::string write_identification(const PointGroup& input, const Identification& id, Format f) {
  std::string axes[3];
  for (int i = 0; i < 3; ++i) axes[i] = direction_of(id.standard_axes[i], input.lattice());
  if (f == Format::json) {
    toml::array ops;
    for (const auto& o : input.operations()) ops.push_back(o.symbol(input.lattice()));
    toml::table t{{"type", id.type->symbol},
                  {"schoenflies", id.type->schoenflies},
                  {"kind", magnetic_kind_name(id.type->kind)},
                  {"order", static_cast<std::int64_t>(input.order())},
                  {"operations", ops},
                  {"standard_axes", toml::table{{"x", axes[0]}, {"y", axes[1]}, {"z", axes[2]}}}};
    if (id.same_setting) t.insert("tabulated_setting", id.same_setting->symbol);
    return json_text(t);
  }
  std::ostringstream os;
  os << heading("identified point group", f);
  std::vector<std::vector<std::string>> rows{
      {"type", code(id.type->symbol, f) + " (" + id.type->schoenflies + ", " + magnetic_kind_name(id.type->kind) + ")"},
      {"order", std::to_string(input.order())},
      {"tabulated setting", id.same_setting ? code(id.same_setting->symbol, f) : "none (a rotated setting)"},
      {"standard setting", "x_std ∥ " + axes[0] + ", y_std ∥ " + axes[1] + ", z_std ∥ " + axes[2] +
                               (input.lattice() == LatticeKind::hexagonal ? " (hexagonal axes of the input)" : " (input axes)")}};
  os << grid({"property", "value"}, rows, f);
  std::string ops;
  for (const auto& o : input.operations()) ops += (ops.empty() ? "" : ", ") + code(o.symbol(input.lattice()), f);
  os << "\noperations: " << ops << "\n";
  return finish(os.str(), f);
}

} // namespace ts
