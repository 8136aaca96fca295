// The report formats of the tensorsieve executable: json parses (strictly) and
// carries the keys readers rely on, markdown has its tables, latex its
// environments, and every format is byte-for-byte reproducible.
#include "support/cli_run.hpp"
#include "support/json_value.hpp"

#include <catch2/catch.hpp>

#include <fstream>
#include <map>

using namespace ts::test;

namespace {

JsonValue run_json(const std::vector<std::string>& args) {
  const CliResult r = run_cli(args);
  INFO("stderr: " << r.err);
  REQUIRE(r.exit_code == 0);
  try {
    return parse_json(r.out);
  } catch (const std::exception& e) {
    FAIL(e.what() << "\n" << r.out);
  }
  return {};
}

std::size_t count_of(const std::string& text, const std::string& what) {
  std::size_t n = 0;
  for (std::size_t p = text.find(what); p != std::string::npos; p = text.find(what, p + what.size())) ++n;
  return n;
}

// A markdown table: a header row, then a separator row of dashes between pipes.
bool has_markdown_table(const std::string& text) {
  std::size_t p = 0;
  while ((p = text.find("\n|", p)) != std::string::npos) {
    const std::size_t next = text.find('\n', p + 1);
    if (next == std::string::npos) return false;
    if (text.compare(next, 3, "\n|-") == 0) return true;
    p = next;
  }
  return false;
}

} // namespace

TEST_CASE("json reader: rejects what is not JSON", "[formats]") {
  // The checker must be able to fail, or the format tests below prove nothing.
  CHECK_NOTHROW(parse_json(R"({"a": [1, -2.5e3, true, null, "x\"y\u00e9"], "b": {}})"));
  for (const char* bad : {"", "{", R"({"a": 1,})", R"([1, 2,])", R"({"a": 01})", R"({a: 1})", R"({"a": 1} x)",
                          R"({"a": 1, "a": 2})", R"(["tab	inside"])", R"({"a": .5})", R"({"a": NaN})", "[1 2]"}) {
    INFO("input " << bad);
    CHECK_THROWS(parse_json(bad));
  }
  const JsonValue v = parse_json(R"({"n": 3, "x": 3.0})");
  CHECK(v.at("n").is_integer());
  CHECK(!v.at("x").is_integer());
}

TEST_CASE("json: form reports group, tensor, independent and components", "[formats]") {
  // Independent counts of the piezoelectric d (V[V2]) and elastic c ([[V2]2])
  // tensors: Nye, "Physical Properties of Crystals" (Oxford 1957), the tables of
  // ch. VII and VIII (from memory).
  const std::vector<std::tuple<std::string, std::string, int>> cases = {
      {"3m", "V[V2]", 4},      {"4mm", "V[V2]", 3},  {"-43m", "V[V2]", 1}, {"432", "V[V2]", 0},
      {"1", "[[V2]2]", 21},    {"m-3m", "[[V2]2]", 3}, {"4'/m'm'm", "aeV", 0},  {"m'm2'", "aeV", 1},
  };
  for (const auto& [group, spec, independent] : cases) {
    INFO("form " << group << " " << spec);
    const JsonValue j = run_json({"form", group, spec, "-f", "json"});
    REQUIRE(j.is_object());
    REQUIRE(j.has("group"));
    REQUIRE(j.has("tensor"));
    REQUIRE(j.has("independent"));
    REQUIRE(j.has("components"));
    const JsonValue& g = j.at("group");
    REQUIRE(g.is_object());
    // a symbol without primes names the non-magnetic crystal, the grey group
    CHECK(g.at("symbol").text == (group.find('\'') == std::string::npos ? group + "1'" : group));
    CHECK(g.at("order").is_integer());
    CHECK(g.at("operations").is_array());
    CHECK(static_cast<double>(g.at("operations").items.size()) == g.at("order").number);
    const JsonValue& t = j.at("tensor");
    REQUIRE(t.is_object());
    CHECK(t.at("rank").is_integer());
    CHECK(t.at("spec").is_string());
    REQUIRE(j.at("independent").is_integer());
    CHECK(j.at("independent").number == independent);
    const JsonValue& comps = j.at("components");
    REQUIRE(comps.is_array());
    CHECK(j.at("parameters").items.size() == static_cast<std::size_t>(independent));
    CHECK((independent == 0) == comps.items.empty());
    for (const auto& c : comps.items) {
      REQUIRE(c.is_object());
      CHECK(c.at("component").is_string());
      CHECK(c.at("value").is_string());
      CHECK(c.at("terms").is_array());
    }
  }
}

