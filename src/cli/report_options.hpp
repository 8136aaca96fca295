// How much of a scenario report `run` and `sample` print: --brief (the chain and the
// verdicts) and --only RESPONSE (the parts, bars and layouts of the named responses).
#pragma once

#include "cli/commands.hpp"
#include "core/error.hpp"
#include "core/text.hpp"
#include "response/response_catalogue.hpp"
#include "scenario/scenario.hpp"

#include <CLI/CLI.hpp>

#include <algorithm>
#include <string>
#include <vector>

namespace ts::cli {

struct ReportOptions {
  bool brief = false;
  std::vector<std::string> only;
};

inline void add_report_options(CLI::App& cmd, ReportOptions& o) {
  cmd.add_flag("--brief", o.brief, "print the chain of groups and one verdict per response part, without the forms");
  cmd.add_option("--only", o.only, "report only this response of the scenario (id or alias; repeatable)")
      ->allow_extra_args(false);
}

// --brief shortens the reports people read; JSON and the html page stay whole.
inline void check_brief(const ReportOptions& o, const OutputOptions& out) {
  if (o.brief && (out.format == "json" || out.format == "html"))
    fail(ErrorKind::usage, "--brief shortens the text, Markdown and LaTeX reports; the " + out.format + " output is always whole",
         "--brief", "--brief with -f text, markdown or latex");
}

// --only keeps the named responses (each must be one the scenario asks for, after "all"
// and families are expanded) and the layouts designed for them; extra tensors go.
inline void apply_only_option(const ReportOptions& o, Scenario& sc) {
  if (o.only.empty()) return;
  const auto& cat = ResponseCatalogue::builtin();
  std::vector<std::string> asked;
  for (const auto& id : sc.responses)
    for (const auto& e : cat.expand(id))
      if (std::find(asked.begin(), asked.end(), e) == asked.end()) asked.push_back(e);
  std::vector<std::string> kept;
  for (const auto& name : o.only) {
    const std::string id = cat.get(name).id;
    if (std::find(asked.begin(), asked.end(), id) == asked.end())
      fail(ErrorKind::usage, "'" + name + "' is not among the responses of this scenario", "--only",
           asked.empty() ? "none: the scenario asks for tensors only" : join(asked, ", "));
    if (std::find(kept.begin(), kept.end(), id) == kept.end()) kept.push_back(id);
  }
  sc.responses = kept;
  sc.tensors.clear();
  sc.layouts.erase(std::remove_if(sc.layouts.begin(), sc.layouts.end(),
                                  [&](const LayoutSpec& l) {
                                    return std::find(kept.begin(), kept.end(), cat.get(l.response).id) == kept.end();
                                  }),
                   sc.layouts.end());
}

} // namespace ts::cli
