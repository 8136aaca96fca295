// tensorsieve: which responses a crystal, film or interface may show, from
// Neumann's principle on (magnetic) point groups. This file only wires the
// subcommands and turns errors into messages and exit codes (docs/cli.md).
#include "cli/commands.hpp"
#include "cli/parse_errors.hpp"
#include "core/error.hpp"
#include "core/text.hpp"
#include "core/output_file.hpp"
#include "group/group_catalogue.hpp"
#include "report/report_format.hpp"

#include <cstdlib>
#include <ctime>
#include <iostream>
#include <malloc.h>
#include <sys/ioctl.h>
#include <unistd.h>

namespace ts::cli {

namespace {
std::string g_command_line = "tensorsieve";
std::string g_note; // said with the report, so a command that fails says only what failed

// Columns of the terminal on standard output; 0 when it is a file or a pipe.
std::size_t terminal_width() {
  if (!isatty(STDOUT_FILENO)) return 0;
  winsize ws{};
  if (ioctl(STDOUT_FILENO, TIOCGWINSZ, &ws) == 0 && ws.ws_col >= 40) return ws.ws_col;
  if (const char* c = std::getenv("COLUMNS"); c && std::atoi(c) >= 40) return static_cast<std::size_t>(std::atoi(c));
  return 80;
}
} // namespace

const std::string& command_line() { return g_command_line; }

std::string report_date() {
  std::time_t t = std::time(nullptr);
  if (const char* epoch = std::getenv("SOURCE_DATE_EPOCH"); epoch && *epoch) t = static_cast<std::time_t>(std::atoll(epoch));
  std::tm utc{};
  gmtime_r(&t, &utc);
  char buf[16];
  std::strftime(buf, sizeof buf, "%Y-%m-%d", &utc);
  return buf;
}

void set_command_line(int argc, char** argv) {
  for (int i = 1; i < argc; ++i) {
    std::string a = argv[i];
    if (!a.empty() && a.front() == '/') a = a.substr(a.find_last_of('/') + 1); // no machine paths on a page
    if (a.empty() || a.find_first_of(" \t'\"()[]$&;|<>*?!#~`\\") != std::string::npos) {
      std::string q = "'";
      for (char c : a) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
      a = q + "'";
    }
    g_command_line += " " + a;
  }
}

void add_output_options(CLI::App& cmd, OutputOptions& o, bool html) {
  o.html = html;
  cmd.add_option("-f,--format", o.format,
                 html ? "text (default), markdown, latex, json or html (a page with the figures)"
                      : "text (default), markdown, latex or json")
      ->capture_default_str();
  cmd.add_option("-o,--output", o.output, "write the report to this file instead of standard output");
  cmd.add_option("--width", o.width,
                 "wrap text reports to N columns (0: never; default: the terminal's width on a terminal, else never)");
  // A format the subcommand cannot write fails before any work is done; the width is
  // set before any writer runs.
  cmd.parse_complete_callback([&o] {
    check_format(o);
    if (o.width < -1 || (o.width > 0 && o.width < 40))
      fail(ErrorKind::usage, "--width " + std::to_string(o.width) + " is too narrow for a report", "--width",
           "0 (no wrapping) or 40 columns and more");
    set_text_width(o.width >= 0 ? static_cast<std::size_t>(o.width) : o.output == "-" ? terminal_width() : 0);
  });
}

void check_format(const OutputOptions& o) {
  if (o.html && o.format == "html") return;
  if (o.format == "html")
    fail(ErrorKind::usage, "the html page is written by `run`, `sample` and `fit` only", "--format",
         "text, markdown, latex, json");
  try {
    parse_format(o.format);
  } catch (const Error& e) {
    if (!o.html) throw;
    fail(ErrorKind::usage, e.problem(), e.location(), e.valid() + ", html");
  }
}

const char* const kGroupSymbolHelp =
    "point group: 4mm (no primes: a non-magnetic crystal, 4mm1'), 4m'm', -3'm', or Schoenflies C4v";

void add_colourless_flag(CLI::App& cmd, bool& colourless) {
  cmd.add_flag("--colourless", colourless,
               "read a symbol without primes as the colourless group (magnetic order, no time reversal), "
               "not as the non-magnetic crystal G1'");
}

void emit(const OutputOptions& o, const std::string& text) {
  // JSON escapes control characters itself; every other format is read as text.
  const std::string safe = o.format == "json" ? text : without_control_characters(text);
  write_output(o.output, o.format == "text" ? wrap_text(safe, text_width()) : safe);
  std::cerr << g_note;
  if (o.output != "-") std::cerr << "tensorsieve: wrote " << o.output << "\n";
}

const NamedGroup& read_group(const std::string& symbol, bool colourless) {
  const auto& cat = GroupCatalogue::builtin();
  const NamedGroup& literal = cat.get(symbol);
  const NamedGroup& g = cat.get(symbol, colourless ? PlainSymbol::colourless : PlainSymbol::nonmagnetic);
  // Said on standard error, as `run` says it in its report: a bare symbol silently read as
  // G1' makes every c-type answer zero, which surprises whoever meant magnetic order.
  if (&g != &literal)
    g_note = "tensorsieve: note: " + literal.symbol + " read as the non-magnetic crystal " + g.symbol +
             " (--colourless for the colourless magnetic group " + literal.symbol + ")\n";
  return g;
}

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
  app.name("tensorsieve"); // the usage line names the program, wherever it was started from
  app.require_subcommand(1);
  // The parser's own messages are replaced by ours (parse_errors.hpp); its help stays.
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
  ts::cli::set_command_line(argc, argv);
  if (argc <= 1) { // a bare `tensorsieve` asks what the program does
    std::cout << app.help();
    return 0;
  }
  try {
    try {
      app.parse(argc, argv);
    } catch (const CLI::ParseError& e) {
      if (e.get_exit_code() == 0) return app.exit(e); // --help, --version
      throw ts::cli::parse_error(app, e);
    }
  } catch (const ts::Error& e) {
    std::cerr << ts::printable_message(std::string("tensorsieve: error: ") + e.what()) << "\n";
    return e.exit_code();
  } catch (const std::exception& e) {
    std::cerr << ts::printable_message(std::string("tensorsieve: internal error: ") + e.what()) << "\n";
    return static_cast<int>(ts::ErrorKind::internal);
  }
  return 0;
}
