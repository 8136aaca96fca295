#include "lowering/curie.hpp"

namespace ts {

const char* quantity_kind_name(QuantityKind k) {
  switch (k) {
  case QuantityKind::polar_even: return "polar vector, time-even";
  case QuantityKind::polar_odd: return "polar vector, time-odd";
  case QuantityKind::axial_odd: return "axial vector, time-odd";
  case QuantityKind::axial_even: return "axial vector, time-even";
  case QuantityKind::strain: return "symmetric rank-2 tensor, time-even";
  case QuantityKind::line: return "unoriented line";
  }
  return "";
}

Mat3 uniaxial_strain(const Vec3& d) {
  Mat3 m;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) m(i, j) = d[i] * d[j];
  return m;
}

Mat3 shear_strain(const Vec3& a, const Vec3& b) {
  Mat3 m;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) m(i, j) = a[i] * b[j] + b[i] * a[j];
  return m;
}

PointGroup stabiliser(const PointGroup& g, const ImposedQuantity& q) {
  std::vector<Operation> kept;
  for (const auto& op : g.operations()) {
    bool keep = false;
    switch (q.kind) {
    case QuantityKind::strain:
      keep = op.R * q.tensor * op.R.transpose() == q.tensor;
      break;
    case QuantityKind::line: {
      Vec3 v = op.R * q.direction;
      keep = v == q.direction || v == -q.direction;
      break;
    }
    default: {
      Vec3 v = op.R * q.direction;
      bool axial = q.kind == QuantityKind::axial_odd || q.kind == QuantityKind::axial_even;
      bool odd = q.kind == QuantityKind::axial_odd || q.kind == QuantityKind::polar_odd;
      int sign = (axial && op.det() < 0 ? -1 : 1) * (odd && op.primed ? -1 : 1);
      keep = sign > 0 ? v == q.direction : v == -q.direction;
    }
    }
    if (keep) kept.push_back(op);
  }
  return PointGroup::from_closed_set(std::move(kept), g.lattice());
}

} // namespace ts
