#include "lowering/component_observation.hpp"

#include "core/error.hpp"
#include "lowering/domains.hpp"

#include <algorithm>

namespace ts {

TimeParity parse_time_parity(const std::string& text, const std::string& where) {
  if (text == "i" || text == "i-type" || text == "even") return TimeParity::i_type;
  if (text == "c" || text == "c-type" || text == "odd") return TimeParity::c_type;
  if (text == "either" || text.empty()) return TimeParity::either;
  fail(ErrorKind::usage, "unknown time parity '" + text + "'", where,
       "i (time-even, i-type), c (time-odd, c-type) or either");
}

const char* time_parity_name(TimeParity p) {
  switch (p) {
  case TimeParity::i_type: return "i-type";
  case TimeParity::c_type: return "c-type";
  case TimeParity::either: return "i-type or c-type";
  }
  return "";
}

std::vector<TensorSpec> parity_versions(const TensorSpec& spec, TimeParity parity) {
  std::vector<TensorSpec> out;
  for (bool odd : {false, true}) {
    if ((parity == TimeParity::i_type && odd) || (parity == TimeParity::c_type && !odd)) continue;
    TensorSpec v = spec;
    v.time_odd = odd;
    v.jahn.clear(); // the Jahn symbol, if any, named the other parity
    out.push_back(v);
  }
  return out;
}

std::vector<int> component_codes(const TensorSpec& spec, const std::vector<std::string>& names,
                                 const std::string& where) {
  AllowedForm all = allowed_form(spec, PointGroup());
  const int full = all.symmetry->full_size();
  std::string example = all.component_name(0);
  if (names.empty())
    fail(ErrorKind::usage, "no observed component given", where, "one or more components such as " + example);
  std::vector<int> codes;
  for (const auto& n : names) {
    std::string wanted = n.find('_') == std::string::npos ? spec.name + "_" + n : n;
    int found = -1;
    for (int c = 0; c < full && found < 0; ++c)
      if (all.component_name(c) == wanted) found = c;
    if (found < 0)
      fail(ErrorKind::bad_spec, "'" + n + "' is not a component of " + spec.canonical_text(), where,
           "a name such as " + example + " (" + std::to_string(spec.rank) + " letters from x, y, z, sample frame)");
    if (std::find(codes.begin(), codes.end(), found) == codes.end()) codes.push_back(found);
  }
  return codes;
}

namespace {

template <class Zero>
bool shown(const std::vector<int>& codes, bool all, Zero is_zero) {
  auto nonzero = [&](int c) { return !is_zero(c); };
  return all ? std::all_of(codes.begin(), codes.end(), nonzero) : std::any_of(codes.begin(), codes.end(), nonzero);
}

} // namespace

bool shows_components(const TensorSpec& version, const std::vector<int>& codes, const PointGroup& g,
                      const Frame& frame, bool all) {
  AllowedForm f = allowed_form(version, g, frame);
  return shown(codes, all, [&](int c) { return f.is_zero(c); });
}

Observation observation_of(const ComponentObservation& c) {
  Observation o;
  std::string names;
  for (const auto& n : c.names) names += (names.empty() ? "" : ", ") + n;
  o.description = names + (c.all && c.names.size() > 1 ? " all" : "") + " nonzero (" + time_parity_name(c.parity) + ")";
  std::vector<TensorSpec> versions = parity_versions(c.spec, c.parity);
  o.allowed_in = [versions, c](const PointGroup& g) {
    return std::any_of(versions.begin(), versions.end(),
                       [&](const TensorSpec& v) { return shows_components(v, c.codes, g, c.frame, c.all); });
  };
  o.readings_in = [versions, c](const PointGroup& g) {
    std::vector<std::string> out;
    for (const auto& v : versions)
      if (shows_components(v, c.codes, g, c.frame, c.all)) out.push_back(v.time_odd ? "c-type" : "i-type");
    return out;
  };
  o.survives_equal_domains = [versions, c](const PointGroup& parent, const PointGroup& h) {
    for (const auto& v : versions) {
      AllowedForm f = allowed_form(v, h, c.frame);
      DomainAnalysis d = domain_variants(parent, h, f, c.frame);
      if (shown(c.codes, c.all, [&](int code) { return d.average.is_zero(code); })) return true;
    }
    return false;
  };
  return o;
}

} // namespace ts
