#include "geometry/signal_observation.hpp"

#include "core/error.hpp"

#include <algorithm>

namespace ts {

namespace {

std::string without_stars(std::string s) {
  s.erase(std::remove(s.begin(), s.end(), '*'), s.end());
  return s;
}

} // namespace

void parse_signal_observation(const std::string& raw, SignalObservation& o, const std::string& where) {
  // Spaces and '*' are dropped, so "sin(3*phi)" (the reports' spelling) and "sin(3phi)" both match.
  std::string text;
  for (char c : raw)
    if (c != ' ' && c != '*') text += c;
  o.text = raw;
  std::size_t sep = text.find_first_of(":@");
  std::string probe = text.substr(0, sep);
  if (probe == "longitudinal" || probe == "L" || probe == "parallel") o.probe = Probe::longitudinal;
  else if (probe == "transverse" || probe == "T" || probe == "perpendicular") o.probe = Probe::transverse;
  else
    fail(ErrorKind::usage, "'" + raw + "' does not name a probe", where,
         "longitudinal or transverse, then :FUNCTION (e.g. transverse:cos(phi)) or @ANGLE (e.g. longitudinal@30)");
  if (sep == std::string::npos) return;
  std::string rest = text.substr(sep + 1);
  if (text[sep] == ':') {
    if (rest.empty()) fail(ErrorKind::usage, "no angle function after ':' in '" + raw + "'", where, "e.g. cos(phi), sin(3*phi)");
    o.function = rest;
    return;
  }
  bool digits = !rest.empty() && rest.size() < 5 && rest.find_first_not_of("0123456789") == std::string::npos;
  if (!digits || std::stoi(rest) % 15 != 0)
    fail(ErrorKind::usage, "'" + rest + "' is not a current azimuth in degrees that is a multiple of 15", where,
         "e.g. longitudinal@30");
  o.azimuth = std::stoi(rest) % 360;
}

bool shows_signal(const SignalObservation& o, const TensorSpec& version, const PointGroup& g) {
  ResponsePart part = o.part;
  part.spec = version;
  AllowedForm form = allowed_form(version, g, o.frame);
  if (form.independent() == 0) return false;
  PartSignal ps = bar_signal(part, form, o.bar);
  const ProbeSignal& p = o.probe == Probe::longitudinal ? ps.longitudinal : ps.transverse;
  if (!o.function.empty())
    return std::any_of(p.terms.begin(), p.terms.end(),
                       [&](const FourierTerm& t) { return without_stars(angle_function_text(t)) == o.function; });
  if (o.azimuth < 0) return p.reads();
  // Nonzero at the azimuth for some parameter values: some parameter's coefficient is nonzero there.
  std::vector<Surd> value(form.independent());
  for (const auto& t : p.terms) {
    for (int i = 1; i < angle_count; ++i)
      if (t.k[i] != 0) return true; // the reading still depends on a field angle: nonzero for some
    Surd f = angle_function_value(t, {o.azimuth, 0, 0, 0});
    for (const auto& lt : t.coefficient) value[lt.parameter] += lt.coefficient * f;
  }
  return std::any_of(value.begin(), value.end(), [](const Surd& v) { return !v.is_zero(); });
}

Observation observation_of(const SignalObservation& o) {
  Observation out;
  out.description = o.text + " (" + time_parity_name(o.parity) + ")";
  std::vector<TensorSpec> versions = parity_versions(o.part.spec, o.parity);
  out.allowed_in = [versions, o](const PointGroup& g) {
    return std::any_of(versions.begin(), versions.end(), [&](const TensorSpec& v) { return shows_signal(o, v, g); });
  };
  out.readings_in = [versions, o](const PointGroup& g) {
    std::vector<std::string> r;
    for (const auto& v : versions)
      if (shows_signal(o, v, g)) r.push_back(v.time_odd ? "c-type" : "i-type");
    return r;
  };
  // The search runs only for signals the parent forbids, and the average over
  // equally populated variants g_i·H of the parent is the parent's invariant part
  // of the tensor (Janovec & Přívratská, International Tables Vol. D, ch. 3.4):
  // it cannot show the signal, for any bar.
  out.survives_equal_domains = [](const PointGroup&, const PointGroup&) { return false; };
  return out;
}

} // namespace ts
