// Fresnel / local-field factors of second-harmonic polarimetry: the numbers
// against the textbook transmission coefficients, the exact structure of the
// amplitudes with the factors as symbols, and the reports that say so.
#include "geometry/local_field.hpp"
#include "geometry/optics_geometry.hpp"
#include "group/group_catalogue.hpp"
#include "scenario/scenario.hpp"
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>
#include <toml++/toml.h>

#include <cmath>
#include <set>
#include <sstream>

using namespace ts;
using ts::test::run_cli;

namespace {

constexpr double pi = 3.14159265358979323846;

bool near(Complex a, Complex b, double tol = 1e-9) { return std::abs(a - b) < tol; }

ShgSpec setup(const std::string& incidence, const std::string& azimuth, bool local_field,
              const std::vector<std::string>& channels = {}) {
  ShgSpec s;
  s.name = std::string(local_field ? "with" : "without") + " factors, " + incidence + ", " + azimuth;
  s.incidence = incidence;
  s.azimuth = azimuth;
  s.channels = channels;
  s.local_field = local_field;
  return s;
}

// The one monomial of the local-field symbols, as a function.
ThetaTrig factor_product(std::initializer_list<int> symbols) {
  ThetaTrig p = TrigPoly::constant(Rational(1));
  for (int s : symbols) p = p * ThetaTrig::local_field(s);
  return p;
}

bool same(const ThetaTrig& a, const ThetaTrig& b) { return (a + b.scaled(Rational(-1))).is_zero(); }

constexpr int Lx_w = 0, Ly_w = 1, Lz_w = 2, Lx_2w = 3, Ly_2w = 4, Lz_2w = 5;

} // namespace

// Born and Wolf, Principles of Optics, section 1.5.2 (Fresnel formulae), from
// memory: t_s = 2 n1 cos θ1 / (n1 cos θ1 + n2 cos θ2), t_p = 2 n1 cos θ1 /
// (n2 cos θ1 + n1 cos θ2) with n1 sin θ1 = n2 sin θ2. Written here with real
// angles from Snell's law, independently of the k_z form of the library.
TEST_CASE("Fresnel transmission of a real index: the textbook t_s and t_p (Born and Wolf)", "[optics][local-field]") {
  // Normal incidence on glass, n = 1.5: t = 2/(1 + 1.5) = 0.8 (common practice).
  FresnelTransmission n0 = fresnel_transmission(1.0, 1.5, 0.0);
  CHECK(near(n0.t_s, 0.8));
  CHECK(near(n0.t_p, 0.8));
  auto l0 = interface_local_field(1.0, 1.5, 0.0);
  CHECK(near(l0[0], 0.8));
  CHECK(near(l0[1], 0.8));
  CHECK(near(l0[2], 0.8 / 1.5)); // L_z = t_p sin θ2 / sin θ1 = t_p n1/n2 by Snell's law

  for (double n2 : {1.33, 1.5, 2.2, 3.5})
    for (int deg : {15, 30, 45, 60, 75}) {
      const double n1 = 1.0, t1 = deg * pi / 180, t2 = std::asin(n1 * std::sin(t1) / n2);
      const double ts = 2 * n1 * std::cos(t1) / (n1 * std::cos(t1) + n2 * std::cos(t2));
      const double tp = 2 * n1 * std::cos(t1) / (n2 * std::cos(t1) + n1 * std::cos(t2));
      INFO("n2 " << n2 << ", theta " << deg);
      FresnelTransmission t = fresnel_transmission(n1, n2, t1);
      CHECK(near(t.t_s, ts));
      CHECK(near(t.t_p, tp));
      CHECK(near(t.cos_refracted, std::cos(t2)));
      // The x and z components of the transmitted P wave: t_p cos θ2 / cos θ1 and t_p sin θ2 / sin θ1.
      auto l = interface_local_field(n1, n2, t1);
      CHECK(near(l[0], tp * std::cos(t2) / std::cos(t1)));
      CHECK(near(l[1], ts));
      CHECK(near(l[2], tp * std::sin(t2) / std::sin(t1)));
    }
  // 45° on n = 1.5, values computed by hand from the formulas above.
  FresnelTransmission g = fresnel_transmission(1.0, 1.5, pi / 4);
  CHECK(near(g.t_s, 0.696663, 1e-6));
  CHECK(near(g.t_p, 0.728009, 1e-6));
}

