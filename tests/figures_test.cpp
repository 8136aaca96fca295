// Figures drawn with cairo: every file parses (SVG as XML, PDF by poppler),
// renders with an independent renderer (librsvg's rsvg-convert, poppler's
// pdftoppm) to an image that is not blank, carries a caption file stating the
// illustrative values, and the sampled curves put their extrema where the
// exact expressions say.
#include "figure/figure_data.hpp"
#include "figure/figure_draw.hpp"
#include "figure/image_ink.hpp"
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"
#include "support/shell_run.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>

using namespace ts;
using ts::test::read_file;
using ts::test::run_cli;
using ts::test::shell;
using ts::test::shell_quote;
using ts::test::TempDir;

namespace {

// Local maxima of a sampled periodic curve (x in degrees, last sample = first).
std::vector<double> maxima(const Curve& c) {
  std::vector<double> out;
  const std::size_t n = c.y.size() - 1;
  for (std::size_t i = 0; i < n; ++i) {
    const double prev = c.y[(i + n - 1) % n], next = c.y[(i + 1) % n];
    if (c.y[i] > prev && c.y[i] >= next) out.push_back(c.x[i]);
  }
  return out;
}

} // namespace

TEST_CASE("figure files: SVG is XML, PDF and SVG render to non-blank images, captions say illustrative", "[figures]") {
  TempDir dir;
  auto r = run_cli({"sample", "m-3m", "--cut", "(111)", "--response", "electric-dipole-shg", "--response",
                    "second-order-conductivity", "--shg", "reflection:45", "--bar", "rotating:none", "--layout",
                    "second-order-conductivity:2", "--figures", (dir / "fig").string(), "--figure-format", "svg,pdf,png",
                    "--figure-value", "chi_zzz=0.5"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.err.find("wrote") != std::string::npos);
  std::vector<std::string> stems;
  for (const auto& e : std::filesystem::directory_iterator(dir / "fig")) {
    const std::string name = e.path().filename().string();
    if (name.size() > 4 && name.compare(name.size() - 4, 4, ".svg") == 0) stems.push_back(name.substr(0, name.size() - 4));
  }
  std::sort(stems.begin(), stems.end());
  REQUIRE(stems.size() >= 3);
  CHECK(std::any_of(stems.begin(), stems.end(), [](const std::string& s) { return s.rfind("shg-", 0) == 0; }));
  CHECK(std::any_of(stems.begin(), stems.end(), [](const std::string& s) { return s.rfind("bar-", 0) == 0; }));
  CHECK(std::any_of(stems.begin(), stems.end(), [](const std::string& s) { return s.rfind("layout-", 0) == 0; }));
  for (const auto& stem : stems) {
    INFO(stem);
    const auto base = dir / "fig" / stem;
    const std::string caption = read_file(base.string() + ".caption.txt");
    CHECK(caption.find("not") != std::string::npos);
    if (stem.rfind("layout-", 0) != 0) CHECK(caption.find("illustrative") != std::string::npos);
    // SVG parses as XML (Python's standard parser, an outside check).
    CHECK(shell("python3 -c " + shell_quote("import sys, xml.dom.minidom; xml.dom.minidom.parse(sys.argv[1])") + " " +
                shell_quote(base.string() + ".svg")) == 0);
    // librsvg draws the SVG, poppler draws the PDF; our own PNG is checked too.
    REQUIRE(shell("rsvg-convert -o " + shell_quote(base.string() + ".rsvg.png") + " " + shell_quote(base.string() + ".svg")) == 0);
    REQUIRE(shell("pdftoppm -png -r 72 -singlefile " + shell_quote(base.string() + ".pdf") + " " +
                  shell_quote(base.string() + ".poppler")) == 0);
    for (const char* png : {".rsvg.png", ".poppler.png", ".png"}) {
      INFO(png);
      ImageInk ink = png_ink(read_file(base.string() + png), stem + png);
      CHECK(ink.width > 100);
      CHECK(ink.ink > 0.01); // axes, curves and labels
      CHECK(ink.ink < 0.6);  // not a filled page
      CHECK(ink.coloured > 0.0005); // the curves or bars are in colour
    }
  }
  // An unknown parameter name or format is refused before any file is written.
  auto bad = run_cli({"sample", "m-3m", "--cut", "(111)", "--shg", "reflection:45", "--figures",
                      (dir / "bad").string(), "--figure-value", "chi_qqq=1"});
  CHECK(bad.exit_code != 0);
  CHECK(bad.err.find("chi_qqq") != std::string::npos);
  CHECK_FALSE(std::filesystem::exists(dir / "bad"));
  auto fmt = run_cli({"sample", "m-3m", "--cut", "(111)", "--shg", "reflection:45", "--figures", (dir / "bad").string(),
                      "--figure-format", "gif"});
  CHECK(fmt.exit_code != 0);
  CHECK(fmt.err.find("svg, pdf or png") != std::string::npos);
}

// At normal incidence the 3m face gives PP ∝ sin²3φ and SS ∝ cos²3φ (the exact
// amplitudes: tests/optics_shg_test.cpp), so the plotted PP curve peaks at
// φ = 30° + 60°k and SS at φ = 60°k (Tom, Heinz and Shen, PRL 51, 1983 (1983), from memory).
TEST_CASE("the plotted RA-SHG curves peak where the exact expression says", "[figures]") {
  Scenario sc;
  sc.group = "m-3m";
  sc.cut = "(111)";
  sc.responses = {"electric-dipole-shg"};
  ShgSpec s;
  s.name = "normal incidence";
  s.incidence = "0";
  s.channels = {"PP", "SS"};
  sc.shg.push_back(s);
  ScenarioResult r = run_scenario(sc);
  std::vector<FigureData> figs = scenario_figures(r, FigureSettings{});
  REQUIRE_FALSE(figs.empty());
  const FigureData& f = figs.front();
  REQUIRE(f.kind == FigureKind::polar);
  REQUIRE(f.panels.size() == 2);
  CHECK(maxima(f.panels[0][0]) == std::vector<double>{30, 90, 150, 210, 270, 330});
  CHECK(maxima(f.panels[1][0]) == std::vector<double>{0, 60, 120, 180, 240, 300});
  // JSON carries the same samples as the picture.
  auto j = run_cli({"sample", "m-3m", "--cut", "(111)", "--shg", "reflection:0", "--shg-channels", "PP,SS",
                    "--figure-incidence", "45", "-f", "json"});
  REQUIRE(j.exit_code == 0);
  CHECK(j.out.find("\"figures\"") != std::string::npos);
  CHECK(j.out.find("\"x_step_deg\"") != std::string::npos);
}

// The figures are computed once and handed to every writer (report_figures): the
// JSON samples, the text list and the HTML pictures name the same figures, and a
// [figures] value no figure uses fails the same way whatever the format.
TEST_CASE("every report format carries the same figures, and refuses a bad [figures] value alike", "[figures]") {
  TempDir dir;
  const std::string example = std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/magnetised-film-optics.toml";
  std::string text = read_file(example);
  const std::size_t at = text.find("[figures]\n");
  REQUIRE(at != std::string::npos);
  const std::string bad_path = (dir / "bad-values.toml").string();
  {
    std::ofstream bad(bad_path);
    bad << text.substr(0, at) << "[figures]\nvalues = { chi_qqq = 1 }\n" << text.substr(at + 10);
  }
  for (const char* format : {"text", "markdown", "latex", "json", "html"}) {
    INFO(format);
    auto r = run_cli({"run", bad_path, "-f", format});
    CHECK(r.exit_code == 2);
    CHECK(r.err.find("no figure has a parameter 'chi_qqq'") != std::string::npos);
    CHECK(r.err.find("bad-values.toml") != std::string::npos);
    CHECK(r.out.empty());
  }

  auto json = run_cli({"run", example, "-f", "json"});
  REQUIRE(json.exit_code == 0);
  std::vector<std::string> stems;
  for (std::size_t p = json.out.find("\"file_stem\""); p != std::string::npos; p = json.out.find("\"file_stem\"", p + 1)) {
    const std::size_t open = json.out.find('"', json.out.find(':', p)) + 1;
    stems.push_back(json.out.substr(open, json.out.find('"', open) - open));
  }
  REQUIRE(stems.size() == 7); // three SHG setups, their sources (examples/magnetised-film-optics.toml)
  auto listed = run_cli({"run", example, "-f", "markdown"});
  REQUIRE(listed.exit_code == 0);
  const std::size_t list = listed.out.find("## figures");
  REQUIRE(list != std::string::npos);
  for (const auto& s : stems) CHECK(listed.out.find("`" + s + "`", list) != std::string::npos);
  auto page = run_cli({"run", example, "-f", "html"});
  REQUIRE(page.exit_code == 0);
  std::size_t pictures = 0;
  for (std::size_t p = page.out.find("<figure id=\"figure-"); p != std::string::npos; p = page.out.find("<figure id=\"figure-", p + 1))
    ++pictures;
  CHECK(pictures == stems.size());
  // A scenario without [figures]: no figures in JSON or text, but the page draws them.
  const std::string plain = std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml";
  CHECK(run_cli({"run", plain, "-f", "json"}).out.find("\"figures\"") == std::string::npos);
  CHECK(run_cli({"run", plain, "-f", "markdown"}).out.find("## figures") == std::string::npos);
  CHECK(run_cli({"run", plain, "-f", "html"}).out.find("<figure id=\"figure-1\"") != std::string::npos);
}
