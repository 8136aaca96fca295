// The one contraction loop of the measurement layer: every component of an
// allowed form times the product of one direction-vector component per index.
// Bars (TrigPoly vectors) and optics (vectors that also depend on the angle of
// incidence) share it.
#pragma once

#include "geometry/angle_series.hpp"

#include <array>
#include <vector>

namespace ts {

// Calls add(parameter, coefficient, product) for every component with a
// nonzero value and a nonzero product Π_k vectors[k][digit_k].
template <class Poly, class Add>
void contract_components(const AllowedForm& form, const std::vector<const std::array<Poly, 3>*>& vectors, Add add) {
  const int rank = form.spec.rank;
  int size = 1;
  for (int i = 0; i < rank; ++i) size *= 3;
  for (int code = 0; code < size; ++code) {
    std::vector<LinearTerm> value = form.value(code);
    if (value.empty()) continue;
    Poly product = Poly(TrigPoly::constant(Rational(1)));
    int c = code;
    for (int k = rank - 1; k >= 0 && !product.is_zero(); --k) {
      product = product * (*vectors[k])[c % 3];
      c /= 3;
    }
    if (product.is_zero()) continue;
    for (const auto& t : value) add(t.parameter, t.coefficient, product);
  }
}

} // namespace ts
