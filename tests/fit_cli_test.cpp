// `tensorsieve fit`: the example scan end to end, the formats, and bad input
// (located messages, non-zero exits, nothing on standard output).
#include "report/html_math.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <fstream>
#include <sstream>

using ts::test::run_cli;

namespace {

const std::string kExample = std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/threefold-film-scan.toml";

void write(const std::filesystem::path& p, const std::string& text) {
  std::ofstream out(p, std::ios::binary);
  out << text;
}

const std::string kScenario =
    ts::test::read_file(std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/data/fit-threefold-film.toml") +
    "[[fit]]\ndata = \"scan.csv\"\nharmonic = 2\n";

// The HTML page shows every line of the Markdown report from the first fit on:
// headings and paragraphs by their text, table rows cell by cell.
void check_page_shows_markdown(const std::string& md, const std::string& html) {
  const std::size_t first = md.find("### fit: ");
  REQUIRE(first != std::string::npos);
  std::istringstream in(md.substr(first));
  std::string line;
  while (std::getline(in, line)) {
    if (line.empty() || line.find_first_not_of("|- :") == std::string::npos) continue; // table rules
    INFO(line);
    if (line[0] != '|') {
      CHECK(html.find(ts::html_escape(line.substr(line.find_first_not_of("# ")))) != std::string::npos);
      continue;
    }
    std::istringstream row(line.substr(1));
    std::string cell;
    while (std::getline(row, cell, '|')) {
      const std::size_t a = cell.find_first_not_of(' '), b = cell.find_last_not_of(' ');
      if (a == std::string::npos) continue;
      CHECK(html.find(">" + ts::html_escape(cell.substr(a, b - a + 1)) + "</t") != std::string::npos);
    }
  }
}

} // namespace

TEST_CASE("fit: the invented example scan requires lowering the threefold film", "[fit][cli]") {
  auto r = run_cli({"fit", kExample});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("scan fits: Invented (111) film") != std::string::npos);
  CHECK(r.out.find("ranking (lowest AIC first") != std::string::npos);
  CHECK(r.out.find("symmetry breaking: the data require lowering 3m1'") != std::string::npos);
  CHECK(r.out.find("highest symmetry not rejected: m1' (mirror ⊥ [1-10])") != std::string::npos);
  for (const char* format : {"markdown", "latex", "json"}) {
    auto f = run_cli({"fit", kExample, "--format", format});
    INFO(format << ": " << f.err);
    CHECK(f.exit_code == 0);
    CHECK(f.out.find("m1'") != std::string::npos);
  }
  auto h = run_cli({"fit", kExample, "--format", "html"});
  CHECK(h.exit_code == 0);
  CHECK(h.out.rfind("<!DOCTYPE html>", 0) == 0);
  CHECK(h.out.find("<h3>verdict</h3>") != std::string::npos);
  CHECK(h.out.find("<svg") != std::string::npos);
  auto j = run_cli({"fit", kExample, "--format", "json"});
  CHECK(j.out.rfind("{", 0) == 0);
  CHECK(j.out.find("\"akaike_weight\"") != std::string::npos);
}

TEST_CASE("fit: a scan that does not parse stops the fit with its position", "[fit][cli]") {
  ts::test::TempDir dir;
  write(dir / "film.toml", kScenario);
  write(dir / "scan.csv", "phi_deg, Y_uV\n0, 1.0\n30, 0,5\n");
  auto r = run_cli({"fit", (dir / "film.toml").string()});
  CHECK(r.exit_code == 5);
  CHECK(r.out.empty());
  CHECK(r.err.find("scan.csv:3:") != std::string::npos);
  CHECK(r.err.find("decimal comma") != std::string::npos);

  write(dir / "scan.csv", "B_T, Y_uV\n0, 1.0\n");
  r = run_cli({"fit", (dir / "film.toml").string()});
  CHECK(r.exit_code == 5);
  CHECK(r.err.find("the bar's geometry turns phi during the scan, and the file has no column for it") != std::string::npos);

  write(dir / "scan.csv", "phi_deg, X_uV\n0, 1.0\n");
  r = run_cli({"fit", (dir / "film.toml").string()});
  CHECK(r.exit_code == 5);
  CHECK(r.err.find("Y (quadrature)") != std::string::npos);

  std::filesystem::remove(dir / "scan.csv");
  r = run_cli({"fit", (dir / "film.toml").string()});
  CHECK(r.exit_code == 5);
  CHECK(r.err.find("cannot read the scan file") != std::string::npos);
}

TEST_CASE("fit: bad options are usage errors", "[fit][cli]") {
  auto r = run_cli({"fit", kExample, "--data", "x.csv", "--harmonic", "9"});
  CHECK(r.exit_code == 2);
  r = run_cli({"fit", kExample, "--data", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/threefold-film-scan.csv",
               "--probe", "diagonal"});
  CHECK(r.exit_code == 2);
  CHECK(r.err.find("unknown probe 'diagonal'") != std::string::npos);
}

