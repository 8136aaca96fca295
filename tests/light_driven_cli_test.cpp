// The pump-probe and photocurrent questions through the CLI: options of
// `sample`, the scenario tables of `run`, every report format, and the
// messages for bad input.
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <fstream>

using ts::test::read_file;
using ts::test::run_cli;
using ts::test::TempDir;

namespace {

std::string example(const std::string& name) { return std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/" + name; }

} // namespace

TEST_CASE("sample --photocurrent: a polar film has no in-plane current at normal incidence", "[light][cli]") {
  // Ganichev & Prettl, J. Phys.: Condens. Matter 15, R935 (2003) [from memory]: in a polar structure the
  // photocurrents need oblique incidence.
  auto normal = run_cli({"sample", "4mm", "--cut", "(001)", "--photocurrent", "0:0", "--pump-polarisations",
                         "linear,circular+"});
  REQUIRE(normal.exit_code == 0);
  CHECK(normal.out.find("Photocurrents: photocurrent (0:0)") != std::string::npos);
  CHECK(normal.out.find("  linear     no            no            none") != std::string::npos);
  CHECK(normal.out.find("  circular+  no            no            none") != std::string::npos);
  auto oblique = run_cli({"sample", "4mm", "--cut", "(001)", "--photocurrent", "45:0", "--pump-polarisations",
                          "circular+", "-f", "json"});
  REQUIRE(oblique.exit_code == 0);
  CHECK(oblique.out.find("\"helicity_odd_y_pair\" : true") != std::string::npos);
  CHECK(oblique.out.find("\"helicity_odd_x_pair\" : false") != std::string::npos);
}

TEST_CASE("sample --pump-probe asks of the final group with the last moment's direction", "[light][cli]") {
  auto r = run_cli({"sample", "mmm", "--z", "[001]", "--x", "[100]", "--lower", "moment:[001]", "--pump-probe", "0:0",
                    "--pump-polarisations", "circular+,circular-"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("order vector l0 [001] = +z") != std::string::npos);
  CHECK(r.out.find("sees circular+") != std::string::npos);
}

TEST_CASE("the light-driven examples in every format", "[light][cli][formats]") {
  TempDir dir;
  for (const char* f : {"text", "markdown", "latex", "json", "html"}) {
    INFO(f);
    const std::string out = (dir / (std::string("pp.") + f)).string();
    auto r = run_cli({"run", example("spin-reorientation-pump-probe.toml"), "-f", f, "-o", out});
    REQUIRE(r.exit_code == 0);
    const std::string text = read_file(out);
    // The HTML page sets the Markdown report's formulas: F_zz as an italic symbol with a subscript.
    const std::string f_zz = std::string(f) == "latex" ? "F_{zz}" : std::string(f) == "html" ? "<i>F</i><sub>zz</sub>" : "F_zz";
    CHECK(text.find(std::string(f) == "json" ? "\"sees\"" : "sees circular+") != std::string::npos);
    CHECK(text.find(f_zz) != std::string::npos);
  }
  const std::string html = read_file(dir / "pp.html");
  CHECK(html.find("<td>pump torque</td>") != std::string::npos);
  const std::string out = (dir / "pc.html").string();
  REQUIRE(run_cli({"run", example("polar-film-photocurrents.toml"), "-f", "html", "-o", out}).exit_code == 0);
  CHECK(read_file(out).find("helicity-odd part read by") != std::string::npos);
}

TEST_CASE("bad pump questions are refused with the place and what is valid", "[light][cli][errors]") {
  auto a = run_cli({"sample", "4mm", "--pump-polarisations", "linear"});
  CHECK(a.exit_code == 2);
  CHECK(a.err.find("--pump-polarisations needs --pump-probe or --photocurrent") != std::string::npos);
  auto b = run_cli({"sample", "4mm", "--cut", "(001)", "--photocurrent", "40"});
  CHECK(b.exit_code == 7);
  CHECK(b.err.find("--photocurrent 40") != std::string::npos);
  auto c = run_cli({"sample", "4mm", "--cut", "(001)", "--photocurrent", "45", "--pump-polarisations", "circular"});
  CHECK(c.exit_code == 2);
  CHECK(c.err.find("circular+, circular-, linear") != std::string::npos);
  auto d = run_cli({"sample", "4mm", "--lower", "moment:[001]", "--pump-probe", "0", "--response", "conductivity"});
  CHECK(d.exit_code == 2);
  CHECK(d.err.find("add inverse-faraday to responses") != std::string::npos);
  // In a file: the table's line, exit 5 for a bad word, 7 for an impossible order vector.
  TempDir dir;
  const auto file = dir / "bad.toml";
  std::ofstream(file) << "responses = [\"inverse-faraday\"]\n[crystal]\ngroup = \"mmm\"\n[sample]\nz = \"[001]\"\n"
                         "[[pump_probe]]\npolarisations = [\"sideways\"]\n";
  auto e = run_cli({"run", file.string()});
  CHECK(e.exit_code == 5);
  CHECK(e.err.find("bad.toml:6") != std::string::npos);
  // A Néel vector along [110] of a cubic crystal magnetised along [001]: the fourfold axis moves it.
  std::ofstream(file) << "responses = [\"inverse-faraday\"]\n[crystal]\ngroup = \"m-3m\"\n[sample]\nz = \"[001]\"\n"
                         "x = \"[110]\"\n[[pump_probe]]\n[[pump_probe.phase]]\nlowering = [\"moment:[001]\"]\n"
                         "order = \"[110]\"\n";
  auto g = run_cli({"run", file.string()});
  CHECK(g.exit_code == 7);
  CHECK(g.err.find("moves the line of the order vector") != std::string::npos);
}
