// A scenario of a film with one Hall bar, for tests of what bars read.
#pragma once

#include "scenario/scenario.hpp"

#include <string>
#include <vector>

namespace ts::test {

inline Scenario film(const std::string& group, const std::string& cut, const std::vector<std::string>& responses,
                     const std::string& current, const std::string& field) {
  Scenario sc;
  sc.group = group;
  sc.cut = cut;
  sc.responses = responses;
  BarSpec b;
  b.name = "test bar";
  b.current = current;
  b.field = field;
  sc.bars.push_back(b);
  return sc;
}

} // namespace ts::test