TEST_CASE("fit: --figures writes the data with the best fits and the residuals", "[fit][cli][figures]") {
  ts::test::TempDir dir;
  auto r = run_cli({"fit", kExample, "--figures", (dir / "figs").string()});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  for (const char* name : {"fit-1-data.svg", "fit-1-data.pdf", "fit-1-residuals.svg", "fit-1-residuals.pdf",
                           "fit-1-data.caption.txt"}) {
    INFO(name);
    CHECK(std::filesystem::exists(dir / "figs" / name));
  }
  const std::string svg = ts::test::read_file(dir / "figs" / "fit-1-data.svg");
  CHECK(svg.find("<svg") != std::string::npos);
}

TEST_CASE("fit: the HTML page shows every section of the Markdown report", "[fit][cli][html]") {
  // The example: the models shown, with their coefficients, what each measures, the
  // functions, the degenerate combinations, the verdict's origin and the F-tests' "vs".
  auto md = run_cli({"fit", kExample, "--format", "markdown"});
  auto html = run_cli({"fit", kExample, "--format", "html"});
  INFO(md.err << html.err);
  REQUIRE(md.exit_code == 0);
  REQUIRE(html.exit_code == 0);
  for (const char* part : {"#### model of m1' (mirror ⊥ [1-10])", "| coefficient |", "| ± (1σ)  | measures",
                           "functions: cos(phi); cos(3*phi)", "degenerate: ", " vs m' (mirror' ⊥ [01-1])",
                           "(subgroup of 3m1'"}) {
    INFO(part);
    CHECK(md.out.find(part) != std::string::npos);
  }
  check_page_shows_markdown(md.out, html.out);
  CHECK(html.out.find("id=\"stamp\">tensorsieve ") != std::string::npos);

  // Four angles cannot separate cos φ from cos 3φ: the models with both are not
  // fitted, and every format says why.
  ts::test::TempDir dir;
  write(dir / "film.toml", kScenario);
  write(dir / "scan.csv", "phi_deg, Y_uV, sigma_uV\n0, 1.0, 0.1\n90, 0.02, 0.1\n180, -0.97, 0.1\n270, 0.01, 0.1\n");
  md = run_cli({"fit", (dir / "film.toml").string(), "--format", "markdown"});
  html = run_cli({"fit", (dir / "film.toml").string(), "--format", "html"});
  auto text = run_cli({"fit", (dir / "film.toml").string()});
  INFO(md.err << html.err);
  REQUIRE(md.exit_code == 0);
  REQUIRE(html.exit_code == 0);
  const std::string reason = "not fitted: the scan's angles cannot separate cos(phi), cos(3*phi)";
  CHECK(md.out.find(reason) != std::string::npos);
  CHECK(text.out.find(reason) != std::string::npos);
  CHECK(html.out.find(ts::html_escape(reason)) != std::string::npos);
  check_page_shows_markdown(md.out, html.out);
}

TEST_CASE("fit: the figures draw the models the reports show, the accepted hypothesis first", "[fit][cli][figures]") {
  ts::test::TempDir dir;
  auto r = run_cli({"fit", kExample, "--figures", (dir / "figs").string()});
  REQUIRE(r.exit_code == 0);
  const std::string caption = ts::test::read_file(dir / "figs" / "fit-1-data.caption.txt");
  INFO(caption);
  // The accepted hypothesis, named first, then the others the text shows a model of.
  const std::size_t accepted = caption.find("m1' (mirror ⊥ [1-10])");
  CHECK(accepted != std::string::npos);
  CHECK(caption.find("m1' (mirror ⊥ [01-1])") > accepted);
  CHECK(caption.find("m' (mirror' ⊥ [01-1])") != std::string::npos);
  CHECK(caption.find("3m1' (3") == std::string::npos); // ranked fourth, not accepted: not drawn
}

TEST_CASE("fit: reports name the scan as the scenario does, without this machine's folders", "[fit][cli]") {
  // The scenario given by its absolute path: its scan is read from beside it, and every
  // format names the scan as the scenario file does (threefold-film-scan.csv).
  const std::string scenario = std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/threefold-film-scan.toml";
  for (const char* format : {"text", "markdown", "latex", "json", "html"}) {
    INFO(format);
    auto r = run_cli({"fit", scenario, "-f", format});
    REQUIRE(r.exit_code == 0);
    CHECK(r.out.find("threefold-film-scan.csv") != std::string::npos);
    CHECK(r.out.find(TENSORSIEVE_SOURCE_DIR) == std::string::npos);
  }
  // --data: the file as typed.
  auto d = run_cli({"fit", scenario, "--data", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/threefold-film-scan.csv",
                    "--harmonic", "2", "--bar-geometry", "rotating:none"});
  INFO(d.err);
  REQUIRE(d.exit_code == 0);
  CHECK(d.out.find("data: " + std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/threefold-film-scan.csv") !=
        std::string::npos);
}
