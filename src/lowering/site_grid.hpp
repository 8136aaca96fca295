// Atoms near a point of a periodic cell, found in time independent of how many
// atoms the cell holds. Checking every new atom against every placed one made
// large cells (supercells, many-site structure files) quadratic.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <unordered_map>
#include <vector>

namespace ts {

class SiteGrid {
public:
  using Vec = std::array<double, 3>;
  using Mat = std::array<Vec, 3>; // rows are the lattice vectors a, b, c

  // `tolerance` is a Cartesian distance (same unit as the lattice).
  SiteGrid(const Mat& lattice, double tolerance);

  void insert(const Vec& frac, std::size_t id);

  // Every inserted id that may lie within the tolerance of `frac` (minimum image
  // through rounded fractional differences), in increasing order. A superset:
  // callers apply their own distance test, so results do not depend on the grid.
  std::vector<std::size_t> candidates(const Vec& frac) const;

private:
  std::array<int, 3> bin_of(const Vec& frac) const;
  std::int64_t key(int i, int j, int k) const;
  std::array<int, 3> bins_{};
  std::unordered_map<std::int64_t, std::vector<std::size_t>> cells_;
};

} // namespace ts
