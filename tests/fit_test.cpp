// Fitting measured scans against symmetry hypotheses (src/fit, docs/fit.md).
// Synthetic scans are generated here from the exact model of a known group with
// Gaussian noise and fixed seeds (invented data, for the checks only); the
// physics checks name their outside source beside them.
#include "figure/fit_figure.hpp"
#include "fit/fit_statistics.hpp"
#include "fit/scan_fit.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <functional>
#include <random>

using namespace ts;

namespace {

constexpr double kPi = 3.14159265358979323846;

Error parse_error(const std::string& text, const std::string& name = "scan.csv") {
  try {
    parse_scan_table(text, name);
  } catch (const Error& e) {
    return e;
  }
  FAIL("the scan parsed: " << text);
  return Error(ErrorKind::internal, "");
}

ScenarioResult scenario(const std::string& toml) { return run_scenario(parse_scenario(toml, "test.toml")); }

const std::string kThreefoldPath = std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/data/fit-threefold-film.toml";
const std::string kThreefold = ts::test::read_file(kThreefoldPath);

std::vector<double> angles(int n) {
  std::vector<double> a;
  for (int i = 0; i < n; ++i) a.push_back(360.0 * i / n);
  return a;
}

ScanTable synthetic(const std::vector<double>& phi_deg, const std::function<double(double)>& truth, double sigma,
                    unsigned seed, const char* reading = "Y") {
  std::mt19937 rng(seed);
  std::normal_distribution<double> noise(0.0, sigma);
  std::vector<double> v, s;
  for (double d : phi_deg) {
    v.push_back(truth(d * kPi / 180) + noise(rng));
    s.push_back(sigma);
  }
  return scan_table_from_arrays({{"phi_deg", phi_deg}, {reading, v}, {"sigma", s}}, {}, "synthetic");
}

FitSpec transverse(int harmonic) {
  FitSpec f;
  f.name = "test";
  f.probe = "transverse";
  f.harmonic = harmonic;
  return f;
}

const HypothesisFit* find_model(const FitResult& r, const std::vector<std::string>& functions) {
  for (const auto& h : r.hypotheses)
    if (h.functions == functions) return &h;
  return nullptr;
}

const HypothesisFit* accepted(const FitResult& r) {
  for (const auto& h : r.hypotheses)
    if (h.hypothesis.symbol == r.verdict.accepted) return &h;
  return nullptr;
}

} // namespace

TEST_CASE("the scan reader takes CSV, TSV and columns with units in the header", "[fit][reader]") {
  ScanTable t = parse_scan_table("# bar scan\nphi_deg, V_uV, sigma_uV\n0, 1.5, 0.1  # first\n\n90, -2e-1, 0.1\n", "a.csv");
  REQUIRE(t.points() == 2);
  CHECK(t.column(ScanQuantity::phi)[1] == Approx(kPi / 2));
  CHECK(t.column(ScanQuantity::value)[0] == Approx(1.5e-6));
  CHECK(t.column(ScanQuantity::sigma)[1] == Approx(1e-7));
  CHECK(t.lines == std::vector<int>{3, 5});
  ScanTable w = parse_scan_table("phi_b_rad  B_mT  I_mA  X_nV\n0.5 100 2 3\n", "b.dat");
  CHECK(w.column(ScanQuantity::phi_b)[0] == Approx(0.5));
  CHECK(w.column(ScanQuantity::field)[0] == Approx(0.1));
  CHECK(w.column(ScanQuantity::current)[0] == Approx(2e-3));
  CHECK(w.column(ScanQuantity::x)[0] == Approx(3e-9));
  ScanTable tab = parse_scan_table("azimuth_deg\tchannel\tintensity\n30\tPP\t4\n", "c.tsv");
  CHECK(tab.channels == std::vector<std::string>{"PP"});
}

