// The pump geometry: the effective field of the inverse Faraday effect, the
// torque on an order vector and what each magneto-optic probe reads across a
// spin reorientation, and the photocurrents of a polar film. Each check names
// its outside source and status tag; [computed] marks a statement derived here.
#include "scenario/scenario_run.hpp"

#include "core/error.hpp"
#include "group/group_catalogue.hpp"
#include "response/response_catalogue.hpp"

#include <catch2/catch.hpp>

#include <string>

using namespace ts;

namespace {

// The constant term of a series as (parameter index -> coefficient); empty when it has other harmonics.
std::map<int, Surd> constant_term(const std::vector<FourierTerm>& terms) {
  std::map<int, Surd> out;
  if (terms.size() != 1 || terms[0].k != Frequency{}) return out;
  for (const auto& t : terms[0].coefficient) out[t.parameter] = t.coefficient;
  return out;
}

std::map<int, Surd> negated(std::map<int, Surd> m) {
  for (auto& [p, c] : m) c = -c;
  return m;
}

const PumpPhase& phase(const ScenarioResult& r, std::size_t i) { return r.pump_probe.at(0).phases.at(i); }

std::size_t part_index(const PumpPhase& ph, const std::string& title) {
  for (std::size_t k = 0; k < ph.part_titles.size(); ++k)
    if (ph.part_titles[k] == title) return k;
  FAIL("no pump part " << title);
  return 0;
}

// A bulk plate normal to [001] of `group`, asked for the inverse Faraday effect, with the pump tables given.
ScenarioResult ife_scenario(const std::string& group, const std::string& pump_tables) {
  return run_scenario(parse_scenario("responses = [\"inverse-faraday\"]\n[crystal]\ngroup = \"" + group +
                                         "\"\n[sample]\nz = \"[001]\"\n" + pump_tables,
                                     group + ".toml"));
}

const char* kIfe = "inverse-faraday: inverse Faraday effect, i-type";
const char* kIfeC = "inverse-faraday: inverse Faraday effect, c-type (through the order parameter)";

} // namespace

TEST_CASE("inverse Faraday field: along i(E × E*) in an isotropic medium, reversed with helicity", "[light][pump]") {
  // Pershan, van der Ziel & Malmstrom, Phys. Rev. 143, 574 (1966) [from memory]: H = F i(E × E*) in an
  // isotropic medium; zero for linear light, opposite for the two helicities. m-3m stands for the isotropic
  // medium (one coefficient, responses test). The pump arrives along -z: the spin of circular+ points along -z.
  const ScenarioResult r = ife_scenario("m-3m", R"(
[[pump_probe]]
incidence = 0
azimuth = 0
polarisations = ["circular+", "circular-", "linear", "elliptical:45", "elliptical:-45"]
[[pump_probe.phase]]
lowering = ["moment:[001]"]
)");
  const PumpPhase& ph = phase(r, 0);
  const std::size_t k = part_index(ph, kIfe);
  const auto hz = [&](std::size_t pol, int i) { return ph.drives[pol].field[k][static_cast<std::size_t>(i)]; };
  // circular+: H = (0, 0, -F); circular-: the opposite; linear: no field.
  const std::map<int, Surd> plus = constant_term(hz(0, 2));
  REQUIRE(plus.size() == 1);
  CHECK(plus.begin()->second == Surd(Rational(-1)));
  CHECK(constant_term(hz(1, 2)) == negated(plus));
  for (int i = 0; i < 2; ++i) {
    CHECK(hz(0, i).empty());
    CHECK(hz(1, i).empty());
  }
  for (int i = 0; i < 3; ++i) CHECK(hz(2, i).empty());
  // Elliptical light at β = ±45° is circular± (sin 2β = ±1).
  CHECK(constant_term(hz(3, 2)) == plus);
  CHECK(constant_term(hz(4, 2)) == negated(plus));
  // The field is along the moment of this phase: no torque from the isotropic part [computed].
  CHECK(ph.drives[0].torque[k][0].empty());
  CHECK(ph.drives[0].torque[k][1].empty());
}

