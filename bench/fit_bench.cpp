#include "fit_bench.hpp"

#include "bench_clock.hpp"
#include "fit/scan_fit.hpp"

#include <cmath>
#include <cstdio>
#include <random>

namespace ts::bench {

namespace {

// An invented scan: N bar angles, the transverse 2ω reading of a film with a
// single mirror (cos 3φ and cos φ), Gaussian noise; fixed seed.
ScanTable invented_scan(std::size_t n) {
  std::mt19937 rng(15);
  std::normal_distribution<double> noise(0.0, 0.05);
  std::vector<double> phi, y, s;
  for (std::size_t i = 0; i < n; ++i) {
    const double d = 360.0 * static_cast<double>(i) / static_cast<double>(n);
    const double p = d * 3.14159265358979323846 / 180;
    phi.push_back(d);
    y.push_back(std::cos(3 * p) + 0.2 * std::cos(p) + noise(rng));
    s.push_back(0.05);
  }
  return scan_table_from_arrays({{"phi_deg", phi}, {"Y", y}, {"sigma", s}}, {}, "bench");
}

} // namespace

void print_fit_figures(int repeats) {
  std::printf("\n");
  // The scenario of the fit tests (a (111) film, a turning bar at zero field), with
  // a second transport response so the probe sum has two parts.
  Scenario sc = load_scenario(std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/data/fit-threefold-film.toml");
  sc.responses.push_back("berry-curvature-dipole");
  const ScenarioResult res = run_scenario(sc);
  FitSpec spec;
  spec.name = "bench";
  spec.harmonic = 2;
  for (std::size_t n : {std::size_t(1000), std::size_t(10000)}) {
    const ScanTable scan = invented_scan(n);
    FitResult r;
    Timing t = time_repeated(repeats, [&] { r = fit_scan(res, spec, scan); });
    std::size_t groups = 0;
    for (const auto& h : r.hypotheses) groups += 1 + h.same_model.size();
    const std::string what = "fit, " + std::to_string(n) + " points, every hypothesis of a (111) film";
    print_figure(what + ", median", duration_text(t.median), "< 1 s", n == 10000 ? verdict(t.median < 1.0) : "-");
    print_figure(what + ": hypotheses / models", std::to_string(groups) + " / " + std::to_string(r.hypotheses.size()));
  }
  print_figure("peak memory after the fits (MiB)", std::to_string(static_cast<int>(peak_memory_mib())));
}

} // namespace ts::bench