TEST_CASE("bad scan files are refused with file:line:column, the column and what is valid", "[fit][reader]") {
  Error e = parse_error("phi_deg, V_uV, temperature\n0, 1, 2\n");
  CHECK(e.kind() == ErrorKind::bad_file);
  CHECK(e.location() == "scan.csv:1:16");
  CHECK(e.problem() == "unknown column 'temperature'");
  CHECK(e.valid().find("phi") != std::string::npos);

  e = parse_error("phi, V\n0, 1\n");
  CHECK(e.problem() == "column 'phi' is an angle without a unit");
  CHECK(e.valid() == "phi_deg or phi_rad");

  e = parse_error("phi_deg, V_uV\n0, 1\n30, nan\n");
  CHECK(e.location() == "scan.csv:3:5");
  CHECK(e.problem() == "'nan' in column 'V_uV' is not a finite number");

  e = parse_error("phi_deg V_uV\n0 1\n30 abc\n");
  CHECK(e.location() == "scan.csv:3:4");
  CHECK(e.problem() == "'abc' in column 'V_uV' is not a number");

  e = parse_error("phi_deg\tV_uV\n0\t1,5\n");
  CHECK(e.problem() == "'1,5' in column 'V_uV' has a decimal comma");
  CHECK(e.valid() == "a decimal point, e.g. 1.5");

  e = parse_error("phi_deg, V_uV\n0, 1,5\n");
  CHECK(e.problem().find("decimal comma") != std::string::npos);
  CHECK(e.location() == "scan.csv:2:6"); // the cell after the decimal comma

  e = parse_error("phi_deg, phi_rad, V\n0, 0, 1\n");
  CHECK(e.problem() == "columns 'phi_deg' and 'phi_rad' both hold phi (with conflicting units)");

  e = parse_error("phi_deg, V_uV, sigma_ohm\n0, 1, 1\n");
  CHECK(e.problem().find("conflicting units") != std::string::npos);

  e = parse_error("phi_deg, B_T\n0, 1\n");
  CHECK(e.problem() == "no column holds a reading");

  e = parse_error("phi_deg, V_uV, sigma_uV\n0, 1, 0\n");
  CHECK(e.problem() == "uncertainty '0' in column 'sigma_uV' is not positive");

  e = parse_error("# only a comment\n");
  CHECK(e.problem() == "no header row");
}

TEST_CASE("regularised gamma and beta functions against tabulated values", "[fit][statistics]") {
  // χ² upper tail: P(χ²_1 >= 3.841) = 0.05, P(χ²_10 >= 18.307) = 0.05 (Abramowitz & Stegun, table 26.8).
  CHECK(chi2_upper_tail(3.841, 1) == Approx(0.05).margin(2e-4));
  CHECK(chi2_upper_tail(18.307, 10) == Approx(0.05).margin(2e-4));
  // F upper tail: F(0.05; 2, 10) = 4.10, F(0.01; 3, 20) = 4.94 (Abramowitz & Stegun, table 26.9).
  CHECK(f_upper_tail(4.10, 2, 10) == Approx(0.05).margin(5e-4));
  CHECK(f_upper_tail(4.94, 3, 20) == Approx(0.01).margin(2e-4));
}

TEST_CASE("a threefold film: the generating group wins in at least 9 of 10 seeds", "[fit][synthetic]") {
  // The 3m interface of a cubic crystal cut (111) has T_2ω ∝ cos 3φ (docs/hall-bars.md);
  // 36 angles, signal-to-noise 10 (amplitude / σ).
  const ScenarioResult res = scenario(kThreefold);
  FitSpec spec = transverse(2);
  int wins = 0;
  for (unsigned seed = 1; seed <= 10; ++seed) {
    FitResult r = fit_scan(res, spec, synthetic(angles(36), [](double p) { return std::cos(3 * p); }, 0.1, seed));
    REQUIRE(find_model(r, {"cos(3*phi)"}) != nullptr);
    INFO("seed " << seed << ": accepted " << r.verdict.accepted);
    if (accepted(r) && accepted(r)->functions == std::vector<std::string>{"cos(3*phi)"}) ++wins;
  }
  CHECK(wins >= 9);
}