TEST_CASE("json: survey, group, groups and identify", "[formats]") {
  {
    const JsonValue j = run_json({"survey", "V[V2]", "-f", "json"});
    REQUIRE(j.has("tensor"));
    REQUIRE(j.at("groups").is_array());
    CHECK(j.at("groups").items.size() == 32);
    CHECK(j.at("count").is_integer());
    CHECK(j.at("count").number == 32);
    int allowed = 0;
    std::map<std::string, double> count_by_group;
    for (const auto& g : j.at("groups").items) {
      REQUIRE(g.at("independent").is_integer());
      REQUIRE(g.at("allowed").type == JsonValue::Type::boolean);
      CHECK(g.at("allowed").boolean == (g.at("independent").number > 0));
      allowed += g.at("allowed").boolean;
      count_by_group[g.at("group").text] = g.at("independent").number;
    }
    CHECK(j.at("allowed_in").number == allowed);
    // Piezoelectricity is allowed in the 20 noncentrosymmetric classes other than 432
    // (Nye 1957, from memory); 18 components in class 1.
    CHECK(allowed == 20);
    // the 32 classes as non-magnetic crystals: grey groups
    CHECK(count_by_group["11'"] == 18);
    CHECK(count_by_group["4321'"] == 0);
  }
  {
    const JsonValue j = run_json({"survey", "aeV", "-m", "-f", "json"});
    CHECK(j.at("groups").items.size() == 122);
    CHECK(j.at("count").number == 122);
    // Spontaneous magnetisation is allowed in 31 magnetic point-group types
    // (Birss 1964; ITC Vol. D ch. 1.5; from memory).
    CHECK(j.at("allowed_in").number == 31);
  }
  {
    const JsonValue j = run_json({"group", "6/mmm", "--colourless", "-f", "json"});
    CHECK(j.at("symbol").text == "6/mmm");
    CHECK(j.at("type").text == "6/mmm");
    CHECK(j.at("schoenflies").text == "D6h");
    CHECK(j.at("order").is_integer());
    CHECK(j.at("order").number == 24);
    CHECK(j.at("operations").items.size() == 24);
    CHECK(j.at("centrosymmetric").type == JsonValue::Type::boolean);
  }
  {
    const JsonValue j = run_json({"group", "mm'2'", "--subgroups", "-f", "json"});
    CHECK(j.at("symbol").text == "mm'2'");
    CHECK(j.at("type").text == "m'm2'");
  }
  for (const auto& [flag, n] : std::vector<std::pair<std::string, std::size_t>>{{"", 32}, {"-m", 122}}) {
    std::vector<std::string> args = {"groups", "-f", "json"};
    if (!flag.empty()) args.push_back(flag);
    const JsonValue j = run_json(args);
    CHECK(j.at("count").number == static_cast<double>(n));
    REQUIRE(j.at("groups").items.size() == n);
    for (const auto& g : j.at("groups").items) {
      CHECK(g.at("symbol").is_string());
      CHECK(g.at("order").is_integer());
    }
  }
  {
    const JsonValue j = run_json({"identify", "4+ [001]", "m' [100]", "-f", "json"});
    CHECK(j.at("type").text == "4m'm'");
    CHECK(j.at("order").number == 8);
  }
}

TEST_CASE("formats: markdown tables and latex environments", "[formats]") {
  struct Case {
    std::vector<std::string> args;
    const char* latex_env; // an environment the latex report must open and close
  };
  const std::vector<Case> cases = {
      {{"form", "3m", "V[V2]"}, "align*"},
      {{"form", "m'm2'", "aeV"}, "align*"},
      {{"survey", "aeV", "-m"}, "tabular"},
      {{"group", "4'/mm'm", "--subgroups"}, "tabular"},
      {{"groups", "-m"}, "tabular"},
  };
  for (const auto& c : cases) {
    INFO("command " << c.args[0] << " " << c.args[1]);
    std::vector<std::string> md = c.args, tex = c.args;
    md.insert(md.end(), {"-f", "markdown"});
    tex.insert(tex.end(), {"-f", "latex"});
    const CliResult m = run_cli(md);
    REQUIRE(m.exit_code == 0);
    CHECK(has_markdown_table(m.out));
    const CliResult l = run_cli(tex);
    REQUIRE(l.exit_code == 0);
    const std::string begin = std::string("\\begin{") + c.latex_env + "}", end = std::string("\\end{") + c.latex_env + "}";
    CHECK(count_of(l.out, begin) >= 1);
    CHECK(count_of(l.out, begin) == count_of(l.out, end));
    CHECK(count_of(l.out, "\\begin{") == count_of(l.out, "\\end{"));
  }
}