// Total internal reflection (light from a prism of index 1.5 onto a medium of
// index 1 at 60°, beyond the critical angle of 41.8°): cos θ2 is imaginary,
// on the branch that decays away from the interface (Im k_z2 > 0), and all the
// power is reflected, |r_s| = |t_s - 1| = 1 (common practice: t_s = 1 + r_s
// from the continuity of the tangential field).
TEST_CASE("total internal reflection: the decaying branch and |r_s| = 1", "[optics][local-field]") {
  FresnelTransmission t = fresnel_transmission(1.5, 1.0, 60 * pi / 180);
  CHECK(std::abs(t.cos_refracted.real()) < 1e-12);
  CHECK(t.cos_refracted.imag() > 0);
  CHECK(std::abs(std::abs(t.t_s - 1.0) - 1.0) < 1e-12);
  // The evanescent field: sin θ2 = 1.5 sin 60° = 1.299, cos θ2 = i sqrt(1.299² - 1) = 0.8292i (by hand).
  CHECK(near(t.cos_refracted, Complex(0, 0.829156), 1e-6));
}

// An absorbing medium n = 2.2 + 0.5i at 45°: Snell's law with a complex angle,
// cos θ2 = sqrt(1 - sin²θ2) on the branch Im(n2 cos θ2) ≥ 0 (the wave decays into
// the medium; Born and Wolf, section 14.2, wave in a conducting medium, from
// memory), then the same Born and Wolf formulas as above.
TEST_CASE("absorbing medium: complex Snell's law on the physical branch", "[optics][local-field]") {
  const Complex n1 = 1.0, n2(2.2, 0.5);
  const double t1 = pi / 4;
  const Complex s2 = n1 * std::sin(t1) / n2;
  Complex c2 = std::sqrt(1.0 - s2 * s2);
  if ((n2 * c2).imag() < 0) c2 = -c2;
  const Complex ts = 2.0 * n1 * std::cos(t1) / (n1 * std::cos(t1) + n2 * c2);
  const Complex tp = 2.0 * n1 * std::cos(t1) / (n2 * std::cos(t1) + n1 * c2);
  FresnelTransmission t = fresnel_transmission(n1, n2, t1);
  CHECK((n2 * t.cos_refracted).imag() > 0);
  CHECK(near(t.t_s, ts));
  CHECK(near(t.t_p, tp));
  auto l = interface_local_field(n1, n2, t1);
  CHECK(near(l[0], tp * c2 / std::cos(t1)));
  CHECK(near(l[1], ts));
  CHECK(near(l[2], tp * s2 / std::sin(t1)));
  CHECK(l[1].imag() < 0); // absorption gives the factors a phase
}

TEST_CASE("refractive indices: the written forms and the refusals", "[optics][local-field]") {
  CHECK(parse_refractive_index("2.2+0.01i", false, ErrorKind::usage, "n").value == Complex(2.2, 0.01));
  CHECK(parse_refractive_index(" 2.2 - 0i ", false, ErrorKind::usage, "n").value == Complex(2.2, 0));
  CHECK(parse_refractive_index("1.5e0", true, ErrorKind::usage, "n").value == Complex(1.5, 0));
  CHECK(parse_refractive_index("0.2+3.4i", false, ErrorKind::usage, "n").value == Complex(0.2, 3.4));
  for (const char* bad : {"", "i", "2.2+i", "2.2+0.01", "2.2+0.01j", "nan", "inf", "1..2", "2,2", "0x1p1", "1e"})
    CHECK_THROWS_AS(parse_refractive_index(bad, false, ErrorKind::usage, "n"), Error);
  CHECK_THROWS_WITH(parse_refractive_index("-1.5", false, ErrorKind::usage, "n"), Catch::Contains("not positive"));
  CHECK_THROWS_WITH(parse_refractive_index("0.5i", false, ErrorKind::usage, "n"), Catch::Contains("not positive"));
  CHECK_THROWS_WITH(parse_refractive_index("2.2-0.01i", false, ErrorKind::usage, "n"), Catch::Contains("gain"));
  CHECK_THROWS_WITH(parse_refractive_index("1+0.1i", true, ErrorKind::usage, "n"), Catch::Contains("ambient"));
  // Light from n = 2 onto n = 1 at 30° meets the critical angle: L_x = 0 is refused.
  RefractiveIndices crit;
  crit.ambient = {"2", 2.0};
  crit.omega = {"1", 1.0};
  crit.two_omega = {"1.2", 1.2};
  CHECK_THROWS_WITH(local_field_values(crit, 30, "here"), Catch::Contains("critical angle"));
}

