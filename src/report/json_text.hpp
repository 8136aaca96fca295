// JSON is produced by a library (toml++'s JSON formatter) from a toml::table,
// never by string concatenation. Tables keep keys sorted: canonical bytes.
#pragma once

#include <toml++/toml.h>

#include <string>

namespace ts {

// The document with a top-level "version" key (the tensorsieve version) added.
std::string json_text(const toml::table& t);
// The same object on one line (JSON Lines), ending in a newline.
std::string json_line(const toml::table& t);

} // namespace ts
