// Small text helpers shared by the report writers and the catalogue loader.
#pragma once

#include <string>
#include <vector>

namespace ts {

inline std::string join(const std::vector<std::string>& items, const std::string& separator) {
  std::string s;
  for (std::size_t i = 0; i < items.size(); ++i) s += (i ? separator : "") + items[i];
  return s;
}

} // namespace ts
