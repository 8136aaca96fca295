// tensorsieve screen PATHS... --response ID ... [--cut (hkl)] [--jobs N]
#include "cli/commands.hpp"
#include "core/error.hpp"
#include "report/screen_report.hpp"
#include "scenario/screen_journal.hpp"
#include "scenario/screening.hpp"

#include <unistd.h>

#include <chrono>
#include <cstdio>
#include <iostream>
#include <memory>

namespace ts::cli {

namespace {

// A one-line bar redrawn in place: only for a person watching a terminal,
// never in files or pipes (the report goes to standard output, untouched).
class ProgressBar {
public:
  void update(std::size_t done, std::size_t total) {
    const double seconds =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
    const double rate = seconds > 0 ? static_cast<double>(done) / seconds : 0;
    const int width = 30;
    const int filled = total ? static_cast<int>(width * done / total) : width;
    std::string bar(static_cast<std::size_t>(filled), '#');
    bar += std::string(static_cast<std::size_t>(width - filled), '.');
    const double left = rate > 0 ? static_cast<double>(total - done) / rate : 0;
    std::fprintf(stderr, "\r[%s] %zu/%zu  %.1f files/s  %.0f s left ", bar.c_str(), done, total, rate, left);
    if (done == total) std::fprintf(stderr, "\n");
    std::fflush(stderr);
  }

private:
  std::chrono::steady_clock::time_point start_ = std::chrono::steady_clock::now();
};

} // namespace

void setup_screen(CLI::App& app) {
  struct Opts {
    std::vector<std::string> paths;
    ScreenRequest request;
    std::string format = "text", output = "-", occupancy = "refuse";
    unsigned threads = 0;
    bool quiet = false;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("screen", "many structure files at once: point group and allowed responses per file");
  cmd->add_option("paths", o->paths, "CIF/mCIF files, folders of them, or @list.txt (one path per line)")->required();
  cmd->add_option("--response", o->request.responses, "response id from `tensorsieve responses` (repeatable)")
      ->required();
  cmd->add_option("--cut", o->request.cuts, "film cut to screen as well, e.g. (001) (repeatable)");
  cmd->add_option("--occupancy", o->occupancy, "partial occupancy: refuse (default, the row fails) or ignore");
  cmd->add_option("--symprec", o->request.options.symprec, "distance tolerance in Angstrom")->capture_default_str();
  cmd->add_option("-j,--jobs,--threads", o->threads,
                  "worker processes screening files side by side (default: one per core)");
  cmd->add_option("--max-atoms", o->request.options.max_atoms,
                  "refuse a file whose cell holds more atoms than this")
      ->capture_default_str();
  cmd->add_flag("--quiet", o->quiet, "no progress bar");
  cmd->add_option("-f,--format", o->format, "text (default), markdown, csv or jsonl")->capture_default_str();
  cmd->add_option("-o,--output", o->output, "write the table to this file instead of standard output");
  cmd->callback([o] {
    ScreenRequest request = o->request;
    const ScreenFormat format = parse_screen_format(o->format);
    request.options.occupancy = parse_occupancy_policy(o->occupancy, "--occupancy", ErrorKind::usage);
    if (!(request.options.symprec > 0 && request.options.symprec < 1))
      fail(ErrorKind::usage, "symprec out of range", "--symprec", "0 < symprec < 1 Angstrom");
    if (request.options.max_atoms < 1)
      fail(ErrorKind::usage, "--max-atoms must be at least 1", "--max-atoms", "e.g. 20000");
    request.files = collect_structure_files(o->paths);
    ProgressBar bar;
    const bool show = !o->quiet && ::isatty(STDERR_FILENO);
    // A run writing a file keeps a journal beside it, so an interrupted run resumes.
    std::unique_ptr<ScreenJournal> journal;
    if (o->output != "-" && !o->output.empty()) {
      journal = std::make_unique<ScreenJournal>(o->output + ".partial", request);
      if (!journal->resumed().empty())
        std::cerr << "tensorsieve: resuming from " << o->output << ".partial: " << journal->resumed().size()
                  << " files already screened\n";
    }
    std::size_t appended = 0;
    std::vector<ScreenRow> rows;
    try {
      rows = screen_structures(
          request, o->threads,
          [&](std::size_t done, std::size_t total) {
            if (show) bar.update(done, total);
          },
          journal ? journal->resumed() : std::vector<ScreenRow>{},
          [&](const ScreenRow& row) {
            if (journal) journal->append(row);
            ++appended;
          });
    } catch (...) {
      // Refused before any file was screened (an unknown response id): nothing to resume.
      if (journal && appended == 0 && journal->resumed().empty()) journal->remove();
      throw;
    }
    emit({"text", o->output}, write_screen(request, rows, format));
    if (journal) journal->remove();
    std::size_t failed = 0;
    for (const auto& r : rows) failed += r.error.empty() ? 0 : 1;
    if (failed)
      fail(ErrorKind::bad_file,
           std::to_string(failed) + " of " + std::to_string(rows.size()) +
               " structure files could not be screened; their rows hold the errors",
           "screen", "readable, ordered, commensurate CIF or mCIF files");
  });
}

} // namespace ts::cli
