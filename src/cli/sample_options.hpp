// The options that describe a sample without a scenario file, shared by
// `sample` and `observe`: parent group, cut, frame, lowering steps, lattice.
#pragma once

#include "cli/commands.hpp"
#include "cli/frame_options.hpp"
#include "scenario/scenario.hpp"

#include <CLI/CLI.hpp>

#include <string>
#include <vector>

namespace ts::cli {

struct SampleOptions {
  Scenario sc;
  std::vector<std::string> lowerings;
  std::string a, b, c;
  bool colourless = false;
};

inline void add_sample_options(CLI::App& cmd, SampleOptions& o, bool group_required) {
  auto* g = cmd.add_option("group", o.sc.group, kGroupSymbolHelp);
  if (group_required) g->required();
  cmd.add_option("--cut", o.sc.cut, "surface or interface: (hkl), (hkil) or [uvw]");
  cmd.add_option("--max-steps", o.sc.max_steps, "refuse a chain of more lowering steps than this")
      ->capture_default_str();
  cmd.add_option("--x", o.sc.x, "in-plane direction for sample x");
  cmd.add_option("--z", o.sc.z, "sample z for a bulk sample (no cut)");
  cmd.add_flag("--equivalent-faces", o.sc.equivalent_faces, "free-standing slab with identical faces");
  cmd.add_option("--lower", o.lowerings,
                 "lowering step KIND:VALUE, in order: strain:[001], shear:[100],[010], polar:[110], "
                 "electric-field:[001], moment:[001], magnetic-field:[1-10], current:[100], "
                 "subgroup:mm2 (structural), magnetic-group:4'/m'm'm (magnetic order), tilts:a0a0c-")
      ->allow_extra_args(false);
  cmd.add_option("--a", o.a, "lattice parameter a");
  cmd.add_option("--b", o.b, "lattice parameter b");
  cmd.add_option("--c", o.c, "lattice parameter c");
  add_colourless_flag(cmd, o.colourless);
}

inline Scenario scenario_from_options(const SampleOptions& o) {
  Scenario sc = o.sc;
  sc.assume_nonmagnetic = !o.colourless;
  for (const auto& l : o.lowerings) sc.steps.push_back(parse_lowering_option(l, "--lower " + l));
  sc.metric = metric_option({"", "", o.a, o.b, o.c});
  return sc;
}

inline void add_fractions_option(CLI::App& cmd, std::string& fractions) {
  cmd.add_option("--domain-fractions", fractions,
                 "volume fractions of the domain variants, in the report's order, e.g. 0.75,0.25 or 2/3,1/3");
}

// The option replaces the fractions of a scenario file.
inline void apply_fractions_option(const std::string& text, Scenario& sc) {
  if (text.empty()) return;
  sc.domain_fractions.clear();
  sc.fractions_where = "--domain-fractions " + text;
  std::size_t start = 0;
  while (start <= text.size()) {
    std::size_t comma = text.find(',', start);
    std::string item = text.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
    sc.domain_fractions.push_back(parse_fraction(item, sc.fractions_where, ErrorKind::usage));
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  if (!sc.domains)
    fail(ErrorKind::usage, "--domain-fractions need domains", "--domain-fractions", "--domains (sample) or domains = true");
}

inline void add_order_option(CLI::App& cmd, std::vector<std::string>& orders) {
  cmd.add_option("--order", orders,
                 "expand RESPONSE in B or M to order N, RESPONSE=N (repeatable), e.g. harmonic-hall-torques=3")
      ->allow_extra_args(false);
}

// --order RESPONSE=N: replaces the order of that response in a scenario file.
inline void apply_order_options(const std::vector<std::string>& orders, Scenario& sc) {
  for (const auto& text : orders) {
    const std::string where = "--order " + text;
    const auto eq = text.find('=');
    const std::string id = eq == std::string::npos ? "" : text.substr(0, eq);
    const std::string n = eq == std::string::npos ? "" : text.substr(eq + 1);
    const bool digits = !n.empty() && n.size() <= 2 && n.find_first_not_of("0123456789") == std::string::npos;
    if (id.empty() || !digits || std::stoi(n) < 1 || std::stoi(n) > 6)
      fail(ErrorKind::usage, "'" + text + "' is not RESPONSE=ORDER", where,
           "a response id and an order from 1 to 6, e.g. --order harmonic-hall-torques=3");
    sc.expansion_orders[id] = std::stoi(n);
    sc.expansion_where = where;
    sc.expansion_bad_value = ErrorKind::usage;
  }
}

} // namespace ts::cli
