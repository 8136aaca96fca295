#include "scenario/scenario_table.hpp"

#include "core/error.hpp"
#include "core/text.hpp"
#include "data/toml_read.hpp"
#include "group/group_catalogue.hpp"
#include "lowering/structure_file.hpp"
#include "lowering/structure_table.hpp"
#include "response/response_catalogue.hpp"
#include "tensor/tensor_spec.hpp"

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <set>

namespace ts {

using toml_read::at;
using toml_read::check_at;
using toml_read::check_keys;
using toml_read::get_string;
using toml_read::get_strings;
using toml_read::position_of;

namespace {

const char* scenario_schema = "a TOML scenario file (schema in docs/scenarios.md)";

const char* kinds_help =
    "strain, shear, polar, electric-field, moment, magnetic-field, current, magnetic-group, subgroup, tilts";

std::optional<Rational> get_length(const toml::table& t, const char* key, const std::string& file) {
  auto node = t.get(key);
  if (!node) return std::nullopt;
  auto v = node->value<double>();
  if (!v || !std::isfinite(*v) || *v <= 0)
    fail(ErrorKind::bad_file, std::string("lattice parameter '") + key + "' must be a positive number",
         at(file, node->source()), "a length in Angstrom, e.g. 3.905");
  return exact_decimal(*v, at(file, node->source()), ErrorKind::bad_file);
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

LoweringStep parse_lowering_option(const std::string& text, const std::string& where, ErrorKind bad_value) {
  std::size_t colon = text.find(':');
  if (colon == std::string::npos)
    fail(bad_value, "'" + text + "' is not KIND:VALUE", where,
         "e.g. strain:[001], field:[1-10], shear:[100],[010], subgroup:mm2, magnetic-group:4'/m'm'm, tilts:a0a0c-");
  LoweringStep s;
  s.bad_value = bad_value;
  s.kind = parse_lowering_kind(text.substr(0, colon), where, bad_value);
  std::string value = text.substr(colon + 1);
  s.where = where;
  if (s.kind == LoweringKind::magnetic_group || s.kind == LoweringKind::subgroup || s.kind == LoweringKind::tilts) {
    s.value = value;
  } else if (s.kind == LoweringKind::shear) {
    std::size_t comma = value.find("],");
    if (comma == std::string::npos)
      fail(bad_value, "a shear needs two directions", where, "shear:[100],[010]");
    s.along = value.substr(0, comma + 1);
    s.second = value.substr(comma + 2);
  } else {
    s.along = value;
  }
  return s;
}

BarSpec parse_bar_option(const std::string& text, const std::string& where) {
  BarSpec b;
  b.where = where;
  b.bad_value = ErrorKind::usage;
  std::size_t colon = text.find(':');
  b.current = text.substr(0, colon);
  if (b.current.empty()) b.current = "rotating";
  if (colon != std::string::npos) b.field = text.substr(colon + 1);
  b.name = "bar (" + text + ")";
  return b;
}

ShgSpec parse_shg_option(const std::string& text, const std::string& where) {
  ShgSpec s;
  s.where = where;
  s.bad_value = ErrorKind::usage;
  s.name = "SHG (" + text + ")";
  const std::vector<std::string> fields = split(text, ':');
  if (fields.size() > 3)
    fail(ErrorKind::usage, "'" + text + "' has more than three fields", where,
         "GEOMETRY[:INCIDENCE[:AZIMUTH]], e.g. reflection:45:rotating or transmission:0");
  if (!fields[0].empty()) s.geometry = fields[0];
  if (fields.size() > 1 && !fields[1].empty()) s.incidence = fields[1];
  if (fields.size() > 2 && !fields[2].empty()) s.azimuth = fields[2];
  return s;
}

RefractiveIndices parse_indices_option(const std::string& text, const std::string& where) {
  const std::vector<std::string> fields = split(text, ',');
  if (fields.size() != 2 && fields.size() != 3)
    fail(ErrorKind::usage, "'" + text + "' is not a list of two or three refractive indices", where,
         "N_AMBIENT,N_OMEGA,N_2OMEGA or N_OMEGA,N_2OMEGA (ambient 1), e.g. 1,2.2+0.01i,2.3+0.05i");
  RefractiveIndices n;
  std::size_t k = 0;
  if (fields.size() == 3) n.ambient = parse_refractive_index(fields[k++], true, ErrorKind::usage, where + " (ambient)");
  n.omega = parse_refractive_index(fields[k++], false, ErrorKind::usage, where + " (n at omega)");
  n.two_omega = parse_refractive_index(fields[k], false, ErrorKind::usage, where + " (n at 2 omega)");
  return n;
}

LayoutSpec parse_layout_option(const std::string& text, const std::string& where) {
  LayoutSpec l;
  l.where = where;
  l.bad_value = ErrorKind::usage;
  // A harmonic alone ("2") plans for every mechanism the probes read there.
  if (text.size() == 1 && text[0] >= '0' && text[0] <= '6') {
    l.harmonic = text[0] - '0';
    return l;
  }
  std::size_t colon = text.find(':');
  l.response = text.substr(0, colon);
  if (colon != std::string::npos) {
    std::string h = text.substr(colon + 1);
    if (h.size() != 1 || h[0] < '0' || h[0] > '6')
      fail(ErrorKind::usage, "'" + h + "' is not a harmonic", where, "RESPONSE:N with N from 0 (DC) to 6, e.g. second-order-conductivity:2");
    l.harmonic = h[0] - '0';
  }
  return l;
}

namespace {

std::optional<double> get_positive(const toml::table& t, const char* key, const std::string& file, const char* unit) {
  auto node = t.get(key);
  if (!node) return std::nullopt;
  auto v = node->value<double>();
  if (!v || !(*v > 0) || *v > 1e6)
    fail(ErrorKind::bad_file, std::string("'") + key + "' must be a positive number", at(file, node->source()),
         std::string("a value in ") + unit);
  return *v;
}

void read_bars(const toml::table& root, const std::string& path, Scenario& sc) {
  auto node = root.get("bar");
  if (!node) return;
  auto arr = node->as_array();
  if (!arr) fail(ErrorKind::bad_file, "'bar' must be an array of tables [[bar]]", at(path, node->source()));
  for (auto& el : *arr) {
    auto t = el.as_table();
    if (!t) fail(ErrorKind::bad_file, "each [[bar]] entry must be a table", at(path, el.source()));
    check_keys(*t, {"name", "current", "field", "waveform", "current_rms", "length", "width", "thickness", "responses"},
               path, "[[bar]]");
    BarSpec b;
    b.where = at(path, t->source());
    b.name = get_string(*t, "name", path, false, "a string");
    if (b.name.empty()) b.name = "bar " + std::to_string(sc.bars.size() + 1);
    std::string cur = get_string(*t, "current", path, false, "\"rotating\", \"[110]\" or an angle such as \"30\"");
    if (!cur.empty()) b.current = cur;
    std::string f = get_string(*t, "field", path, false, "in-plane, normal, any, along-current, across-current, none or \"[001]\"");
    if (!f.empty()) b.field = f;
    std::string w = get_string(*t, "waveform", path, false, "\"sine\" or \"cosine\"");
    if (!w.empty()) b.waveform = w;
    b.current_rms = get_positive(*t, "current_rms", path, "ampere (rms)");
    b.length = get_positive(*t, "length", path, "metre (distance between the longitudinal probes)");
    b.width = get_positive(*t, "width", path, "metre");
    b.thickness = get_positive(*t, "thickness", path, "metre");
    b.responses = get_strings(*t, "responses", path);
    sc.bars.push_back(b);
  }
}

// [expansion]: response id = order, e.g. harmonic-hall-torques = 3.
void read_expansion(const toml::table& root, const std::string& path, Scenario& sc) {
  auto node = root.get("expansion");
  if (!node) return;
  auto t = node->as_table();
  if (!t) fail(ErrorKind::bad_file, "'expansion' must be a table of orders", at(path, node->source()),
               "[expansion] with lines such as harmonic-hall-torques = 3");
  sc.expansion_where = at(path, t->source());
  for (const auto& [key, value] : *t) {
    auto v = value.value<int64_t>();
    if (!v || *v < 1 || *v > 6)
      fail(ErrorKind::bad_file, "the expansion order of '" + std::string(key.str()) + "' must be an integer from 1 to 6",
           at(path, value.source()), std::string(key.str()) + " = 3");
    sc.expansion_orders[std::string(key.str())] = static_cast<int>(*v);
  }
}

void read_layouts(const toml::table& root, const std::string& path, Scenario& sc) {
  auto node = root.get("layout");
  if (!node) return;
  auto arr = node->as_array();
  if (!arr) fail(ErrorKind::bad_file, "'layout' must be an array of tables [[layout]]", at(path, node->source()));
  for (auto& el : *arr) {
    auto t = el.as_table();
    if (!t) fail(ErrorKind::bad_file, "each [[layout]] entry must be a table", at(path, el.source()));
    check_keys(*t, {"response", "harmonic", "directions", "rosette", "fields"}, path, "[[layout]]");
    LayoutSpec l;
    l.where = at(path, t->source());
    l.response = get_string(*t, "response", path, false, "a catalogue id such as \"second-order-conductivity\"");
    if (auto h = t->get("harmonic")) {
      auto v = h->value<int64_t>();
      if (!v || *v < 0 || *v > 6)
        fail(ErrorKind::bad_file, "'harmonic' must be an integer from 0 (DC) to 6", at(path, h->source()), "harmonic = 2");
      l.harmonic = static_cast<int>(*v);
    }
    l.directions = get_strings(*t, "directions", path);
    if (auto r = t->get("rosette")) {
      auto ra = r->as_array();
      if (!ra) fail(ErrorKind::bad_file, "'rosette' must be an array of angles in degrees", at(path, r->source()), "rosette = [0, 45, 90]");
      for (auto& a : *ra) {
        auto v = a.value<int64_t>();
        if (!v || *v % 15 != 0 || *v < -360 || *v > 360)
          fail(ErrorKind::bad_file, "rosette angles must be whole multiples of 15 degrees (exact cosines)",
               at(path, a.source()), "rosette = [0, 30, 45, 90]");
        l.rosette.push_back(static_cast<int>(*v));
      }
    }
    l.fields = get_strings(*t, "fields", path);
    sc.layouts.push_back(l);
  }
}
// An angle key that may be a whole number of degrees or a word ("any", "rotating").
// A refractive index key: a TOML number or a string such as "2.2+0.01i".
std::optional<RefractiveIndex> get_index(const toml::table& t, const char* key, bool ambient, const std::string& file) {
  auto node = t.get(key);
  if (!node) return std::nullopt;
  const std::string where = at(file, node->source()) + ": " + key;
  if (auto v = node->value_exact<double>()) {
    char text[32]; // 15 significant digits: the number as written, without binary noise
    std::snprintf(text, sizeof text, "%.15g", *v);
    return parse_refractive_index(text, ambient, ErrorKind::bad_file, where);
  }
  if (auto v = node->value_exact<int64_t>()) return parse_refractive_index(std::to_string(*v), ambient, ErrorKind::bad_file, where);
  if (auto v = node->value<std::string>()) return parse_refractive_index(*v, ambient, ErrorKind::bad_file, where);
  fail(ErrorKind::bad_file, std::string("'") + key + "' must be a refractive index", where,
       "a number, or a string such as \"2.2+0.01i\"");
}

void read_local_field(const toml::table& t, const std::string& path, ShgSpec& s) {
  auto flag = t.get("local_field");
  if (flag) {
    auto v = flag->value_exact<bool>();
    if (!v) fail(ErrorKind::bad_file, "'local_field' must be true or false", at(path, flag->source()), "local_field = true");
    s.local_field = *v;
  }
  auto ambient = get_index(t, "n_ambient", true, path);
  auto omega = get_index(t, "n_omega", false, path);
  auto two_omega = get_index(t, "n_2omega", false, path);
  if (!ambient && !omega && !two_omega) return;
  if (!omega || !two_omega)
    fail(ErrorKind::bad_file, "refractive indices need both n_omega and n_2omega", at(path, t.source()),
         "n_omega = \"2.2+0.01i\" and n_2omega = \"2.3+0.05i\" (n_ambient optional, default 1)");
  if (flag && !s.local_field)
    fail(ErrorKind::bad_file, "refractive indices given with local_field = false", at(path, flag->source()),
         "drop local_field (indices turn the factors on) or drop the indices");
  RefractiveIndices n;
  if (ambient) n.ambient = *ambient;
  n.omega = *omega;
  n.two_omega = *two_omega;
  s.indices = n;
  s.local_field = true;
}

void read_shg(const toml::table& root, const std::string& path, Scenario& sc) {
  auto node = root.get("shg");
  if (!node) return;
  auto arr = node->as_array();
  if (!arr) fail(ErrorKind::bad_file, "'shg' must be an array of tables [[shg]]", at(path, node->source()));
  for (auto& el : *arr) {
    auto t = el.as_table();
    if (!t) fail(ErrorKind::bad_file, "each [[shg]] entry must be a table", at(path, el.source()));
    check_keys(*t, {"name", "geometry", "incidence", "azimuth", "channels", "responses", "local_field", "n_ambient",
                    "n_omega", "n_2omega"},
               path, "[[shg]]");
    ShgSpec s;
    s.where = at(path, t->source());
    s.name = get_string(*t, "name", path, false, "a string");
    if (s.name.empty()) s.name = "SHG " + std::to_string(sc.shg.size() + 1);
    std::string g = get_string(*t, "geometry", path, false, "\"reflection\" or \"transmission\"");
    if (!g.empty()) s.geometry = g;
    std::string inc = get_angle(*t, "incidence", path, "incidence = 45 (degrees from the normal) or \"any\"");
    if (!inc.empty()) s.incidence = inc;
    std::string az = get_angle(*t, "azimuth", path, "azimuth = \"rotating\" or a fixed angle such as 30");
    if (!az.empty()) s.azimuth = az;
    s.channels = get_strings(*t, "channels", path);
    s.responses = get_strings(*t, "responses", path);
    read_local_field(*t, path, s);
    sc.shg.push_back(s);
  }
}

void read_kerr(const toml::table& root, const std::string& path, Scenario& sc) {
  auto node = root.get("kerr");
  if (!node) return;
  auto arr = node->as_array();
  if (!arr) fail(ErrorKind::bad_file, "'kerr' must be an array of tables [[kerr]]", at(path, node->source()));
  for (auto& el : *arr) {
    auto t = el.as_table();
    if (!t) fail(ErrorKind::bad_file, "each [[kerr]] entry must be a table", at(path, el.source()));
    check_keys(*t, {"name", "magnetisation"}, path, "[[kerr]]");
    KerrSpec k;
    k.where = at(path, t->source());
    k.name = get_string(*t, "name", path, false, "a string");
    if (k.name.empty()) k.name = "magneto-optics " + std::to_string(sc.kerr.size() + 1);
    std::string m = get_string(*t, "magnetisation", path, false, "in-plane, normal, any, \"[001]\" or \"in-plane:30\"");
    if (!m.empty()) k.magnetisation = m;
    sc.kerr.push_back(k);
  }
}

void read_fits(const toml::table& root, const std::string& path, Scenario& sc) {
  auto node = root.get("fit");
  if (!node) return;
  auto arr = node->as_array();
  if (!arr) fail(ErrorKind::bad_file, "'fit' must be an array of tables [[fit]]", at(path, node->source()));
  for (auto& el : *arr) {
    auto t = el.as_table();
    if (!t) fail(ErrorKind::bad_file, "each [[fit]] entry must be a table", at(path, el.source()));
    check_keys(*t, {"name", "data", "bar", "shg", "probe", "harmonic", "reading", "floor", "offset", "alpha"}, path,
               "[[fit]]", "(docs/fit.md)");
    FitSpec f;
    f.where = at(path, t->source());
    f.name = get_string(*t, "name", path, false, "a string");
    if (f.name.empty()) f.name = "fit " + std::to_string(sc.fits.size() + 1);
    // A relative path is read from the scenario's folder, so a scenario and its scan travel together.
    std::filesystem::path data = get_string(*t, "data", path, true, "a scan file (CSV, TSV), relative to this file", "[[fit]]");
    f.data_as_written = data.string();
    if (data.is_relative()) data = std::filesystem::path(path).parent_path() / data;
    f.data = data.string();
    f.bar = get_string(*t, "bar", path, false, "a [[bar]] name or number");
    f.shg = get_string(*t, "shg", path, false, "an [[shg]] name or number");
    std::string probe = get_string(*t, "probe", path, false, "\"longitudinal\" or \"transverse\"");
    if (!probe.empty()) f.probe = probe;
    std::string reading = get_string(*t, "reading", path, false, "\"x\", \"y\" or \"auto\"");
    if (!reading.empty()) f.reading = reading;
    auto integer = [&](const char* key, int lo, int hi, int& out) {
      if (auto n = t->get(key)) {
        auto v = n->value<std::int64_t>();
        if (!n->is_integer() || !v || *v < lo || *v > hi)
          fail(ErrorKind::bad_file, std::string("'") + key + "' in [[fit]] must be an integer from " + std::to_string(lo) +
                                        " to " + std::to_string(hi), at(path, n->source()));
        out = static_cast<int>(*v);
      }
    };
    integer("harmonic", 0, 5, f.harmonic);
    integer("floor", 1, 192, f.floor);
    if (auto b = toml_read::get_bool(*t, "offset", path, "[[fit]]")) f.offset = *b;
    if (auto a = t->get("alpha")) {
      auto v = a->value<double>();
      if (!v || !(*v > 0 && *v < 0.5))
        fail(ErrorKind::bad_file, "'alpha' in [[fit]] must be a significance level between 0 and 0.5",
             at(path, a->source()), "alpha = 0.01");
      f.alpha = *v;
    }
    sc.fits.push_back(f);
  }
}

void read_figures(const toml::table& root, const std::string& path, Scenario& sc) {
  auto node = root.get("figures");
  if (!node) return;
  auto t = node->as_table();
  if (!t) fail(ErrorKind::bad_file, "'figures' must be a table [figures]", at(path, node->source()));
  check_keys(*t, {"values", "incidence", "formats", "directory"}, path, "[figures]");
  FigureSpec& f = sc.figures;
  f.present = true;
  f.where = at(path, t->source());
  if (auto v = t->get("values")) {
    auto vt = v->as_table();
    if (!vt) fail(ErrorKind::bad_file, "'values' must be a table of parameter names and numbers", at(path, v->source()),
                  "values = { chi_xxy = 0.5, chi_zzz = 1 }");
    for (const auto& [k, x] : *vt) {
      auto d = x.value<double>();
      if (!d || !std::isfinite(*d))
        fail(ErrorKind::bad_file, "illustrative value of '" + std::string(k.str()) + "' must be a number",
             at(path, x.source()), "a finite number such as 0.5");
      f.values[std::string(k.str())] = *d;
    }
  }
  if (auto v = t->get("incidence")) {
    auto d = v->value_exact<int64_t>();
    if (!d || *d < 0 || *d >= 90)
      fail(ErrorKind::bad_file, "'incidence' must be whole degrees from 0 to 89", at(path, v->source()), "incidence = 45");
    f.incidence = static_cast<int>(*d);
  }
  f.formats = get_strings(*t, "formats", path);
  f.directory = get_string(*t, "directory", path, false, "a directory path, relative to the scenario file");
  // A scenario is a file someone may have sent: it chooses where files are
  // written only inside its own folder. Another place is the command line's
  // to choose (--figures DIR).
  if (!f.directory.empty()) {
    const std::filesystem::path dir(f.directory);
    int depth = 0;
    bool inside = dir.is_relative() && !dir.has_root_name();
    for (const auto& part : dir) {
      if (part == "..") --depth;
      else if (part != "." && !part.empty()) ++depth;
      inside = inside && depth >= 0;
    }
    if (!inside)
      fail(ErrorKind::bad_file, "figure directory '" + f.directory + "' lies outside the scenario's folder",
           at(path, t->get("directory")->source()),
           "a relative path inside the scenario's folder, e.g. directory = \"figures\"; another place is given on "
           "the command line with --figures DIR");
    f.directory = (std::filesystem::path(path).parent_path() / dir).lexically_normal().string();
  }
}

} // namespace

Rational parse_fraction(const std::string& text, const std::string& where, ErrorKind bad_value) {
  const char* valid = "a volume fraction between 0 and 1: 0.25 or 1/4";
  Rational r;
  try {
    std::size_t used = 0;
    std::size_t slash = text.find('/');
    if (slash == std::string::npos) {
      double v = std::stod(text, &used);
      if (used != text.size() || !std::isfinite(v)) throw std::invalid_argument(text);
      // exact_decimal reads positive lengths; a fraction may be zero (a variant
      // that is absent) and is out of range below zero.
      r = v <= 0 ? Rational(v < 0 ? -1 : 0) : exact_decimal(v, where, bad_value);
    } else {
      long long p = std::stoll(text.substr(0, slash), &used);
      if (used != slash) throw std::invalid_argument(text);
      std::string den = text.substr(slash + 1);
      long long q = std::stoll(den, &used);
      if (used != den.size() || q <= 0) throw std::invalid_argument(text);
      r = Rational(p, q);
    }
  } catch (const std::exception&) {
    fail(bad_value, "'" + text + "' is not a fraction", where, valid);
  }
  if (r < Rational(0) || Rational(1) < r) fail(bad_value, "domain fraction " + text + " is outside [0, 1]", where, valid);
  return r;
}

Scenario load_scenario(const std::string& path) {
  return scenario_from_table(toml_read::parse_file(path, "scenario file", scenario_schema), path);
}

Scenario parse_scenario(const std::string& text, const std::string& path) {
  return scenario_from_table(toml_read::parse_text(text, path, scenario_schema), path);
}

Scenario scenario_from_table(const toml::table& root, const std::string& path) {
  Scenario sc;
  sc.source = path;
  check_keys(root, {"title", "crystal", "sample", "lowering", "responses", "tensors", "report", "bar", "layout", "observation", "shg", "kerr", "pump_probe", "photocurrent", "figures",
              "expansion", "fit"},
             path, "the scenario");
  sc.title = get_string(root, "title", path, false, "a string");
  auto crystal = root["crystal"].as_table();
  if (!crystal) fail(ErrorKind::bad_file, "missing [crystal] table", path, "[crystal] with group = \"m-3m\" or a [crystal.structure]");
  check_keys(*crystal, {"group", "lattice", "structure", "nonmagnetic", "file", "occupancy", "symprec", "max_atoms"}, path,
             "[crystal]");
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
  if (auto file = crystal->get("file")) {
    if (sc.structure) fail(ErrorKind::bad_file, "[crystal] gives both a file and a structure; keep one", at(path, file->source()));
    StructureFileOptions options;
    const std::string occupancy = get_string(*crystal, "occupancy", path, false, "\"refuse\" or \"ignore\"");
    if (!occupancy.empty())
      options.occupancy = parse_occupancy_policy(occupancy, at(path, crystal->get("occupancy")->source()), ErrorKind::bad_file);
    if (auto p = crystal->get("symprec")) {
      auto v = p->value<double>();
      if (!v || !(*v > 0 && *v < 1))
        fail(ErrorKind::bad_file, "'symprec' must be a distance in Angstrom between 0 and 1", at(path, p->source()),
             "symprec = 0.01 (the default for files)");
      options.symprec = *v;
    }
    if (auto p = crystal->get("max_atoms")) {
      auto v = p->value_exact<int64_t>();
      if (!v || *v < 1 || *v > 10000000)
        fail(ErrorKind::bad_file, "'max_atoms' must be a whole number of atoms from 1 to 10000000",
             at(path, p->source()), "max_atoms = 20000");
      options.max_atoms = static_cast<std::size_t>(*v);
    }
    // A relative path is read from the scenario's folder, so a scenario and its CIF travel together.
    std::filesystem::path cif = get_string(*crystal, "file", path, true, "a CIF or mCIF path, relative to this file");
    if (cif.is_relative()) cif = std::filesystem::path(path).parent_path() / cif;
    sc.structure = read_structure_file(cif.string(), options);
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
      // Far beyond any liftable limit of run_scenario: reading stops here, not in memory.
      if (sc.steps.size() > 100000)
        fail(ErrorKind::bad_file, "more than 100000 [[lowering]] steps", s.where,
             "a chain of steps a report can show (64 by default, --max-steps N for more)");
    }
  }
  sc.responses = get_strings(root, "responses", path);
  sc.tensors = get_strings(root, "tensors", path);
  read_bars(root, path, sc);
  read_layouts(root, path, sc);
  for (const auto& id : sc.responses)
    check_at(position_of(root, "responses", path), [&] { ResponseCatalogue::builtin().expand(id); });
  for (const auto& t : sc.tensors) check_at(position_of(root, "tensors", path), [&] { parse_tensor_spec(t); });
  read_shg(root, path, sc);
  read_kerr(root, path, sc);
  read_expansion(root, path, sc);
  read_pump_tables(root, path, sc);
  read_figures(root, path, sc);
  read_fits(root, path, sc);
  if (auto rep = root["report"].as_table()) {
    check_keys(*rep, {"domains", "domain_fractions"}, path, "[report]");
    if (auto d = rep->get("domains")) {
      auto b = d->is_boolean() ? d->value<bool>() : std::nullopt;
      if (!b) fail(ErrorKind::bad_file, "'domains' must be true or false", at(path, d->source()));
      sc.domains = *b;
    }
    if (auto fr = rep->get("domain_fractions")) {
      auto arr = fr->as_array();
      sc.fractions_where = at(path, fr->source());
      if (!arr) fail(ErrorKind::bad_file, "'domain_fractions' must be an array", sc.fractions_where, "[0.75, 0.25] or [\"2/3\", \"1/3\"]");
      for (auto& el : *arr) {
        std::string where = at(path, el.source());
        if (auto text = el.value<std::string>()) sc.domain_fractions.push_back(parse_fraction(*text, where, ErrorKind::bad_file));
        else if (auto num = el.value<double>()) sc.domain_fractions.push_back(parse_fraction(std::to_string(*num), where, ErrorKind::bad_file));
        else fail(ErrorKind::bad_file, "a domain fraction must be a number or a string such as \"1/3\"", where);
      }
      if (!sc.domains)
        fail(ErrorKind::bad_file, "'domain_fractions' need domains = true", sc.fractions_where, "domains = true in [report]");
    }
  }
  if (auto obs = root.get("observation")) {
    auto arr = obs->as_array();
    if (!arr) fail(ErrorKind::bad_file, "'observation' must be an array of tables [[observation]]", at(path, obs->source()));
    for (auto& el : *arr) {
      auto t = el.as_table();
      if (!t) fail(ErrorKind::bad_file, "each [[observation]] entry must be a table", at(path, el.source()));
      check_keys(*t, {"label", "response", "part", "tensor", "components", "type", "match", "signal", "bar"}, path,
                 "[[observation]]");
      ObservationRequest o;
      o.where = at(path, t->source());
      o.label = get_string(*t, "label", path, false, "a string");
      o.response = get_string(*t, "response", path, false, "a response id from `tensorsieve responses`");
      o.tensor = get_string(*t, "tensor", path, false, "a tensor spec such as \"chi_abc: sym(abc)\"");
      if (auto part = t->get("part")) {
        auto n = part->value<std::int64_t>();
        if (!n || *n < 1) fail(ErrorKind::bad_file, "'part' must be a part number 1, 2, ...", at(path, part->source()));
        o.part = std::to_string(*n);
      }
      o.components = get_strings(*t, "components", path);
      std::string type = get_string(*t, "type", path, false, "\"i\", \"c\" or \"either\"");
      if (!type.empty()) o.parity = type;
      std::string match = get_string(*t, "match", path, false, "\"any\" or \"all\"");
      if (!match.empty()) o.match = match;
      if (o.response.empty() == o.tensor.empty())
        fail(ErrorKind::bad_file, "an [[observation]] needs either 'response' or 'tensor'", o.where,
             "response = \"second-order-conductivity\" or tensor = \"chi_abc: sym(abc)\"");
      o.signal = get_string(*t, "signal", path, false, "\"transverse:cos(phi)\" or \"longitudinal@30\"");
      std::string bar = get_string(*t, "bar", path, false, "CURRENT[:FIELD] as for --bar, e.g. \"rotating:in-plane\"");
      if (!bar.empty()) o.bar = bar;
      if (o.components.empty() == o.signal.empty())
        fail(ErrorKind::bad_file, "an [[observation]] needs either 'components' or a bar 'signal'", o.where,
             "components = [\"chi_xxx\"], or signal = \"transverse:cos(phi)\" with a response");
      if (!o.signal.empty() && o.response.empty())
        fail(ErrorKind::bad_file, "a bar 'signal' needs a catalogue 'response'", o.where,
             "response = \"second-order-conductivity\"");
      sc.observations.push_back(o);
    }
  }
  if (sc.responses.empty() && sc.tensors.empty() && sc.observations.empty())
    fail(ErrorKind::bad_file, "the scenario asks for no response", path,
         "responses = [\"anomalous-hall\", ...] (see `tensorsieve responses`), tensors = [\"V[V2]\"] or an "
         "[[observation]] table");
  return sc;
}

} // namespace ts