// A (111) face of a cubic crystal (3m) at normal incidence: the fields lie in
// the plane, and S and P are the same wave turned about the normal, so the
// in-plane factors coincide (L_y = L_x; t_s = t_p = 2 n1/(n1 + n2) at normal
// incidence, Born and Wolf, from memory) and every channel is the bare one
// times L_x(2ω) L_x(ω)²: the sixfold patterns of Tom, Heinz and Shen (PRL 51,
// 1983 (1983)) are only rescaled.
TEST_CASE("normal incidence on a 3m face: the factors only rescale the channels", "[optics][local-field]") {
  Scenario sc;
  sc.group = "m-3m";
  sc.cut = "(111)";
  sc.responses = {"electric-dipole-shg"};
  sc.shg = {setup("0", "rotating", false), setup("0", "rotating", true)};
  ScenarioResult r = run_scenario(sc);
  const ThetaTrig in_plane = factor_product({Lx_2w, Lx_w, Lx_w});
  for (std::size_t s = 0; s < r.shg[0].sources.size(); ++s)
    for (std::size_t c = 0; c < 4; ++c) {
      const ChannelAmplitude& bare = r.shg[0].sources[s].channels[c];
      const ChannelAmplitude& with = r.shg[1].sources[s].channels[c];
      for (std::size_t j = 0; j < bare.per_parameter.size(); ++j) {
        INFO("source " << s << ", channel " << r.shg[0].measurement.channels[c].name << ", parameter " << j);
        CHECK(same(with.per_parameter[j], bare.per_parameter[j] * in_plane));
      }
    }
  CHECK(r.shg[0].sources[0].channels[0].radiates()); // PP ∝ sin 3φ
}

// L_z(ω) and L_z(2ω) multiply the normal components of the fields only, and the
// normal is sample z for every azimuth: in the amplitude of a parameter, the
// power of L_z(2ω) is 1 exactly when its component has a first index z, and the
// power of L_z(ω) counts the z among the two driving indices (the form of
// χ_eff,ijk = L_ii(2ω) χ_ijk L_jj(ω) L_kk(ω), Heinz 1991, from memory). Each term
// has one factor at 2ω and two at ω.
TEST_CASE("L_z enters only through the components with a z index", "[optics][local-field]") {
  for (const char* group : {"3m", "4mm", "6mm", "mm2", "m", "2", "1", "4", "-42m", "3"}) {
    Scenario sc;
    sc.group = group;
    sc.responses = {"electric-dipole-shg"};
    sc.shg = {setup("any", "rotating", true, {"PP", "PS", "SP", "SS", "45-45"})};
    ScenarioResult r = run_scenario(sc);
    for (const auto& src : r.shg[0].sources) {
      const AllowedForm& form = r.parts[src.part].forms.back();
      // The (z first, z among the drives) patterns of the components carrying each parameter.
      std::vector<std::set<std::pair<int, int>>> patterns(form.independent());
      for (int code = 0; code < 27; ++code) {
        const int i = code / 9, j = (code / 3) % 3, k = code % 3;
        for (const auto& t : form.value(code)) patterns[t.parameter].insert({i == 2, (j == 2) + (k == 2)});
      }
      for (const auto& a : src.channels)
        for (int p = 0; p < form.independent(); ++p)
          for (const auto& [key, poly] : a.per_parameter[p].terms()) {
            INFO("group " << group << ", parameter " << form.parameter_name(p));
            CHECK(key.field[Lx_w] + key.field[Ly_w] + key.field[Lz_w] == 2);
            CHECK(key.field[Lx_2w] + key.field[Ly_2w] + key.field[Lz_2w] == 1);
            CHECK(patterns[p].count({key.field[Lz_2w], key.field[Lz_w]}) == 1);
          }
    }
  }
}

