// The neighbour grid behind the coincident-atom checks: it must never miss a pair
// that the direct all-pairs search finds, in any cell shape (the reference: that search, common practice).
#include "lowering/site_grid.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <random>

using namespace ts;

namespace {

double min_image_distance(const SiteGrid::Mat& lattice, const SiteGrid::Vec& p, const SiteGrid::Vec& q) {
  SiteGrid::Vec d{}, r{};
  for (int k = 0; k < 3; ++k) d[k] = p[k] - q[k] - std::round(p[k] - q[k]);
  for (int i = 0; i < 3; ++i)
    for (int k = 0; k < 3; ++k) r[i] += lattice[k][i] * d[k];
  return std::sqrt(r[0] * r[0] + r[1] * r[1] + r[2] * r[2]);
}

} // namespace

TEST_CASE("the site grid finds every pair the all-pairs search finds", "[structure]") {
  const double tol = GENERATE(1e-3, 0.3, 2.0);
  const SiteGrid::Mat lattice = GENERATE(SiteGrid::Mat{{{5, 0, 0}, {0, 5, 0}, {0, 0, 5}}},
                                         SiteGrid::Mat{{{4, 0, 0}, {-2, 3.4641016, 0}, {0, 0, 7}}},   // hexagonal
                                         SiteGrid::Mat{{{3, 0, 0}, {2.9, 0.4, 0}, {1.2, 0.7, 2.5}}}); // very oblique
  std::mt19937 rng(12345);
  std::uniform_real_distribution<double> u(-0.2, 1.2); // outside [0, 1) too: images must be found
  std::vector<SiteGrid::Vec> points;
  for (int i = 0; i < 300; ++i) points.push_back({u(rng), u(rng), u(rng)});
  // Pairs at a distance just inside the tolerance, so near misses are tested too.
  for (int i = 0; i < 100; ++i) {
    SiteGrid::Vec p = points[i];
    p[i % 3] += (i % 2 ? 1.0 : -1.0) + 0.9 * tol / 10.0; // a lattice translation plus a small step
    points.push_back(p);
  }
  SiteGrid grid(lattice, tol);
  for (std::size_t i = 0; i < points.size(); ++i) {
    const std::vector<std::size_t> found = grid.candidates(points[i]);
    CHECK(std::is_sorted(found.begin(), found.end()));
    for (std::size_t j = 0; j < i; ++j)
      if (min_image_distance(lattice, points[i], points[j]) <= tol)
        CHECK(std::find(found.begin(), found.end(), j) != found.end());
    grid.insert(points[i], i);
  }
}
