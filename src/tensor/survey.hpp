// One tensor across many groups: the count of independent components in each
// of the 32 crystal classes or the 122 magnetic point-group types.
#pragma once

#include "group/group_catalogue.hpp"
#include "tensor/tensor_spec.hpp"

#include <vector>

namespace ts {

struct SurveyRow {
  const NamedGroup* group;
  int independent;
};

std::vector<SurveyRow> survey(const TensorSpec& spec, const std::vector<const NamedGroup*>& groups);

} // namespace ts
