// Second-harmonic polarimetry: the channel amplitudes of crystal faces checked
// against published rotational-anisotropy forms and against the channel
// formulas derived below, exactly, at every multiple of 15° of the angle of
// incidence θ and the sample azimuth φ.
#include "geometry/optics_expression.hpp"
#include "geometry/optics_geometry.hpp"
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <functional>
#include <map>
#include <set>

using namespace ts;
using ts::test::run_cli;

namespace {

Scenario face(const std::string& group, const std::string& cut, const std::vector<std::string>& responses,
              const std::string& incidence, const std::vector<std::string>& channels = {}) {
  Scenario sc;
  sc.group = group;
  sc.cut = cut;
  sc.responses = responses;
  ShgSpec s;
  s.name = "test setup";
  s.incidence = incidence;
  s.channels = channels;
  sc.shg.push_back(s);
  return sc;
}

int code_of(const std::string& xyz) {
  int code = 0;
  for (char c : xyz) code = 3 * code + (c - 'x');
  return code;
}

// Exact value of f at θ and φ (degrees), other angles zero.
Surd exact_value(const ThetaTrig& f, int theta, int phi) {
  Surd sum;
  for (const auto& [key, poly] : f.terms()) {
    Surd mono = Rational(1);
    for (int i = 0; i < key.cos_theta; ++i) mono = mono * cos_degrees(theta);
    for (int i = 0; i < key.sin_theta; ++i) mono = mono * sin_degrees(theta);
    for (const auto& [k, c] : poly.terms()) {
      int arg = k[static_cast<int>(Angle::phi)] * phi;
      sum += mono * (c.re * cos_degrees(arg) - c.im * sin_degrees(arg));
    }
  }
  return sum;
}

// The expected amplitude as Σ (angle factor) · (component value).
using Expected = std::function<std::vector<std::pair<Surd, std::string>>(int theta, int phi)>;

// Checks channel `c` of the only source against `expected` at every grid point, per parameter.
void check_channel(const ScenarioResult& r, std::size_t c, const Expected& expected) {
  REQUIRE(r.shg.size() == 1);
  const ShgSource& src = r.shg[0].sources.at(0);
  const AllowedForm& form = r.parts[src.part].forms.back();
  const ChannelAmplitude& a = src.channels.at(c);
  for (int theta = 0; theta <= 75; theta += 15)
    for (int phi = 0; phi < 360; phi += 15) {
      std::vector<Surd> want(form.independent());
      for (const auto& [factor, component] : expected(theta, phi))
        for (const auto& t : form.value(code_of(component))) want[t.parameter] += factor * t.coefficient;
      for (int j = 0; j < form.independent(); ++j) {
        INFO("channel " << r.shg[0].measurement.channels[c].name << ", theta " << theta << ", phi " << phi
                        << ", parameter " << form.parameter_name(j));
        CHECK(exact_value(a.per_parameter[j], theta, phi) == want[j]);
      }
    }
}

Surd c_(int d) { return cos_degrees(d); }
Surd s_(int d) { return sin_degrees(d); }
Surd pow_(const Surd& x, int n) {
  Surd r = Rational(1);
  for (int i = 0; i < n; ++i) r = r * x;
  return r;
}

std::set<std::string> texts(const std::vector<Harmonic>& hs) {
  std::set<std::string> out;
  for (const auto& h : hs) out.insert(harmonic_text(h));
  return out;
}

std::set<std::string> amplitude_harmonics(const ChannelAmplitude& a) {
  std::set<std::string> out;
  for (const auto& t : optical_terms(a)) out.insert(harmonic_text({t.k, t.sine}));
  return out;
}

} // namespace

