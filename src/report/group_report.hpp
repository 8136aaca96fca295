// Reports about groups: the list of groups, one group described (operations,
// subgroups), a tensor surveyed across groups, and an identified operation set.
#pragma once

#include "group/group_description.hpp"
#include "group/identify.hpp"
#include "report/report_format.hpp"
#include "tensor/survey.hpp"

#include <string>
#include <vector>

namespace ts {

std::string write_group_list(const std::vector<const NamedGroup*>& groups, Format f);
std::string write_group_description(const GroupDescription& d, Format f);
std::string write_survey(const TensorSpec& spec, const std::vector<SurveyRow>& rows, Format f);
std::string write_identification(const PointGroup& input, const Identification& id, Format f);

} // namespace ts
