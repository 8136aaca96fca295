#include "tensor/frame.hpp"

#include "core/error.hpp"

namespace ts {

bool Frame::is_identity() const {
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      if (axes[i][j] != QSqrt3(i == j ? 1 : 0)) return false;
  return true;
}

void Frame::validate() const {
  for (int i = 0; i < 3; ++i) {
    if (is_zero(axes[i])) fail(ErrorKind::bad_geometry, "frame axis " + labels[i] + " is the zero vector");
    if (!dot(axes[i], axes[i]).is_rational())
      fail(ErrorKind::bad_geometry, "frame axis " + labels[i] + " has an irrational length",
           "", "lattice directions of the crystal");
    for (int j = i + 1; j < 3; ++j)
      if (!dot(axes[i], axes[j]).is_zero())
        fail(ErrorKind::bad_geometry, "frame axes " + labels[i] + " and " + labels[j] + " are not perpendicular");
  }
  if (dot(cross(axes[0], axes[1]), axes[2]).sign() <= 0)
    fail(ErrorKind::bad_geometry, "the frame x, y, z is left-handed", "", "y = z × x");
}

} // namespace ts
