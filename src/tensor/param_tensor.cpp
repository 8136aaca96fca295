#include "tensor/param_tensor.hpp"

#include <algorithm>

namespace ts {

Combination combine(const Combination& a, const Combination& b, const Surd& fb) {
  Combination out;
  std::size_t i = 0, j = 0;
  while (i < a.size() || j < b.size()) {
    if (j >= b.size() || (i < a.size() && a[i].parameter < b[j].parameter)) {
      out.push_back(a[i++]);
    } else if (i >= a.size() || b[j].parameter < a[i].parameter) {
      Surd c = fb * b[j].coefficient;
      if (!c.is_zero()) out.push_back({b[j].parameter, c});
      ++j;
    } else {
      Surd c = a[i].coefficient + fb * b[j].coefficient;
      if (!c.is_zero()) out.push_back({a[i].parameter, c});
      ++i;
      ++j;
    }
  }
  return out;
}

ParamTensor ParamTensor::of(const AllowedForm& form) {
  ParamTensor t;
  t.rank = form.spec.rank;
  t.components.resize(form.symmetry->full_size());
  for (int code = 0; code < form.symmetry->full_size(); ++code) {
    Combination c = form.value(code);
    std::sort(c.begin(), c.end(), [](const LinearTerm& x, const LinearTerm& y) { return x.parameter < y.parameter; });
    t.components[code] = c;
  }
  return t;
}

ParamTensor apply_operation(const ParamTensor& t, const SurdMatrix& S, const TensorSpec& spec, bool primed, int det) {
  const int full = static_cast<int>(t.components.size());
  std::vector<Combination> cur = t.components;
  int stride = full;
  for (int p = 0; p < t.rank; ++p) {
    stride /= 3;
    std::vector<Combination> next(full);
    for (int code = 0; code < full; ++code) {
      int digit = (code / stride) % 3;
      int base = code - digit * stride;
      Combination acc;
      for (int a = 0; a < 3; ++a)
        if (!S[digit][a].is_zero() && !cur[base + a * stride].empty()) acc = combine(acc, cur[base + a * stride], S[digit][a]);
      next[code] = std::move(acc);
    }
    cur.swap(next);
  }
  int sign = (spec.axial && det < 0 ? -1 : 1) * (spec.time_odd && primed ? -1 : 1);
  ParamTensor out;
  out.rank = t.rank;
  out.components.resize(full);
  for (int code = 0; code < full; ++code) {
    int src = code;
    if (primed && !spec.onsager.empty()) {
      // T'_C = (S·T)_{C∘onsager}
      std::vector<int> d(t.rank), e(t.rank);
      int c = code;
      for (int p = t.rank - 1; p >= 0; --p) {
        d[p] = c % 3;
        c /= 3;
      }
      for (int p = 0; p < t.rank; ++p) e[p] = d[spec.onsager[p]];
      src = 0;
      for (int v : e) src = src * 3 + v;
    }
    out.components[code] = sign > 0 ? cur[src] : combine({}, cur[src], Surd(Rational(-1)));
  }
  return out;
}

ParamTensor add(const ParamTensor& a, const ParamTensor& b) {
  ParamTensor out = a;
  for (std::size_t i = 0; i < a.components.size(); ++i)
    out.components[i] = combine(a.components[i], b.components[i], Surd(Rational(1)));
  return out;
}

ParamTensor scaled(const ParamTensor& a, const Rational& s) {
  ParamTensor out = a;
  for (auto& c : out.components) c = combine({}, c, Surd(s));
  return out;
}

SurdMatrix operation_in_frame(const Mat3& R, const Frame& frame) {
  SurdMatrix S;
  Rational n2[3];
  for (int i = 0; i < 3; ++i) n2[i] = dot(frame.axes[i], frame.axes[i]).rational_part();
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      QSqrt3 x = dot(frame.axes[i], R * frame.axes[j]);
      S[i][j] = x.is_zero() ? Surd() : Surd(x) * Surd::sqrt_of(Rational(1) / (n2[i] * n2[j]));
    }
  return S;
}

} // namespace ts
