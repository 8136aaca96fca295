// One setup_/run_ pair per subcommand. setup_ binds options into a shared
// struct; the callback calls the library and a writer, nothing else.
#pragma once

#include "group/group_catalogue.hpp"

#include <CLI/CLI.hpp>

#include <string>

namespace ts::cli {

struct OutputOptions {
  std::string format = "text";
  std::string output = "-";
  bool html = false; // the subcommand writes the html page too (run, sample, fit)
  int width = -1;     // --width; -1: the terminal's when standard output is one, else no wrapping
};
void add_output_options(CLI::App& cmd, OutputOptions& o, bool html = false);
// A format this subcommand cannot write fails with the list of those it can.
void check_format(const OutputOptions& o);
// The group a symbol names, a symbol without primes read as the non-magnetic crystal G1'
// unless `colourless`; when it did, emit() says so on standard error with the report.
const NamedGroup& read_group(const std::string& symbol, bool colourless);
// --colourless, the one way to read a group symbol without primes as the colourless
// magnetic group G instead of the non-magnetic crystal G1' (docs/conventions.md, section 3).
void add_colourless_flag(CLI::App& cmd, bool& colourless);
// Help text of a group-symbol argument, saying how a symbol without primes is read.
extern const char* const kGroupSymbolHelp;
// Atomic file write (then "wrote FILE" on standard error) or standard output.
void emit(const OutputOptions& o, const std::string& text);

// The command line as the HTML page states it: absolute paths by their file names.
const std::string& command_line();
// The date a report is written, YYYY-MM-DD (UTC), or that of $SOURCE_DATE_EPOCH when
// set, so a page can be rebuilt byte for byte.
std::string report_date();
void set_command_line(int argc, char** argv);

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
