// Reports of the response catalogue: the list of responses, and one response
// described with the allowed form of each of its parts in a group, with a
// one-line verdict per part. Text, Markdown, LaTeX and JSON (through toml++'s
// JSON formatter only); the forms themselves are written by src/report/form_report.
#pragma once

#include "report/form_report.hpp"
#include "report/report_format.hpp"
#include "response/response_catalogue.hpp"

#include <string>
#include <vector>

namespace ts {

std::string write_response_list(const std::vector<Response>& responses, Format f);

std::string write_response(const Response& r, const std::vector<PartForm>& parts, const GroupContext& group,
                           const FrameContext& frame, Format f, View view = View::automatic);

// The JSON object of one response entry (no group): for embedding in larger reports.
void response_json(const Response& r, toml::table& out);

} // namespace ts
