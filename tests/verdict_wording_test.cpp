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

std::string strained_film() {
  return (std::filesystem::path(TENSORSIEVE_SOURCE_DIR) / "examples" / "strained-film.toml").string();
}

// The text from `from` up to the next line that starts a new part section (or the end).
std::string section(const std::string& text, const std::string& from, const std::string& until) {
  const auto a = text.find(from);
  if (a == std::string::npos) return "";
  const auto b = text.find(until, a + from.size());
  return text.substr(a, b == std::string::npos ? std::string::npos : b - a);
}

// A cubic crystal cut on (001) with one lowering step.
Scenario cubic_film(const std::string& response, LoweringKind kind, const std::string& along) {
  Scenario sc;
  sc.group = "m-3m";
  sc.cut = "(001)";
  sc.responses = {response};
  LoweringStep step;
  step.kind = kind;
  step.along = along;
  sc.steps = {step};
  return sc;
}

std::string bars_of(const std::string& text) {
  const auto a = text.find("\nHall bars\n");
  return a == std::string::npos ? "" : text.substr(a);
}

} // namespace

TEST_CASE("domain averages in a field come before the zero-field ones and say which is which", "[wording][domains]") {
  CliResult r = run_cli({"run", strained_film()});
  REQUIRE(r.exit_code == 0);
  // The Hall vector of the strained film: both variants forbid it at zero field; the
  // field along [100] gives it on average (1/2)(hB_xx + hB_yy) B.
  const std::string hall = section(r.out, "[anomalous-hall]: Hall vector h\n", "\n[anomalous-hall]");
  REQUIRE_FALSE(hall.empty());
  const auto in_field = hall.find("average over equal populations in the field: ⟨h_x⟩ = 1/2*hB_xx + 1/2*hB_yy");
  const auto zero_field = hall.find("average over equal populations at zero field: all components vanish");
  REQUIRE(in_field != std::string::npos);
  REQUIRE(zero_field != std::string::npos);
  CHECK(in_field < zero_field);
  CHECK(has(hall, "every variant at zero field (the spontaneous steps alone)"));
  CHECK_FALSE(has(r.out, "average over equal populations: all components vanish"));

  // Without an applied field the zero-field average stays as it was (no "at zero field").
  CliResult plain = run_cli({"sample", "m-3m", "--lower", "subgroup:4mm", "--tensor", "[V2]", "--domains"});
  REQUIRE(plain.exit_code == 0);
  CHECK(has(plain.out, "average over equal populations: ⟨T_xx⟩ = ⟨T_yy⟩ = ⟨T_zz⟩ = 2/3*T_xx + 1/3*T_zz"));
  CHECK_FALSE(has(plain.out, "at zero field"));
}

TEST_CASE("a part evaluated without the field is titled with the group it was evaluated in", "[wording][field]") {
  Scenario sc = load_scenario(strained_film());
  ScenarioResult res = run_scenario(sc);
  const PartForms* gamma = nullptr;
  for (const auto& p : res.parts)
    if (p.response_id == "magnetochiral-anisotropy" && p.spec.time_odd) gamma = &p;
  REQUIRE(gamma != nullptr);
  REQUIRE(gamma->evaluated_in.has_value());
  // Evaluated in the strained film's mm21' (the field step left out), not in mm'2'.
  CHECK(gamma->evaluated_in->readable_symbol == "mm21'");
  CHECK(res.chain.back().readable_symbol == "mm'2'");
  CHECK(allowed_form(gamma->spec, gamma->evaluated_in->group, res.frame).independent() == gamma->forms.back().independent());
  CHECK(allowed_form(gamma->spec, res.chain.back().group, res.frame).independent() != gamma->forms.back().independent());

  CliResult r = run_cli({"run", strained_film()});
  REQUIRE(r.exit_code == 0);
  CHECK(has(r.out, "allowed form of gamma in mm21'"));
  CHECK_FALSE(has(r.out, "allowed form of gamma in mm'2'"));
  CHECK(has(r.out, "the form below is that of mm21', the group without them"));
}

TEST_CASE("a Hall vector induced by a field in a non-magnetic crystal is not called spontaneous", "[wording][hall]") {
  CliResult film = run_cli({"run", strained_film()});
  REQUIRE(film.exit_code == 0);
  CHECK_FALSE(has(film.out, "anomalous (spontaneous) Hall effect [anomalous-hall]: Hall vector h"));
  CHECK(has(film.out, "Hall effect induced by the applied field (ordinary or in-plane Hall, not spontaneous: no magnetic "
                      "order of the scenario allows it) [anomalous-hall]: Hall vector h"));
  CHECK(has(film.out, "switched on: anomalous-hall: Hall vector h, induced by the applied field, not spontaneous (1 "
                      "independent)"));

  // A moment along the normal makes it spontaneous: the title stays the anomalous Hall effect.
  CliResult magnet = run_cli({"sample", "m-3m", "--cut", "(001)", "--lower", "moment:[001]", "--lower",
                              "magnetic-field:[001]", "--response", "anomalous-hall"});
  REQUIRE(magnet.exit_code == 0);
  CHECK(has(magnet.out, "anomalous (spontaneous) Hall effect [anomalous-hall]: Hall vector h"));
  CHECK_FALSE(has(magnet.out, "induced by the applied field"));

  // A field alone along the normal of a cubic crystal: the ordinary Hall effect.
  ScenarioResult res = run_scenario(cubic_film("anomalous-hall", LoweringKind::magnetic_field, "[001]"));
  REQUIRE(res.parts.size() == 2);
  CHECK(res.parts[0].counts.back() == 1);
  CHECK(res.parts[0].induced_by_field);
}

