#include "tensor/survey.hpp"

#include "core/error.hpp"
#include "tensor/allowed_form.hpp"

namespace ts {

std::vector<SurveyRow> survey(const TensorSpec& spec, const std::vector<const NamedGroup*>& groups) {
  std::vector<SurveyRow> rows;
  rows.reserve(groups.size());
  for (const auto* g : groups) rows.push_back({g, independent_count(spec, g->group)});
  return rows;
}

std::vector<const NamedGroup*> survey_groups(const GroupCatalogue& catalogue, bool magnetic, bool colourless) {
  if (magnetic && colourless)
    fail(ErrorKind::usage, "-m lists every magnetic type already; --colourless picks the 32 colourless ones",
         "--colourless", "either -m or --colourless");
  if (magnetic) return catalogue.types();
  std::vector<const NamedGroup*> groups;
  for (const NamedGroup* g : catalogue.crystallographic_types())
    groups.push_back(colourless ? g : &catalogue.grey_of(*g));
  return groups;
}

} // namespace ts