TEST_CASE("a group that forbids a generating term is never preferred at high signal-to-noise", "[fit][synthetic]") {
  // A mirror ⊥ x alone adds a first harmonic to the 3m form (T_2ω = L'/3 + D cos φ,
  // docs/hall-bars.md); 3m forbids it. Signal-to-noise 20 on the cos φ term.
  const ScenarioResult res = scenario(kThreefold);
  FitSpec spec = transverse(2);
  for (unsigned seed = 1; seed <= 10; ++seed) {
    FitResult r = fit_scan(res, spec, synthetic(angles(36), [](double p) { return std::cos(3 * p) + 0.4 * std::cos(p); },
                                                0.02, seed));
    const HypothesisFit* threefold = find_model(r, {"cos(3*phi)"});
    REQUIRE(threefold);
    CHECK(threefold->rejected);
    REQUIRE(accepted(r));
    const auto& fs = accepted(r)->functions;
    CHECK(std::find(fs.begin(), fs.end(), "cos(phi)") != fs.end());
    CHECK(r.hypotheses.front().functions != std::vector<std::string>{"cos(3*phi)"});
    REQUIRE(!r.verdict.breaking.empty());
    CHECK(r.verdict.breaking.front().find("the data require lowering") != std::string::npos);
  }
}

TEST_CASE("planar Hall signal of an in-plane isotropic film goes as sin 2(φ_B − φ)", "[fit][transport]") {
  // Goldberg & Davis, Phys. Rev. 94, 1121 (1954), from memory: the transverse voltage of a
  // film whose resistivity depends on the angle between current and field is ∝ sin 2(φ_B − φ).
  // A sixfold axis along the normal makes a rank-4 tensor isotropic in the plane.
  const ScenarioResult res = scenario(R"toml(title = "hexagonal film"
responses = ["magnetoconductivity-quadratic"]
[crystal]
group = "6/mmm"
[sample]
cut = "(0001)"
[[bar]]
current = "rotating"
field = "in-plane"
)toml");
  std::vector<double> phi, phib, v, s;
  std::mt19937 rng(5);
  std::normal_distribution<double> noise(0.0, 0.01);
  for (int i = 0; i < 12; ++i)
    for (int j = 0; j < 12; ++j) {
      phi.push_back(30.0 * i);
      phib.push_back(30.0 * j + 7.5);
      v.push_back(0.7 * std::sin(2 * (phib.back() - phi.back()) * kPi / 180) + noise(rng));
      s.push_back(0.01);
    }
  FitResult r = fit_scan(res, transverse(1),
                         scan_table_from_arrays({{"phi_deg", phi}, {"phi_b_deg", phib}, {"X", v}, {"sigma", s}}, {}, "phe"));
  const HypothesisFit* top = accepted(r);
  REQUIRE(top);
  CHECK(top->hypothesis.symbol.rfind("6mm1'", 0) == 0);
  REQUIRE(top->functions.size() == 1);
  CHECK(top->functions[0] == "sin(2*phi - 2*phiB)");
  CHECK(std::fabs(top->parameters[0].value) == Approx(0.7).margin(0.01));
}

TEST_CASE("too few angles for the model's harmonics: the fit says so instead of fitting", "[fit][aliasing]") {
  // Four equally spaced angles cannot separate cos φ from cos 3φ (3 > N/2: cos 3φ = cos φ at 0°, 90°, 180°, 270°).
  const ScenarioResult res = scenario(kThreefold);
  FitResult r = fit_scan(res, transverse(2), synthetic(angles(4), [](double p) { return std::cos(3 * p); }, 0.1, 1));
  const HypothesisFit* mirror = find_model(r, {"cos(phi)", "cos(3*phi)"});
  REQUIRE(mirror);
  CHECK_FALSE(mirror->fitted);
  CHECK(mirror->not_fitted.find("cannot separate cos(phi), cos(3*phi)") != std::string::npos);
  bool said = false;
  for (const auto& u : r.verdict.undecided) said = said || u.find("not fitted") != std::string::npos;
  CHECK(said);
}

TEST_CASE("no more points than functions in a model: that model is not fitted", "[fit][aliasing]") {
  // Two points: the one-function model of the scenario is fitted; a model of two
  // functions would pass through both points and leave nothing to judge it by.
  const ScenarioResult res = scenario(kThreefold);
  FitResult r = fit_scan(res, transverse(2), synthetic({0.0, 0.3}, [](double p) { return std::cos(3 * p); }, 0.1, 1));
  bool one_fitted = false;
  for (const auto& h : r.hypotheses) {
    if (h.functions.size() > 1) CHECK_FALSE(h.fitted);
    if (h.functions.size() == 1) one_fitted = one_fitted || h.fitted;
  }
  CHECK(one_fitted);
}

