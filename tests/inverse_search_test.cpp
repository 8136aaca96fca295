// The inverse question: which maximal subgroups allow an observed signal that
// the parent forbids, with the quantity that would produce each.
#include "group/group_catalogue.hpp"
#include "group/identify.hpp"
#include "lowering/component_observation.hpp"
#include "lowering/inverse_search.hpp"
#include "support/cli_run.hpp"
#include "support/json_value.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <fstream>
#include <map>

using namespace ts;
using namespace ts::test;

namespace {

PointGroup grey(const std::string& symbol) { return GroupCatalogue::builtin().get(symbol).group.with_time_reversal(); }

ComponentObservation seen(const std::string& spec, std::vector<std::string> names, TimeParity parity) {
  ComponentObservation c;
  c.spec = parse_tensor_spec(spec);
  c.codes = component_codes(c.spec, names, "test");
  c.names = std::move(names);
  c.parity = parity;
  return c;
}

std::vector<std::string> symbols(const PointGroup& g) {
  std::vector<std::string> out;
  for (const auto& op : g.operations()) out.push_back(op.symbol());
  return out;
}

bool has(const std::vector<std::string>& v, const std::string& s) { return std::find(v.begin(), v.end(), s) != v.end(); }

std::string type_of(const PointGroup& g) { return identify(g, GroupCatalogue::builtin()).type->symbol; }

const char* chi = "chi_abc: sym(abc)";

} // namespace

TEST_CASE("inverse: chi_xxx at a (001) interface of a grey 4mm host needs an in-plane polar mirror group", "[inverse]") {
  // Derived here: a subgroup of index 2 is normal with a quotient of order 2, so
  // it contains the square of every element; (4_z)^2 = 2_z, so every index-2
  // subgroup of 4mm1' keeps 2_z, which sends (x, y) to (-x, -y) and so kills
  // every in-plane component of odd rank: chi_xxx = -chi_xxx. The least breaking
  // keeps one mirror that contains x (m ⊥ [010]) or that maps x onto ±y
  // (m ⊥ [110], [1-10]), with time reversal: m1', index 4.
  const PointGroup g = grey("4mm");
  const Observation o = observation_of(seen(chi, {"chi_xxx"}, TimeParity::i_type));
  for (const auto& h : cached_subgroups(g))
    if (h.order() * 2 == g.order()) {
      CHECK(has(symbols(h), "2 [001]"));
      CHECK(!o.allowed_in(h));
    }
  const InverseResult r = find_minimal_breaking(g, o);
  CHECK(!r.allowed_in_parent);
  REQUIRE(r.maximal.size() == 3);
  std::vector<std::string> mirrors;
  for (const auto& m : r.maximal) {
    CHECK(type_of(m.group) == "m1'");
    CHECK(m.index == 4);
    CHECK(m.variants == 4);
    CHECK(m.cancels_with_equal_domains == std::optional<bool>(true));
    for (const auto& s : symbols(m.group))
      if (s.rfind("m [", 0) == 0) mirrors.push_back(s);
    REQUIRE(!m.producers.empty());
    CHECK(m.producers.front().kind == QuantityKind::polar_even);
  }
  std::sort(mirrors.begin(), mirrors.end());
  CHECK(mirrors == std::vector<std::string>{"m [010]", "m [1-10]", "m [110]"});
  // The mirror ⊥ [010] case: a polar displacement along [100] (with the normal z) is its producer.
  for (const auto& m : r.maximal)
    if (has(symbols(m.group), "m [010]")) {
      const Producer& p = m.producers.front();
      CHECK(p.free_dimensions == 2); // the plane xz: x plus the interface normal
      CHECK(stabiliser(g, {QuantityKind::polar_even, {QSqrt3(1), QSqrt3(0), QSqrt3(0)}, Mat3::identity()}) == m.group);
    }
}

TEST_CASE("inverse: c-type chi_xxx at the same interface needs an in-plane moment perpendicular to x", "[inverse]") {
  // Derived here: with time reversal broken, {1, m_y, m'_x, 2'_z} keeps chi_xxx
  // (m_y and m'_x with the c-type sign both leave xxx unchanged); its producer is
  // a magnetisation along y, perpendicular to a current along x (the symmetry of
  // unidirectional and bilinear magnetoresistance), or a current along x itself.
  const PointGroup g = grey("4mm");
  const InverseResult r = find_minimal_breaking(g, observation_of(seen(chi, {"chi_xxx"}, TimeParity::c_type)));
  REQUIRE(r.maximal.size() == 3);
  bool found_y = false;
  for (const auto& m : r.maximal) {
    CHECK(type_of(m.group) == "m'm2'");
    CHECK(m.index == 4);
    std::vector<std::string> ops = symbols(m.group);
    if (has(ops, "m [010]")) {
      found_y = true;
      CHECK(has(ops, "m' [100]"));
      CHECK(has(ops, "2' [001]"));
      bool magnetisation_y = false;
      for (const auto& p : m.producers)
        if (p.kind == QuantityKind::axial_odd && p.free_dimensions == 1 && p.direction[0].is_zero() &&
            p.direction[2].is_zero())
          magnetisation_y = true;
      CHECK(magnetisation_y);
    }
  }
  CHECK(found_y);
}

