// The HTML report: one self-contained file (no network, no external script,
// style sheet, font or image) that a real browser renders. Headless Chromium
// (Debian chromium-headless-shell) loads it offline, takes a screenshot and
// dumps the DOM; the screenshot must not be blank, the figures must be in the
// DOM, and the browser must log no console error.
#include "figure/image_ink.hpp"
#include "support/cli_run.hpp"
#include "support/shell_run.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <regex>

using namespace ts;
using ts::test::read_file;
using ts::test::run_cli;
using ts::test::shell;
using ts::test::shell_quote;
using ts::test::TempDir;

namespace {

std::size_t count_of(const std::string& s, const std::string& what) {
  std::size_t n = 0;
  for (std::size_t at = s.find(what); at != std::string::npos; at = s.find(what, at + what.size())) ++n;
  return n;
}

// The browser, offline: no sandbox (tests may run as root), no GPU, no
// background traffic, a fresh profile.
std::string chromium(const TempDir& dir, const std::string& args) {
  return "chromium-headless-shell --no-sandbox --disable-gpu --disable-background-networking --disable-component-update "
         "--disable-sync --no-first-run --user-data-dir=" +
         shell_quote((dir / "profile").string()) + " --enable-logging=stderr --v=0 " + args;
}

} // namespace

TEST_CASE("HTML report: self-contained, rendered by headless Chromium", "[html]") {
  TempDir dir;
  const std::string page = (dir / "report.html").string();
  auto r = run_cli({"sample", "m-3m", "--cut", "(111)", "--response", "electric-dipole-shg", "--response",
                    "second-order-conductivity", "--shg", "reflection:45", "--bar", "rotating:none", "--layout",
                    "second-order-conductivity:2", "-f", "html", "-o", page});
  REQUIRE(r.exit_code == 0);
  const std::string html = read_file(page);
  CHECK(html.rfind("<!DOCTYPE html>", 0) == 0);
  // Nothing to fetch: no script or link elements, no src attributes, no url() to another file.
  CHECK(html.find("<script") == std::string::npos);
  CHECK(html.find("<link") == std::string::npos);
  CHECK(html.find(" src=") == std::string::npos);
  CHECK(html.find("@import") == std::string::npos);
  CHECK(std::regex_search(html, std::regex("url\\((?!#)")) == false);
  CHECK(count_of(html, "<svg") >= 3);
  CHECK(html.find("χ<sub>") != std::string::npos); // formulas with subscripts
  CHECK(html.find("laser") != std::string::npos);  // the safety notes in the footer
  CHECK(html.find("laser-safety officer") != std::string::npos);

  const std::string url = "file://" + page;
  const std::string shot = (dir / "shot.png").string();
  REQUIRE(shell("command -v chromium-headless-shell >/dev/null") == 0); // installed by scripts/setup --with-tests
  const int rc = shell("cd " + shell_quote(dir.path().string()) + " && timeout 120 " +
                       chromium(dir, "--window-size=1280,9000 --screenshot=" + shell_quote(shot) + " " + shell_quote(url)) +
                       " >" + shell_quote((dir / "shot.out").string()) + " 2>" + shell_quote((dir / "shot.err").string()));
  INFO(read_file(dir / "shot.err"));
  REQUIRE(rc == 0);
  ImageInk ink = png_ink(read_file(shot), "the screenshot");
  CHECK(ink.width == 1280);
  CHECK(ink.ink > 0.01);          // text and figures, not a blank page
  CHECK(ink.coloured > 0.0005);   // the coloured curves of the figures
  const std::string log = read_file(dir / "shot.err");
  CHECK(log.find("CONSOLE") == std::string::npos); // no console message at all, errors included
  CHECK(log.find("ERR_FILE_NOT_FOUND") == std::string::npos);

  REQUIRE(shell("timeout 120 " + chromium(dir, "--dump-dom " + shell_quote(url)) + " >" +
                shell_quote((dir / "dom.html").string()) + " 2>" + shell_quote((dir / "dom.err").string())) == 0);
  const std::string dom = read_file(dir / "dom.html");
  CHECK(count_of(dom, "<figure") >= 3);
  CHECK(dom.find("<section id=\"summary\">") != std::string::npos);
  CHECK(dom.find("Summary and verdicts") != std::string::npos);
  CHECK(std::regex_search(dom, std::regex("<td>second-order-conductivity</td><td>[^<]*</td><td>[0-9 →]+</td><td>[a-z]")));
  CHECK(dom.find("Symmetry chain") == std::string::npos); // one chain, the writers', not a second one of the page's own
  CHECK(count_of(dom, "symmetry chain") == 2);             // in the summary and in the report
  CHECK(count_of(dom, "<svg") >= 3);
  CHECK(dom.find("Second-harmonic polarimetry") != std::string::npos);
}

TEST_CASE("HTML report from a scenario file, and formats other commands refuse", "[html]") {
  TempDir dir;
  auto r = run_cli({"run", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml", "-f", "html"},
                   {{"SOURCE_DATE_EPOCH", "1767225600"}});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("Hall bars</h") != std::string::npos);
  CHECK(r.out.find("</html>") != std::string::npos);
  // Everything the text report has: the same writer's sections, one by one.
  const auto text = run_cli({"run", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml"});
  for (const char* section : {"symmetry chain", "verdicts after step", "domains: ", "lock-in readings", "Hall test",
                              "bar layout", "average over"}) {
    INFO(section);
    CHECK(r.out.find(section) != std::string::npos);
  }
  CHECK(text.out.find("lock-in readings") != std::string::npos);
  // Version, date and command; no path of this machine.
  CHECK(std::regex_search(r.out, std::regex("tensorsieve [0-9.]+, 2026-01-01; command: <code>tensorsieve run "
                                            "strained-film.toml -f html</code>")));
  CHECK(r.out.find(TENSORSIEVE_SOURCE_DIR) == std::string::npos);
  CHECK(r.out.find("/tmp/") == std::string::npos);
  auto bad = run_cli({"form", "4mm", "V", "-f", "html"});
  CHECK(bad.exit_code != 0);
}
