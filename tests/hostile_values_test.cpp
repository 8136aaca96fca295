// Values a careless or hostile user may give: LaTeX-special text in labels, a
// zero volume fraction, and the bounds on work (lowering steps, atoms in a
// cell) with the options that lift them. The refusals themselves are cases of
// the bad-input corpus (tests/bad_input/cases.txt).
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <sys/resource.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <vector>

using ts::test::run_cli;
using ts::test::TempDir;

namespace {

bool has(const std::string& text, const std::string& piece) { return text.find(piece) != std::string::npos; }
std::string source(const std::string& rel) { return std::string(TENSORSIEVE_SOURCE_DIR) + "/" + rel; }

} // namespace

TEST_CASE("LaTeX output escapes what the user wrote: a label runs no command") {
  TempDir dir;
  std::ofstream(dir / "label.toml") << "title = \"film_1 at 50%\"\nresponses = [\"conductivity\"]\n[crystal]\n"
                                       "group = \"m-3m\"\n[[lowering]]\nkind = \"strain\"\nalong = \"[001]\"\n"
                                       "label = \"x_1 \\\\input{secret} $a$ 50% #2\"\n";
  const auto r = run_cli({"run", (dir / "label.toml").string(), "-f", "latex"});
  REQUIRE(r.exit_code == 0);
  CHECK(!has(r.out, "\\input{secret}"));
  CHECK(has(r.out, "x\\_1 \\textbackslash{}input\\{secret\\} \\$a\\$ 50\\% \\#2"));
  CHECK(has(r.out, "film\\_1 at 50\\%"));
}

TEST_CASE("a volume fraction of zero is a fraction: 0 and 0.0 are accepted") {
  const auto cli = run_cli({"sample", "m-3m", "--cut", "(001)", "--lower", "strain:[100]", "--response",
                            "anomalous-hall", "--domains", "--domain-fractions", "0,1"});
  CHECK(cli.exit_code == 0);
  const auto decimal = run_cli({"sample", "m-3m", "--cut", "(001)", "--lower", "strain:[100]", "--response",
                                "anomalous-hall", "--domains", "--domain-fractions", "0.0,1.0"});
  CHECK(decimal.exit_code == 0);
  TempDir dir;
  std::ofstream(dir / "f.toml") << "responses = [\"anomalous-hall\"]\n[crystal]\ngroup = \"m-3m\"\n[sample]\n"
                                   "cut = \"(001)\"\n[[lowering]]\nkind = \"strain\"\nalong = \"[100]\"\n[report]\n"
                                   "domains = true\ndomain_fractions = [0.0, 1]\n";
  const auto file = run_cli({"run", (dir / "f.toml").string()});
  CHECK(file.exit_code == 0);
  const auto negative = run_cli({"sample", "m-3m", "--cut", "(001)", "--lower", "strain:[100]", "--response",
                                 "anomalous-hall", "--domains", "--domain-fractions=-0.5,1.5"});
  CHECK(negative.exit_code == 2);
  CHECK(has(negative.err, "outside [0, 1]"));
}

TEST_CASE("bounds on work name their limit, and the command line lifts them") {
  const std::string steps = source("tests/bad_input/many-steps.toml");
  const auto refused = run_cli({"run", steps});
  CHECK(refused.exit_code == 5);
  CHECK(has(refused.err, "more than the 64 a scenario may run"));
  CHECK(has(refused.err, "--max-steps N"));
  CHECK(run_cli({"run", steps, "--max-steps", "100"}).exit_code == 0);
  std::vector<std::string> many = {"sample", "m-3m", "--response", "conductivity", "--max-steps", "2"};
  for (int i = 0; i < 3; ++i) many.insert(many.end(), {"--lower", "strain:[001]"});
  const auto cli = run_cli(many);
  CHECK(cli.exit_code == 2);
  CHECK(has(cli.err, "--lower strain:[001]"));

  // Cr2O3 has 30 atoms in its hexagonal cell (common practice).
  const std::string cr = source("tests/data/cr2o3-afm.mcif");
  const auto small = run_cli({"sample", "--structure-file", cr, "--max-atoms", "10", "--response", "conductivity"});
  CHECK(small.exit_code == 5);
  CHECK(has(small.err, "more than 10 atoms"));
  CHECK(run_cli({"sample", "--structure-file", cr, "--max-atoms", "30", "--response", "conductivity"}).exit_code == 0);
}

