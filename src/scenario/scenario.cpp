#include "scenario/scenario.hpp"

#include "core/error.hpp"
#include "group/group_catalogue.hpp"
#include "response/response_catalogue.hpp"
#include "tensor/tensor_spec.hpp"

#include <toml++/toml.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <set>

namespace ts {

namespace {

const char* kinds_help =
    "strain, shear, polar, electric-field, moment, magnetic-field, current, magnetic-group, subgroup, tilts";

std::string at(const std::string& file, const toml::source_region& s) {
  return file + ":" + std::to_string(s.begin.line) + ":" + std::to_string(s.begin.column);
}

std::string get_string(const toml::table& t, const char* key, const std::string& file, bool required,
                       const char* valid) {
  auto node = t.get(key);
  if (!node) {
    if (required) fail(ErrorKind::bad_file, std::string("missing key '") + key + "'", at(file, t.source()), valid);
    return {};
  }
  auto v = node->value<std::string>();
  if (!v) fail(ErrorKind::bad_file, std::string("'") + key + "' must be a string", at(file, node->source()), valid);
  return *v;
}

void check_keys(const toml::table& t, const std::set<std::string>& allowed, const std::string& file,
                const std::string& section) {
  for (const auto& [k, v] : t)
    if (!allowed.count(std::string(k.str()))) {
      std::string list;
      for (const auto& a : allowed) list += (list.empty() ? "" : ", ") + a;
      fail(ErrorKind::bad_file, "unknown key '" + std::string(k.str()) + "' in " + section, at(file, v.source()), list);
    }
}

std::vector<std::string> get_strings(const toml::table& t, const char* key, const std::string& file) {
  std::vector<std::string> out;
  auto node = t.get(key);
  if (!node) return out;
  if (auto s = node->value<std::string>()) return {*s};
  auto arr = node->as_array();
  if (!arr) fail(ErrorKind::bad_file, std::string("'") + key + "' must be a string or an array of strings", at(file, node->source()));
  for (auto& el : *arr) {
    auto s = el.value<std::string>();
    if (!s) fail(ErrorKind::bad_file, std::string("'") + key + "' must hold strings", at(file, el.source()));
    out.push_back(*s);
  }
  return out;
}

std::optional<Rational> get_length(const toml::table& t, const char* key, const std::string& file) {
  auto node = t.get(key);
  if (!node) return std::nullopt;
  auto v = node->value<double>();
  if (!v || !std::isfinite(*v) || *v <= 0)
    fail(ErrorKind::bad_file, std::string("lattice parameter '") + key + "' must be a positive number",
         at(file, node->source()), "a length in Angstrom, e.g. 3.905");
  return exact_decimal(*v, at(file, node->source()), ErrorKind::bad_file);
}

// Check a value where it is read, so its error names the file, line and column.
template <typename Check>
void check_at(const std::string& where, Check check) {
  try {
    check();
  } catch (const Error& e) {
    fail(e.kind(), e.problem(), e.location().empty() ? where : where + ": " + e.location(), e.valid());
  }
}

std::string position_of(const toml::table& t, const char* key, const std::string& file) {
  auto node = t.get(key);
  return node ? at(file, node->source()) : file;
}

} // namespace

const char* lowering_kind_name(LoweringKind k) {
  switch (k) {
  case LoweringKind::strain: return "strain";
  case LoweringKind::shear: return "shear";
  case LoweringKind::polar: return "polar";
  case LoweringKind::electric_field: return "electric-field";
  case LoweringKind::moment: return "moment";
  case LoweringKind::magnetic_field: return "magnetic-field";
  case LoweringKind::current: return "current";
  case LoweringKind::magnetic_group: return "magnetic-group";
  case LoweringKind::subgroup: return "subgroup";
  case LoweringKind::tilts: return "tilts";
  }
  return "";
}

LoweringKind parse_lowering_kind(const std::string& text, const std::string& where, ErrorKind bad_value) {
  static const std::pair<const char*, LoweringKind> names[] = {
      {"strain", LoweringKind::strain},           {"distortion", LoweringKind::strain},
      {"shear", LoweringKind::shear},             {"polar", LoweringKind::polar},
      {"polarization", LoweringKind::polar},      {"displacement", LoweringKind::polar},
      {"electric-field", LoweringKind::electric_field}, {"efield", LoweringKind::electric_field},
      {"moment", LoweringKind::moment},           {"magnetization", LoweringKind::moment},
      {"magnetic-field", LoweringKind::magnetic_field}, {"field", LoweringKind::magnetic_field},
      {"current", LoweringKind::current},         {"magnetic-group", LoweringKind::magnetic_group},
      {"order", LoweringKind::magnetic_group},    {"subgroup", LoweringKind::subgroup},
      {"structural-subgroup", LoweringKind::subgroup}, {"tilts", LoweringKind::tilts}};
  for (const auto& [n, k] : names)
    if (text == n) return k;
  fail(bad_value, "unknown lowering kind '" + text + "'", where, kinds_help);
}

LoweringStep parse_lowering_option(const std::string& text, const std::string& where) {
  std::size_t colon = text.find(':');
  if (colon == std::string::npos)
    fail(ErrorKind::usage, "'" + text + "' is not KIND:VALUE", where,
         "e.g. strain:[001], field:[1-10], shear:[100],[010], subgroup:mm2, magnetic-group:4'/m'm'm, tilts:a0a0c-");
  LoweringStep s;
  s.bad_value = ErrorKind::usage;
  s.kind = parse_lowering_kind(text.substr(0, colon), where, ErrorKind::usage);
  std::string value = text.substr(colon + 1);
  s.where = where;
  if (s.kind == LoweringKind::magnetic_group || s.kind == LoweringKind::subgroup || s.kind == LoweringKind::tilts) {
    s.value = value;
  } else if (s.kind == LoweringKind::shear) {
    std::size_t comma = value.find("],");
    if (comma == std::string::npos)
      fail(ErrorKind::usage, "a shear needs two directions", where, "shear:[100],[010]");
    s.along = value.substr(0, comma + 1);
    s.second = value.substr(comma + 2);
  } else {
    s.along = value;
  }
  return s;
}

Scenario load_scenario(const std::string& path) {
  std::error_code ec;
  auto status = std::filesystem::status(path, ec);
  if (ec || !std::filesystem::exists(status))
    fail(ErrorKind::bad_file, "no such file", path, "the path of a scenario TOML file (docs/scenarios.md)");
  if (!std::filesystem::is_regular_file(status))
    fail(ErrorKind::bad_file, std::filesystem::is_directory(status) ? "is a directory, not a scenario file"
                                                                     : "is not a regular file",
         path, "the path of a scenario TOML file (docs/scenarios.md)");
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  if (!in) fail(ErrorKind::bad_file, "cannot read the file", path, "a readable scenario TOML file");
  return parse_scenario(text.str(), path);
}

Scenario parse_scenario(const std::string& text, const std::string& path) {
  toml::table root;
  try {
    root = toml::parse(text, path);
  } catch (const toml::parse_error& e) {
    fail(ErrorKind::bad_file, std::string(e.description()), at(path, e.source()),
         "a TOML scenario file (schema in docs/scenarios.md)");
  }
  Scenario sc;
  sc.source = path;
  check_keys(root, {"title", "crystal", "sample", "lowering", "responses", "tensors", "report"}, path, "the scenario");
  sc.title = get_string(root, "title", path, false, "a string");
  auto crystal = root["crystal"].as_table();
  if (!crystal) fail(ErrorKind::bad_file, "missing [crystal] table", path, "[crystal] with group = \"m-3m\" or a [crystal.structure]");
  check_keys(*crystal, {"group", "lattice", "structure", "nonmagnetic"}, path, "[crystal]");
  sc.group = get_string(*crystal, "group", path, false, "a point-group symbol such as m-3m or 4/mmm1'");
  if (crystal->get("group"))
    check_at(position_of(*crystal, "group", path), [&] { GroupCatalogue::builtin().get(sc.group); });
  if (auto nm = crystal->get("nonmagnetic")) {
    auto b = nm->is_boolean() ? nm->value<bool>() : std::nullopt;
    if (!b) fail(ErrorKind::bad_file, "'nonmagnetic' must be true or false", at(path, nm->source()));
    sc.assume_nonmagnetic = *b;
  }
  if (auto st = crystal->get("structure")) {
    auto t = st->as_table();
    if (!t) fail(ErrorKind::bad_file, "[crystal.structure] must be a table", at(path, st->source()));
    sc.structure = parse_structure(*t, path + ":[crystal.structure]");
  }
  if (sc.group.empty() && !sc.structure)
    fail(ErrorKind::bad_file, "[crystal] needs a point group or a structure", at(path, crystal->source()),
         "group = \"m-3m\" or a [crystal.structure] table (docs/structures.md)");
  if (!sc.group.empty() && sc.structure)
    fail(ErrorKind::bad_file, "[crystal] gives both a group and a structure; keep one", at(path, crystal->source()));
  if (auto lat = crystal->get("lattice")) {
    auto t = lat->as_table();
    if (!t) fail(ErrorKind::bad_file, "'lattice' must be a table", at(path, lat->source()), "lattice = { a = 3.905, c = 4.1 }");
    check_keys(*t, {"a", "b", "c"}, path, "lattice");
    sc.metric.a = get_length(*t, "a", path);
    sc.metric.b = get_length(*t, "b", path);
    sc.metric.c = get_length(*t, "c", path);
    if (!sc.metric.a) fail(ErrorKind::bad_file, "lattice needs at least a", at(path, t->source()), "lattice = { a = 3.905 }");
  }
  if (auto sample = root["sample"].as_table()) {
    check_keys(*sample, {"cut", "x", "z", "faces"}, path, "[sample]");
    sc.cut = get_string(*sample, "cut", path, false, "a plane such as \"(110)\" or a direction \"[111]\"");
    sc.x = get_string(*sample, "x", path, false, "an in-plane direction such as \"[001]\"");
    sc.z = get_string(*sample, "z", path, false, "a direction such as \"[001]\"");
    std::string faces = get_string(*sample, "faces", path, false, "\"inequivalent\" or \"equivalent\"");
    if (!faces.empty() && faces != "inequivalent" && faces != "equivalent")
      fail(ErrorKind::bad_file, "faces must be \"inequivalent\" (interface, film on a substrate) or \"equivalent\"",
           at(path, sample->get("faces")->source()));
    sc.equivalent_faces = faces == "equivalent";
    if (!sc.cut.empty() && !sc.z.empty())
      fail(ErrorKind::bad_file, "give either cut or z in [sample], not both", at(path, sample->source()));
  }
  if (auto steps = root.get("lowering")) {
    auto arr = steps->as_array();
    if (!arr) fail(ErrorKind::bad_file, "'lowering' must be an array of tables [[lowering]]", at(path, steps->source()));
    for (auto& el : *arr) {
      auto t = el.as_table();
      if (!t) fail(ErrorKind::bad_file, "each [[lowering]] entry must be a table", at(path, el.source()));
      check_keys(*t, {"kind", "along", "and", "group", "glazer", "label"}, path, "[[lowering]]");
      LoweringStep s;
      s.where = at(path, t->source());
      s.kind = parse_lowering_kind(get_string(*t, "kind", path, true, kinds_help), s.where, ErrorKind::bad_file);
      s.along = get_string(*t, "along", path, false, "a direction such as \"[001]\"");
      s.second = get_string(*t, "and", path, false, "a direction such as \"[010]\"");
      s.label = get_string(*t, "label", path, false, "a string");
      if (s.kind == LoweringKind::magnetic_group) s.value = get_string(*t, "group", path, true, "a magnetic point group symbol in the crystal frame");
      if (s.kind == LoweringKind::subgroup)
        s.value = get_string(*t, "group", path, true, "a point group symbol without primes in the crystal frame");
      if (s.kind == LoweringKind::tilts) s.value = get_string(*t, "glazer", path, true, "a Glazer symbol such as \"a0a0c-\"");
      bool vector_like = s.kind != LoweringKind::magnetic_group && s.kind != LoweringKind::subgroup &&
                         s.kind != LoweringKind::tilts;
      if (vector_like && s.along.empty())
        fail(ErrorKind::bad_file, std::string("a ") + lowering_kind_name(s.kind) + " step needs 'along'", s.where,
             "along = \"[001]\"");
      if (s.kind == LoweringKind::shear && s.second.empty())
        fail(ErrorKind::bad_file, "a shear step needs 'along' and 'and'", s.where, "along = \"[100]\", and = \"[010]\"");
      sc.steps.push_back(s);
    }
  }
  sc.responses = get_strings(root, "responses", path);
  sc.tensors = get_strings(root, "tensors", path);
  for (const auto& id : sc.responses)
    check_at(position_of(root, "responses", path), [&] { ResponseCatalogue::builtin().expand(id); });
  for (const auto& t : sc.tensors) check_at(position_of(root, "tensors", path), [&] { parse_tensor_spec(t); });
  if (auto rep = root["report"].as_table()) {
    check_keys(*rep, {"domains"}, path, "[report]");
    if (auto d = rep->get("domains")) {
      auto b = d->is_boolean() ? d->value<bool>() : std::nullopt;
      if (!b) fail(ErrorKind::bad_file, "'domains' must be true or false", at(path, d->source()));
      sc.domains = *b;
    }
  }
  if (sc.responses.empty() && sc.tensors.empty())
    fail(ErrorKind::bad_file, "the scenario asks for no response", path,
         "responses = [\"anomalous-hall\", ...] (see `tensorsieve responses`) or tensors = [\"V[V2]\"]");
  return sc;
}

} // namespace ts