// The channel formulas used below, derived for this project (no local-field
// factors). In the sample frame the vectors of the lab turn by -φ:
//   P_in = (cosθ cosφ, -cosθ sinφ, sinθ), P_out = (-cosθ cosφ, cosθ sinφ, sinθ), S = (sinφ, cosφ, 0).
// 3m with the mirror normal to x has chi_yyy = c = -chi_yxx = -chi_xxy, chi_zxx = chi_zyy,
// chi_xxz = chi_yyz and chi_zzz. Contracting A = e_out·chi:e_in e_in and
// using cos³φ - 3 cosφ sin²φ = cos 3φ, 3 sinφ cos²φ - sin³φ = sin 3φ:
//   PP = -c cos³θ sin 3φ + sinθ [(chi_zxx - 2 chi_xxz) cos²θ + chi_zzz sin²θ]
//   PS = -c cos²θ cos 3φ,  SP = c cosθ sin 3φ + chi_zxx sinθ,  SS = c cos 3φ.
// At normal incidence PP = -c sin 3φ and SS = c cos 3φ: the six-lobed
// patterns I ∝ sin²3φ and cos²3φ, and at oblique incidence each channel is a
// constant plus one 3φ harmonic, I ∝ |a + b cos 3(φ - φ0)|², the form of
// Tom, Heinz and Shen, "Second-harmonic reflection from silicon surfaces and
// its relation to structural phase transitions", PRL 51, 1983 (1983), from memory.
TEST_CASE("3m face: the four channels and the threefold pattern (Tom, Heinz and Shen 1983)", "[optics]") {
  // A cubic crystal cut (111): the face has 3m with the mirror normal to sample x ∥ [1-10].
  ScenarioResult r = run_scenario(face("m-3m", "(111)", {"electric-dipole-shg"}, "any"));
  check_channel(r, 0, [](int t, int p) -> std::vector<std::pair<Surd, std::string>> {
    return {{-(pow_(c_(t), 3) * s_(3 * p)), "yyy"},
            {s_(t) * pow_(c_(t), 2), "zxx"},
            {-(Surd(Rational(2)) * s_(t) * pow_(c_(t), 2)), "xxz"},
            {pow_(s_(t), 3), "zzz"}};
  });
  check_channel(r, 1, [](int t, int p) -> std::vector<std::pair<Surd, std::string>> {
    return {{-(pow_(c_(t), 2) * c_(3 * p)), "yyy"}};
  });
  check_channel(r, 2, [](int t, int p) -> std::vector<std::pair<Surd, std::string>> {
    return {{c_(t) * s_(3 * p), "yyy"}, {s_(t), "zxx"}};
  });
  check_channel(r, 3, [](int, int p) -> std::vector<std::pair<Surd, std::string>> { return {{c_(3 * p), "yyy"}}; });

  ScenarioResult n = run_scenario(face("m-3m", "(111)", {"electric-dipole-shg"}, "0"));
  const ShgSource& ed = n.shg[0].sources.at(0);
  CHECK(amplitude_harmonics(ed.channels[0]) == std::set<std::string>{"sin(3*phi)"});
  CHECK(amplitude_harmonics(ed.channels[3]) == std::set<std::string>{"cos(3*phi)"});
  // sin²3φ = (1 - cos 6φ)/2: the intensity holds the constant and 6φ only.
  CHECK(texts(product_harmonics(ed.channels[0], ed.channels[0])) == std::set<std::string>{"1", "cos(6*phi)"});

  // The GiNaC form of the amplitudes: with the parameter named after chi_xxy = -c,
  // PS = chi_xxy cos²θ cos 3φ and SS = -chi_xxy cos 3φ, equal as expressions.
  {
    const ShgSource& src = r.shg[0].sources.at(0);
    const AllowedForm& form = r.parts[src.part].forms.back();
    ExpressionSymbols sy;
    const GiNaC::ex ps = optical_amplitude_ex(optical_terms(src.channels[1]), form, sy);
    const GiNaC::ex ss = optical_amplitude_ex(optical_terms(src.channels[3]), form, sy);
    const GiNaC::ex c = -sy.parameter("chi_xxy"), theta = sy.named("theta", "\\theta"), phi = sy.angle(Angle::phi);
    CHECK((ps - (-c * GiNaC::pow(GiNaC::cos(theta), 2) * GiNaC::cos(3 * phi))).expand().is_zero());
    CHECK((ss - c * GiNaC::cos(3 * phi)).expand().is_zero());
  }

  ScenarioResult o = run_scenario(face("m-3m", "(111)", {"electric-dipole-shg"}, "45"));
  CHECK(amplitude_harmonics(o.shg[0].sources.at(0).channels[0]) == std::set<std::string>{"1", "sin(3*phi)"});
}

// 4mm with 2 ∥ n: the surviving components chi_zxx = chi_zyy, chi_xxz = chi_yyz and
// chi_zzz are invariant under any rotation about n, so no channel depends on φ:
//   PP = sinθ [(chi_zxx - 2 chi_xxz) cos²θ + chi_zzz sin²θ], SP = chi_zxx sinθ, PS = SS = 0
// (Sipe, Moss and van Driel, "Phenomenological theory of optical second- and
// third-harmonic generation from cubic centrosymmetric crystals", PRB 35, 1129 (1987), from memory).
TEST_CASE("4mm face: isotropic in the azimuth, PS = SS = 0 (Sipe, Moss and van Driel 1987)", "[optics]") {
  ScenarioResult r = run_scenario(face("m-3m", "(001)", {"electric-dipole-shg"}, "any"));
  check_channel(r, 0, [](int t, int) -> std::vector<std::pair<Surd, std::string>> {
    return {{s_(t) * pow_(c_(t), 2), "zxx"},
            {-(Surd(Rational(2)) * s_(t) * pow_(c_(t), 2)), "xxz"},
            {pow_(s_(t), 3), "zzz"}};
  });
  check_channel(r, 2, [](int t, int) -> std::vector<std::pair<Surd, std::string>> { return {{s_(t), "zxx"}}; });
  const ShgSource& ed = r.shg[0].sources.at(0);
  CHECK_FALSE(ed.channels[1].radiates());
  CHECK_FALSE(ed.channels[3].radiates());
  CHECK(amplitude_harmonics(ed.channels[0]) == std::set<std::string>{"1"});
  CHECK(amplitude_harmonics(ed.channels[2]) == std::set<std::string>{"1"});
}

