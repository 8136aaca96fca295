// One meaning for a group symbol in every command: without primes it is a
// non-magnetic crystal (the grey group G1'); the colourless group G needs --colourless
// (or nonmagnetic = false in a scenario). Checked command by command.
//
// The physics behind the checks (common practice): in a grey group every c-type
// (time-odd) tensor vanishes, so no spontaneous moment; a colourless group treats a
// c-type tensor like the i-type one of the same parity, so the axial vector of the
// colourless 4/m survives along z (4/m allows a pseudovector along its axis: Nye,
// Physical Properties of Crystals, 1957, ch. on pyromagnetism; from memory).
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

using ts::test::run_cli;
using ts::test::TempDir;

namespace {
bool has(const std::string& text, const std::string& what) { return text.find(what) != std::string::npos; }
} // namespace

TEST_CASE("symbol meaning: form", "[symbols]") {
  const auto grey = run_cli({"form", "4/m", "aeV"});
  REQUIRE(grey.exit_code == 0);
  CHECK(has(grey.out, "allowed form of T in 4/m1', C4h1', grey, order 16"));
  CHECK(has(grey.out, "independent: 0"));
  const auto colourless = run_cli({"form", "4/m", "aeV", "--colourless"});
  REQUIRE(colourless.exit_code == 0);
  CHECK(has(colourless.out, "in 4/m, C4h, ordinary (colourless), order 8"));
  CHECK(has(colourless.out, "independent: 1"));
  // Primes mean what they say, with or without the option.
  const auto primed = run_cli({"form", "4m'm'", "aeV", "--colourless"});
  REQUIRE(primed.exit_code == 0);
  CHECK(has(primed.out, "in 4m'm', C4v(C4), black-white"));
  // Schoenflies symbols follow the same rule.
  const auto schoenflies = run_cli({"form", "C4h", "aeV"});
  REQUIRE(schoenflies.exit_code == 0);
  CHECK(has(schoenflies.out, "in 4/m1'"));
}

TEST_CASE("symbol meaning: response", "[symbols]") {
  // The anomalous Hall effect needs broken time reversal: none in a non-magnetic crystal.
  const auto grey = run_cli({"response", "anomalous-hall", "4/m"});
  REQUIRE(grey.exit_code == 0);
  CHECK(has(grey.out, "4/m1'"));
  const auto colourless = run_cli({"response", "anomalous-hall", "4/m", "--colourless"});
  REQUIRE(colourless.exit_code == 0);
  CHECK(has(colourless.out, "ordinary (colourless)"));
  CHECK(grey.out != colourless.out);
}

TEST_CASE("symbol meaning: group", "[symbols]") {
  const auto grey = run_cli({"group", "4mm"});
  REQUIRE(grey.exit_code == 0);
  CHECK(has(grey.out, "point group 4mm1'"));
  CHECK(has(grey.out, "order            16"));
  const auto colourless = run_cli({"group", "4mm", "--colourless"});
  REQUIRE(colourless.exit_code == 0);
  CHECK(has(colourless.out, "point group 4mm\n"));
  CHECK(has(colourless.out, "order            8"));
}

TEST_CASE("symbol meaning: survey", "[symbols]") {
  // No non-magnetic crystal has a spontaneous moment; 13 colourless classes admit an
  // axial vector (1, -1, 2, m, 2/m, 4, -4, 4/m, 3, -3, 6, -6, 6/m: Nye 1957, from memory).
  const auto grey = run_cli({"survey", "aeV"});
  REQUIRE(grey.exit_code == 0);
  CHECK(has(grey.out, "allowed in 0 of 32 groups"));
  CHECK(has(grey.out, "4mm1'"));
  const auto colourless = run_cli({"survey", "aeV", "--colourless"});
  REQUIRE(colourless.exit_code == 0);
  CHECK(has(colourless.out, "allowed in 13 of 32 groups"));
}

TEST_CASE("symbol meaning: sample and run", "[symbols]") {
  const auto grey = run_cli({"sample", "4/m", "--tensor", "aeV"});
  REQUIRE(grey.exit_code == 0);
  CHECK(has(grey.out, "4/m taken as non-magnetic: 4/m1'"));
  const auto colourless = run_cli({"sample", "4/m", "--tensor", "aeV", "--colourless"});
  REQUIRE(colourless.exit_code == 0);
  CHECK(!has(colourless.out, "4/m1'"));
  CHECK(has(colourless.out, "independent: 1"));

  TempDir dir;
  std::ofstream(dir / "grey.toml") << "tensors = [\"aeV\"]\n[crystal]\ngroup = \"4/m\"\n";
  std::ofstream(dir / "colourless.toml") << "tensors = [\"aeV\"]\n[crystal]\ngroup = \"4/m\"\nnonmagnetic = false\n";
  const auto run_grey = run_cli({"run", (dir / "grey.toml").string()});
  const auto run_colourless = run_cli({"run", (dir / "colourless.toml").string()});
  REQUIRE(run_grey.exit_code == 0);
  REQUIRE(run_colourless.exit_code == 0);
  CHECK(has(run_grey.out, "4/m1'"));
  CHECK(has(run_colourless.out, "independent: 1"));
}