// Which channels are dark, for every parameter value, must not depend on the
// factors (they are nonzero numbers): over the 122 magnetic point-group types,
// at a variable and at fixed angles of incidence, with the sample turning and
// fixed. The bare amplitudes are the factored ones at L = 1, so "dark with
// factors" implies "dark without"; the converse is what this checks
// (common practice: the factors weight the tensor components, they do not
// create or remove any). At normal incidence this needs L_y = L_x: with
// independent in-plane factors a 45° polariser at a fixed azimuth on a -6'm2'
// crystal seen along z would radiate where the bare amplitude cancels between
// x and y (found by this test).
TEST_CASE("dark channels are the same with and without the factors, in every magnetic point group",
          "[optics][local-field]") {
  const std::vector<std::string> channels = {"PP", "PS", "SP", "SS", "45-S", "45-P", "rotating-P", "rotating-S"};
  int compared = 0;
  for (const NamedGroup* g : GroupCatalogue::builtin().types()) {
    Scenario sc;
    sc.group = g->symbol;
    sc.assume_nonmagnetic = false;
    sc.responses = {"electric-dipole-shg"};
    for (const char* inc : {"any", "0", "45"})
      for (const char* az : {"rotating", "30"}) {
        sc.shg.push_back(setup(inc, az, false, channels));
        sc.shg.push_back(setup(inc, az, true, channels));
      }
    ScenarioResult r = run_scenario(sc);
    for (std::size_t s = 0; s < r.shg.size(); s += 2)
      for (std::size_t k = 0; k < r.shg[s].sources.size(); ++k)
        for (std::size_t c = 0; c < channels.size(); ++c) {
          INFO("group " << g->symbol << ", " << r.shg[s].measurement.name << ", source " << k << ", channel "
                        << channels[c]);
          CHECK(r.shg[s].sources[k].channels[c].radiates() == r.shg[s + 1].sources[k].channels[c].radiates());
          ++compared;
        }
  }
  CHECK(compared > 122 * 6 * 8);
}

TEST_CASE("local-field factors need the reflection geometry, a fixed angle for indices, dipole sources",
          "[optics][local-field]") {
  Scenario sc;
  sc.group = "m-3m";
  sc.cut = "(111)";
  sc.responses = {"electric-dipole-shg"};
  ShgSpec t = setup("45", "rotating", true);
  t.geometry = "transmission";
  sc.shg = {t};
  CHECK_THROWS_WITH(run_scenario(sc), Catch::Contains("reflection only"));
  ShgSpec any = setup("any", "rotating", true);
  any.indices = parse_indices_option("1,2.2,2.3", "test");
  sc.shg = {any};
  CHECK_THROWS_WITH(run_scenario(sc), Catch::Contains("fixed angle of incidence"));
  sc.shg = {setup("45", "rotating", true)};
  sc.responses = {"electric-dipole-shg", "magnetic-dipole-shg"};
  CHECK_THROWS_WITH(run_scenario(sc), Catch::Contains("electric-dipole sources only"));
  sc.shg[0].responses = {"electric-dipole-shg"};
  CHECK_NOTHROW(run_scenario(sc));
}

