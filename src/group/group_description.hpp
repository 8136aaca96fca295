// One group described for a report: the group and, when asked for, each of its
// subgroups named by the catalogue (the tabulated setting with exactly its
// operations, or its type). Computed here so the writers only format.
#pragma once

#include "group/group_catalogue.hpp"

#include <string>
#include <vector>

namespace ts {

struct NamedSubgroup {
  PointGroup group;        // in the frame of the described group
  std::string symbol;      // the tabulated setting's symbol, or the type's symbol followed by "*"
  std::string type_symbol; // the standard symbol of its type
};

struct GroupDescription {
  const NamedGroup* group = nullptr;
  bool with_subgroups = false;
  std::vector<NamedSubgroup> subgroups;
};

GroupDescription describe_group(const NamedGroup& g, bool with_subgroups, const GroupCatalogue& catalogue);

} // namespace ts
