// What kind of tensor is asked for: rank, polar or axial, time-even (i-type) or
// time-odd (c-type), its intrinsic index symmetry, and, for transport
// coefficients, the Onsager-Kleiner transposition that time-reversed
// operations apply (Kleiner, Phys. Rev. 142, 318 (1966)).
//
// Two ways in (docs/spec-syntax.md):
//   Jahn symbols  (Jahn, Acta Cryst. 2, 30 (1949)):  V  aeV  [V2]  V[V2]  [[V2]2]  a{V2}  eV[V2]V
//   index specs   (ours):   d_ijk: polar, sym(jk)      sigma_ab: onsager(a,b)
//                           rho_abk: axial, time-odd, onsager(a,b)     c_ijkl: sym(ij), sym(kl), sym(ij,kl)
#pragma once

#include <string>
#include <vector>

namespace ts {

constexpr int max_rank = 6;

// A permutation of index positions with a sign: the tensor obeys
// T[I∘perm] = sign · T[I], i.e. component (i_perm[0], ..., i_perm[n-1]) equals sign times (i_0, ..., i_{n-1}).
struct IndexPermutation {
  std::vector<int> perm;
  int sign = 1;
};

struct TensorSpec {
  std::string name = "T";   // symbol for components: T_xyz, d_xxz, sigma_xy
  std::string letters;      // index letters in order, e.g. "ijk"
  int rank = 0;
  bool axial = false;       // odd number of axial factors: picks up det R
  bool time_odd = false;    // c-type: picks up -1 under primed operations
  std::vector<IndexPermutation> symmetries; // generators of the intrinsic index symmetry
  std::vector<std::string> symmetry_text;   // the same in our syntax: "sym(jk)", "antisym(ab)", "sym(ij,kl)"
  std::vector<int> onsager; // empty, or the position permutation applied by primed operations
  std::string jahn;         // Jahn symbol when the spec came from one (or is equivalent to one)

  std::string description() const; // "rank 3, polar, time-even (i-type), symmetric in jk"
  std::string canonical_text() const; // the spec in our index syntax, round-trips through parse
};

// Parse either syntax. Throws Error(bad_spec) pointing at the offending
// character; rank above max_rank throws Error(too_large).
TensorSpec parse_tensor_spec(const std::string& text);
TensorSpec parse_jahn_symbol(const std::string& text);
TensorSpec parse_index_spec(const std::string& text);

} // namespace ts
