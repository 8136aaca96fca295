// What a screening run has finished, kept on disk as it goes, so an
// interrupted `screen -o FILE` continues where it stopped.
//
// The journal (FILE.partial beside the output) starts with a line naming the
// request (responses, cuts, tolerance, occupancy, atom limit); every finished
// file adds one line holding its whole row, written and flushed at once. A run
// with the same output and an equal request reads the rows back and screens
// only the files not in it; the journal goes when the output is written.
// Rows of a file that failed are rows like any other: never lost, never redone.
#pragma once

#include "scenario/screening.hpp"

#include <cstdio>
#include <string>
#include <vector>

namespace ts {

// The one line naming what a journal's rows answer.
std::string screen_signature(const ScreenRequest& request);

// A row as one line (tabs, newlines and backslashes escaped), and back; false
// for a line that is not a complete row (the last line of a killed run may be cut).
std::string journal_line(const ScreenRow& row);
bool parse_journal_line(const std::string& line, ScreenRow* row);

class ScreenJournal {
public:
  // Opens `path`; rows already there are kept (`resumed()`) when its first line
  // is this request's signature, otherwise the file is started afresh.
  ScreenJournal(const std::string& path, const ScreenRequest& request);
  ~ScreenJournal();
  ScreenJournal(const ScreenJournal&) = delete;
  ScreenJournal& operator=(const ScreenJournal&) = delete;

  const std::vector<ScreenRow>& resumed() const { return resumed_; }
  void append(const ScreenRow& row); // throws Error(bad_file) when the journal cannot be written
  void remove();                     // after the output is written

private:
  std::string path_;
  std::FILE* file_ = nullptr;
  std::vector<ScreenRow> resumed_;
};

} // namespace ts