namespace {

// Every free-text field of every example (title, lowering and phase labels,
// bar, SHG, Kerr, fit, photocurrent and pump-probe names, observation labels)
// replaced by a hostile string that carries a marker naming its field and line.
std::string with_hostile_text(const std::string& scenario, std::vector<std::string>* markers) {
  std::istringstream in(scenario);
  std::string out, line;
  int n = 0;
  while (std::getline(in, line)) {
    for (const std::string key : {"title = \"", "name = \"", "label = \""}) {
      if (line.rfind(key, 0) != 0) continue;
      const std::string marker = "secret" + std::to_string(++n);
      markers->push_back(marker);
      line = key.substr(0, key.size() - 1) + "'Q_1 \\input{" + marker + "} $a$ 50% #2 & ~ ^ <script>x</script>'";
    }
    out += line + "\n";
  }
  return out;
}

} // namespace

TEST_CASE("every writer escapes every free-text field of every example") {
  const std::vector<std::string> examples = {"hall-signal-to-explain", "magnetised-film-harmonic-hall",
                                             "magnetised-film-optics",  "polar-film-photocurrents",
                                             "spin-reorientation-pump-probe", "threefold-film-scan",
                                             "strained-film", "tilted-perovskite-film"};
  for (const auto& name : examples) {
    INFO(name);
    TempDir dir;
    std::vector<std::string> markers;
    std::ifstream in(source("examples/" + name + ".toml"));
    std::stringstream text;
    text << in.rdbuf();
    std::ofstream(dir / "s.toml") << with_hostile_text(text.str(), &markers);
    std::filesystem::copy_file(source("examples/threefold-film-scan.csv"), dir / "threefold-film-scan.csv");
    REQUIRE(!markers.empty());

    auto latex = run_cli({"run", (dir / "s.toml").string(), "-f", "latex"});
    REQUIRE(latex.exit_code == 0);
    // `run` reports the scenario, `fit` its [[fit]] scans.
    const bool fits = has(text.str(), "[[fit]]");
    if (fits) {
      const auto fitted = run_cli({"fit", (dir / "s.toml").string(), "-f", "latex"});
      REQUIRE(fitted.exit_code == 0);
      latex.out += fitted.out;
    }
    for (const auto& m : markers) {
      INFO(m);
      CHECK(has(latex.out, "\\textbackslash{}input\\{" + m + "\\}"));
      CHECK(!has(latex.out, "\\input{" + m));
    }
    // The short report too: step labels in its tables.
    const auto brief = run_cli({"run", (dir / "s.toml").string(), "-f", "latex", "--brief"});
    REQUIRE(brief.exit_code == 0);
    CHECK(!has(brief.out, "\\input{secret"));
    CHECK(!has(brief.out, "Q_1"));
    CHECK(!has(latex.out, "Q_1"));
    CHECK(!has(latex.out, " $a$"));
    CHECK(!has(latex.out, "50%"));
    CHECK(!has(latex.out, " #2"));
    CHECK(!has(latex.out, " & ~"));

    auto html = run_cli({"run", (dir / "s.toml").string(), "-f", "html"});
    REQUIRE(html.exit_code == 0);
    if (fits) {
      const auto fitted = run_cli({"fit", (dir / "s.toml").string(), "-f", "html"});
      REQUIRE(fitted.exit_code == 0);
      html.out += fitted.out;
    }
    for (const auto& m : markers) {
      INFO(m);
      CHECK(has(html.out, m));
    }
    CHECK(!has(html.out, "<script>x"));
    CHECK(has(html.out, "&lt;script&gt;x"));
  }
}

