// The inverse question: a signal is seen that the sample's group forbids; which
// symmetry breaking must have happened? The answer is the set of maximal
// subgroups of the parent that allow the signal (the least breaking that
// explains it), every conjugate on its own because the lab frame is fixed, each
// with the single imposed quantity (if any) whose stabiliser it is. This is the
// logic of ferroic species (Aizu, "Possible species of ferromagnetic,
// ferroelectric, and ferroelastic crystals", Phys. Rev. B 2, 754 (1970)) run
// backwards from one observed quantity.
//
// An observation enters only through a predicate "is it allowed in this
// group?", so component sets, Fourier terms of bar signals or anything else
// linear in symmetry-constrained tensors use the same search. The predicate must
// be monotone: allowed in H implies allowed in every subgroup of H (true for any
// observation that is a nonzero linear function of a tensor, by Neumann's principle).
#pragma once

#include "lowering/curie.hpp"

#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace ts {

struct Observation {
  std::string description;
  std::function<bool(const PointGroup&)> allowed_in;
  // Optional: whether the equal-population average over the variants g_i·H of
  // `parent` still shows the signal. Left empty when the observation has no
  // tensor to average; the search then reports "not evaluated".
  std::function<bool(const PointGroup& parent, const PointGroup& h)> survives_equal_domains;
  // Optional: which readings of the observation a group allows (for component
  // observations "i-type" and/or "c-type"), for reports. Empty function: none named.
  std::function<std::vector<std::string>(const PointGroup&)> readings_in;
};

// One imposed quantity whose stabiliser in the parent is exactly a given subgroup.
struct Producer {
  QuantityKind kind = QuantityKind::polar_even;
  Vec3 direction{};  // crystal frame, for vectors
  int free_dimensions = 1; // 1: a unique line; 2 or 3: any generic direction in the fixed plane/space
  Vec3 plane_normal{};     // for free_dimensions == 2
  Mat3 strain = Mat3::identity(); // for strain: a generic invariant strain, crystal frame
};

struct MinimalBreaking {
  PointGroup group;            // crystal frame, a subgroup of the parent
  std::size_t index = 0;       // [parent : group]
  std::size_t variants = 0;    // domain variants: one per coset
  std::size_t orientations = 0; // distinct groups among the variants g_i H g_i^-1
  std::vector<Producer> producers; // empty: no single vector or strain does it
  std::optional<bool> cancels_with_equal_domains;
};

struct InverseResult {
  bool allowed_in_parent = false;
  std::size_t subgroups = 0;       // proper subgroups of the parent considered
  std::size_t predicate_calls = 0; // groups the predicate was asked about
  std::vector<MinimalBreaking> maximal; // largest order first, then canonical order of operations
};

// All subgroups of g, computed once per group and kept for the life of the
// program (not guarded for threads: the engine starts none).
const std::vector<PointGroup>& cached_subgroups(const PointGroup& g);

// The search. Groups that lie inside an allowing group already found are never
// passed to the predicate: they allow it too but are not maximal.
InverseResult find_minimal_breaking(const PointGroup& parent, const Observation& observation);

// Imposed vectors (polar and axial, time-even and time-odd) and strains whose
// stabiliser in parent is exactly h, in the order polar displacement,
// magnetisation, current, axial time-even rotation, strain.
std::vector<Producer> single_producers(const PointGroup& parent, const PointGroup& h);

} // namespace ts
