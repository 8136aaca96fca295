// Verdicts that answer the question asked: each headline of a scenario report
// says what was evaluated, in which group and in which field, and a part the
// reader cannot measure the way the section suggests says so in words.
//
// Physics behind the checks, each from the named sources:
// - a multidomain sample shows the average of its variants, which keeps only what
//   the parent group allows (Janovec & Přívratská, International Tables for
//   Crystallography Vol. D, ch. 3.4, from memory); a field applied to the whole
//   sample acts on every variant (common practice);
// - the spontaneous (anomalous) Hall vector needs magnetic order; in a
//   non-magnetic crystal a Hall vector appears only through the applied field,
//   the ordinary (and in-plane) Hall effect (Nagaosa, Sinova, Onoda, MacDonald &
//   Ong, Rev. Mod. Phys. 82, 1539 (2010), from memory);
// - a ferromagnetic moment is an axial, time-odd vector: in 4/mm'm' (cubic crystal
//   magnetised along [100]) it may lie along [100] only (Birss, Symmetry and
//   Magnetism, 1964, from memory);
// - unidirectional magnetoresistance is odd in the magnetisation M, read through
//   its in-plane direction (Avci et al., Nat. Phys. 11, 570 (2015), from memory).
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"
#include "support/json_value.hpp"

#include <catch2/catch.hpp>

#include <filesystem>

using namespace ts;
using namespace ts::test;

namespace {

bool has(const std::string& text, const std::string& what) { return text.find(what) != std::string::npos; }

} // namespace

TEST_CASE("a Kerr magnetisation the group does not allow is warned about, with the direction it allows", "[wording][kerr]") {
  // A cubic crystal magnetised along [100]: the moment may lie along [100] only.
  CliResult wrong = run_cli({"sample", "m-3m", "--lower", "moment:[100]", "--kerr", "[001]"});
  REQUIRE(wrong.exit_code == 0);
  CHECK(has(wrong.out, "warning: the magnetisation along [001] is not one the final group"));
  CHECK(has(wrong.out, "there the moment (an axial time-odd vector) points along sample x ∥ [100]"));
  CliResult right = run_cli({"sample", "m-3m", "--lower", "moment:[100]", "--kerr", "[100]"});
  REQUIRE(right.exit_code == 0);
  CHECK_FALSE(has(right.out, "warning:"));
  CliResult normal = run_cli({"sample", "m-3m", "--cut", "(001)", "--lower", "moment:[100]", "--kerr", "normal"});
  REQUIRE(normal.exit_code == 0);
  CHECK(has(normal.out, "warning: the magnetisation along the normal n is not one the final group"));
  // A grey group allows no net moment: the direction is the order vector's, no warning.
  CliResult grey = run_cli({"sample", "m-3m", "--cut", "(001)", "--kerr", "[001]"});
  REQUIRE(grey.exit_code == 0);
  CHECK_FALSE(has(grey.out, "warning:"));
}
