#include "group/matrix3.hpp"

namespace ts {

Mat3 Mat3::inverse() const {
  QSqrt3 d = det();
  if (d.is_zero()) fail(ErrorKind::bad_group, "singular matrix " + str());
  Mat3 r;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      int i1 = (j + 1) % 3, i2 = (j + 2) % 3, j1 = (i + 1) % 3, j2 = (i + 2) % 3;
      r.m[i][j] = (m[i1][j1] * m[i2][j2] - m[i1][j2] * m[i2][j1]) / d;
    }
  return r;
}

std::string vec_str(const Vec3& v) {
  return "[" + v[0].str() + ", " + v[1].str() + ", " + v[2].str() + "]";
}

std::string Mat3::str() const {
  std::string s = "[";
  for (int i = 0; i < 3; ++i) {
    if (i) s += ", ";
    s += vec_str(m[i]);
  }
  return s + "]";
}

} // namespace ts
