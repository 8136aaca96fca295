#include "geometry/optics_setup_text.hpp"

#include "geometry/local_field.hpp"

namespace ts {

std::string optical_setup_text(const OpticalMeasurement& m) {
  std::string s = optics_mode_name(m.mode);
  s += m.incidence_deg ? ", angle of incidence θ = " + std::to_string(*m.incidence_deg) + "°" : ", angle of incidence θ (a variable)";
  s += m.azimuth_rotating ? ", sample azimuth φ turning" : ", sample azimuth fixed at " + std::to_string(m.azimuth_deg) + "°";
  return s;
}

std::string local_field_text(const OpticalMeasurement& m, const std::function<std::string(const std::string&)>& escape) {
  const LocalFieldSetting& lf = m.local_field;
  const bool latex = static_cast<bool>(escape);
  auto words = [&](const std::string& s) { return latex ? escape(s) : s; };
  if (!lf.applied) return words("no Fresnel or local-field factors are applied");
  auto symbol = [&](int i) { return latex ? "$" + local_field_symbol_name(i, true) + "$" : local_field_symbol_name(i); };
  auto three = [&](int first) { return symbol(first) + ", " + symbol(first + 1) + ", " + symbol(first + 2); };
  std::string s = words("Fresnel / local-field factors are applied, as symbols: the lab components x, y, z of the "
                        "driving field carry ") +
                  three(0) + words(" and those of the radiated field ") + three(3) +
                  words(" (x in the plane of incidence, z along the normal); which channels are dark does not depend "
                        "on their values");
  if (m.incidence_deg && *m.incidence_deg == 0)
    s += words("; at normal incidence S and P are the same wave, so the in-plane factors coincide and the amplitudes "
               "write ") + symbol(1) + words(" as ") + symbol(0) + words(" and ") + symbol(4) + words(" as ") + symbol(3);
  if (!lf.indices) return s + words("; no refractive indices are given, so they have no numbers");
  const RefractiveIndices& n = *lf.indices;
  s += words("; their values in the two-medium Fresnel model at θ = " + std::to_string(*m.incidence_deg) +
             "° with n_ambient = " + n.ambient.text + ", n(ω) = " + n.omega.text + ", n(2ω) = " + n.two_omega.text +
             " are ");
  for (int i = 0; i < local_field_symbol_count; ++i)
    s += (i ? ", " : "") + symbol(i) + " = " + words(complex_text(lf.values[i]));
  return s + words(" (numbers for display and figures only)");
}

} // namespace ts