// mm2 with 2 ∥ n, mirrors normal to x and y: chi_zxx, chi_zyy, chi_xxz, chi_yyz, chi_zzz.
// With the vectors above:
//   PP = sinθ [chi_zzz sin²θ + (chi_zxx cos²φ + chi_zyy sin²φ - 2 chi_xxz cos²φ - 2 chi_yyz sin²φ) cos²θ]
//   PS = ½ (chi_xxz - chi_yyz) sin 2φ sin 2θ,  SP = (chi_zxx sin²φ + chi_zyy cos²φ) sinθ,  SS = 0.
TEST_CASE("mm2 face: the channel formulas (derived here)", "[optics]") {
  // A cubic crystal cut (110): mm2 with the twofold axis along the normal.
  ScenarioResult r = run_scenario(face("m-3m", "(110)", {"electric-dipole-shg"}, "any"));
  check_channel(r, 0, [](int t, int p) -> std::vector<std::pair<Surd, std::string>> {
    Surd cc = pow_(c_(t), 2) * s_(t), c2 = pow_(c_(p), 2), s2 = pow_(s_(p), 2), m2 = Rational(-2);
    return {{pow_(s_(t), 3), "zzz"}, {cc * c2, "zxx"}, {cc * s2, "zyy"}, {m2 * cc * c2, "xxz"}, {m2 * cc * s2, "yyz"}};
  });
  check_channel(r, 1, [](int t, int p) -> std::vector<std::pair<Surd, std::string>> {
    Surd f = Surd(Rational(1, 2)) * s_(2 * p) * s_(2 * t);
    return {{f, "xxz"}, {-f, "yyz"}};
  });
  check_channel(r, 2, [](int t, int p) -> std::vector<std::pair<Surd, std::string>> {
    return {{pow_(s_(p), 2) * s_(t), "zxx"}, {pow_(c_(p), 2) * s_(t), "zyy"}};
  });
  CHECK_FALSE(r.shg[0].sources.at(0).channels[3].radiates());
}

// At normal incidence every field of an m-3m (001) face lies in the plane or
// along n, and the twofold axis along n of its 4mm group reverses every
// product with an odd number of in-plane factors: the dipole, magnetic-dipole
// and quadrupole sources all cancel (derived here; for the bulk quadrupole the
// same statement is made by Sipe, Moss and van Driel 1987, from memory).
TEST_CASE("m-3m (001) face at normal incidence: no second harmonic from any source", "[optics]") {
  ScenarioResult r = run_scenario(face("m-3m", "(001)",
                                       {"electric-dipole-shg", "magnetic-dipole-shg", "electric-quadrupole-shg"}, "0",
                                       {"PP", "PS", "SP", "SS", "rotating-P", "rotating-S"}));
  REQUIRE(r.shg[0].sources.size() >= 9);
  for (const auto& s : r.shg[0].sources)
    for (const auto& c : s.channels) CHECK_FALSE(c.radiates());
  // At 45° the same face radiates through the dipole and the bulk gradient source.
  ScenarioResult o = run_scenario(face("m-3m", "(001)", {"electric-dipole-shg", "electric-quadrupole-shg"}, "45"));
  bool gamma_radiates = false;
  for (const auto& s : o.shg[0].sources)
    if (o.parts[s.part].part_label.find("Gamma") != std::string::npos && !o.parts[s.part].spec.time_odd)
      gamma_radiates = gamma_radiates || s.channels[0].radiates();
  CHECK(gamma_radiates);
}

