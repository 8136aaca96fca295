// `run` of a scenario with [[observation]] tables: the scenario report, then the
// answer to each observation against the group the chain ends in, in every format,
// and the same answers as `observe --scenario` gives for the same file.
//
// The physics of the example (examples/hall-signal-to-explain.toml): a (001) film
// of a cubic crystal has the grey group 4mm1' at its interface, which forbids a
// zero-field second-harmonic Hall signal from a Berry-curvature dipole; a single
// mirror allows it, and the dipole is perpendicular to that mirror (Sodemann and Fu,
// "Quantum nonlinear Hall effect induced by Berry curvature dipole in time-reversal
// invariant materials", Phys. Rev. Lett. 115, 216806 (2015), from memory). The three
// maximal subgroups are the mirrors perpendicular to [100], [110] and [1-10] (the
// in-plane mirrors of 4mm up to the 4-fold axis: common practice).
#include "support/cli_run.hpp"
#include "support/json_value.hpp"

#include <catch2/catch.hpp>

#include <fstream>

using namespace ts::test;

namespace {

const std::string example = std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/hall-signal-to-explain.toml";

std::size_t count(const std::string& text, const std::string& what) {
  std::size_t n = 0;
  for (std::size_t at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
  return n;
}

} // namespace

TEST_CASE("run answers the observations of a scenario after its report", "[observations][cli]") {
  CliResult r = run_cli({"run", example});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.err.empty());
  // The scenario report comes first, unchanged ...
  CHECK(r.out.find("symmetry chain") < r.out.find("observations: what the signals prove"));
  CHECK(r.out.find("nonlinear Hall effect from the Berry-curvature dipole") != std::string::npos);
  // ... then one section per observation, against the group the chain ends in.
  CHECK(count(r.out, "\nobservation: ") == 2);
  CHECK(r.out.find("against the sample's group 4mm1'") != std::string::npos);
  CHECK(count(r.out, "verdict: forbidden in 4mm1'") == 2);
  const std::string first = r.out.substr(r.out.find("observation: 2ω transverse"));
  const std::string first_only = first.substr(0, first.find("\nobservation: "));
  CHECK(first_only.find("3 found among 34 proper subgroups") != std::string::npos);
  for (const char* mirror : {"m1' (mirror ⊥ [100])", "m1' (mirror ⊥ [110])", "m1' (mirror ⊥ [1-10])"})
    CHECK(first_only.find(mirror) != std::string::npos);
}

TEST_CASE("run and observe --scenario give the same answers", "[observations][cli]") {
  CliResult run = run_cli({"run", example, "-f", "json"});
  CliResult observe = run_cli({"observe", "--scenario", example, "-f", "json"});
  REQUIRE(run.exit_code == 0);
  REQUIRE(observe.exit_code == 0);
  JsonValue r = parse_json(run.out), o = parse_json(observe.out);
  // The run keeps every key of a scenario report and adds the observations.
  for (const char* key : {"chain", "parts", "bars", "frame", "title", "observations"}) CHECK(r.has(key));
  const auto& a = r.at("observations").items;
  const auto& b = o.at("observations").items;
  REQUIRE(a.size() == 2);
  REQUIRE(b.size() == 2);
  for (std::size_t i = 0; i < a.size(); ++i) {
    CHECK(a[i].at("label").text == b[i].at("label").text);
    CHECK(a[i].at("allowed_in_parent").boolean == b[i].at("allowed_in_parent").boolean);
    REQUIRE(a[i].at("maximal_subgroups").items.size() == b[i].at("maximal_subgroups").items.size());
    for (std::size_t k = 0; k < a[i].at("maximal_subgroups").items.size(); ++k) {
      const JsonValue& x = a[i].at("maximal_subgroups").items[k];
      const JsonValue& y = b[i].at("maximal_subgroups").items[k];
      CHECK(x.at("type").text == y.at("type").text);
      CHECK(x.at("sample_frame_symbol").text == y.at("sample_frame_symbol").text);
      REQUIRE(x.at("operations").items.size() == y.at("operations").items.size());
    }
  }
  CHECK(a[0].at("maximal_subgroups").items.size() == 3);
  CHECK(a[0].at("maximal_subgroups").items[0].at("type").text == "m1'");
}

TEST_CASE("the observations appear in every format of run", "[observations][cli][formats]") {
  CliResult md = run_cli({"run", example, "-f", "markdown"});
  REQUIRE(md.exit_code == 0);
  CHECK(md.out.find("### observations: what the signals prove") != std::string::npos);
  CHECK(count(md.out, "#### observation: ") == 2);
  CliResult tex = run_cli({"run", example, "-f", "latex"});
  REQUIRE(tex.exit_code == 0);
  CHECK(tex.out.find("\\subsection*{observations: what the signals prove}") != std::string::npos);
  CliResult html = run_cli({"run", example, "-f", "html"});
  REQUIRE(html.exit_code == 0);
  // the page renders the Markdown report: one level below the page's own sections
  CHECK(html.out.find("<h4>observations: what the signals prove</h4>") != std::string::npos);
  CHECK(count(html.out, "<h5>observation: ") == 2);
  CHECK(html.out.find("m1' (mirror ⊥ [100])") != std::string::npos);
}

TEST_CASE("a scenario without observations runs as before, and a bad one fails whole", "[observations][cli]") {
  CliResult plain = run_cli({"run", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml"});
  REQUIRE(plain.exit_code == 0);
  CHECK(plain.out.find("observations: what the signals prove") == std::string::npos);

  TempDir dir;
  const std::string bad = (dir / "bad.toml").string();
  std::ofstream(bad) << "responses = [\"conductivity\"]\n[crystal]\ngroup = \"4mm\"\n\n"
                        "[[observation]]\nresponse = \"second-order-conductivity\"\ncomponents = [\"chi_qqq\"]\n";
  CliResult r = run_cli({"run", bad});
  CHECK(r.exit_code != 0);
  CHECK(r.out.empty()); // no half report: the scenario part is not printed either
  CHECK(r.err.find(bad + ":5:") != std::string::npos);
}
