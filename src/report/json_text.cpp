#include "report/json_text.hpp"

#include <sstream>

namespace ts {

std::string json_text(const toml::table& t) {
  std::ostringstream os;
  os << toml::json_formatter{t} << "\n";
  return os.str();
}

} // namespace ts
