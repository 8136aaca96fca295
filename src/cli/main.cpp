// tensorsieve: which responses a crystal, film or interface may show, from
// Neumann's principle on (magnetic) point groups. This file only wires the
// subcommands and turns errors into messages and exit codes (docs/cli.md).
#include "cli/commands.hpp"
#include "core/error.hpp"
#include "core/text.hpp"
#include "core/output_file.hpp"

#include <iostream>
#include <malloc.h>

namespace ts::cli {

void add_output_options(CLI::App& cmd, OutputOptions& o) {
  cmd.add_option("-f,--format", o.format, "text (default), markdown, latex or json")->capture_default_str();
  cmd.add_option("-o,--output", o.output, "write the report to this file instead of standard output");
}

const char* const kGroupSymbolHelp =
    "point group: 4mm (no primes: a non-magnetic crystal, 4mm1'), 4m'm', -3'm', or Schoenflies C4v";

void add_colourless_flag(CLI::App& cmd, bool& colourless) {
  cmd.add_flag("--colourless", colourless,
               "read a symbol without primes as the colourless group (magnetic order, no time reversal), "
               "not as the non-magnetic crystal G1'");
}

void emit(const OutputOptions& o, const std::string& text) { write_output(o.output, text); }

} // namespace ts::cli

int main(int argc, char** argv) {
  // The exact solver allocates and frees many short-lived vectors; glibc's default
  // trimming hands the top of the heap back to the kernel after each burst and makes
  // rank-4 and rank-6 work several times slower. Keep it (docs/performance.md).
  mallopt(M_TRIM_THRESHOLD, 256 * 1024 * 1024);
  mallopt(M_TOP_PAD, 16 * 1024 * 1024);
  mallopt(M_MMAP_THRESHOLD, 64 * 1024 * 1024);
  CLI::App app{"tensorsieve: symmetry-allowed transport and optical responses of crystals, films and interfaces"};
  app.set_version_flag("--version", std::string("tensorsieve ") + TENSORSIEVE_VERSION);
  app.require_subcommand(1);
  ts::cli::setup_groups(app);
  ts::cli::setup_group(app);
  ts::cli::setup_identify(app);
  ts::cli::setup_form(app);
  ts::cli::setup_survey(app);
  ts::cli::setup_run(app);
  ts::cli::setup_sample(app);
  ts::cli::setup_responses(app);
  ts::cli::setup_observe(app);
  ts::cli::setup_screen(app);
  ts::cli::setup_fit(app);
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    return app.exit(e) == 0 ? 0 : static_cast<int>(ts::ErrorKind::usage);
  } catch (const ts::Error& e) {
    std::cerr << ts::printable_message(std::string("tensorsieve: error: ") + e.what()) << "\n";
    return e.exit_code();
  } catch (const std::exception& e) {
    std::cerr << ts::printable_message(std::string("tensorsieve: internal error: ") + e.what()) << "\n";
    return static_cast<int>(ts::ErrorKind::internal);
  }
  return 0;
}
