// Neumann's principle, exactly: the components of a tensor that a point group
// allows, as linear combinations of free parameters named after their leading
// components (the first nonzero component in x<y<z order, e.g. d_xxz).
//
// The solver imposes invariance under the group's generators only and works
// in the reduced (index-symmetric) basis. For groups whose operations are
// signed permutations of x, y, z (all groups in cubic, tetragonal,
// orthorhombic, monoclinic and triclinic frames) or monomial in the circular
// basis x±iy, z (trigonal and hexagonal frames), invariance reduces to orbits
// with phases (12th roots of unity): no linear system is solved. Any other
// exact group falls back to Gaussian elimination over Q(√3).
#pragma once

#include "core/surd.hpp"
#include "group/point_group.hpp"
#include "tensor/frame.hpp"
#include "tensor/index_symmetry.hpp"

#include <array>
#include <memory>
#include <string>
#include <vector>

namespace ts {

struct LinearTerm {
  int parameter;
  Surd coefficient;
  friend bool operator==(const LinearTerm& a, const LinearTerm& b) {
    return a.parameter == b.parameter && a.coefficient == b.coefficient;
  }
};

struct AllowedForm {
  TensorSpec spec;
  std::shared_ptr<const IndexSymmetry> symmetry;
  std::vector<int> parameter_components;           // reduced component that names each free parameter
  std::vector<std::vector<LinearTerm>> components;  // value of each reduced component

  int independent() const { return static_cast<int>(parameter_components.size()); }
  std::string parameter_name(int j) const;
  std::string component_name(int full_code) const;
  std::vector<LinearTerm> value(int full_code) const; // with the index-symmetry sign applied
  bool is_zero(int full_code) const { return value(full_code).empty(); }
  int nonzero_components() const; // count over all 3^n components
};

// The allowed form in the group's own Cartesian frame.
AllowedForm allowed_form(const TensorSpec& spec, const PointGroup& group);
// The allowed form with components referred to another frame.
AllowedForm allowed_form(const TensorSpec& spec, const PointGroup& group, const Frame& frame);

// Only the number of independent components (same solver, no naming).
int independent_count(const TensorSpec& spec, const PointGroup& group);

// Which exact method the solver uses for a group (for reports and tests).
enum class SolverPath { signed_permutation, circular_basis, general_elimination };
SolverPath solver_path(const PointGroup& group);

} // namespace ts
