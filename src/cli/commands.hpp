// One setup_/run_ pair per subcommand. setup_ binds options into a shared
// struct; the callback calls the library and a writer, nothing else.
#pragma once

#include <CLI/CLI.hpp>

#include <string>

namespace ts::cli {

struct OutputOptions {
  std::string format = "text";
  std::string output = "-";
};
void add_output_options(CLI::App& cmd, OutputOptions& o);
// --colourless, the one way to read a group symbol without primes as the colourless
// magnetic group G instead of the non-magnetic crystal G1' (docs/conventions.md, section 3).
void add_colourless_flag(CLI::App& cmd, bool& colourless);
// Help text of a group-symbol argument, saying how a symbol without primes is read.
extern const char* const kGroupSymbolHelp;
void emit(const OutputOptions& o, const std::string& text); // atomic file write or stdout

void setup_groups(CLI::App& app);
void setup_group(CLI::App& app);
void setup_identify(CLI::App& app);
void setup_form(CLI::App& app);
void setup_survey(CLI::App& app);
void setup_run(CLI::App& app);
void setup_sample(CLI::App& app);
void setup_responses(CLI::App& app);
void setup_observe(CLI::App& app);
void setup_screen(CLI::App& app);
void setup_fit(CLI::App& app);

} // namespace ts::cli
