// Every LaTeX output is pure ASCII plus LaTeX commands, and, when pdflatex is installed
// (Debian texlive-latex-base, listed by scripts/setup --with-tests), compiles: every
// example scenario, every catalogue response, and the other reports, in one document.
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <sstream>

namespace fs = std::filesystem;
using ts::test::run_cli;

namespace {

std::vector<std::string> response_ids() {
  const auto r = run_cli({"responses", "-f", "json"});
  std::vector<std::string> ids;
  const std::string key = "\"id\" : \"";
  for (std::size_t p = r.out.find(key); p != std::string::npos; p = r.out.find(key, p + 1)) {
    std::size_t start = p + key.size();
    ids.push_back(r.out.substr(start, r.out.find('"', start) - start));
  }
  return ids;
}

std::vector<std::vector<std::string>> latex_commands() {
  std::vector<std::vector<std::string>> cmds;
  for (const auto& e : fs::directory_iterator(fs::path(TENSORSIEVE_SOURCE_DIR) / "examples"))
    if (e.path().extension() == ".toml") cmds.push_back({"run", e.path().string()});
  for (const auto& id : response_ids())
    for (const char* g : {"m-3m", "4m'm'"}) cmds.push_back({"response", id, g});
  cmds.push_back({"form", "4mm", "V[V2]", "--z", "[110]", "--x", "[001]"});
  cmds.push_back({"form", "m-3m", "[[V2]2]", "--z", "[111]", "--x", "[1-10]"});
  cmds.push_back({"group", "4mm", "--subgroups"});
  cmds.push_back({"groups", "-m"});
  cmds.push_back({"survey", "aeV", "-m"});
  cmds.push_back({"identify", "3+ [111]", "m [1-10]"});
  cmds.push_back({"responses"});
  cmds.push_back({"sample", "m-3m", "--cut", "(110)", "--lower", "moment:[001]", "--response", "anomalous-hall",
                  "--domains"});
  // Every response at once: catalogue descriptions with ^ and k-hat, coefficients such
  // as -3 inside displayed math, long relation lists and wide matrices.
  cmds.push_back({"sample", "m-3m", "--cut", "(111)", "--response", "all"});
  cmds.push_back({"groups"});
  return cmds;
}

} // namespace

TEST_CASE("LaTeX output: ASCII only, and pdflatex compiles it", "[latex][formats]") {
  std::ostringstream doc, examples;
  doc << "\\documentclass{article}\n\\usepackage{amsmath}\n\\begin{document}\n";
  examples << doc.str();
  int fragments = 0;
  for (auto cmd : latex_commands()) {
    std::string label;
    for (const auto& a : cmd) label += a + " ";
    INFO(label);
    cmd.insert(cmd.end(), {"-f", "latex"});
    const auto r = run_cli(cmd);
    REQUIRE(r.exit_code == 0);
    bool ascii = true;
    for (unsigned char c : r.out) ascii = ascii && c < 128;
    CHECK(ascii);
    doc << "\\clearpage\n" << r.out << "\n";
    if (cmd[0] == "run") examples << "\\clearpage\n" << r.out << "\n";
    ++fragments;
  }
  doc << "\\end{document}\n";
  examples << "\\end{document}\n";
  CHECK(fragments > 40);
  if (std::system("command -v pdflatex >/dev/null 2>&1") != 0) {
    WARN("pdflatex not installed: only the ASCII check ran (scripts/setup --with-tests installs it)");
    return;
  }
  ts::test::TempDir dir;
  std::ofstream(dir / "all.tex") << doc.str();
  std::ofstream(dir / "examples.tex") << examples.str();
  const std::string cmd = "cd " + ts::test::shell_quote(dir.path().string()) +
                          " && pdflatex -interaction=nonstopmode -halt-on-error all.tex >log.txt 2>&1";
  const int rc = std::system(cmd.c_str());
  INFO(ts::test::read_file(dir / "log.txt").substr(0, 6000));
  CHECK(rc == 0);
  CHECK(fs::exists(dir / "all.pdf"));
  const std::string all_log = ts::test::read_file(dir / "all.log");
  CHECK(all_log.find("\n! ") == std::string::npos); // no TeX error anywhere
  // Every report, not only the examples: tables and displays fit the page.
  std::size_t all_overfull = 0;
  for (std::size_t p = all_log.find("Overfull \\"); p != std::string::npos; p = all_log.find("Overfull \\", p + 1)) {
    if (all_overfull < 5) UNSCOPED_INFO(all_log.substr(p, 400));
    ++all_overfull;
  }
  CHECK(all_overfull == 0);
  // The reports of the examples as a paper would include them: tables fit the page and
  // no line runs into the margin, not one overfull box.
  REQUIRE(std::system(("cd " + ts::test::shell_quote(dir.path().string()) +
                       " && pdflatex -interaction=nonstopmode -halt-on-error examples.tex >log2.txt 2>&1")
                          .c_str()) == 0);
  const std::string log = ts::test::read_file(dir / "examples.log");
  std::size_t overfull = 0;
  for (std::size_t p = log.find("Overfull \\"); p != std::string::npos; p = log.find("Overfull \\", p + 1)) {
    if (overfull < 5) UNSCOPED_INFO(log.substr(p, 400));
    ++overfull;
  }
  CHECK(overfull == 0);
  CHECK(log.find("\n! ") == std::string::npos);
}

TEST_CASE("LaTeX output: overbars, options kept whole, every string escaped", "[latex][formats]") {
  // common practice: Hermann-Mauguin symbols are typeset with overbars, m\bar{3}m
  const auto chain = run_cli({"sample", "m-3m", "--cut", "(111)", "--response", "pyroelectric", "-f", "latex"});
  REQUIRE(chain.exit_code == 0);
  CHECK_THAT(chain.out, Catch::Contains("$\\mathrm{m\\bar{3}m1'}$"));
  CHECK_THAT(chain.out, !Catch::Contains("m-3m"));
  // "--format" would be set as an en dash and "format"
  const auto many = run_cli({"sample", "m-3m", "--response", "all", "-f", "latex"});
  REQUIRE(many.exit_code == 0);
  std::size_t bare = 0;
  for (std::size_t p = many.out.find("--"); p != std::string::npos; p = many.out.find("--", p + 2)) {
    const std::size_t line = many.out.rfind('\n', p) + 1;
    if (many.out[line] != '%' && many.out.compare(p, 3, "---") != 0) ++bare;
  }
  CHECK(bare == 0);
  // A title with every character LaTeX treats specially.
  ts::test::TempDir dir;
  std::ofstream(dir / "odd.toml") << "title = \"50% & more: x_1 #2 ~{a}^b $ \\\\ end\"\nresponses = [\"pyroelectric\"]\n"
                                     "[crystal]\ngroup = \"4mm\"\n";
  const auto odd = run_cli({"run", (dir / "odd.toml").string(), "-f", "latex"});
  REQUIRE(odd.exit_code == 0);
  CHECK_THAT(odd.out, Catch::Contains("50\\% \\& more: x\\_1 \\#2 \\textasciitilde{}\\{a\\}\\textasciicircum{}b \\$ "
                                      "\\textbackslash{} end"));
}
