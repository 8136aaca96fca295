#include "report/fit_report.hpp"

#include "core/text.hpp"
#include "report/expression_text.hpp"
#include "report/json_text.hpp"

#include <cmath>
#include <cstdio>

namespace ts {

namespace {

// Four significant digits: enough to compare fits, and the same bytes on every run.
std::string num(double v, int digits = 4) {
  if (!std::isfinite(v)) return v > 0 ? "inf" : v < 0 ? "-inf" : "nan";
  if (v == 0) return "0";
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", digits, v);
  return buf;
}

std::string line(const std::string& s, Format f) {
  if (f == Format::latex) return "\\noindent " + latex_escape(s) + "\\\\\n";
  if (f == Format::markdown) return s + "\n\n";
  return s + "\n";
}

std::string meaning_text(const FitParameter& p, TextStyle style) {
  std::string s;
  for (const auto& [name, c] : p.meaning) {
    std::string coef = surd_text(c, style);
    std::string term = coef == "1" ? symbol_text(name, style) : coef == "-1" ? "-" + symbol_text(name, style)
                                                                             : coef + "*" + symbol_text(name, style);
    if (!s.empty()) s += term[0] == '-' ? " - " + term.substr(1) : " + " + term;
    else s = term;
  }
  return s;
}

// A subsection; in text a blank line before it, so each block can be cut out by its heading.
std::string subsection(const std::string& title, Format f) {
  return (f == Format::text ? "\n" : "") + section_heading(title, f, 3);
}

std::string fit_text(const HypothesisFit& h, const FitResult& r) {
  if (!h.fitted) return "-";
  return r.uncertainties ? num(h.chi2_per_dof) : num(h.rms);
}

std::string status(const HypothesisFit& h) {
  if (!h.fitted) return "not fitted";
  return h.rejected ? "rejected" : "not rejected";
}

std::string nested_text(const HypothesisFit& h) {
  if (!h.nested) return "-";
  return "P = " + num(h.nested->p, 3) + " vs " + h.nested->against;
}

toml::array strings(const std::vector<std::string>& v) {
  toml::array a;
  for (const auto& s : v) a.push_back(s);
  return a;
}

toml::table fit_json(const FitResult& r) {
  toml::array hyps;
  int rank = 0;
  for (const auto& h : r.hypotheses) {
    toml::array params;
    for (const auto& p : h.parameters) {
      toml::table t{{"name", p.name}, {"value", p.value}, {"error", p.error}};
      if (!p.meaning.empty()) t.insert("measures", meaning_text(p, TextStyle::plain));
      params.push_back(std::move(t));
    }
    toml::table t{{"rank", static_cast<std::int64_t>(++rank)},
                  {"hypothesis", h.hypothesis.symbol},
                  {"origin", h.hypothesis.origin},
                  {"order", static_cast<std::int64_t>(h.groups.front().order())},
                  {"same_model", strings(h.same_model)},
                  {"produced_by", strings(h.hypothesis.producers)},
                  {"model_functions", strings(h.functions)},
                  {"tensor_parameters", strings(h.tensor_parameters)},
                  {"fitted", h.fitted},
                  {"degenerate", strings(h.degenerate)}};
    if (!h.fitted) t.insert("not_fitted", h.not_fitted);
    else {
      t.insert("parameters", std::move(params));
      t.insert("k", static_cast<std::int64_t>(h.k));
      t.insert("dof", static_cast<std::int64_t>(h.dof));
      t.insert(r.uncertainties ? "chi2" : "residual_sum_of_squares", h.chi2);
      if (r.uncertainties) t.insert("chi2_per_dof", h.chi2_per_dof);
      else t.insert("rms", h.rms);
      if (h.p_value) t.insert("p_value", *h.p_value);
      t.insert("aic", h.aic);
      t.insert("bic", h.bic);
      t.insert("akaike_weight", h.weight);
      t.insert("rejected", h.rejected);
      if (h.rejected) t.insert("rejected_because", h.rejected_because);
      if (h.nested)
        t.insert("f_test", toml::table{{"against", h.nested->against},
                                       {"f", std::isfinite(h.nested->f) ? h.nested->f : 1e308},
                                       {"d1", static_cast<std::int64_t>(h.nested->d1)},
                                       {"d2", static_cast<std::int64_t>(h.nested->d2)},
                                       {"p", h.nested->p}});
      if (!h.offset_note.empty()) t.insert("offset_note", h.offset_note);
    }
    hyps.push_back(std::move(t));
  }
  toml::array shown; // by rank, as the hypotheses are numbered
  for (std::size_t i : r.shown_models) shown.push_back(static_cast<std::int64_t>(i + 1));
  toml::table verdict{{"accepted", r.verdict.accepted},
                      {"accepted_origin", r.verdict.accepted_origin},
                      {"breaking", strings(r.verdict.breaking)},
                      {"undecided", strings(r.verdict.undecided)}};
  return toml::table{{"name", r.name},
                     {"data", r.data},
                     {"kind", r.kind},
                     {"measurement", r.measurement},
                     {"parent", r.parent},
                     {"points", static_cast<std::int64_t>(r.points)},
                     {"uncertainties", r.uncertainties},
                     {"alpha", r.alpha},
                     {"offset_fitted", r.offset},
                     {"hypotheses", std::move(hyps)},
                     {"shown_models", std::move(shown)},
                     {"verdict", std::move(verdict)}};
}

} // namespace

std::string write_fit_section(const FitResult& r, Format f) {
  std::string out;
  out += line("data: " + r.data + " (" + std::to_string(r.points) + " points; " +
                  (r.uncertainties ? "uncertainties given: χ²/dof and a χ² test"
                                   : "no uncertainties: residual RMS, errors scaled by the residual variance") + ")",
              f);
  out += line("measurement: " + r.measurement, f);
  out += line("hypotheses: the scenario's chain and the subgroups of " + r.parent + "; " +
                  std::to_string(r.hypotheses.size()) + " distinct models on this scan; significance level " +
                  num(r.alpha, 3),
              f);
  out += line("Fits are floating point: they rank models that were derived exactly and decide no symmetry zero. "
              "Coefficients are in SI units of the reading (the geometric prefactors are absorbed in them).", f);
  out += subsection("ranking (lowest AIC first; weights are Akaike weights)", f);
  std::vector<std::vector<std::string>> rows;
  int n = 0;
  for (const auto& h : r.hypotheses) {
    std::string name = h.hypothesis.symbol;
    if (!h.same_model.empty()) name += " (+" + std::to_string(h.same_model.size()) + " same model)";
    rows.push_back({std::to_string(++n), name, std::to_string(h.groups.front().order()),
                    h.fitted ? std::to_string(h.k) : "-", fit_text(h, r), h.fitted ? num(h.aic) : "-",
                    h.fitted ? num(h.bic) : "-", h.fitted ? num(h.weight, 3) : "-", h.fitted ? nested_text(h) : "-",
                    status(h)});
  }
  out += grid({"#", "hypothesis", "order", "k", r.uncertainties ? "χ²/dof" : "RMS", "AIC", "BIC", "weight", "F-test",
               "status"},
              rows, f);
  if (f == Format::markdown) out += "\n";
  out += subsection("verdict", f);
  out += line(r.verdict.accepted.empty() ? "highest symmetry not rejected: none"
                                         : "highest symmetry not rejected: " + r.verdict.accepted + " (" +
                                               r.verdict.accepted_origin + ")",
              f);
  for (const auto& s : r.verdict.breaking) out += line("symmetry breaking: " + s, f);
  for (const auto& s : r.verdict.undecided) out += line("cannot be decided: " + s, f);
  // The models the fit chose to show (FitResult::shown_models), as the figures and JSON do.
  for (std::size_t i : r.shown_models) {
    const HypothesisFit& h = r.hypotheses.at(i);
    out += subsection("model of " + h.hypothesis.symbol, f);
    if (!h.same_model.empty()) out += line("same model on this scan: " + join(h.same_model, ", "), f);
    out += line("functions: " + (h.functions.empty() ? std::string("none (the hypothesis forbids the signal)")
                                                    : join(h.functions, "; ")),
                f);
    if (h.rejected) out += line("rejected: " + h.rejected_because, f);
    std::vector<std::vector<std::string>> prow;
    for (const auto& p : h.parameters)
      prow.push_back({p.name, num(p.value), num(p.error, 2),
                      p.meaning.empty() ? "" : meaning_text(p, TextStyle::plain)});
    if (!prow.empty()) {
      out += grid({"coefficient", "value", "± (1σ)", "measures"}, prow, f);
      if (f != Format::latex) out += "\n";
    }
    for (const auto& d : h.degenerate) out += line("degenerate: " + d, f);
    if (!h.offset_note.empty()) out += line("offset: " + h.offset_note, f);
  }
  return out;
}

std::string write_fits(const FitRun& run, Format f) {
  if (f == Format::json) {
    toml::array fits;
    for (const auto& r : run.fits) fits.push_back(fit_json(r));
    return json_text(toml::table{{"title", run.scenario.scenario.title}, {"fits", std::move(fits)}});
  }
  std::string out = section_heading("scan fits: " + run.scenario.scenario.title, f, 1);
  for (const auto& r : run.fits) {
    out += section_heading("fit: " + r.name, f, 2);
    out += write_fit_section(r, f);
  }
  return finish(out, f);
}

} // namespace ts
