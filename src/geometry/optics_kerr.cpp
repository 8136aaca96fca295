#include "geometry/optics_kerr.hpp"

#include "core/error.hpp"

namespace ts {

std::vector<KerrReading> kerr_readings(const AllowedForm& g) {
  if (g.spec.rank != 1) fail(ErrorKind::internal, "kerr_readings needs a vector form, got rank " + std::to_string(g.spec.rank));
  const TrigPoly c = TrigPoly::cos_of(Angle::phi), s = TrigPoly::sin_of(Angle::phi), one = TrigPoly::constant(Rational(1));
  const TrigVector polar{TrigPoly{}, TrigPoly{}, one}, longitudinal{c, s, TrigPoly{}},
      transverse{s.scaled(Rational(-1)), c, TrigPoly{}};
  std::vector<KerrReading> out;
  const std::pair<const char*, const char*> names[] = {{"polar", "n·g (also the Faraday rotation at normal incidence)"},
                                                       {"longitudinal", "p·g, p the in-plane direction of the plane of incidence"},
                                                       {"transverse", "(n × p)·g, as a change of the P reflectance"}};
  const TrigVector* vectors[] = {&polar, &longitudinal, &transverse};
  for (int k = 0; k < 3; ++k) {
    SignalSeries series;
    for (int i = 0; i < 3; ++i)
      for (const auto& t : g.value(i)) series.add_term(t.parameter, t.coefficient, (*vectors[k])[i]);
    out.push_back({names[k].first, names[k].second, real_fourier_terms(series)});
  }
  return out;
}

std::vector<VoigtReading> voigt_readings(const AllowedForm& q, const TrigVector& m) {
  if (q.spec.rank != 4) fail(ErrorKind::internal, "voigt_readings needs a rank-4 form");
  auto delta = [&](int i, int j) {
    SignalSeries s;
    for (int k = 0; k < 3; ++k)
      for (int l = 0; l < 3; ++l) {
        TrigPoly mm = m[k] * m[l];
        if (mm.is_zero()) continue;
        for (const auto& t : q.value(((i * 3 + j) * 3 + k) * 3 + l)) s.add_term(t.parameter, t.coefficient, mm);
      }
    return s;
  };
  std::vector<VoigtReading> out;
  SignalSeries anisotropy = delta(0, 0);
  anisotropy.add(delta(1, 1), Rational(-1));
  out.push_back({"xx-yy", real_fourier_terms(anisotropy)});
  const char* names[] = {"x", "y", "z"};
  const std::pair<int, int> pairs[] = {{0, 1}, {0, 0}, {1, 1}, {2, 2}, {0, 2}, {1, 2}};
  for (const auto& [i, j] : pairs)
    out.push_back({std::string(names[i]) + names[j], real_fourier_terms(delta(i, j))});
  return out;
}

} // namespace ts
