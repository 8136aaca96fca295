// The command line as a new user meets it: the option parser's mistakes in the
// project's error format with the closest subcommand or option, the help for a bare
// `tensorsieve`, plain spellings of barred group symbols, every format listed,
// "wrote FILE", the note on a bare group symbol, and the short, filtered and wrapped
// scenario reports (--brief, --only, --width) with counted nouns.
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <sstream>

using namespace ts::test;

namespace {

void check_usage_error(const CliResult& r) {
  INFO("stderr: " << r.err);
  CHECK(r.exit_code == 2);
  CHECK(r.out.empty());
  CHECK_THAT(r.err, Catch::StartsWith("tensorsieve: error: "));
  CHECK_THAT(r.err, Catch::Contains("\n  valid: "));
}

std::size_t longest_line(const std::string& text) {
  std::istringstream in(text);
  std::size_t most = 0;
  for (std::string l; std::getline(in, l);) {
    std::size_t w = 0;
    for (unsigned char c : l) w += (c & 0xC0) != 0x80; // code points
    most = std::max(most, w);
  }
  return most;
}

std::size_t line_count(const std::string& text) { return static_cast<std::size_t>(std::count(text.begin(), text.end(), '\n')); }

const std::string example = std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml";

} // namespace

TEST_CASE("usage: a mistyped subcommand or option is named with the closest one", "[cli][usage]") {
  const CliResult frm = run_cli({"frm", "4mm", "V"});
  check_usage_error(frm);
  CHECK_THAT(frm.err, Catch::Contains("unknown subcommand 'frm' (did you mean form?)"));
  CHECK_THAT(frm.err, Catch::Contains("subcommands: groups, group, identify, form"));

  const CliResult magnetc = run_cli({"survey", "aeV", "--magnetc"});
  check_usage_error(magnetc);
  CHECK_THAT(magnetc.err, Catch::Contains("tensorsieve survey: unknown option '--magnetc' (did you mean --magnetic?)"));

  const CliResult missing = run_cli({"form", "4mm"});
  check_usage_error(missing);
  CHECK_THAT(missing.err, Catch::Contains("tensorsieve form: spec is required"));
  CHECK_THAT(missing.err, Catch::Contains("tensorsieve form group spec [options]"));

  const CliResult extra = run_cli({"form", "4mm", "V", "E"});
  check_usage_error(extra);
  CHECK_THAT(extra.err, Catch::Contains("unexpected argument 'E'"));

  // Nothing close: no guess.
  const CliResult far = run_cli({"survey", "aeV", "--zebra"});
  check_usage_error(far);
  CHECK_THAT(far.err, !Catch::Contains("did you mean"));
}

TEST_CASE("usage: a bare tensorsieve prints the help", "[cli][usage]") {
  const CliResult r = run_cli({});
  CHECK(r.exit_code == 0);
  CHECK(r.err.empty());
  CHECK_THAT(r.out, Catch::Contains("Subcommands:"));
  CHECK_THAT(r.out, Catch::Contains("form"));
  CHECK(r.out == run_cli({"--help"}).out);
}

TEST_CASE("usage: group symbols that lost their overbars are read when only one group fits", "[cli][usage]") {
  // common practice: m3m, 43m, 6m2 and m3 are the plain-text spellings of m-3m, -43m, -6m2, m-3
  for (const auto& [plain, barred] : std::vector<std::pair<std::string, std::string>>{
           {"m3m", "m-3m"}, {"43m", "-43m"}, {"6m2", "-6m2"}, {"m3", "m-3"}, {"42m", "-42m"}, {"m3m'", "m-3m'"}}) {
    INFO(plain);
    const CliResult a = run_cli({"form", plain, "[[V2]2]", "-f", "json"});
    const CliResult b = run_cli({"form", barred, "[[V2]2]", "-f", "json"});
    CHECK(a.exit_code == 0);
    CHECK(a.out == b.out);
  }
  // 3m is a group of its own (C3v), never -3m (D3d).
  const CliResult c3v = run_cli({"group", "3m"});
  CHECK(c3v.exit_code == 0);
  CHECK_THAT(c3v.out, Catch::Contains("C3v"));
  CHECK(run_cli({"form", "m3x", "V"}).exit_code == 3);
}

TEST_CASE("usage: every format is listed, html where it is written", "[cli][usage]") {
  CHECK_THAT(run_cli({"run", "--help"}).out, Catch::Contains("text (default), markdown, latex, json or html"));
  CHECK_THAT(run_cli({"sample", "--help"}).out, Catch::Contains("json or html"));
  CHECK_THAT(run_cli({"form", "--help"}).out, Catch::Contains("text (default), markdown, latex or json"));
  const CliResult bad = run_cli({"run", example, "-f", "yaml"});
  check_usage_error(bad);
  CHECK_THAT(bad.err, Catch::Contains("text, markdown, latex, json, html"));
  const CliResult html = run_cli({"form", "4mm", "V", "-f", "html"});
  check_usage_error(html);
  CHECK_THAT(html.err, Catch::Contains("`run`, `sample` and `fit`"));
}