TEST_CASE("a part no bar reads says so in one line", "[wording][bar]") {
  CliResult spin = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "current-induced-spin-polarization",
                            "--response", "second-order-conductivity", "--bar", "rotating:none"});
  REQUIRE(spin.exit_code == 0);
  const std::string bars = bars_of(spin.out);
  CHECK(has(bars, "[current-induced-spin-polarization]\n  its 2 parts are not voltages a bar's probes read: its response "
                  "is a spin polarisation (index role S), not the electric field or current that two contacts of a "
                  "bar read"));

  // Many such responses (--response all): one line naming each once.
  CliResult all = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "all", "--bar", "rotating:none"});
  REQUIRE(all.exit_code == 0);
  CHECK(has(bars_of(all.out), "gives each reason): current-induced-spin-polarization; spin-hall; linear-magnetoelectric; "
                              "magneto-optic-kerr;"));

  CliResult tensor = run_cli({"sample", "m-3m", "--cut", "(001)", "--tensor", "T_ab: polar", "--bar", "rotating:none"});
  REQUIRE(tensor.exit_code == 0);
  CHECK(has(bars_of(tensor.out), "tensor T_ab: polar, time-even\n  not a voltage a bar's probes read: a tensor given by its spec "
                                 "carries no index roles"));
  CliResult json = run_cli({"sample", "m-3m", "--cut", "(001)", "--tensor", "T_ab: polar", "--bar", "rotating:none",
                            "-f", "json"});
  REQUIRE(json.exit_code == 0);
  JsonValue v = parse_json(json.out);
  CHECK(v.at("bars").items.at(0).at("not_read").items.size() == 1);
}

TEST_CASE("magnetisation angles are named as such in parts expanded in M", "[wording][bar]") {
  const std::vector<std::string> base{"sample", "m-3m", "--cut", "(001)", "--response",
                                      "unidirectional-magnetoresistance", "--bar", "rotating:in-plane"};
  CliResult text = run_cli(base);
  REQUIRE(text.exit_code == 0);
  const std::string bars = bars_of(text.out);
  CHECK(has(bars, "magnetisation: in plane, φ_M from sample x"));
  // (z × M)·j with j at φ and M at φ_M in the plane: sin(φ - φ_M) along the bar.
  CHECK(has(bars, "*sin(phi - phiM)"));
  CHECK_FALSE(has(bars, "phiB"));
  CHECK_FALSE(has(bars, "φ_B"));

  auto with = [&](std::vector<std::string> extra) {
    std::vector<std::string> args = base;
    args.insert(args.end(), extra.begin(), extra.end());
    return run_cli(args);
  };
  CliResult latex = with({"-f", "latex"});
  REQUIRE(latex.exit_code == 0);
  CHECK(has(latex.out, "\\varphi_M"));
  CHECK_FALSE(has(latex.out, "\\varphi_B"));
  CliResult markdown = with({"-f", "markdown"});
  REQUIRE(markdown.exit_code == 0);
  CHECK(has(markdown.out, "magnetisation: in plane, φ_M from sample x"));
  CHECK(has(markdown.out, "phiM"));
  CHECK_FALSE(has(markdown.out, "phiB"));
  CliResult json = with({"-f", "json"});
  REQUIRE(json.exit_code == 0);
  JsonValue v = parse_json(json.out);
  CHECK(v.at("bars").items.at(0).at("signals").items.at(0).at("field_angles_of").text == "magnetisation");
}

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

TEST_CASE("with domains the bar section gives the domain-averaged readings", "[wording][bar][domains]") {
  // A (001) film of a cubic crystal with an in-plane polar distortion along [100]:
  // one domain shows zero-field 2ω signals in a turning bar; the four variants
  // (±[100], ±[010]) average back to the interface group 4mm1', which allows no
  // planar 2ω signal at zero field, so the averaged readings vanish.
  Scenario sc = cubic_film("second-order-conductivity", LoweringKind::polar, "[100]");
  sc.domains = true;
  BarSpec bar;
  bar.name = "turning bar";
  bar.current = "rotating";
  bar.field = "none";
  sc.bars = {bar};
  ScenarioResult res = run_scenario(sc);
  REQUIRE(res.bars.size() == 1);
  bool some_single_domain_reading = false;
  for (const auto& s : res.bars[0].signals) {
    REQUIRE(s.domain_averaged.size() == 1); // no applied field: the zero-field average only
    CHECK_FALSE(s.domain_averaged[0].signal.reads());
    some_single_domain_reading = some_single_domain_reading || s.signal.reads();
  }
  CHECK(some_single_domain_reading);

  // The strained film in its field: the c-type Hall part reads on average through the field.
  CliResult film = run_cli({"run", strained_film()});
  REQUIRE(film.exit_code == 0);
  const std::string bars = bars_of(film.out);
  // The c-type Hall part: one domain reads -D_xz cos φ; the two variants average to
  // ⟨D_xz⟩ = (DB_xzx + DB_yzy)/2 per unit field, read the same way.
  CHECK(has(bars, "averaged over the domain variants (equal populations), at zero field: both probes read zero\n"
                  "  averaged over the domain variants (equal populations), the part linear in the in-plane field along "
                  "the current (magnetic field ∥ [100]), per unit field:\n    ⟨S_∥⟩ = 0\n"
                  "    ⟨S_⊥⟩ = (-1/2*DB_xzx - 1/2*DB_yzy)*cos(phi)\n"));
  CHECK(has(bars, "averaged over the domain variants (equal populations): both probes read zero, at zero field and "
                  "linear in each applied field"));
  CliResult single = run_cli({"sample", "m-3m", "--cut", "(001)", "--lower", "polar:[100]", "--response",
                              "second-order-conductivity", "--bar", "rotating:none"});
  REQUIRE(single.exit_code == 0);
  CHECK_FALSE(has(single.out, "averaged over the domain variants"));
}
