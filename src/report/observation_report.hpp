// The report of `tensorsieve observe`: the sample's group, and for each observed
// signal whether that group allows it or which minimal symmetry breakings do,
// with what would produce each and what equal domains do to it.
#pragma once

#include "figure/figure_data.hpp"
#include "report/report_format.hpp"
#include "scenario/observation_run.hpp"

#include <string>
#include <vector>

namespace ts {

// What the reports say about one observation, in words, for every writer (the
// text formats here, the HTML page in html_report.cpp).
struct AnswerText {
  struct Solution {
    std::string number, group, order, index, variants, shown_by, equal_domains;
    std::vector<std::string> operations; // crystal-axes symbols
    std::string produced_by;
  };
  std::string heading, seen, verdict;
  std::vector<Solution> solutions; // empty when the sample's group allows the signal
  std::string domains_note;        // with solutions only
};
std::vector<AnswerText> answers_text(const ObservationRun& run);
// The columns of the solutions table: #, group, order, index, variants, shown by, equal domains.
const std::vector<std::string>& answer_columns();

std::string write_observations(const ObservationRun& run, Format format);
// The scenario report of `run` followed by the answers to its observations, for
// `tensorsieve run` of a scenario with [[observation]] tables; in JSON, the
// scenario's object with an "observations" array (as in write_observations).
std::string write_scenario_with_observations(const ObservationRun& run, const ReportFigures& figures, Format format);

} // namespace ts
