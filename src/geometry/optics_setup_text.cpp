#include "geometry/optics_setup_text.hpp"

namespace ts {

std::string optical_setup_text(const OpticalMeasurement& m) {
  std::string s = optics_mode_name(m.mode);
  s += m.incidence_deg ? ", angle of incidence θ = " + std::to_string(*m.incidence_deg) + "°" : ", angle of incidence θ (a variable)";
  s += m.azimuth_rotating ? ", sample azimuth φ turning" : ", sample azimuth fixed at " + std::to_string(m.azimuth_deg) + "°";
  return s;
}

} // namespace ts
