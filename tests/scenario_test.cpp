// Scenarios end to end: parent crystal, cut, lowering by order, fields,
// structures and tilts, checked against published assignments, spglib, and the
// lowering rules; plus the messages for malformed scenario files.
#include "group/identify.hpp"
#include "scenario/scenario_run.hpp"

#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <sys/wait.h>

using namespace ts;
namespace fs = std::filesystem;

namespace {

std::string final_type(const ScenarioResult& r) { return r.chain.back().id.type->symbol; }

Scenario basic(const std::string& group) {
  Scenario s;
  s.group = group;
  s.tensors = {"V"};
  return s;
}

LoweringStep step(LoweringKind k, const std::string& along, const std::string& value = {}) {
  LoweringStep s;
  s.kind = k;
  s.along = along;
  s.value = value;
  s.where = "test";
  return s;
}

// One scratch directory per test process: parallel ctest runs never share a file.
const ts::test::TempDir& scratch() {
  static const ts::test::TempDir dir;
  return dir;
}

fs::path write_temp(const std::string& name, const std::string& text) {
  fs::path p = scratch() / name;
  std::ofstream(p) << text;
  return p;
}

struct Run {
  int code;
  std::string err;
};
Run cli(const std::string& args) {
  fs::path err = scratch() / "cli-err.txt";
  std::string cmd = "'" TENSORSIEVE_BINARY "' " + args + " > /dev/null 2> '" + err.string() + "'";
  int rc = std::system(cmd.c_str());
  std::ifstream in(err);
  std::ostringstream s;
  s << in.rdbuf();
  return {WIFEXITED(rc) ? WEXITSTATUS(rc) : -1, s.str()};
}

} // namespace

TEST_CASE("hematite-type weak ferromagnet: in-plane moments of -3m1' give the 2/m-type groups", "[scenario][magnetic]") {
  // Birss, Symmetry and Magnetism (1964): a moment along the 2-fold axis of -3m keeps 2/m, a moment
  // perpendicular to it (in the mirror plane) gives 2'/m'; both admit a ferromagnetic moment. The
  // assignment of 2'/m' to hematite above the Morin transition is from memory.
  Scenario along = basic("-3m");
  along.steps = {step(LoweringKind::moment, "[100]")};
  Scenario perp = basic("-3m");
  perp.steps = {step(LoweringKind::moment, "[120]")};
  perp.responses = {"spontaneous-magnetization"};
  ScenarioResult ra = run_scenario(along), rp = run_scenario(perp);
  CHECK(final_type(ra) == "2/m");
  CHECK(final_type(rp) == "2'/m'");
  CHECK(rp.parts.front().forms.back().independent() >= 1);
  // Below the Morin transition the moments lie along c: -3m (type I), no net moment.
  Scenario axial = basic("-3m");
  axial.steps = {step(LoweringKind::magnetic_group, "", "-3m")};
  axial.responses = {"spontaneous-magnetization"};
  ScenarioResult rz = run_scenario(axial);
  CHECK(final_type(rz) == "-3m");
  CHECK(rz.parts.front().forms.back().independent() == 0);
}

TEST_CASE("Cr2O3-type order -3'm' gives the diagonal magnetoelectric tensor", "[scenario][magnetic]") {
  // Dzyaloshinskii, Sov. Phys. JETP 10, 628 (1960): alpha = diag(a, a, b) for Cr2O3.
  Scenario s = basic("-3m");
  s.tensors.clear();
  s.responses = {"linear-magnetoelectric"};
  s.steps = {step(LoweringKind::magnetic_group, "", "-3'm'")};
  ScenarioResult r = run_scenario(s);
  CHECK(final_type(r) == "-3'm'");
  const AllowedForm& alpha = r.parts.front().forms.back();
  REQUIRE(alpha.spec.rank == 2);
  CHECK(alpha.independent() == 2);
  CHECK_FALSE(alpha.is_zero(0));
  CHECK_FALSE(alpha.is_zero(8));
  for (int c : {1, 2, 3, 5, 6, 7}) CHECK(alpha.is_zero(c));
}

