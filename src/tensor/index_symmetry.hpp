// The reduced basis of a tensor with intrinsic index symmetry: one component
// per orbit of multi-indices under the index permutations, so that an elastic
// tensor is solved for in 21 unknowns and not 81. Multi-indices are coded in
// base 3 with the first index most significant (x=0, y=1, z=2), so the
// representative of each orbit is its lexicographically first member.
#pragma once

#include "tensor/tensor_spec.hpp"

#include <cstdint>
#include <memory>
#include <string>
#include <vector>

namespace ts {

class IndexSymmetry {
public:
  explicit IndexSymmetry(const TensorSpec& spec);

  int rank() const { return rank_; }
  int full_size() const { return full_size_; }                 // 3^rank
  int size() const { return static_cast<int>(reps_.size()); }  // number of reduced components
  // Representative multi-index code of reduced component r.
  int rep_code(int r) const { return reps_[r]; }
  // Reduced component of a full multi-index code, or -1 when the index symmetry forces it to zero.
  int reduced_of(int code) const { return reduced_[code]; }
  // T[code] = sign_of(code) · t[reduced_of(code)].
  int sign_of(int code) const { return sign_[code]; }
  // Full codes belonging to reduced component r (its orbit), with their signs.
  const std::vector<int>& members(int r) const { return members_[r]; }

  // Digits of a code, first index first.
  std::vector<int> digits(int code) const;
  int code_of(const std::vector<int>& digits) const;
  // Apply a position permutation: result[p] = digits[perm[p]].
  int permuted(int code, const std::vector<int>& perm) const;

private:
  int rank_ = 0, full_size_ = 1;
  std::vector<int> reps_, reduced_, sign_;
  std::vector<std::vector<int>> members_;
};

// The index symmetry of a spec, built once per distinct symmetry (rank, index
// permutations, Onsager exchange) and shared: a survey or a catalogue asks for the
// same spec in every group. Safe to call from several threads.
std::shared_ptr<const IndexSymmetry> index_symmetry_of(const TensorSpec& spec);

// "xyz" for a code.
std::string index_string(int code, int rank);

} // namespace ts
