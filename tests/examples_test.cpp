// Every worked example in examples/ runs through the CLI and reproduces its
// recorded report byte for byte (canonical output: same input, same bytes).
// The recorded reports were checked by hand against the lowering rules of
// docs/scenarios.md; their physics is tested with named sources elsewhere.
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <sys/wait.h>

namespace fs = std::filesystem;

namespace {
std::string slurp(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}
} // namespace

TEST_CASE("worked examples reproduce their recorded reports", "[examples][cli]") {
  fs::path src(TENSORSIEVE_SOURCE_DIR);
  int count = 0;
  for (const auto& e : fs::directory_iterator(src / "examples")) {
    if (e.path().extension() != ".toml") continue;
    fs::path expected = e.path();
    expected.replace_extension(".expected");
    if (!fs::exists(expected)) continue;
    ++count;
    ts::test::TempDir dir; // unique per run: parallel ctest runs never share a file
    fs::path out = dir / (e.path().stem().string() + ".txt");
    std::string cmd = "cd '" + src.string() + "' && '" TENSORSIEVE_BINARY "' run 'examples/" +
                      e.path().filename().string() + "' --output '" + out.string() + "'";
    int rc = std::system(cmd.c_str());
    INFO(cmd);
    REQUIRE(WIFEXITED(rc));
    REQUIRE(WEXITSTATUS(rc) == 0);
    CHECK(slurp(out) == slurp(expected));
    fs::remove(out);
  }
  CHECK(count >= 1);
}

TEST_CASE("the one-off sample command builds the same scenario as a file", "[examples][cli]") {
  // examples/strained-film.toml written as options: the chain and forms must agree.
  fs::path src(TENSORSIEVE_SOURCE_DIR);
  ts::test::TempDir dir;
  fs::path a = dir / "sample-a.json";
  fs::path b = dir / "sample-b.json";
  std::string run = "cd '" + src.string() + "' && '" TENSORSIEVE_BINARY "' run examples/strained-film.toml -f json -o '" +
                    a.string() + "'";
  std::string sample = "'" TENSORSIEVE_BINARY "' sample m-3m --a 3.95 --cut '(001)' --x '[100]' --lower 'strain:[100]' "
                       "--lower 'magnetic-field:[100]' --response anomalous-hall --response second-order-conductivity "
                       "--response magnetochiral-anisotropy --bar 'rotating:[100]' --layout second-order-conductivity:2 "
                       "--rosette 0,45,90,135 --domains -f json -o '" + b.string() + "'";
  REQUIRE(std::system(run.c_str()) == 0);
  REQUIRE(std::system(sample.c_str()) == 0);
  std::string ja = slurp(a), jb = slurp(b);
  // Titles, sources and step labels differ; the groups and forms must not.
  auto chain_types = [](const std::string& j) {
    std::string out;
    for (std::size_t p = j.find("\"type\""); p != std::string::npos; p = j.find("\"type\"", p + 1))
      out += j.substr(p, j.find(',', p) - p) + ";";
    return out;
  };
  CHECK(chain_types(ja) == chain_types(jb));
  CHECK(ja.find("\"independent\"") != std::string::npos);
  fs::remove(a);
  fs::remove(b);
}

TEST_CASE("a scenario report comes in every format", "[examples][cli][formats]") {
  // JSON parses (Python's json module, a reference parser), Markdown has tables,
  // LaTeX is plain ASCII with the Unicode symbols as \ensuremath commands (pdflatex-safe).
  fs::path src(TENSORSIEVE_SOURCE_DIR);
  ts::test::TempDir dir;
  auto run = [&](const std::string& fmt) {
    fs::path out = dir / ("example." + fmt);
    std::string cmd = "cd '" + src.string() + "' && '" TENSORSIEVE_BINARY "' run examples/strained-film.toml -f " +
                      fmt + " -o '" + out.string() + "'";
    REQUIRE(std::system(cmd.c_str()) == 0);
    std::string text = slurp(out);
    fs::remove(out);
    return text;
  };
  std::string json = run("json");
  fs::path jpath = dir / "example-check.json";
  std::ofstream(jpath) << json;
  std::string check = "python3 -c \"import json,sys; d=json.load(open(sys.argv[1])); "
                      "assert d['chain'] and d['parts'] and 'switched_on' in d['parts'][0]['changes'][0]\" '" +
                      jpath.string() + "'";
  CHECK(std::system(check.c_str()) == 0);
  fs::remove(jpath);
  std::string md = run("markdown");
  CHECK(md.find("| step |") != std::string::npos);
  CHECK(md.find("switched on") != std::string::npos);
  std::string tex = run("latex");
  CHECK(tex.find("\\begin{tabular}") != std::string::npos);
  CHECK(tex.find("\\ensuremath{\\parallel}") != std::string::npos);
  bool ascii = true;
  for (unsigned char c : tex) ascii = ascii && c < 128;
  CHECK(ascii);
}