TEST_CASE("control and escape characters in a title never reach the terminal raw") {
  TempDir dir;
  std::ofstream(dir / "t.toml") << "title = \"red \\u001b[31mtitle\\u0007 bell \\u009b2J\"\nresponses = [\"conductivity\"]\n"
                                   "[crystal]\ngroup = \"m-3m\"\n";
  for (const std::string format : {"text", "markdown", "latex", "html"}) {
    INFO(format);
    const auto r = run_cli({"run", (dir / "t.toml").string(), "-f", format});
    REQUIRE(r.exit_code == 0);
    CHECK(has(r.out, "title"));
    CHECK(r.out.find('\x1b') == std::string::npos);
    CHECK(r.out.find('\x07') == std::string::npos);
    CHECK(r.out.find("\xc2\x9b") == std::string::npos);
  }
  // JSON keeps the title as written, escaped by JSON's own rules.
  const auto json = run_cli({"run", (dir / "t.toml").string(), "-f", "json"});
  REQUIRE(json.exit_code == 0);
  CHECK(json.out.find('\x1b') == std::string::npos);
  CHECK((has(json.out, "\\u001b[31m") || has(json.out, "\\u001B[31m")));
}

// The amplification case: every response, domains on, the most lowering steps a
// scenario may run. The step bound keeps the report a few megabytes and the memory of
// the run a small multiple of it; one step more is refused before any work.
TEST_CASE("a scenario asking for everything at the step bound stays bounded in output and memory") {
  const auto ids = run_cli({"responses", "-f", "json"});
  REQUIRE(ids.exit_code == 0);
  std::string list;
  for (std::size_t p = ids.out.find("\"id\" : \""); p != std::string::npos; p = ids.out.find("\"id\" : \"", p + 1)) {
    const std::size_t start = p + 8;
    list += (list.empty() ? "\"" : ", \"") + ids.out.substr(start, ids.out.find('"', start) - start) + "\"";
  }
  REQUIRE(list.size() > 100);
  auto scenario = [&](int triples) {
    std::string s = "responses = [" + list + "]\n[crystal]\ngroup = \"m-3m\"\n[report]\ndomains = true\n";
    for (int i = 0; i < triples; ++i)
      s += "[[lowering]]\nkind = \"strain\"\nalong = \"[001]\"\n[[lowering]]\nkind = \"strain\"\nalong = \"[111]\"\n"
           "[[lowering]]\nkind = \"moment\"\nalong = \"[110]\"\n";
    return s;
  };
  TempDir dir;
  std::ofstream(dir / "all.toml") << scenario(21); // 63 steps
  const auto r = run_cli({"run", (dir / "all.toml").string(), "-f", "json", "-o", (dir / "all.json").string()});
  REQUIRE(r.exit_code == 0);
  const auto size = std::filesystem::file_size(dir / "all.json");
  CHECK(size > 1000000);
  CHECK(size < 20000000);
  struct rusage usage {};
  getrusage(RUSAGE_CHILDREN, &usage);
#if !defined(__SANITIZE_ADDRESS__) // AddressSanitizer's shadow memory and quarantine raise the peak (850 MB seen)
  CHECK(usage.ru_maxrss < 500 * 1024); // kilobytes: every run of this test so far under 500 MB
#endif
  std::ofstream(dir / "more.toml") << scenario(22); // 66 steps
  const auto refused = run_cli({"run", (dir / "more.toml").string(), "-f", "json"});
  CHECK(refused.exit_code == 5);
  CHECK(has(refused.err, "--max-steps N"));
}

// A '|' in a step label stays in its cell: "\|" in Markdown tables, one cell in HTML.
TEST_CASE("a bar in a label does not split a table cell") {
  TempDir dir;
  std::ofstream(dir / "p.toml") << "responses = [\"conductivity\"]\n[crystal]\ngroup = \"m-3m\"\n[[lowering]]\n"
                                   "kind = \"strain\"\nalong = \"[001]\"\nlabel = \"strain a|b\"\n";
  const auto md = run_cli({"run", (dir / "p.toml").string(), "-f", "markdown"});
  REQUIRE(md.exit_code == 0);
  CHECK(has(md.out, "| 1    | strain a\\|b (strain ∥ [001]) |"));
  const auto html = run_cli({"run", (dir / "p.toml").string(), "-f", "html"});
  REQUIRE(html.exit_code == 0);
  CHECK(has(html.out, "<td>strain a|b (strain ∥ [001])</td><td><code>4/"));
}
