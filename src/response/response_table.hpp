// The response catalogue read once at build time. Parsing catalogue.toml with
// toml++ and checking every entry is most of the start-up of a command that names
// a response; the build runs the same load (tools/write_response_table.cpp) and
// compiles its result, a table in the record format of data/record_table.hpp,
// into the library. The TOML files stay the source of truth: the table carries a
// fingerprint of catalogue.toml and families.toml and is used only when the files
// beside the catalogue path are the ones it was made from.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>

namespace ts {

// A hash (files_fingerprint) of the names and bytes of the catalogue file and of families.toml
// beside it (when present); 0 when the catalogue cannot be read.
std::uint64_t response_data_fingerprint(const std::string& catalogue_path);

// The fingerprint a table was written with (0 for a table of another version).
std::uint64_t response_table_fingerprint(std::string_view table);

// The table compiled into the library (generated into the build tree).
std::string_view built_response_table();

} // namespace ts
