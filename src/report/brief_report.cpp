#include "report/brief_report.hpp"

#include "core/error.hpp"
#include "core/text.hpp"
#include "report/observation_report.hpp"

#include <sstream>

namespace ts {

std::string part_verdict(const ScenarioResult& r, std::size_t k) {
  const PartForms& p = r.parts[k];
  std::string verdict = p.verdicts.back();
  // The step that switched the part on is what a lowering chain is asked about.
  if (p.switched_on_at)
    verdict += ", switched on by step " + std::to_string(*p.switched_on_at) + " (" + r.chain[*p.switched_on_at].label + ")";
  return verdict;
}

std::string write_scenario_brief(const ScenarioResult& r, Format f, const ObservationRun* observations) {
  if (f == Format::json)
    fail(ErrorKind::usage, "--brief shortens the text, Markdown and LaTeX reports; the JSON document is always whole",
         "--brief", "--brief with -f text, markdown or latex; or -f json without --brief");
  const auto& sc = r.scenario;
  const char* bullet = f == Format::markdown ? "- " : "  ";
  const char* end = f == Format::latex ? "\\\\\n" : "\n";
  auto prose = [&](const std::string& s) { return as_text(s, f); };
  std::ostringstream os;
  os << section_heading(sc.title.empty() ? "tensorsieve scenario" : sc.title, f, 1);
  if (f == Format::text) os << "source: " << sc.source << "\n";
  if (!r.parent_note.empty()) os << (f == Format::latex ? "\\noindent " : "") << "parent: " << prose(r.parent_note) << "\n";
  os << (f == Format::latex ? "\n\\noindent " : "") << "sample frame: x ∥ " << r.frame_labels[0] << ", y ∥ "
     << r.frame_labels[1] << ", z ∥ " << r.frame_labels[2] << "\n\n";

  os << section_heading("symmetry chain", f);
  std::vector<std::vector<std::string>> rows;
  for (std::size_t i = 0; i < r.chain.size(); ++i)
    rows.push_back({std::to_string(i), as_text(r.chain[i].label, f), inline_code(r.chain[i].readable_symbol, f),
                    std::to_string(r.chain[i].group.order())});
  os << grid({"step", "imposed", "group", "order"}, rows, f) << "\n";

  os << section_heading("verdicts after step " + std::to_string(r.chain.size() - 1) + " (" + r.chain.back().label + ")", f);
  std::vector<std::vector<std::string>> verdicts;
  for (std::size_t k = 0; k < r.parts.size(); ++k) {
    const PartForms& p = r.parts[k];
    std::vector<std::string> counts;
    for (int n : p.counts) counts.push_back(std::to_string(n));
    verdicts.push_back({p.response_id.empty() ? "tensor" : p.response_id,
                        p.response_id.empty() ? inline_code(p.spec.canonical_text(), f) : as_text(p.part_label, f),
                        join(counts, " → "), as_text(part_verdict(r, k), f)});
  }
  os << grid({"response", "part", "independent by step", "verdict"}, verdicts, f) << "\n";

  if (observations) {
    os << section_heading("observations", f);
    for (const auto& a : answers_text(*observations)) {
      std::vector<std::string> groups;
      for (const auto& s : a.solutions) groups.push_back(s.group);
      const std::string verdict = a.solutions.empty()
                                      ? a.verdict.substr(a.verdict.find(' ') + 1)
                                      : "forbidden in the sample's group; the largest subgroups that allow it: " +
                                            join(groups, ", ");
      os << bullet << prose(a.heading) << end << bullet << "  " << prose(verdict) << end;
    }
    os << "\n";
  }
  std::vector<std::string> more;
  if (!r.domains.empty()) more.push_back("domains");
  if (!r.bars.empty()) more.push_back(counted(r.bars.size(), "Hall bar"));
  if (!r.layouts.empty()) more.push_back(counted(r.layouts.size(), "layout"));
  if (!r.shg.empty()) more.push_back(counted(r.shg.size(), "SHG setup"));
  if (!r.kerr.empty()) more.push_back("magneto-optics");
  os << (f == Format::latex ? "\\noindent " : "") << "The full report (without --brief) gives the allowed forms"
     << (more.empty() ? "" : ", " + join(more, ", ")) << " and what each step changed.\n";
  return finish(os.str(), f);
}

} // namespace ts
