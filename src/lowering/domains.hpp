// Orientation domains of a lowering step G -> H: one variant per left coset
// g_i H, carrying the tensor g_i·T, all referred to one common sample frame;
// and the average over equally populated variants, which keeps only what G
// allows (Janovec & Přívratská, International Tables Vol. D, ch. 3.4).
#pragma once

#include "lowering/curie.hpp"
#include "tensor/param_tensor.hpp"

#include <vector>

namespace ts {

struct DomainVariant {
  Operation representative; // g_i (crystal frame)
  PointGroup group;         // g_i H g_i^-1
  ParamTensor tensor;       // g_i·T in the sample frame, in the parameters of variant 1
};

struct DomainAnalysis {
  std::vector<DomainVariant> variants;
  ParamTensor average; // (1/N) Σ g_i·T
};

// `form` is the allowed form in H with components in `frame`.
DomainAnalysis domain_variants(const PointGroup& parent, const PointGroup& child, const AllowedForm& form,
                               const Frame& frame);

// Σ w_i T_i; the weights are volume fractions, one per tensor.
ParamTensor weighted_sum(const std::vector<ParamTensor>& tensors, const std::vector<Rational>& weights);

// A field applied in the lab (magnetic or electric field, current): every
// variant sees the same lab-frame direction, whatever its own orientation.
struct LabField {
  QuantityKind kind = QuantityKind::axial_odd; // axial_odd (B), polar_even (E), polar_odd (j)
  Vec3 direction{};                            // crystal frame
  std::string label;                           // "magnetic field ∥ [100]"
};

// The response linear in a lab field. Variant i is variant 1 turned by g_i, so
// its field expansion is g_i·K with K = ∂T/∂F allowed in H (no field): the
// variant's tensor per unit field is (g_i·K)·f, with f the lab field direction.
// All variants are then in the same parameters (those of K), so their weighted
// sum is exact (Janovec & Přívratská, International Tables Vol. D, ch. 3.4, for
// the tensors of domain states).
struct FieldLinearTerm {
  LabField field;
  TensorSpec expansion;              // K: the part's spec with the field's index appended
  AllowedForm form;                  // K allowed in H, sample frame
  std::vector<ParamTensor> variants; // (g_i·K)·f, rank of the part, in K's parameters
  ParamTensor average;               // Σ w_i (g_i·K)·f
};

// The part's spec with one more index carrying the field's parity; the name
// gains the field's symbol (chi_abc and B give chiB_abcd = ∂chi_abc/∂B_d).
TensorSpec field_expansion_spec(const TensorSpec& spec, QuantityKind field);

FieldLinearTerm field_linear_term(const PointGroup& parent, const PointGroup& child, const TensorSpec& spec,
                                  const LabField& field, const Frame& frame, const std::vector<Rational>& weights);

} // namespace ts