TEST_CASE("a stage offset is fitted by Levenberg-Marquardt where the model fixes the phase", "[fit][offset]") {
  const ScenarioResult res = scenario(kThreefold);
  FitSpec spec = transverse(2);
  spec.offset = true;
  // cos 3(φ - 10°): the 3m model has only cos 3φ, so the offset is measured (modulo 120°).
  FitResult r = fit_scan(res, spec, synthetic(angles(36), [](double p) { return std::cos(3 * (p - 10 * kPi / 180)); }, 0.02, 3));
  const HypothesisFit* threefold = find_model(r, {"cos(3*phi)"});
  REQUIRE(threefold);
  REQUIRE(threefold->parameters.size() == 2);
  CHECK(threefold->parameters[1].name == "phi0 (deg)");
  const double off = threefold->parameters[1].value;
  const double folded = std::remainder(off - 10.0, 120.0);
  CHECK(std::fabs(folded) < 1.0);
  CHECK_FALSE(threefold->rejected);
  // A model with both cos and sin of every harmonic cannot fix the offset.
  bool traded = false;
  for (const auto& h : r.hypotheses) traded = traded || h.offset_note.find("trades against") != std::string::npos;
  CHECK(traded);
}

TEST_CASE("fewer points than the scenario's own model: refused with the file named", "[fit][reader]") {
  // One point fits no model of the chain: the (111) film's own model (cos 3φ) would pass through it.
  const ScenarioResult res = run_scenario(parse_scenario(kThreefold + "[[lowering]]\nkind = \"subgroup\"\ngroup = \"m\"\n",
                                                         "mirror.toml"));
  try {
    fit_scan(res, transverse(2), synthetic({0.0}, [](double p) { return std::cos(3 * p); }, 0.1, 1));
    FAIL("fitted");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_file);
    CHECK(e.location() == "synthetic");
    CHECK(e.problem().find("the scan has 1 point, no more than the") != std::string::npos);
  }
}

TEST_CASE("the models shown: the accepted hypothesis first, then the best ranked; the figures draw the same",
          "[fit][figures]") {
  // cos 3φ with three small terms that lower symmetries allow (each worth about 3.5 in χ²,
  // not significant at 0.01 even together) and a residual of harmonic 9 that no model
  // has (χ² = 36): the threefold group is accepted, yet ranks last by AIC.
  const ScenarioResult res = scenario(kThreefold);
  const double sigma = 0.1, a = sigma * std::sqrt(7.0 / 36.0);
  std::vector<double> phi = angles(36), v, s;
  for (double d : phi) {
    const double p = d * kPi / 180;
    v.push_back(std::cos(3 * p) + a * (std::cos(p) + std::sin(p) + std::sin(3 * p)) +
                sigma * std::sqrt(2.0) * std::cos(9 * p));
    s.push_back(sigma);
  }
  const FitResult r =
      fit_scan(res, transverse(2), scan_table_from_arrays({{"phi_deg", phi}, {"Y", v}, {"sigma", s}}, {}, "synthetic"));
  const HypothesisFit* top = accepted(r);
  REQUIRE(top);
  CHECK(top->hypothesis.symbol.rfind("3m1'", 0) == 0);
  const std::size_t rank = static_cast<std::size_t>(top - r.hypotheses.data());
  CHECK(rank >= 3); // not among the three best ranked
  REQUIRE(r.shown_models.size() == 4);
  CHECK(r.shown_models.front() == rank);
  CHECK(r.shown_models[1] == 0);
  CHECK(r.shown_models[2] == 1);
  CHECK(r.shown_models[3] == 2);
  // The figures draw exactly these models, in this order.
  const auto figures = fit_figures(r, "t");
  REQUIRE(figures.size() == 2);
  for (const auto& fig : figures) {
    std::vector<std::string> labels;
    for (const auto& c : fig.panels.at(0))
      if (c.label != "data") labels.push_back(c.label);
    REQUIRE(labels.size() == r.shown_models.size());
    for (std::size_t i = 0; i < labels.size(); ++i) CHECK(labels[i] == r.hypotheses[r.shown_models[i]].hypothesis.symbol);
  }
}