TEST_CASE("spglib's magnetic search agrees with the group derived by lowering", "[scenario][spglib]") {
  // spglib 2.0.2 (Debian libsymspg-dev), magnetic symmetry search, against the Curie stabiliser of a
  // moment ∥ [001] in m-3m1': both must give 4/mm'm' with the same operations.
  CrystalStructure st;
  st.lattice = {{{3.9, 0, 0}, {0, 3.9, 0}, {0, 0, 3.9}}};
  st.sites = {{"Sr", {0, 0, 0}, {0, 0, 0}},        {"Ti", {0.5, 0.5, 0.5}, {0, 0, 1}},
              {"O", {0.5, 0.5, 0}, {0, 0, 0}},      {"O", {0.5, 0, 0.5}, {0, 0, 0}},
              {"O", {0, 0.5, 0.5}, {0, 0, 0}}};
  st.magnetic = true;
  Scenario from_structure;
  from_structure.structure = st;
  from_structure.tensors = {"aeV"};
  Scenario derived = basic("m-3m");
  derived.tensors = {"aeV"};
  derived.steps = {step(LoweringKind::moment, "[001]")};
  ScenarioResult a = run_scenario(from_structure), b = run_scenario(derived);
  CHECK(final_type(a) == "4/mm'm'");
  CHECK(a.chain.back().group == b.chain.back().group);
  // The non-magnetic cell is m-3m and is taken as grey.
  st.magnetic = false;
  for (auto& site : st.sites) site.moment = {0, 0, 0};
  Scenario plain;
  plain.structure = st;
  plain.tensors = {"V"};
  CHECK(final_type(run_scenario(plain)) == "m-3m1'");
}

TEST_CASE("octahedral tilts lower a cubic perovskite to the point group of its space group", "[scenario][tilts]") {
  // Howard & Stokes, Acta Cryst. B54, 782 (1998) (from memory): a0a0c- is I4/mcm (4/mmm, 4 ∥ z),
  // a-a-a- is R-3c (-3m about [111]), a+b-b- is Pnma (mmm); tilts are non-magnetic, so 1' stays.
  Scenario s = basic("m-3m");
  s.steps = {step(LoweringKind::tilts, "", "a0a0c-")};
  CHECK(final_type(run_scenario(s)) == "4/mmm1'");
  s.steps = {step(LoweringKind::tilts, "", "a-a-a-")};
  CHECK(final_type(run_scenario(s)) == "-3m1'");
  s.steps = {step(LoweringKind::tilts, "", "a+b-b-")};
  CHECK(final_type(run_scenario(s)) == "mmm1'");
  // a0a0c- on a (001) film keeps 4mm1' in the standard sample frame (common practice: tilts about the film normal keep the 4/mmm rows).
  s.cut = "(001)";
  s.steps = {step(LoweringKind::tilts, "", "a0a0c-")};
  ScenarioResult r = run_scenario(s);
  CHECK(r.chain.back().sample_symbol == "4mm1'");
}

TEST_CASE("(110) and (111) films: sample frames and chains of the trade", "[scenario][cut]") {
  // Default in-plane axes (common practice): (110) x ∥ [001], y ∥ [1-10]; (111) x ∥ [1-10], y ∥ [11-2].
  Scenario s = basic("m-3m");
  s.cut = "(110)";
  ScenarioResult r = run_scenario(s);
  CHECK(r.frame_labels[0] == "[001]");
  CHECK(r.frame_labels[1] == "[1-10]");
  CHECK(r.chain.back().sample_symbol == "mm21'");
  s.cut = "(111)";
  r = run_scenario(s);
  CHECK(r.frame_labels[0] == "[1-10]");
  CHECK(r.frame_labels[1] == "[11-2]");
  CHECK(r.chain.back().sample_symbol == "3m1'");
  // A tetragonal distortion along [100] leaves the single mirror (01-1).
  s.steps = {step(LoweringKind::strain, "[100]")};
  r = run_scenario(s);
  CHECK(final_type(r) == "m1'");
}

TEST_CASE("what switched on: a polar in-plane distortion of a (001) interface", "[scenario][switched-on]") {
  // A worked example (common practice): chi_xxx (2ω, current ∥ [100]) is forbidden on a 4mm1'
  // interface and allowed once an in-plane polar distortion ∥ [100] leaves the mirror ⊥ [010].
  Scenario s = basic("m-3m");
  s.tensors = {"chi_abc: polar, time-even, sym(bc)"};
  s.cut = "(001)";
  s.steps = {step(LoweringKind::polar, "[100]")};
  ScenarioResult r = run_scenario(s);
  REQUIRE(r.chain.size() == 3);
  CHECK(final_type(r) == "m1'");
  bool found = false;
  for (const auto& ch : r.changes)
    if (ch.step == 2)
      for (const auto& c : ch.switched_on) found = found || c == "chi_xxx";
  CHECK(found);
}

