// Domain variants in an applied field: each variant sees the lab-frame field,
// so a twinned film in a field keeps the field-induced signals of its variants,
// averaged with their volume fractions.
#include "report/expression_text.hpp"
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"
#include "support/json_value.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

using namespace ts;
using namespace ts::test;

namespace {

const DomainReport& domains_of(const ScenarioResult& r, const std::string& part_label) {
  for (const auto& d : r.domains)
    if (r.parts[d.part].part_label == part_label) return d;
  throw std::runtime_error("no domain report for " + part_label);
}

// "name = value" for a component, in the parameters of the field expansion.
std::string value_of(const FieldLinearTerm& t, const ParamTensor& v, const AllowedForm& named, const std::string& c) {
  const int full = static_cast<int>(v.components.size());
  for (int code = 0; code < full; ++code)
    if (named.component_name(code) == c) {
      std::string out;
      for (const auto& term : v.components[code])
        out += (out.empty() ? "" : " + ") + surd_text(term.coefficient) + "*" + t.form.parameter_name(term.parameter);
      return out.empty() ? "0" : out;
    }
  throw std::runtime_error("no component " + c);
}

} // namespace

TEST_CASE("domains in a field: the strained film on (001) in B along [100]", "[domains]") {
  // examples/strained-film.toml: 4mm1' interface, strain along [100] gives mm21'
  // (2_z, m_x, m_y, 1'), two variants related by 4_z; field B ∥ [100] in the lab.
  // Derived by hand:
  //  * Hall vector h_a = hB_ab B_b with hB polar rank 2 (axial × axial), time-even:
  //    in mm2 it is diagonal. Variant 1: h_x = hB_xx B. Variant 2 is variant 1
  //    turned by 4_z, whose hB' = diag(hB_yy, hB_xx, hB_zz): h_x = hB_yy B.
  //    Fractions w1, w2 give h_x = (w1 hB_xx + w2 hB_yy) B.
  //  * c-type chi_abc = chiB_abcd B_d (axial rank 4, time-even). With d = x,
  //    m_x (det -1) leaves the component iff n_x(abc) is even, m_y iff n_y(abc)
  //    is odd: variant 1 has chi_xxy = chiB_xxyx, chi_yyy = chiB_yyyx,
  //    chi_yzz = chiB_yzzx. Variant 2 sees the lab x as its own -y (4_z^-1 x = -y),
  //    then is turned by 4_z (x -> y, y -> -x): chi_yyy = -chiB_xxxy,
  //    chi_xxy = -chiB_xyyy, chi_yzz = -chiB_xzzy.
  Scenario sc;
  sc.group = "m-3m";
  sc.cut = "(001)";
  sc.x = "[100]";
  LoweringStep strain;
  strain.kind = LoweringKind::strain;
  strain.along = "[100]";
  LoweringStep field;
  field.kind = LoweringKind::magnetic_field;
  field.along = "[100]";
  sc.steps = {strain, field};
  sc.responses = {"anomalous-hall", "second-order-conductivity"};
  sc.domains = true;
  sc.domain_fractions = {Rational(3, 4), Rational(1, 4)};
  const ScenarioResult r = run_scenario(sc);

  const DomainReport& hall = domains_of(r, "Hall vector h");
  REQUIRE(hall.analysis.variants.size() == 2);
  REQUIRE(hall.in_field.size() == 1);
  const FieldLinearTerm& h = hall.in_field[0];
  CHECK(value_of(h, h.variants[0], hall.form, "h_x") == "1*hB_xx");
  CHECK(value_of(h, h.variants[1], hall.form, "h_x") == "1*hB_yy");
  CHECK(value_of(h, h.variants[0], hall.form, "h_y") == "0");
  CHECK(value_of(h, h.average, hall.form, "h_x") == "3/4*hB_xx + 1/4*hB_yy");
  // Without the field the variants show no Hall vector at all: it is the field that allows it.
  CHECK(hall.analysis.average.is_zero(0));

  const DomainReport& c = domains_of(r, "fully symmetric (dissipative) part, c-type");
  const FieldLinearTerm& k = c.in_field.at(0);
  CHECK(value_of(k, k.variants[0], c.form, "chi_yyy") == "1*chiB_yyyx");
  CHECK(value_of(k, k.variants[0], c.form, "chi_xxy") == "1*chiB_xxyx");
  CHECK(value_of(k, k.variants[0], c.form, "chi_yzz") == "1*chiB_yzzx");
  CHECK(value_of(k, k.variants[0], c.form, "chi_xxx") == "0");
  CHECK(value_of(k, k.variants[1], c.form, "chi_yyy") == "-1*chiB_xxxy");
  CHECK(value_of(k, k.variants[1], c.form, "chi_xxy") == "-1*chiB_xyyy");
  CHECK(value_of(k, k.variants[1], c.form, "chi_yzz") == "-1*chiB_xzzy");
  CHECK(value_of(k, k.average, c.form, "chi_yyy") == "-1/4*chiB_xxxy + 3/4*chiB_yyyx");
}

TEST_CASE("domains in a field: the CLI prints the field terms and checks the fractions", "[domains][cli]") {
  const std::filesystem::path src(TENSORSIEVE_SOURCE_DIR);
  const std::string film = (src / "examples" / "strained-film.toml").string();
  CliResult text = run_cli({"run", film});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("average over equal populations in the field: ⟨h_x⟩ = 1/2*hB_xx + 1/2*hB_yy; all others vanish") != std::string::npos);
  CliResult json = run_cli({"run", film, "--domain-fractions", "0.75,0.25", "-f", "json"});
  REQUIRE(json.exit_code == 0);
  JsonValue v = parse_json(json.out);
  const JsonValue& d = v.at("parts").items.at(0).at("domains");
  CHECK(d.at("fractions").items.at(0).text == "3/4");
  CHECK(d.at("in_field").items.at(0).at("average").text == "h_x = 3/4*hB_xx + 1/4*hB_yy");

  CliResult sum = run_cli({"run", film, "--domain-fractions", "1/2,1/3"});
  CHECK(sum.exit_code != 0);
  CHECK(sum.err.find("add up to 5/6") != std::string::npos);
  CliResult count = run_cli({"sample", "m-3m", "--cut", "(001)", "--lower", "strain:[100]", "--response", "anomalous-hall",
                             "--domains", "--domain-fractions", "1"});
  CHECK(count.exit_code != 0);
  CHECK(count.err.find("for 2 variants") != std::string::npos);
  TempDir dir;
  std::ofstream(dir / "f.toml") << "responses = [\"anomalous-hall\"]\n[crystal]\ngroup = \"m-3m\"\n[report]\n"
                                   "domains = true\ndomain_fractions = [0.5, \"1/x\"]\n";
  CliResult bad = run_cli({"run", (dir / "f.toml").string()});
  CHECK(bad.exit_code != 0);
  CHECK(bad.err.find("f.toml:6") != std::string::npos);
  CHECK(bad.err.find("1/x") != std::string::npos);
}
