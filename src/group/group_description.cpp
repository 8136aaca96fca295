#include "group/group_description.hpp"

#include "group/identify.hpp"

namespace ts {

GroupDescription describe_group(const NamedGroup& g, bool with_subgroups, const GroupCatalogue& catalogue) {
  GroupDescription d;
  d.group = &g;
  d.with_subgroups = with_subgroups;
  if (!with_subgroups) return d;
  for (auto& H : g.group.subgroups()) {
    Identification id = identify(H, catalogue);
    std::string symbol = id.same_setting ? id.same_setting->symbol : id.type->symbol + "*";
    d.subgroups.push_back({std::move(H), std::move(symbol), id.type->symbol});
  }
  return d;
}

} // namespace ts
