// Fitting rotational-anisotropy SHG scans (src/fit/shg_fit.cpp): |A|² models,
// Levenberg-Marquardt with exact derivatives from several starts. Synthetic
// scans are generated here (invented, for the checks only).
#include "fit/scan_fit.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <functional>
#include <random>

using namespace ts;

namespace {

constexpr double kPi = 3.14159265358979323846;

ScenarioResult scenario(const std::string& cut, int incidence, const std::string& channels) {
  return run_scenario(parse_scenario("title = \"SHG\"\nresponses = [\"electric-dipole-shg\"]\n[crystal]\ngroup = \"m-3m\"\n"
                                     "[sample]\ncut = \"" + cut + "\"\n[[shg]]\nincidence = " + std::to_string(incidence) +
                                         "\nchannels = " + channels + "\n",
                                     "shg.toml"));
}

ScanTable scan(const std::vector<std::pair<std::string, std::function<double(double)>>>& channels, double sigma,
               unsigned seed) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> noise(0.0, sigma);
  std::vector<double> az, in, s;
  std::vector<std::string> ch;
  for (const auto& [name, truth] : channels)
    for (int d = 0; d < 360; d += 10) {
      az.push_back(d);
      in.push_back(truth(d * kPi / 180) + noise(rng));
      s.push_back(sigma);
      ch.push_back(name);
    }
  return scan_table_from_arrays({{"azimuth_deg", az}, {"intensity", in}, {"sigma", s}}, ch, "synthetic");
}

const HypothesisFit* accepted(const FitResult& r) {
  for (const auto& h : r.hypotheses)
    if (h.hypothesis.symbol == r.verdict.accepted) return &h;
  return nullptr;
}

} // namespace

TEST_CASE("RA-SHG of a 3m surface at normal incidence: sin²3φ and cos²3φ lobes", "[fit][shg]") {
  // Tom, Heinz & Shen, "Second-harmonic reflection from silicon surfaces and its relation to
  // structural symmetry", PRL 51, 1983 (1983): a 3m face gives sixfold lobes, the parallel
  // and crossed channels out of phase; with x the mirror normal PP ∝ sin²3φ, SS ∝ cos²3φ.
  const ScenarioResult res = scenario("(111)", 0, "[\"PP\", \"SS\"]");
  FitSpec spec;
  spec.name = "ra-shg";
  FitResult r = fit_scan(res, spec,
                         scan({{"PP", [](double p) { return 2 * std::pow(std::sin(3 * p), 2); }},
                               {"SS", [](double p) { return 2 * std::pow(std::cos(3 * p), 2); }}},
                              0.02, 11));
  const HypothesisFit* top = accepted(r);
  REQUIRE(top);
  CHECK(top->hypothesis.symbol.rfind("3m1'", 0) == 0);
  CHECK(top->functions == std::vector<std::string>{"PP: 1, cos(6*phi)", "SS: 1, cos(6*phi)"});
  REQUIRE(top->curve.size() == 2);
  REQUIRE(r.curve_deg[15] == 30);
  CHECK(top->curve[0][0] == Approx(0).margin(0.02));  // PP dark at φ = 0
  CHECK(top->curve[0][15] == Approx(2).margin(0.03)); // PP lobe at φ = 30°
  CHECK(top->curve[1][0] == Approx(2).margin(0.03));  // SS lobe at φ = 0
  CHECK(top->curve[1][15] == Approx(0).margin(0.02));
  CHECK_FALSE(top->rejected);
}

TEST_CASE("RA-SHG of a 4mm surface: isotropic, no SS", "[fit][shg]") {
  // Sipe, Moss & van Driel, "Phenomenological theory of optical second- and third-harmonic
  // generation from cubic centrosymmetric crystals", PRB 35, 1129 (1987), from memory: the
  // (001) face radiates isotropic P-out channels and nothing in SS from the surface dipole.
  const ScenarioResult res = scenario("(001)", 45, "[\"PP\", \"SP\", \"SS\"]");
  FitSpec spec;
  spec.name = "4mm";
  FitResult r = fit_scan(res, spec,
                         scan({{"PP", [](double) { return 1.0; }},
                               {"SP", [](double) { return 0.3; }},
                               {"SS", [](double) { return 0.0; }}},
                              0.01, 3));
  const HypothesisFit* top = accepted(r);
  REQUIRE(top);
  CHECK(top->hypothesis.symbol.rfind("4mm1'", 0) == 0);
  CHECK(top->functions == std::vector<std::string>{"PP: 1", "SP: 1", "SS: dark"});
}

TEST_CASE("RA-SHG with six azimuths cannot separate the sixfold harmonic from the constant", "[fit][shg][aliasing]") {
  // cos 6φ = 1 at 0°, 60°, ..., 300°: the intensity harmonics 1 and cos 6φ alias.
  const ScenarioResult res = scenario("(111)", 0, "[\"PP\"]");
  std::vector<double> az, in;
  std::vector<std::string> ch;
  for (int d = 0; d < 360; d += 60) {
    az.push_back(d);
    in.push_back(std::pow(std::sin(3 * d * kPi / 180), 2) + 0.01);
    ch.push_back("PP");
  }
  FitSpec spec;
  spec.name = "six";
  FitResult r = fit_scan(res, spec, scan_table_from_arrays({{"azimuth_deg", az}, {"intensity", in}}, ch, "six"));
  bool said = false;
  for (const auto& h : r.hypotheses)
    if (!h.fitted && h.not_fitted.find("cannot separate the intensity harmonics 1, cos(6*phi)") != std::string::npos)
      said = true;
  CHECK(said);
}
