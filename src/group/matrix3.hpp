// 3-vectors and 3x3 matrices over Q(√3), the exact arithmetic of point
// operations. Matrices act on column vectors of Cartesian components.
#pragma once

#include "core/qsqrt3.hpp"

#include <array>
#include <string>

namespace ts {

using Vec3 = std::array<QSqrt3, 3>;

struct Mat3 {
  std::array<std::array<QSqrt3, 3>, 3> m{};

  static Mat3 identity() {
    Mat3 r;
    for (int i = 0; i < 3; ++i) r.m[i][i] = QSqrt3(1);
    return r;
  }
  const QSqrt3& operator()(int i, int j) const { return m[i][j]; }
  QSqrt3& operator()(int i, int j) { return m[i][j]; }

  friend Mat3 operator*(const Mat3& x, const Mat3& y) {
    Mat3 r;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) {
        QSqrt3 s;
        for (int k = 0; k < 3; ++k)
          if (!x.m[i][k].is_zero() && !y.m[k][j].is_zero()) s += x.m[i][k] * y.m[k][j];
        r.m[i][j] = s;
      }
    return r;
  }
  friend Vec3 operator*(const Mat3& x, const Vec3& v) {
    Vec3 r;
    for (int i = 0; i < 3; ++i)
      for (int k = 0; k < 3; ++k)
        if (!x.m[i][k].is_zero() && !v[k].is_zero()) r[i] += x.m[i][k] * v[k];
    return r;
  }
  friend Mat3 operator-(const Mat3& x, const Mat3& y) {
    Mat3 r;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) r.m[i][j] = x.m[i][j] - y.m[i][j];
    return r;
  }
  friend Mat3 operator+(const Mat3& x, const Mat3& y) {
    Mat3 r;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) r.m[i][j] = x.m[i][j] + y.m[i][j];
    return r;
  }
  Mat3 scaled(const QSqrt3& s) const {
    Mat3 r;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) r.m[i][j] = m[i][j] * s;
    return r;
  }
  friend bool operator==(const Mat3& x, const Mat3& y) { return x.m == y.m; }
  friend bool operator!=(const Mat3& x, const Mat3& y) { return !(x == y); }

  Mat3 transpose() const {
    Mat3 r;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) r.m[i][j] = m[j][i];
    return r;
  }
  QSqrt3 trace() const { return m[0][0] + m[1][1] + m[2][2]; }
  QSqrt3 det() const {
    return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) -
           m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
           m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
  }
  // Exact inverse by the adjugate; throws for a singular matrix.
  Mat3 inverse() const;
  bool is_orthogonal() const { return (*this) * transpose() == identity(); }
  std::string str() const; // "[[1, 0, 0], [0, -1/2, sqrt(3)/2], ...]"
};

inline QSqrt3 dot(const Vec3& a, const Vec3& b) { return a[0] * b[0] + a[1] * b[1] + a[2] * b[2]; }
inline Vec3 cross(const Vec3& a, const Vec3& b) {
  return {a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
}
inline bool is_zero(const Vec3& v) { return v[0].is_zero() && v[1].is_zero() && v[2].is_zero(); }
inline Vec3 operator-(const Vec3& v) { return {-v[0], -v[1], -v[2]}; }
inline Vec3 scaled(const Vec3& v, const QSqrt3& s) { return {v[0] * s, v[1] * s, v[2] * s}; }
// True when a and b are parallel or antiparallel (both nonzero).
inline bool parallel(const Vec3& a, const Vec3& b) { return is_zero(cross(a, b)); }
std::string vec_str(const Vec3& v);

} // namespace ts