TEST_CASE("formats: the same command twice gives identical bytes", "[formats]") {
  const std::vector<std::vector<std::string>> commands = {
      {"form", "-3'm'", "aV[V2]"}, {"form", "4mm", "V", "--z", "[110]", "--x", "[001]"},
      {"survey", "V[V2]", "-m"},   {"group", "m-3m", "--subgroups"},
  };
  const char* const formats[] = {"text", "markdown", "latex", "json"};
  for (const auto& cmd : commands) {
    // Each format twice, all eight runs side by side (separate processes).
    std::vector<std::vector<std::string>> runs;
    for (const char* format : formats)
      for (int copy = 0; copy < 2; ++copy) {
        runs.push_back(cmd);
        runs.back().insert(runs.back().end(), {"-f", format});
      }
    const std::vector<CliResult> results = run_cli_batch(runs);
    for (std::size_t f = 0; f < 4; ++f) {
      INFO("command " << cmd[0] << " " << cmd[1] << " in " << formats[f]);
      const CliResult& a = results[2 * f];
      const CliResult& b = results[2 * f + 1];
      REQUIRE(a.exit_code == 0);
      REQUIRE(b.exit_code == 0);
      CHECK(!a.out.empty());
      CHECK(a.out == b.out);
      if (std::string(formats[f]) == "json") CHECK_NOTHROW(parse_json(a.out));
    }
  }
}

// What the text reports derive from the result (the bar's current density, a layout's
// inseparable combinations, the Kerr verdict, whose angles a probe sum names) is in the
// JSON too, and a form view that does not fit is refused in JSON as in text.
TEST_CASE("json: carries what the text derives, and refuses what the text refuses", "[formats]") {
  TempDir dir;
  const std::string scenario = (dir / "bar.toml").string();
  {
    std::ofstream out(scenario);
    out << "title = \"a bar with its size (invented)\"\nresponses = [\"anomalous-hall\", \"magneto-optic-kerr\"]\n"
           "[crystal]\ngroup = \"4/mm'm'\"\n[sample]\ncut = \"(001)\"\nx = \"[100]\"\n"
           "[[bar]]\nname = \"b\"\ncurrent = \"[100]\"\nfield = \"none\"\n"
           "current_rms = 1e-3\nlength = 2e-4\nwidth = 5e-5\nthickness = 1e-8\n"
           "[[kerr]]\nname = \"k\"\nmagnetisation = \"[001]\"\n";
  }
  const JsonValue j = run_json({"run", scenario, "-f", "json"});
  const JsonValue& dims = j.at("bars").items.at(0).at("dimensions");
  CHECK(dims.at("current_rms_A").number == Approx(1e-3));
  CHECK(dims.at("current_density_rms_A_per_m2").number == Approx(1e-3 / (5e-5 * 1e-8))); // I/(w t) = 2e9 A/m²
  const auto text = run_cli({"run", scenario});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("j_rms = 2e+09 A/m^2") != std::string::npos);
  // 4/mm'm' admits a moment along z: polar Kerr allowed (common practice).
  CHECK(j.at("magneto_optics").items.at(0).at("gyration_allowed").boolean);
  CHECK(j.at("probe_sums").items.at(0).at("field_angles_of").text == "field");

  const JsonValue ex = run_json({"run", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml", "-f", "json"});
  for (const auto& l : ex.at("layouts").items) {
    CHECK(l.at("inseparable").is_integer());
    CHECK(l.at("inseparable").number == l.at("parameters").number - static_cast<double>(l.at("unreadable").items.size()) -
                                            l.at("rank").number);
  }
  CHECK(ex.at("probe_sums").items.at(0).at("field_angles_of").text == "magnetisation"); // the bar's eMChA in M

  for (const char* format : {"text", "json"}) {
    INFO(format);
    auto r = run_cli({"form", "4mm", "V3", "--view", "matrix", "-f", format});
    CHECK(r.exit_code == 2);
    CHECK(r.err.find("the matrix view needs a rank-2 tensor") != std::string::npos);
  }
}
