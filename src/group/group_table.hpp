// The group catalogue derived once at build time. Deriving the 122 magnetic types
// from groups/*.toml (closures, subgroups, identification) is most of the start-up
// of every command; the build runs the same derivation (tools/write_builtin_table.cpp)
// and compiles its result, a text table, into the library. The TOML files stay
// the source of truth: the table carries a fingerprint of the files it was made
// from and is used only for a data directory whose files match it.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>

namespace ts {

// A hash (files_fingerprint) of the names and bytes of dir/groups/*.toml (sorted by name); 0 when
// there are none or one cannot be read.
std::uint64_t group_data_fingerprint(const std::string& data_dir);

// The fingerprint a table was written with (0 for a table of another version).
std::uint64_t group_table_fingerprint(std::string_view table);

// The table compiled into the library (generated into the build tree).
std::string_view built_group_table();

} // namespace ts