TEST_CASE("inverse Faraday field at oblique incidence follows the beam", "[light][pump]") {
  // Pershan et al. 1966 [from memory]: H ∥ k for circular light in an isotropic medium; at 60° from the normal
  // k_in = (sin 60°, 0, -cos 60°), so H_x / H_z = -tan 60° = -√3 [computed].
  const ScenarioResult r = ife_scenario("m-3m", R"(
[[pump_probe]]
incidence = 60
azimuth = 0
polarisations = ["circular+"]
[[pump_probe.phase]]
lowering = ["moment:[001]"]
)");
  const PumpPhase& ph = phase(r, 0);
  const std::size_t k = part_index(ph, kIfe);
  const auto hx = constant_term(ph.drives[0].field[k][0]), hz = constant_term(ph.drives[0].field[k][2]);
  REQUIRE(hx.size() == 1);
  REQUIRE(hz.size() == 1);
  CHECK(hx.begin()->second == Surd::sqrt_of(Rational(3)) * Surd(Rational(1, 2)));
  CHECK(hz.begin()->second == Surd(Rational(-1, 2)));
}

TEST_CASE("pump-probe across the spin reorientation of an orthoferrite-type magnet", "[light][pump]") {
  // Group assignment (orthoferrites RFeO3, space group Pbnm, point group mmm; Bertaut's representations, from
  // memory): the phase with the Néel vector along a and the net moment along c (G_x F_z) has the magnetic point
  // group m'm'm, the one with the Néel vector along c and the net moment along a (G_z F_x) mm'm', the phase with
  // the Néel vector along b and no net moment (G_y) mmm.
  // Kimel et al., Nature 435, 655 (2005) [from memory]: in the G_x F_z phase a circularly polarised pump along z
  // launches a precession whose phase reverses with helicity, seen in the Faraday rotation along z.
  const ScenarioResult r = ife_scenario("mmm", R"(
[[pump_probe]]
incidence = 0
azimuth = 0
polarisations = ["circular+", "circular-"]
[[pump_probe.phase]]
label = "G_x F_z"
lowering = ["moment:[001]"]
order = "[100]"
[[pump_probe.phase]]
label = "G_z F_x"
lowering = ["moment:[100]"]
order = "[001]"
[[pump_probe.phase]]
label = "G_y"
lowering = ["magnetic-group:mmm"]
order = "[010]"
)");
  const PumpPhase& gx = phase(r, 0);
  const PumpPhase& gz = phase(r, 1);
  const PumpPhase& gy = phase(r, 2);
  CHECK(gx.group == "m'm'm");
  CHECK(gz.group == "mm'm'");
  CHECK(gy.group == "mmm");
  // G_x F_z: the i-type field along z turns the Néel vector (x) towards y, reversed with helicity; the Faraday
  // probe sees it (through the dynamic moment along z) for both helicities.
  {
    const std::size_t k = part_index(gx, kIfe);
    REQUIRE(gx.deviation_axes == std::array<int, 2>{1, 2});
    const auto plus = constant_term(gx.drives[0].torque[k][0]);
    REQUIRE(plus.size() == 1);
    CHECK(constant_term(gx.drives[1].torque[k][0]) == negated(plus));
    CHECK(gx.drives[0].drives == std::array<bool, 2>{true, false});
    const ProbeView& faraday = gx.probes[0];
    CHECK(faraday.probe == "Faraday (transmission along n)");
    CHECK(faraday.moment[0]);
    CHECK_FALSE(faraday.order[0]);
    CHECK(faraday.sees == std::vector<bool>{true, true});
  }
  // G_z F_x: the i-type field is along the Néel vector and exerts no torque [computed]; only the c-type part
  // turns it (towards x), and the Faraday probe reads that turn directly: the turned state has a moment along z.
  {
    const std::size_t k = part_index(gz, kIfe), kc = part_index(gz, kIfeC);
    CHECK(gz.drives[0].torque[k][0].empty());
    CHECK(gz.drives[0].torque[k][1].empty());
    const auto plus = constant_term(gz.drives[0].torque[kc][0]);
    REQUIRE(plus.size() == 1);
    CHECK(constant_term(gz.drives[1].torque[kc][0]) == negated(plus)); // odd in helicity
    CHECK(gz.drives[0].drives[0]);
    CHECK(gz.probes[0].order[0]);
    CHECK(gz.probes[0].sees == std::vector<bool>{true, true});
  }
  // G_y (no net moment): the i-type field along z turns the Néel vector (y) towards x, and Faraday sees it,
  // both through the turn (towards the G_x F_z state) and the dynamic moment [computed].
  {
    const std::size_t k = part_index(gy, kIfe);
    CHECK_FALSE(gy.drives[0].torque[k][0].empty());
    CHECK(gy.probes[0].order[0]);
    CHECK(gy.probes[0].moment[0]);
  }
}

