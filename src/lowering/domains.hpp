// Orientation domains of a lowering step G -> H: one variant per left coset
// g_i H, carrying the tensor g_i·T, all referred to one common sample frame;
// and the average over equally populated variants, which keeps only what G
// allows (Janovec & Přívratská, International Tables Vol. D, ch. 3.4).
#pragma once

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

} // namespace ts
