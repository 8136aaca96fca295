// The screening table: one row per structure file, as an aligned text table,
// Markdown, CSV (one integer count per response, 0 = forbidden) or JSON Lines
// (one object per file, for scripts that stream).
#pragma once

#include "scenario/screening.hpp"

#include <string>
#include <vector>

namespace ts {

enum class ScreenFormat { text, markdown, csv, jsonl };
ScreenFormat parse_screen_format(const std::string& name); // throws Error(usage)

std::string write_screen(const ScreenRequest& request, const std::vector<ScreenRow>& rows, ScreenFormat f);

} // namespace ts
