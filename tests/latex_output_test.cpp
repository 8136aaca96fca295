// Every LaTeX output is pure ASCII plus LaTeX commands, and, when pdflatex is installed
// (Debian texlive-latex-base, listed by scripts/setup --with-tests), compiles: every
// example scenario, every catalogue response, and the other reports, in one document.
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
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
  return cmds;
}

} // namespace

TEST_CASE("LaTeX output: ASCII only, and pdflatex compiles it", "[latex][formats]") {
  std::ostringstream doc;
  doc << "\\documentclass{article}\n\\usepackage{amsmath}\n\\begin{document}\n";
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
    ++fragments;
  }
  doc << "\\end{document}\n";
  CHECK(fragments > 40);
  if (std::system("command -v pdflatex >/dev/null 2>&1") != 0) {
    WARN("pdflatex not installed: only the ASCII check ran (scripts/setup --with-tests installs it)");
    return;
  }
  ts::test::TempDir dir;
  std::ofstream(dir / "all.tex") << doc.str();
  const std::string cmd = "cd " + ts::test::shell_quote(dir.path().string()) +
                          " && pdflatex -interaction=nonstopmode -halt-on-error all.tex >log.txt 2>&1";
  const int rc = std::system(cmd.c_str());
  INFO(ts::test::read_file(dir / "log.txt").substr(0, 6000));
  CHECK(rc == 0);
  CHECK(fs::exists(dir / "all.pdf"));
}
