// Screening many structure files at once: for each file, its magnetic point
// group and, for each asked response, whether it is allowed and with how many
// independent components, in the bulk and at each asked film cut. Files are
// independent, so they are spread over worker processes (worker_processes.hpp);
// every row depends only on its file, so the rows (and the bytes written from
// them) are the same for any number of workers. What depends on the point
// group alone (its forms for every response, in the bulk and at each cut) is
// worked out once per worker and shared by every file of that group it
// screens: the symmetry search runs per file, the tensor work per group.
#pragma once

#include "lowering/structure_file.hpp"

#include <cstddef>
#include <functional>
#include <string>
#include <vector>

namespace ts {

struct ScreenRequest {
  std::vector<std::string> files;     // structure files, in output order
  std::vector<std::string> responses; // catalogue ids (or aliases)
  std::vector<std::string> cuts;      // film cuts such as "(001)", optional
  StructureFileOptions options;
};

struct ScreenRow {
  std::string file;
  std::string error;        // the located message when this file failed; then nothing else is filled
  std::string point_group;  // type symbol of the (magnetic) point group, standard setting
  std::string setting;      // catalogue symbol with the same operations in the crystal axes, or empty
  std::string bns_number;   // magnetic space group, empty for a non-magnetic structure
  int magnetic_type = 0;    // 1..4 for a magnetic structure (4: grey point group)
  std::string space_group;  // "R-3c (167)": the family group of a magnetic structure
  std::vector<std::string> cut_groups;  // point group type at each cut
  // [0] bulk, [1 + k] cut k; one count per response: the largest independent
  // count among the response's parts (its tensor and the pieces the catalogue
  // lists, `tensorsieve response ID`), so 0 means every part vanishes.
  std::vector<std::vector<int>> counts;
};

// Paths as given: a directory stands for its *.cif and *.mcif files (sorted,
// not recursive); a path prefixed by '@' is a list file with one path per line
// ('#' starts a comment; relative paths are read from the list's folder).
// Throws Error(bad_file) for a path that does not exist or an empty result.
std::vector<std::string> collect_structure_files(const std::vector<std::string>& paths);

// Checks the response ids once (an unknown id throws before any work), then
// screens every file on `workers` worker processes (0: one per core). A file
// that fails gets its error in its row. A crash on a file (in the symmetry
// library or anywhere else) ends only its worker: the file is screened once
// more, alone, with every library call in a child process of its own, and the
// row holds the error that run names. `progress(done, total)`
// is called in this process after each file, one call at a time. Rows in
// `already` (a resumed run, screen_journal.hpp) are taken for their files as
// they are; `finished(row)` is called, just before `progress`, with every row
// computed in this call. An exception from either stops the run.
std::vector<ScreenRow> screen_structures(const ScreenRequest& request, unsigned workers,
                                         const std::function<void(std::size_t, std::size_t)>& progress = {},
                                         const std::vector<ScreenRow>& already = {},
                                         const std::function<void(const ScreenRow&)>& finished = {});

} // namespace ts
