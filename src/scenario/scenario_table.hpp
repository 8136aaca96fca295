// The scenario reader on a TOML table already in memory (the Python module
// builds one from a dict): the loader side of scenario.hpp, kept apart so toml++
// stays out of the headers the rest of the library includes.
#pragma once

#include "scenario/scenario.hpp"

#include <toml++/toml.h>

#include <string>

namespace ts {

// `path` names the table in messages, and relative structure files are read from its folder.
Scenario scenario_from_table(const toml::table& root, const std::string& path);

// An angle key: whole degrees (an integer) or a word such as "rotating" or "any".
std::string get_angle(const toml::table& t, const char* key, const std::string& file, const char* valid);
// The [[pump_probe]] and [[photocurrent]] tables (pump_table.cpp).
void read_pump_tables(const toml::table& root, const std::string& path, Scenario& sc);

} // namespace ts
