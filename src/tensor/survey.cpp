#include "tensor/survey.hpp"

#include "tensor/allowed_form.hpp"

namespace ts {

std::vector<SurveyRow> survey(const TensorSpec& spec, const std::vector<const NamedGroup*>& groups) {
  std::vector<SurveyRow> rows;
  rows.reserve(groups.size());
  for (const auto* g : groups) rows.push_back({g, independent_count(spec, g->group)});
  return rows;
}

} // namespace ts
