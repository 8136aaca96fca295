// The light-driven sections of a scenario report: per pump-probe question and
// phase, the effective field and torque of each pump polarisation and which
// probe sees the precession; per photocurrent question, the in-plane current of
// each polarisation and the electrode pairs that read it. Writers only format
// ScenarioResult values; the tables are built once and written by the text,
// Markdown, LaTeX and HTML writers alike.
#pragma once

#include "report/report_format.hpp"
#include "scenario/scenario_run.hpp"

#include <toml++/toml.h>

#include <string>
#include <vector>

namespace ts {

struct ReportTable {
  std::string title;  // "phase 1: ... (group m'm'm, order vector [100] = +x)"
  std::string note;   // one paragraph under the title, may be empty
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
};

// The tables of each question, in order; cells hold plain text (LaTeX math for Format::latex).
std::vector<std::pair<std::string, std::vector<ReportTable>>> pump_probe_tables(const ScenarioResult& r, Format f);
std::vector<std::pair<std::string, std::vector<ReportTable>>> photocurrent_tables(const ScenarioResult& r, Format f);

std::string write_light_driven(const ScenarioResult& r, Format f);
toml::array pump_probe_json(const ScenarioResult& r);
toml::array photocurrent_json(const ScenarioResult& r);

} // namespace ts
