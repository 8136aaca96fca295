// The [[pump_probe]] (with its [[pump_probe.phase]] tables) and
// [[photocurrent]] tables of a scenario file (docs/optics.md).
#include "scenario/scenario_table.hpp"

#include "core/error.hpp"
#include "data/toml_read.hpp"

#include <set>

namespace ts {

using toml_read::at;
using toml_read::check_keys;
using toml_read::get_string;
using toml_read::get_strings;

std::string get_angle(const toml::table& t, const char* key, const std::string& file, const char* valid) {
  auto node = t.get(key);
  if (!node) return {};
  if (auto v = node->value_exact<int64_t>()) return std::to_string(*v);
  if (auto v = node->value<std::string>()) return *v;
  fail(ErrorKind::bad_file, std::string("'") + key + "' must be whole degrees or a word", at(file, node->source()), valid);
}

namespace {

const toml::array* table_array(const toml::table& t, const char* key, const std::string& path, const char* name) {
  auto node = t.get(key);
  if (!node) return nullptr;
  auto arr = node->as_array();
  if (!arr) fail(ErrorKind::bad_file, std::string("'") + key + "' must be an array of tables " + name, at(path, node->source()));
  for (auto& el : *arr)
    if (!el.as_table()) fail(ErrorKind::bad_file, std::string("each ") + name + " entry must be a table", at(path, el.source()));
  return arr;
}

const char* incidence_help = "incidence = 45 (whole degrees from the normal, a multiple of 15 from 0 to 75)";
const char* azimuth_help = "azimuth = \"rotating\" or a fixed angle such as 30";

} // namespace

namespace {

// The keys every pump table shares; `extra` are the table's own.
void read_beam(const toml::table& t, const std::string& path, const char* name, std::set<std::string> keys,
               const std::string& default_name, PumpBeamSpec& s) {
  keys.insert({"name", "incidence", "azimuth", "polarisations"});
  check_keys(t, keys, path, name);
  s.where = at(path, t.source());
  s.name = get_string(t, "name", path, false, "a string");
  if (s.name.empty()) s.name = default_name;
  if (auto v = get_angle(t, "incidence", path, incidence_help); !v.empty()) s.incidence = v;
  if (auto v = get_angle(t, "azimuth", path, azimuth_help); !v.empty()) s.azimuth = v;
  s.polarisations = get_strings(t, "polarisations", path);
}

} // namespace

void read_pump_tables(const toml::table& root, const std::string& path, Scenario& sc) {
  if (auto arr = table_array(root, "pump_probe", path, "[[pump_probe]]"))
    for (auto& el : *arr) {
      const toml::table& t = *el.as_table();
      PumpProbeSpec s;
      read_beam(t, path, "[[pump_probe]]", {"phase"}, "pump-probe " + std::to_string(sc.pump_probe.size() + 1), s);
      if (auto phases = table_array(t, "phase", path, "[[pump_probe.phase]]"))
        for (auto& pel : *phases) {
          const toml::table& p = *pel.as_table();
          check_keys(p, {"label", "lowering", "order"}, path, "[[pump_probe.phase]]");
          PumpPhaseSpec ph;
          ph.where = at(path, p.source());
          ph.label = get_string(p, "label", path, false, "a string");
          if (ph.label.empty()) ph.label = "phase " + std::to_string(s.phases.size() + 1);
          for (const auto& text : get_strings(p, "lowering", path))
            ph.steps.push_back(parse_lowering_option(text, ph.where, ErrorKind::bad_file));
          ph.order = get_string(p, "order", path, false, "a crystal direction such as \"[100]\"");
          s.phases.push_back(ph);
        }
      sc.pump_probe.push_back(s);
    }
  if (auto arr = table_array(root, "photocurrent", path, "[[photocurrent]]"))
    for (auto& el : *arr) {
      PhotocurrentSpec s;
      read_beam(*el.as_table(), path, "[[photocurrent]]", {}, "photocurrent " + std::to_string(sc.photocurrents.size() + 1), s);
      sc.photocurrents.push_back(s);
    }
}

} // namespace ts
