// Values a careless or hostile user may give: LaTeX-special text in labels, a
// zero volume fraction, and the bounds on work (lowering steps, atoms in a
// cell) with the options that lift them. The refusals themselves are cases of
// the bad-input corpus (tests/bad_input/cases.txt).
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <fstream>

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