TEST_CASE("scenario files: bad input is named with file, line and what is valid", "[scenario][errors]") {
  fs::path broken = write_temp("ts-broken.toml", "title = \"x\"\nresponses = [\"anomalous-hall\"\n[crystal]\n");
  Run r = cli("run '" + broken.string() + "'");
  CHECK(r.code == 5);
  CHECK(r.err.find("ts-broken.toml:") != std::string::npos);

  fs::path kind = write_temp("ts-kind.toml",
                             "responses = [\"anomalous-hall\"]\n[crystal]\ngroup = \"m-3m\"\n[[lowering]]\nkind = \"squeeze\"\nalong = \"[001]\"\n");
  r = cli("run '" + kind.string() + "'");
  CHECK(r.code == 5);
  CHECK(r.err.find("squeeze") != std::string::npos);
  CHECK(r.err.find("strain") != std::string::npos); // lists the valid kinds

  fs::path plane = write_temp("ts-plane.toml",
                              "responses = [\"anomalous-hall\"]\n[crystal]\ngroup = \"m-3m\"\n[sample]\ncut = \"(001)\"\nx = \"[101]\"\n");
  r = cli("run '" + plane.string() + "'");
  CHECK(r.code == 7);
  CHECK(r.err.find("[101]") != std::string::npos);

  fs::path metric = write_temp("ts-metric.toml",
                               "responses = [\"anomalous-hall\"]\n[crystal]\ngroup = \"4/mmm\"\n[sample]\ncut = \"(101)\"\n");
  r = cli("run '" + metric.string() + "'");
  CHECK(r.code == 7);
  CHECK(r.err.find("lattice") != std::string::npos);

  fs::path unknown = write_temp("ts-unknown.toml", "responses = [\"hall-ish\"]\n[crystal]\ngroup = \"m-3m\"\n");
  r = cli("run '" + unknown.string() + "'");
  CHECK(r.code == 3);

  r = cli("sample m-3m --response anomalous-hall --lower strain");
  CHECK(r.code == 2);
  for (const auto& p : {broken, kind, plane, metric, unknown}) fs::remove(p);
}

TEST_CASE("hexagonal films: Miller-Bravais cuts and the c/a metric", "[scenario][cut][hexagonal]") {
  // A wurtzite-type 6mm crystal (common practice): the c-plane (0001) keeps 6mm; an a-plane (11-20)
  // or r-plane (10-12) film keeps only the mirror that contains c and the normal. The r-plane normal
  // depends on c/a, so without lattice parameters it is refused.
  Scenario s = basic("6mm");
  s.cut = "(0001)";
  ScenarioResult r = run_scenario(s);
  CHECK(r.chain.back().sample_symbol == "6mm1'");
  s.cut = "(11-20)";
  r = run_scenario(s);
  CHECK(final_type(r) == "m1'");
  CHECK(r.frame_labels[0] == "[001]"); // the default x is the c axis, in the a-plane
  CHECK(r.chain.back().sample_symbol == "m1'");
  s.cut = "(10-12)";
  CHECK_THROWS_AS(run_scenario(s), Error);
  s.metric.a = Rational(325, 100);
  s.metric.c = Rational(521, 100);
  r = run_scenario(s);
  CHECK(final_type(r) == "m1'");
  // The in-plane direction [1-100] (Miller-Bravais) of the a-plane film, written in four indices.
  s = basic("6mm");
  s.cut = "(11-20)";
  s.x = "[1-100]";
  r = run_scenario(s);
  CHECK(r.frame_labels[0] == "[1-10]");
}

TEST_CASE("cut x distortion table of a cubic perovskite", "[scenario][cut][table]") {
  // Interface groups of one domain variant on (001), (110), (111): stabiliser of the normal within the
  // distorted group (common practice: site-symmetry reasoning).
  // Each entry: type and the normals of the mirrors that remain.
  struct Row {
    LoweringKind kind;
    const char* along;
    const char* expected[3];
  };
  const Row rows[] = {
      {LoweringKind::strain, "[001]", {"4mm [100] [110] [1-10] [010]", "mm2 [1-10] [001]", "m [1-10]"}},
      {LoweringKind::strain, "[100]", {"mm2 [100] [010]", "m [001]", "m [01-1]"}},
      {LoweringKind::polar, "[001]", {"4mm [100] [110] [1-10] [010]", "m [1-10]", "m [1-10]"}},
      {LoweringKind::polar, "[100]", {"m [010]", "m [001]", "m [01-1]"}},
      {LoweringKind::polar, "[110]", {"m [1-10]", "mm2 [1-10] [001]", "m [1-10]"}},
      {LoweringKind::polar, "[1-10]", {"m [110]", "m [001]", "1"}},
      {LoweringKind::polar, "[111]", {"m [1-10]", "m [1-10]", "3m [10-1] [1-10] [01-1]"}},
  };
  const char* cuts[3] = {"(001)", "(110)", "(111)"};
  for (const auto& row : rows)
    for (int c = 0; c < 3; ++c) {
      Scenario s = basic("m-3m");
      s.assume_nonmagnetic = false;
      s.cut = cuts[c];
      s.steps = {step(row.kind, row.along)};
      ScenarioResult r = run_scenario(s);
      std::string got = final_type(r);
      for (const auto& op : r.chain.back().group.operations()) {
        std::string sym = op.symbol(LatticeKind::orthogonal);
        if (sym.rfind("m ", 0) == 0) got += " " + sym.substr(2);
      }
      INFO(lowering_kind_name(row.kind) << " " << row.along << " on " << cuts[c]);
      CHECK(got == row.expected[c]);
    }
}
