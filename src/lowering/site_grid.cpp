#include "lowering/site_grid.hpp"

#include <algorithm>
#include <cmath>
#include <set>

namespace ts {

namespace {

SiteGrid::Vec cross(const SiteGrid::Vec& u, const SiteGrid::Vec& v) {
  return {u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]};
}

double dot(const SiteGrid::Vec& u, const SiteGrid::Vec& v) { return u[0] * v[0] + u[1] * v[1] + u[2] * v[2]; }

} // namespace

// A displacement of Cartesian length t changes the fractional coordinate along
// axis i by at most t / h_i, h_i the spacing of the lattice planes spanned by the
// other two vectors. With bins no narrower than t / h_i, two points within t lie
// in the same or neighbouring bins.
SiteGrid::SiteGrid(const Mat& lattice, double tolerance) {
  const double volume = std::abs(dot(lattice[0], cross(lattice[1], lattice[2])));
  for (int i = 0; i < 3; ++i) {
    const Vec face = cross(lattice[(i + 1) % 3], lattice[(i + 2) % 3]);
    const double spacing = volume / std::sqrt(dot(face, face));
    const double n = tolerance > 0 ? std::floor(spacing / tolerance) : 1;
    bins_[i] = static_cast<int>(std::clamp(std::isfinite(n) ? n : 1.0, 1.0, 256.0));
  }
}

std::array<int, 3> SiteGrid::bin_of(const Vec& frac) const {
  std::array<int, 3> b{};
  for (int i = 0; i < 3; ++i) {
    const double f = frac[i] - std::floor(frac[i]);
    b[i] = std::min(bins_[i] - 1, std::max(0, static_cast<int>(f * bins_[i])));
  }
  return b;
}

std::int64_t SiteGrid::key(int i, int j, int k) const {
  auto wrap = [](int x, int n) { return ((x % n) + n) % n; };
  return (static_cast<std::int64_t>(wrap(i, bins_[0])) * bins_[1] + wrap(j, bins_[1])) * bins_[2] + wrap(k, bins_[2]);
}

void SiteGrid::insert(const Vec& frac, std::size_t id) {
  const auto b = bin_of(frac);
  cells_[key(b[0], b[1], b[2])].push_back(id);
}

std::vector<std::size_t> SiteGrid::candidates(const Vec& frac) const {
  const auto b = bin_of(frac);
  std::set<std::int64_t> keys; // a grid of fewer than 3 bins along an axis meets a bin twice
  for (int di = -1; di <= 1; ++di)
    for (int dj = -1; dj <= 1; ++dj)
      for (int dk = -1; dk <= 1; ++dk) keys.insert(key(b[0] + di, b[1] + dj, b[2] + dk));
  std::vector<std::size_t> out;
  for (std::int64_t k : keys) {
    auto it = cells_.find(k);
    if (it != cells_.end()) out.insert(out.end(), it->second.begin(), it->second.end());
  }
  std::sort(out.begin(), out.end());
  return out;
}

} // namespace ts
