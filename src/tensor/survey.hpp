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

// The groups a survey runs over: the 122 magnetic types (magnetic), the 32 classes as
// colourless groups G (colourless), or by default the 32 classes as non-magnetic
// crystals G1'. Both flags at once are a usage error naming --colourless.
std::vector<const NamedGroup*> survey_groups(const GroupCatalogue& catalogue, bool magnetic, bool colourless);

} // namespace ts
