// The option parser's complaints in the project's own error format: what was wrong,
// where (the subcommand), what would be valid, and the closest subcommand or option
// for a mistyped word ("did you mean ...?"), with exit code 2 (docs/cli.md).
#pragma once

#include "core/error.hpp"

#include <CLI/CLI.hpp>

#include <string>
#include <vector>

namespace ts::cli {

// The ts::Error (kind usage) that says what CLI11 refused on this command line. `app`
// is the top-level application after its parse threw `e` (a failure, not --help).
Error parse_error(const CLI::App& app, const CLI::ParseError& e);

// The candidates closest to `word` (edit distance, a prefix counts as close), best first;
// empty when none is close enough to be a plausible typo.
std::vector<std::string> closest_words(const std::string& word, const std::vector<std::string>& candidates);

} // namespace ts::cli