TEST_CASE("an order vector the phase does not keep is refused", "[light][pump]") {
  // In 4/mm'm' (a cubic crystal magnetised along [001]) a Néel vector along [110] is moved by the fourfold axis.
  Scenario sc = parse_scenario(R"(
responses = ["inverse-faraday"]
[crystal]
group = "m-3m"
[sample]
z = "[001]"
x = "[110]"
[[pump_probe]]
[[pump_probe.phase]]
lowering = ["moment:[001]"]
order = "[110]"
)", "bad-order.toml");
  try {
    run_scenario(sc);
    FAIL("an order vector the fourfold axis moves was accepted");
  } catch (const Error& e) {
    CHECK(std::string(e.what()).find("moves the line of the order vector") != std::string::npos);
  }
  // A grey phase has no order to drive.
  sc.pump_probe[0].phases[0].steps.clear();
  sc.pump_probe[0].phases[0].order = "[001]";
  CHECK_THROWS_AS(run_scenario(sc), Error);
}

TEST_CASE("photocurrents of a polar film: linear along the plane of incidence, circular across it", "[light][photocurrent]") {
  // Ganichev & Prettl, "Spin photocurrents in quantum wells", J. Phys.: Condens. Matter 15, R935 (2003) [from
  // memory]: in a polar (C∞v-like) structure the circular photogalvanic current needs oblique incidence and flows
  // normal to the plane of incidence, reversing with helicity; the linear current flows in the plane of incidence
  // for P light; at normal incidence no in-plane current flows.
  const ScenarioResult r = run_scenario(parse_scenario(R"T(
responses = ["photogalvanic"]
[crystal]
group = "4mm"
[sample]
cut = "(001)"
x = "[100]"
[[photocurrent]]
incidence = 45
azimuth = 0
polarisations = ["linear:0", "linear:90", "circular+", "circular-"]
[[photocurrent]]
incidence = 0
azimuth = 0
polarisations = ["linear", "circular+", "elliptical"]
)T", "polar-film.toml"));
  const PhotocurrentResult& oblique = r.photocurrents.at(0);
  REQUIRE(oblique.rows.size() == 4);
  // In 4mm the in-plane linear current is j_x = 2 sigma_xxz E_x E_z, j_y = 2 sigma_xxz E_y E_z: P light drives it
  // along x, S light (no E_z) drives none [computed].
  CHECK(oblique.rows[0].pair_reads == std::array<bool, 2>{true, false});
  CHECK(oblique.rows[1].pair_reads == std::array<bool, 2>{false, false});
  // Circular light: a helicity-odd current along y, read by the y pair.
  CHECK(oblique.rows[2].odd_pair_reads == std::array<bool, 2>{false, true});
  CHECK(oblique.rows[3].odd_pair_reads == std::array<bool, 2>{false, true});
  for (std::size_t k = 0; k < oblique.parts.size(); ++k) {
    if (!oblique.helicity_odd[k]) continue;
    const auto plus = constant_term(oblique.rows[2].current[k][1]);
    if (plus.empty()) continue;
    CHECK(constant_term(oblique.rows[3].current[k][1]) == negated(plus));
  }
  for (const auto& row : r.photocurrents.at(1).rows) CHECK(row.pair_reads == std::array<bool, 2>{false, false});
}