TEST_CASE("inverse: the ferroelectric species of m-3m (Aizu)", "[inverse]") {
  // Aizu, "Possible species of ferromagnetic, ferroelectric, and ferroelastic
  // crystals", Phys. Rev. B 2, 754 (1970) (from memory): from m-3m the maximal
  // polar point groups are 4mm (P ∥ <100>, 3 orientations), 3m (P ∥ <111>, 4)
  // and mm2 (P ∥ <110>, 6), each kept grey in a non-magnetic crystal.
  const PointGroup g = grey("m-3m");
  const InverseResult r =
      find_minimal_breaking(g, observation_of(seen("P_a", {"P_x", "P_y", "P_z"}, TimeParity::i_type)));
  std::map<std::string, int> count;
  for (const auto& m : r.maximal) {
    ++count[type_of(m.group)];
    CHECK(m.variants == g.order() / m.group.order());
    REQUIRE(m.producers.size() >= 1);
    CHECK(m.producers.front().kind == QuantityKind::polar_even);
    CHECK(m.producers.front().free_dimensions == 1);
  }
  CHECK(count == std::map<std::string, int>{{"4mm1'", 3}, {"3m1'", 4}, {"mm21'", 6}});
  // Ferromagnetic species of m-3m1' (same source, from memory): 4/mm'm', -3m', m'm'm (M ∥ <100>, <111>, <110>).
  const InverseResult f =
      find_minimal_breaking(g, observation_of(seen("M_a: axial, time-odd", {"M_x", "M_y", "M_z"}, TimeParity::c_type)));
  std::map<std::string, int> fm;
  for (const auto& m : f.maximal) ++fm[type_of(m.group)];
  CHECK(fm == std::map<std::string, int>{{"4/mm'm'", 3}, {"-3m'", 4}, {"m'm'm", 6}});
}

TEST_CASE("inverse: a signal the parent allows needs no breaking; a higher-order parameter is named as such",
          "[inverse]") {
  const PointGroup g = grey("4mm");
  const InverseResult allowed = find_minimal_breaking(g, observation_of(seen(chi, {"chi_zzz"}, TimeParity::i_type)));
  CHECK(allowed.allowed_in_parent);
  CHECK(allowed.maximal.empty());
  // Every producer the search names must have exactly the solution as its
  // stabiliser (checked again here, independently of the search's own check).
  const InverseResult r =
      find_minimal_breaking(grey("m-3m"), observation_of(seen("T_ijkl: sym(kl)", {"T_xxyz"}, TimeParity::i_type)));
  REQUIRE(!r.maximal.empty());
  for (const auto& m : r.maximal)
    for (const auto& p : m.producers) {
      PointGroup s = p.kind == QuantityKind::strain ? stabiliser(grey("m-3m"), {p.kind, {}, p.strain})
                                                    : stabiliser(grey("m-3m"), {p.kind, p.direction, Mat3::identity()});
      CHECK(s == m.group);
    }
}

TEST_CASE("observe: the CLI answers in four formats and from a scenario file", "[inverse][cli]") {
  const std::vector<std::string> base = {"observe", "m-3m", "--cut", "(001)", "--response", "second-order-conductivity",
                                         "--component", "chi_xxx", "--type", "i"};
  CliResult text = run_cli(base);
  INFO(text.err);
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("forbidden in 4mm1'") != std::string::npos);
  CHECK(text.out.find("m [010]") != std::string::npos);
  CHECK(text.out.find("polar displacement") != std::string::npos);
  for (const char* f : {"markdown", "latex"}) {
    std::vector<std::string> args = base;
    args.insert(args.end(), {"-f", f});
    CliResult r = run_cli(args);
    CHECK(r.exit_code == 0);
    CHECK(r.out.find("m1'") != std::string::npos);
    if (std::string(f) == "latex")
      CHECK(std::all_of(r.out.begin(), r.out.end(), [](char c) { return static_cast<unsigned char>(c) < 128; }));
  }
  std::vector<std::string> args = base;
  args.insert(args.end(), {"-f", "json"});
  CliResult j = run_cli(args);
  REQUIRE(j.exit_code == 0);
  JsonValue v = parse_json(j.out);
  const JsonValue& o = v.at("observations").items.at(0);
  CHECK(o.at("allowed_in_parent").boolean == false);
  REQUIRE(o.at("maximal_subgroups").items.size() == 3);
  CHECK(o.at("maximal_subgroups").items[0].at("type").text == "m1'");
  CHECK(o.at("maximal_subgroups").items[0].at("index").text == "4");

  TempDir dir;
  std::ofstream(dir / "seen.toml") << "title = \"seen\"\n[crystal]\ngroup = \"m-3m\"\n[sample]\ncut = \"(001)\"\n"
                                      "[[observation]]\nlabel = \"zero-field second harmonic along [100]\"\n"
                                      "response = \"second-order-conductivity\"\ncomponents = [\"chi_xxx\"]\ntype = \"c\"\n";
  CliResult file = run_cli({"observe", "--scenario", (dir / "seen.toml").string(), "-f", "json"});
  INFO(file.err);
  REQUIRE(file.exit_code == 0);
  JsonValue fv = parse_json(file.out);
  const JsonValue& fo = fv.at("observations").items.at(0);
  CHECK(fo.at("label").text == "zero-field second harmonic along [100]");
  CHECK(fo.at("maximal_subgroups").items.at(0).at("type").text == "m'm2'");
}

