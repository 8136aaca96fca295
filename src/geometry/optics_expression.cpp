#include "geometry/optics_expression.hpp"

namespace ts {

GiNaC::ex optical_amplitude_ex(const std::vector<OpticalTerm>& terms, const AllowedForm& form, ExpressionSymbols& sy) {
  const GiNaC::symbol& theta = sy.named("theta", "\\theta");
  GiNaC::ex e = 0;
  for (const auto& t : terms) {
    GiNaC::ex coefficient = 0;
    for (const auto& [key, comb] : t.by_theta)
    {
      GiNaC::ex factors = 1;
      for (int i = 0; i < local_field_symbol_count; ++i)
        if (key.field[i] != 0)
          factors *= GiNaC::pow(sy.named(local_field_symbol_name(i), local_field_symbol_name(i, true)), key.field[i]);
      coefficient += GiNaC::pow(GiNaC::cos(theta), key.cos_theta) * GiNaC::pow(GiNaC::sin(theta), key.sin_theta) *
                     factors * combination_ex(comb, form, sy);
    }
    GiNaC::ex arg = 0;
    for (int i = 0; i < angle_count; ++i)
      if (t.k[i] != 0) arg += t.k[i] * sy.angle(static_cast<Angle>(i));
    GiNaC::ex f = arg.is_zero() ? GiNaC::ex(1) : (t.sine ? GiNaC::sin(arg) : GiNaC::cos(arg));
    e += coefficient * f;
  }
  return e;
}

} // namespace ts