// The sample options and every report format state the factors and the
// indices; the JSON carries the symbols and their values, and the amplitudes
// carry the symbols.
TEST_CASE("reports state the factors and the indices (CLI)", "[optics][local-field][cli]") {
  const std::vector<std::string> base = {"sample", "m-3m", "--cut", "(111)", "--shg", "reflection:45",
                                         "--shg-channels", "PP,SS", "--shg-indices", "1,1.5,1.5+0.1i"};
  auto with = [&](std::vector<std::string> extra) {
    std::vector<std::string> a = base;
    a.insert(a.end(), extra.begin(), extra.end());
    return run_cli(a);
  };
  auto text = with({});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("Fresnel / local-field factors are applied") != std::string::npos);
  CHECK(text.out.find("n(ω) = 1.5, n(2ω) = 1.5+0.1i") != std::string::npos);
  CHECK(text.out.find("Ly_w = 0.6967") != std::string::npos); // t_s at 45° on n = 1.5 (first test case)
  CHECK(text.out.find("Lx_w^2*Lx_2w") != std::string::npos);
  CHECK(text.out.find("no Fresnel") == std::string::npos);
  for (const char* f : {"markdown", "latex", "html"}) {
    auto r = with({"-f", f});
    INFO(f);
    REQUIRE(r.exit_code == 0);
    CHECK(r.out.find("local-field factors are applied") != std::string::npos);
    CHECK(r.out.find("1.5+0.1i") != std::string::npos);
  }
  auto json = with({"--figure-incidence", "45", "-f", "json"}); // the figure option puts the figures in the JSON
  REQUIRE(json.exit_code == 0);
  CHECK(json.out.find("\"local_field_factors\" : true") != std::string::npos);
  CHECK(json.out.find("\"n_2omega\" : \"1.5+0.1i\"") != std::string::npos);
  CHECK(json.out.find("\"model\" : \"two-medium Fresnel transmission\"") != std::string::npos);
  CHECK(json.out.find("0.69666295") != std::string::npos);
  // The figure captions say it too.
  CHECK(json.out.find("factors are applied, as symbols") != std::string::npos);
  CHECK(json.out.find("local-field factors from n(ω) = 1.5") != std::string::npos);

  // Symbols only: no numbers, and the curves say they take the factors as 1.
  auto symbolic = run_cli({"sample", "m-3m", "--cut", "(111)", "--shg", "reflection:any", "--shg-local-field",
                           "--figure-incidence", "45", "-f", "json"});
  REQUIRE(symbolic.exit_code == 0);
  CHECK(symbolic.out.find("\"local_field_factors\" : true") != std::string::npos);
  CHECK(symbolic.out.find("no refractive indices are given") != std::string::npos);
  CHECK(symbolic.out.find("the curves take every factor as 1") != std::string::npos);
  CHECK(symbolic.out.find("\"values\"") == std::string::npos);

  // Off by default, and said so.
  auto bare = run_cli({"sample", "m-3m", "--cut", "(111)", "--shg", "reflection:45"});
  REQUIRE(bare.exit_code == 0);
  CHECK(bare.out.find("no Fresnel or local-field factors are applied") != std::string::npos);
  CHECK(bare.out.find("Lx_w") == std::string::npos);
}

// A scenario table with the factors: the same numbers as the options.
TEST_CASE("[[shg]] keys: local_field and the indices", "[optics][local-field][scenario]") {
  Scenario sc = parse_scenario(R"toml(
responses = ["electric-dipole-shg"]
[crystal]
group = "m-3m"
[sample]
cut = "(111)"
[[shg]]
incidence = 45
n_omega = 1.5
n_2omega = "1.5+0.1i"
)toml",
                               "test.toml");
  REQUIRE(sc.shg.size() == 1);
  CHECK(sc.shg[0].local_field);
  REQUIRE(sc.shg[0].indices);
  CHECK(sc.shg[0].indices->ambient.value == Complex(1, 0));
  CHECK(sc.shg[0].indices->two_omega.value == Complex(1.5, 0.1));
  CHECK(sc.shg[0].indices->omega.text == "1.5"); // a TOML number is reported as written
  Scenario precise = parse_scenario("responses = [\"electric-dipole-shg\"]\n[crystal]\ngroup = \"m-3m\"\n[[shg]]\nn_omega = 2.2345678\nn_2omega = 3\n", "p.toml");
  CHECK(precise.shg[0].indices->omega.text == "2.2345678");
  CHECK(precise.shg[0].indices->two_omega.text == "3");
  ScenarioResult r = run_scenario(sc);
  CHECK(near(r.shg[0].measurement.local_field.values[Ly_w], 0.696663, 1e-6));
  CHECK_THROWS_WITH(parse_scenario("[crystal]\ngroup = \"m-3m\"\n[[shg]]\nn_omega = \"2.2+x\"\nn_2omega = 2\n", "bad.toml"),
                    Catch::Contains("bad.toml:4:") && Catch::Contains("n_omega"));
}
