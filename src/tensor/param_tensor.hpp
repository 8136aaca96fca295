// A tensor whose components are exact linear combinations of named
// parameters: the allowed form expanded to all 3^n components, which can be
// acted on by a point operation (to get a domain variant) and averaged.
#pragma once

#include "tensor/allowed_form.hpp"

#include <array>
#include <vector>

namespace ts {

using Combination = std::vector<LinearTerm>; // sorted by parameter, no zero coefficients

// 3x3 matrix with exact surd entries: a point operation seen in a rotated frame.
using SurdMatrix = std::array<std::array<Surd, 3>, 3>;

struct ParamTensor {
  int rank = 0;
  std::vector<Combination> components; // by full multi-index code
  static ParamTensor of(const AllowedForm& form);
  bool is_zero(int code) const { return components[code].empty(); }
};

// g·T for an operation given in the tensor's frame (matrix S), with the sign
// det(S)^axial · (-1)^(time-odd and primed) and, for a primed operation of an
// Onsager spec, the exchange of the response and drive indices.
ParamTensor apply_operation(const ParamTensor& t, const SurdMatrix& S, const TensorSpec& spec, bool primed, int det);

ParamTensor add(const ParamTensor& a, const ParamTensor& b);
ParamTensor scaled(const ParamTensor& a, const Rational& s);

Combination combine(const Combination& a, const Combination& b, const Surd& fb); // a + fb·b

// The matrix of an operation R (crystal frame) in a frame with exact axes
// (rows r_i, not normalised): (Q R Qᵀ)_ij = r_i·R r_j / (|r_i||r_j|).
SurdMatrix operation_in_frame(const Mat3& R, const Frame& frame);

} // namespace ts