TEST_CASE("symbol meaning: every help text says how a plain symbol is read", "[symbols]") {
  for (const char* cmd : {"form", "response", "group", "sample"}) {
    INFO(cmd);
    const auto help = run_cli({cmd, "--help"});
    REQUIRE(help.exit_code == 0);
    CHECK(has(help.out, "no primes: a non-magnetic crystal"));
    CHECK(has(help.out, "--colourless"));
  }
  const auto survey = run_cli({"survey", "--help"});
  CHECK(has(survey.out, "--colourless"));
}

TEST_CASE("structural subgroup and magnetic order are different steps", "[symbols]") {
  // A polar 4mm distortion of a non-magnetic cubic crystal keeps time reversal: 4mm1'.
  const auto structural = run_cli({"sample", "m-3m", "--lower", "subgroup:4mm", "--tensor", "aeV"});
  REQUIRE(structural.exit_code == 0);
  CHECK(has(structural.out, "structural subgroup 4mm"));
  CHECK(has(structural.out, "4mm1'"));
  CHECK(!has(structural.out, "magnetic order"));
  // Magnetic order given by its magnetic group: read literally, labelled as order.
  const auto order = run_cli({"sample", "m-3m", "--lower", "magnetic-group:4/mm'm'", "--tensor", "aeV"});
  REQUIRE(order.exit_code == 0);
  CHECK(has(order.out, "magnetic order 4/mm'm'"));
  // a moment along z in 4/mm'm' (common practice: the ferromagnet with M ∥ 4)
  CHECK(has(order.out, "T_z"));
  TempDir dir;
  std::ofstream(dir / "twin.toml") << "tensors = [\"V\"]\n[crystal]\ngroup = \"m-3m\"\n"
                                      "[[lowering]]\nkind = \"subgroup\"\ngroup = \"4mm\"\n";
  const auto run = run_cli({"run", (dir / "twin.toml").string()});
  REQUIRE(run.exit_code == 0);
  CHECK(has(run.out, "structural subgroup 4mm"));
  // A step whose group already contains the sample's says that it changes nothing
  // (4mm lies within m-3m in the same axes: common practice).
  const auto idle = run_cli({"sample", "4mm", "--lower", "subgroup:m-3m", "--tensor", "V"});
  REQUIRE(idle.exit_code == 0);
  CHECK(has(idle.out, "step 1 changes nothing: every operation of step 0 keeps what it imposes"));
  CHECK(!has(structural.out, "changes nothing"));
}

TEST_CASE("standard names of the two-orientation magnetic types", "[symbols]") {
  // International Tables for Crystallography Vol. D, Table 1.5.7.1, and Bradley and
  // Cracknell 1972, Table 7.1 (from memory): 4'mm' and 4'/mmm', not 4'm'm and 4'/mm'm.
  const auto list = run_cli({"groups", "-m"});
  REQUIRE(list.exit_code == 0);
  CHECK(has(list.out, "\n  4'mm' "));
  CHECK(has(list.out, "\n  4'/mmm' "));
  CHECK(!has(list.out, "\n  4'm'm "));
  CHECK(!has(list.out, "\n  4'/mm'm "));
  // the other orientation stays valid input, of the same type
  const auto other = run_cli({"group", "4'm'm"});
  REQUIRE(other.exit_code == 0);
  CHECK(has(other.out, "type             4'mm'"));
  const auto other2 = run_cli({"group", "4'/mm'm"});
  REQUIRE(other2.exit_code == 0);
  CHECK(has(other2.out, "type             4'/mmm'"));
}

TEST_CASE("settings written with 1 positions are printed as type and elements", "[symbols]") {
  // The (101) face of a tetragonal crystal keeps one mirror, the one containing the
  // normal and [-101]: its normal is [010] (common practice).
  const std::vector<std::string> args = {"sample", "4/mmm", "--cut", "(101)", "--a", "3.91", "--c", "4.1",
                                         "--tensor", "V"};
  const auto text = run_cli(args);
  REQUIRE(text.exit_code == 0);
  CHECK(has(text.out, "m1' (mirror ⊥ [010])"));
  CHECK(!has(text.out, "m111'"));
  auto json_args = args;
  json_args.insert(json_args.end(), {"-f", "json"});
  const auto json = run_cli(json_args);
  REQUIRE(json.exit_code == 0);
  CHECK(has(json.out, "\"sample_frame_symbol\" : \"m111'\"")); // the full setting stays in JSON
}
