// Floating-point 3x3 matrices for tests that compare our exact operations with
// references that live in doubles (spglib's integer lattice matrices taken to a
// Cartesian frame, normalised identification axes). Kept apart from the exact
// Mat3 on purpose: a reference check must not run through the code it checks.
#pragma once

#include "group/matrix3.hpp"
#include "group/operation.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <string>
#include <vector>

namespace ts::test {

using DMat3 = std::array<std::array<double, 3>, 3>;

inline DMat3 dmat_identity() { return {{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}}; }

inline DMat3 to_dmat(const Mat3& m) {
  DMat3 d{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) d[i][j] = m(i, j).to_double();
  return d;
}

inline DMat3 dmul(const DMat3& a, const DMat3& b) {
  DMat3 c{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      for (int k = 0; k < 3; ++k) c[i][j] += a[i][k] * b[k][j];
  return c;
}

inline DMat3 dtranspose(const DMat3& a) {
  DMat3 t{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) t[i][j] = a[j][i];
  return t;
}

inline double ddet(const DMat3& m) {
  return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
         m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
}

// Inverse by the adjugate; the bases inverted here are far from singular.
inline DMat3 dinverse(const DMat3& m) {
  const double d = ddet(m);
  DMat3 r{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      const int i1 = (j + 1) % 3, i2 = (j + 2) % 3, j1 = (i + 1) % 3, j2 = (i + 2) % 3;
      r[i][j] = (m[i1][j1] * m[i2][j2] - m[i1][j2] * m[i2][j1]) / d;
    }
  return r;
}

inline double max_abs_diff(const DMat3& a, const DMat3& b) {
  double e = 0;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) e = std::max(e, std::fabs(a[i][j] - b[i][j]));
  return e;
}

inline bool is_orthogonal(const DMat3& a, double tol) {
  return max_abs_diff(dmul(a, dtranspose(a)), dmat_identity()) < tol;
}

inline std::string dmat_str(const DMat3& a) {
  std::string s = "[";
  for (int i = 0; i < 3; ++i) {
    s += i ? ", [" : "[";
    for (int j = 0; j < 3; ++j) s += (j ? ", " : "") + std::to_string(a[i][j]);
    s += "]";
  }
  return s + "]";
}

// A point operation in doubles: rotation part and time-reversal flag.
struct DOp {
  DMat3 R{};
  bool primed = false;
};

// Largest entry-wise distance of the best one-to-one matching of two operation
// sets (same flags required), or +inf when the sets differ in size or some
// operation has no partner within tol. Distinct point operations differ by at
// least 1/2 in some entry, so a greedy nearest match within tol is the matching.
inline double set_distance(const std::vector<DOp>& a, const std::vector<DOp>& b, double tol) {
  if (a.size() != b.size()) return INFINITY;
  std::vector<bool> used(b.size(), false);
  double worst = 0;
  for (const auto& x : a) {
    bool found = false;
    for (std::size_t j = 0; j < b.size() && !found; ++j) {
      if (used[j] || b[j].primed != x.primed) continue;
      const double e = max_abs_diff(x.R, b[j].R);
      if (e < tol) {
        used[j] = true;
        worst = std::max(worst, e);
        found = true;
      }
    }
    if (!found) return INFINITY;
  }
  return worst;
}

inline std::vector<DOp> to_dops(const std::vector<Operation>& ops) {
  std::vector<DOp> out;
  out.reserve(ops.size());
  for (const auto& op : ops) out.push_back({to_dmat(op.R), op.primed});
  return out;
}

// An order-independent fingerprint of an operation set (entries rounded to 1e-6,
// far finer than the 1/2 - sqrt(3)/2 gap between distinct entries), for finding
// candidate matches quickly; a candidate is then confirmed with set_distance.
inline std::string fingerprint(const std::vector<DOp>& ops) {
  std::vector<std::string> parts;
  parts.reserve(ops.size());
  for (const auto& op : ops) {
    std::string p = op.primed ? "'" : "";
    for (const auto& row : op.R)
      for (double v : row) p += std::to_string(std::lround(v * 1e6)) + ",";
    parts.push_back(p);
  }
  std::sort(parts.begin(), parts.end());
  std::string key;
  for (const auto& p : parts) key += p + ";";
  return key;
}

} // namespace ts::test