TEST_CASE("usage: -o says which file it wrote", "[cli][usage]") {
  TempDir dir;
  const std::string path = (dir / "form.txt").string();
  const CliResult r = run_cli({"form", "4mm", "V", "--colourless", "-o", path});
  CHECK(r.exit_code == 0);
  CHECK(r.out.empty());
  CHECK(r.err == "tensorsieve: wrote " + path + "\n");
}

TEST_CASE("usage: a bare group symbol read as the grey group is said in form, response, group and observe",
          "[cli][usage]") {
  const std::string note = "tensorsieve: note: 4mm read as the non-magnetic crystal 4mm1'";
  for (const auto& args : std::vector<std::vector<std::string>>{
           {"form", "4mm", "aeV"},
           {"response", "anomalous-hall", "4mm"},
           {"group", "4mm"},
           {"observe", "4mm", "--response", "second-order-conductivity", "--component", "chi_zzz"}}) {
    INFO(args[0]);
    const CliResult r = run_cli(args);
    CHECK(r.exit_code == 0);
    CHECK_THAT(r.err, Catch::StartsWith(note));
    CHECK_THAT(r.err, Catch::Contains("--colourless"));
  }
  // Primes, 1' or --colourless: the symbol means what it says, and nothing is said.
  CHECK(run_cli({"form", "4m'm'", "aeV"}).err.empty());
  CHECK(run_cli({"form", "4mm1'", "aeV"}).err.empty());
  CHECK(run_cli({"form", "4mm", "aeV", "--colourless"}).err.empty());
}

TEST_CASE("terminal: --brief gives the chain and one verdict a part", "[cli][terminal]") {
  const CliResult full = run_cli({"run", example});
  const CliResult brief = run_cli({"run", example, "--brief"});
  REQUIRE(full.exit_code == 0);
  REQUIRE(brief.exit_code == 0);
  CHECK(line_count(brief.out) * 4 < line_count(full.out));
  CHECK_THAT(brief.out, Catch::Contains("symmetry chain"));
  CHECK_THAT(brief.out, Catch::Contains("verdicts after step"));
  CHECK_THAT(brief.out, Catch::Contains("independent by step"));
  CHECK_THAT(brief.out, !Catch::Contains("allowed form of"));
  check_usage_error(run_cli({"run", example, "--brief", "-f", "json"}));
}

TEST_CASE("terminal: --only keeps the named responses", "[cli][terminal]") {
  const std::vector<std::string> base = {"sample", "m-3m", "--cut", "(001)", "--lower", "moment:[001]", "--response", "all"};
  std::vector<std::string> only = base;
  only.insert(only.end(), {"--only", "anomalous-hall", "-f", "json"});
  const CliResult r = run_cli(only);
  REQUIRE(r.exit_code == 0);
  CHECK_THAT(r.out, Catch::Contains("\"response\" : \"anomalous-hall\""));
  CHECK_THAT(r.out, !Catch::Contains("\"response\" : \"second-order-conductivity\""));
  // A response the scenario does not ask for is refused, with those it does.
  const CliResult no = run_cli({"sample", "m-3m", "--response", "anomalous-hall", "--only", "pyroelectric"});
  check_usage_error(no);
  CHECK_THAT(no.err, Catch::Contains("--only"));
  CHECK_THAT(no.err, Catch::Contains("anomalous-hall"));
}

TEST_CASE("terminal: --width wraps every line of a text report", "[cli][terminal]") {
  const CliResult wide = run_cli({"run", example});
  REQUIRE(wide.exit_code == 0);
  CHECK(longest_line(wide.out) > 120); // a file or pipe gets the lines as they come
  for (int width : {80, 100}) {
    const CliResult r = run_cli({"run", example, "--width", std::to_string(width)});
    REQUIRE(r.exit_code == 0);
    CHECK(longest_line(r.out) <= static_cast<std::size_t>(width));
    // nothing lost: the same words in the same order
    auto words = [](const std::string& t) {
      std::istringstream in(t);
      std::string all, w;
      while (in >> w)
        if (w.find_first_not_of('-') != std::string::npos) all += w; // table rules shrink with their columns
      return all;
    };
    CHECK(words(r.out).size() == words(wide.out).size());
  }
  const CliResult responses = run_cli({"responses", "--width", "90"});
  CHECK(longest_line(responses.out) <= 90);
  check_usage_error(run_cli({"responses", "--width", "10"}));
}

TEST_CASE("terminal: counts take the right number", "[cli][terminal]") {
  // one part forbidden after the last step, one allowed: "1 part", never "1 parts"
  const CliResult r = run_cli({"sample", "m-3m", "--cut", "(001)", "--lower", "moment:[001]", "--response", "all"});
  REQUIRE(r.exit_code == 0);
  CHECK_THAT(r.out, !Catch::Contains(" 1 parts"));
  CHECK_THAT(r.out, !Catch::Contains("(s)"));
  CHECK_THAT(r.out, !Catch::Contains(" 1 operations"));
}