// A centrosymmetric crystal has no electric-dipole SHG (Boyd, Nonlinear Optics, 3rd ed. (2008),
// §1.5, from memory); the magnetic-dipole and quadrupole sources survive inversion.
TEST_CASE("centrosymmetric bulk: the dipole is dark, magnetic-dipole and quadrupole sources radiate", "[optics]") {
  ScenarioResult r = run_scenario(face("m-3m", "", {"electric-dipole-shg", "magnetic-dipole-shg"}, "45"));
  bool dipole = false, magnetic = false;
  for (const auto& s : r.shg[0].sources)
    for (const auto& c : s.channels) {
      if (r.parts[s.part].response_id == "electric-dipole-shg") dipole = dipole || c.radiates();
      else if (!r.parts[s.part].spec.time_odd) magnetic = magnetic || c.radiates();
    }
  CHECK_FALSE(dipole);
  CHECK(magnetic);
}

// An in-plane magnetisation on a 4mm face leaves {1, m_x, m_y', 2_z'}: the
// c-type chi (chi_yyy, chi_yxx, chi_xxy, chi_yzz, chi_zyz) radiates into PP
// together with the crystallographic i-type part, so the two 180° domains
// differ in intensity through the cross term; a grey face has no c-type
// source (magnetisation-induced SHG from a magnetised surface: Pan, Wei and
// Shen, "Optical second-harmonic generation from magnetized surfaces", PRB 39, 1229 (1989), from memory).
TEST_CASE("domain contrast: i-type and c-type interfere only with magnetic order", "[optics]") {
  Scenario sc = face("m-3m", "(001)", {"electric-dipole-shg"}, "45");
  sc.steps.push_back(parse_lowering_option("moment:[100]", "test"));
  ScenarioResult m = run_scenario(sc);
  REQUIRE_FALSE(m.shg[0].interference.empty());
  bool pp = false;
  for (const auto& in : m.shg[0].interference) pp = pp || !in.cross[0].empty();
  CHECK(pp);
  ScenarioResult grey = run_scenario(face("m-3m", "(001)", {"electric-dipole-shg"}, "45"));
  CHECK(grey.shg[0].interference.empty());
}

TEST_CASE("SHG from the command line and from a scenario file, and bad geometries", "[optics][cli]") {
  auto dark = run_cli({"sample", "m-3m", "--cut", "(001)", "--shg", "reflection:0"});
  REQUIRE(dark.exit_code == 0);
  CHECK(dark.out.find("dark for every source and every parameter value: PP, PS, SP, SS") != std::string::npos);
  auto j = run_cli({"sample", "m-3m", "--cut", "(111)", "--shg", "reflection:0", "--shg-channels", "PP,SS", "--format",
                    "json"});
  REQUIRE(j.exit_code == 0);
  CHECK(j.out.find("\"amplitude\"") != std::string::npos);
  CHECK(j.out.find("cos(6*phi)") != std::string::npos);
  for (const char* fmt : {"markdown", "latex"}) {
    auto t = run_cli({"sample", "m-3m", "--cut", "(111)", "--shg", "transmission:any", "--format", fmt});
    CHECK(t.exit_code == 0);
    CHECK(t.out.find("Second-harmonic polarimetry") != std::string::npos);
  }
  auto bad = run_cli({"sample", "m-3m", "--cut", "(001)", "--shg", "reflection:50"});
  CHECK(bad.exit_code != 0);
  CHECK(bad.err.find("multiple of 15 from 0 to 75") != std::string::npos);
  auto chan = run_cli({"sample", "m-3m", "--cut", "(001)", "--shg", "reflection:45", "--shg-channels", "PX"});
  CHECK(chan.exit_code != 0);
  CHECK(chan.err.find("PP, PS, SP, SS") != std::string::npos);

  ts::test::TempDir dir;
  {
    std::ofstream f(dir / "shg.toml");
    f << "title = \"threefold face\"\nresponses = [\"electric-dipole-shg\"]\n[crystal]\ngroup = \"m-3m\"\n"
         "[sample]\ncut = \"(111)\"\n[[shg]]\nname = \"oblique\"\nincidence = 45\nchannels = [\"PP\", \"rotating-S\"]\n"
         "[[shg]]\nincidence = 100\n";
  }
  auto file = run_cli({"run", (dir / "shg.toml").string()});
  CHECK(file.exit_code != 0);
  CHECK(file.err.find("shg.toml:") != std::string::npos);
  {
    std::ofstream f(dir / "ok.toml");
    f << "title = \"threefold face\"\nresponses = [\"electric-dipole-shg\"]\n[crystal]\ngroup = \"m-3m\"\n"
         "[sample]\ncut = \"(111)\"\n[[shg]]\nname = \"oblique\"\nincidence = 45\nchannels = [\"PP\", \"rotating-S\"]\n";
  }
  auto ok = run_cli({"run", (dir / "ok.toml").string()});
  CHECK(ok.exit_code == 0);
  CHECK(ok.out.find("rotating-S") != std::string::npos);
}
