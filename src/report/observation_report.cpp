#include "report/observation_report.hpp"

#include "core/text.hpp"
#include "report/json_text.hpp"
#include "report/scenario_report.hpp"

#include <sstream>

namespace ts {

namespace {

std::string producers_text(const ObservationSolution& s) {
  return s.producers.empty() ? "no single vector or strain: a higher-order order parameter" : join(s.producers, "; or ");
}

std::string domains_text(const MinimalBreaking& m) {
  if (!m.cancels_with_equal_domains) return "not evaluated";
  return *m.cancels_with_equal_domains ? "cancel" : "survive";
}

std::string line(const std::string& s, Format f) {
  if (f == Format::latex) return "\\noindent " + latex_escape(s) + "\\\\\n";
  if (f == Format::markdown) return s + "\n\n";
  return s + "\n";
}

toml::array strings(const std::vector<std::string>& v) {
  toml::array a;
  for (const auto& s : v) a.push_back(s);
  return a;
}

std::string chain_text(const ScenarioResult& r) {
  std::vector<std::string> labels;
  for (const auto& st : r.chain) labels.push_back(st.label);
  return join(labels, " → ");
}

std::string parent_symbol(const ScenarioResult& r) {
  const ChainStep& st = r.chain.back();
  return st.sample_symbol.empty() ? st.id.type->symbol : st.sample_symbol;
}

toml::array observations_json(const ObservationRun& run) {
  toml::array answers;
  for (const auto& a : run.answers) {
    toml::array sols;
    for (const auto& s : a.solutions) {
      const MinimalBreaking& m = s.breaking;
      toml::table t{{"type", s.id.type->symbol},
                    {"sample_frame_symbol", s.sample_symbol},
                    {"order", static_cast<std::int64_t>(m.group.order())},
                    {"index", static_cast<std::int64_t>(m.index)},
                    {"domain_variants", static_cast<std::int64_t>(m.variants)},
                    {"orientations", static_cast<std::int64_t>(m.orientations)},
                    {"operations", strings(s.operations)},
                    {"shown_by", strings(s.versions)},
                    {"produced_by", strings(s.producers)},
                    {"equal_domains", domains_text(m)}};
      sols.push_back(std::move(t));
    }
    answers.push_back(toml::table{{"label", a.request.label},
                                  {"observed", a.what},
                                  {"spec", a.spec.canonical_text()},
                                  {"components", strings(a.components)},
                                  {"type", time_parity_name(a.parity)},
                                  {"match", a.request.match},
                                  {"allowed_in_parent", a.allowed_in_parent()},
                                  {"parent_allows", strings(a.parent_versions)},
                                  {"subgroups_searched", static_cast<std::int64_t>(a.search.subgroups)},
                                  {"maximal_subgroups", sols}});
  }
  return answers;
}

// One section per observation (headings at `level`): what was seen, the verdict
// and, when the sample's group forbids it, the maximal subgroups that allow it.
void write_answers(const ObservationRun& run, Format f, int level, std::ostringstream& os) {
  for (const AnswerText& a : answers_text(run)) {
    os << section_heading(a.heading, f, level);
    os << line(a.seen, f);
    os << line(a.verdict, f);
    if (a.solutions.empty()) {
      os << "\n";
      continue;
    }
    std::vector<std::vector<std::string>> rows;
    for (const auto& s : a.solutions)
      rows.push_back({s.number, inline_code(s.group, f), s.order, s.index, s.variants, s.shown_by, s.equal_domains});
    os << grid(answer_columns(), rows, f) << "\n";
    const char* end = f == Format::latex ? "\\\\\n" : f == Format::markdown ? "\n\n" : "\n";
    for (const auto& s : a.solutions) {
      std::vector<std::string> shown;
      for (const auto& o : s.operations) shown.push_back(inline_code(o, f));
      std::string listed = s.operations.size() <= 16 ? join(shown, ", ")
                                                     : std::to_string(s.operations.size()) + " operations (in --format json)";
      os << (f == Format::latex ? "\\noindent " : "") << s.number << ": " << listed << end
         << (f == Format::latex ? "\\noindent " : "") << (f == Format::text ? "   " : "") << "produced by: "
         << (f == Format::latex ? latex_escape(s.produced_by) : s.produced_by) << end;
    }
    os << "\n" << line(a.domains_note, f) << "\n";
  }
}

} // namespace

const std::vector<std::string>& answer_columns() {
  static const std::vector<std::string> c{"#", "group", "order", "index", "variants", "shown by", "equal domains"};
  return c;
}

std::vector<AnswerText> answers_text(const ObservationRun& run) {
  const ScenarioResult& r = run.scenario;
  std::vector<AnswerText> out;
  for (const auto& a : run.answers) {
    AnswerText t;
    const bool all = a.request.match == "all";
    const std::string seen = join(a.components, ", ") +
                             (a.components.size() < 2 ? "" : all ? ", each of them" : ", at least one of them") +
                             " nonzero (" + time_parity_name(a.parity) + ")";
    t.heading = "observation: " + (a.request.label.empty() ? seen : a.request.label);
    t.seen = "seen: " + seen + " in " + a.what;
    if (a.allowed_in_parent()) {
      t.verdict = "verdict: allowed in " + parent_symbol(r) + " itself" +
                  (a.parent_versions.empty() ? "" : " (" + join(a.parent_versions, ", ") + ")") +
                  ": the signal proves no symmetry breaking";
      out.push_back(std::move(t));
      continue;
    }
    t.verdict = "verdict: forbidden in " + parent_symbol(r) + "; the largest subgroups that allow it (the least "
                "symmetry breaking; " + std::to_string(a.solutions.size()) + " found among " +
                std::to_string(a.search.subgroups) + " proper subgroups, each orientation separately):";
    for (std::size_t i = 0; i < a.solutions.size(); ++i) {
      const auto& s = a.solutions[i];
      const auto& m = s.breaking;
      t.solutions.push_back({std::to_string(i + 1), s.readable_symbol, std::to_string(m.group.order()),
                             std::to_string(m.index), std::to_string(m.variants), join(s.versions, ", "),
                             domains_text(m), s.operations, producers_text(s)});
    }
    t.domains_note = "equal domains: the average over equally populated variants keeps only what the parent allows, "
                     "so a signal the parent forbids cancels; a single-domain region, or a sample poled or trained by "
                     "the producing field, shows it.";
    out.push_back(std::move(t));
  }
  return out;
}

std::string write_observations(const ObservationRun& run, Format f) {
  const ScenarioResult& r = run.scenario;
  const ChainStep& parent = r.chain.back();
  const std::string frame_text = "x ∥ " + r.frame_labels[0] + ", y ∥ " + r.frame_labels[1] + ", z ∥ " + r.frame_labels[2];
  if (f == Format::json) {
    toml::table root;
    root.insert("title", r.scenario.title);
    root.insert("source", r.scenario.source);
    root.insert("frame", toml::table{{"x", r.frame_labels[0]}, {"y", r.frame_labels[1]}, {"z", r.frame_labels[2]}});
    root.insert("parent", toml::table{{"chain", chain_text(r)},
                                      {"type", parent.id.type->symbol},
                                      {"sample_frame_symbol", parent.sample_symbol},
                                      {"order", static_cast<std::int64_t>(parent.group.order())}});
    root.insert("observations", observations_json(run));
    return json_text(root);
  }

  std::ostringstream os;
  os << section_heading(r.scenario.title.empty() ? "tensorsieve observe: what the signal proves" : r.scenario.title, f, 1);
  if (f == Format::text) os << "source: " << r.scenario.source << "\n";
  os << line("sample: " + chain_text(r) + "; group " + parent_symbol(r) + " (" + parent.id.type->symbol + ", order " +
                 std::to_string(parent.group.order()) + ")",
             f);
  os << line("sample frame: " + frame_text + "; components below are in this frame, operations in crystal axes", f)
     << "\n";
  write_answers(run, f, 2, os);
  return finish(os.str(), f);
}

std::string write_scenario_with_observations(const ObservationRun& run, const ReportFigures& figures, Format f) {
  if (f == Format::json) {
    toml::table root = scenario_json(run.scenario, figures);
    root.insert("observations", observations_json(run));
    return json_text(root);
  }
  std::ostringstream os;
  os << "\n" << section_heading("observations: what the signals prove", f, 2);
  os << line("each observation against the sample's group " + parent_symbol(run.scenario) +
                 " (the last step of the chain); components in the sample frame, operations in crystal axes",
             f)
     << "\n";
  write_answers(run, f, 3, os);
  return write_scenario(run.scenario, figures, f) + finish(os.str(), f);
}

} // namespace ts