TEST_CASE("observe: bad input names the option or file line", "[inverse][cli]") {
  CliResult bad = run_cli({"observe", "m-3m", "--tensor", "chi_abc: sym(abc)", "--component", "chi_xxw"});
  CHECK(bad.exit_code != 0);
  CHECK(bad.err.find("chi_xxw") != std::string::npos);
  CHECK(bad.err.find("--component") != std::string::npos);
  CliResult parity = run_cli({"observe", "m-3m", "--tensor", "V", "--component", "x", "--type", "q"});
  CHECK(parity.exit_code != 0);
  CHECK(parity.err.find("either") != std::string::npos);
  CliResult match = run_cli({"observe", "m-3m", "--tensor", "V", "--component", "x", "--match", "some"});
  CHECK(match.exit_code != 0);
  CHECK(match.err.find("any (at least one") != std::string::npos);
  CliResult every = run_cli({"observe", "m-3m", "--tensor", "P_a", "--component", "P_x", "--component", "P_y",
                             "--component", "P_z", "--match", "all", "--type", "i"});
  CHECK(every.exit_code == 0);
  CHECK(every.out.find("each of them nonzero") != std::string::npos);
  CHECK(every.out.find("4 found among 419 proper subgroups") != std::string::npos);
  CliResult parent = run_cli({"observe", "m-3m", "--cut", "(001)", "--tensor", "chi_abc: sym(abc)", "--component", "chi_zzz"});
  CHECK(parent.exit_code == 0);
  CHECK(parent.out.find("allowed in 4mm1' itself (i-type): the signal proves no symmetry breaking") != std::string::npos);
  CliResult none = run_cli({"observe", "m-3m"});
  CHECK(none.exit_code != 0);
  CHECK(none.err.find("--response") != std::string::npos);
  TempDir dir;
  std::ofstream(dir / "bad.toml") << "[crystal]\ngroup = \"m-3m\"\n[[observation]]\nresponse = \"shg\"\n";
  CliResult f = run_cli({"observe", "--scenario", (dir / "bad.toml").string()});
  CHECK(f.exit_code != 0);
  CHECK(f.err.find("bad.toml:3") != std::string::npos);
  CHECK(f.err.find("components") != std::string::npos);
}

TEST_CASE("inverse: all components at once, and a colourless answer in a grey parent", "[inverse]") {
  // Derived here: with P_x, P_y and P_z each nonzero, of the polar species above
  // only 3m1' (P ∥ <111>, four orientations) qualifies: 4mm keeps P on a cube axis,
  // mm2 on a face diagonal (one component zero). The mirror groups m ⊥ <110> that
  // allow (a, a, c) lie inside a 3m1', so they are not maximal.
  ComponentObservation every = seen("P_a", {"P_x", "P_y", "P_z"}, TimeParity::i_type);
  every.all = true;
  const InverseResult r = find_minimal_breaking(grey("m-3m"), observation_of(every));
  REQUIRE(r.maximal.size() == 4);
  for (const auto& m : r.maximal) CHECK(type_of(m.group) == "3m1'");
  // A grey triclinic parent 11': a moment M_x (c-type) is forbidden by 1' and
  // allowed only in the colourless subgroup 1, which the search must offer.
  const InverseResult t =
      find_minimal_breaking(grey("1"), observation_of(seen("M_a: axial, time-odd", {"M_x"}, TimeParity::c_type)));
  REQUIRE(t.maximal.size() == 1);
  CHECK(t.maximal[0].group.order() == 1);
  CHECK(t.maximal[0].variants == 2);
}
