#include "lowering/domains.hpp"

#include "core/error.hpp"

namespace ts {

DomainAnalysis domain_variants(const PointGroup& parent, const PointGroup& child, const AllowedForm& form,
                               const Frame& frame) {
  DomainAnalysis d;
  ParamTensor t = ParamTensor::of(form);
  std::vector<Operation> reps = parent.coset_representatives(child);
  ParamTensor sum;
  for (std::size_t i = 0; i < reps.size(); ++i) {
    const Operation& g = reps[i];
    std::vector<Operation> conj;
    for (const auto& h : child.operations()) conj.push_back(g * h * g.inverse());
    DomainVariant v{g, PointGroup::from_closed_set(conj, parent.lattice()),
                    apply_operation(t, operation_in_frame(g.R, frame), form.spec, g.primed, g.det())};
    sum = i == 0 ? v.tensor : add(sum, v.tensor);
    d.variants.push_back(std::move(v));
  }
  d.average = scaled(sum, Rational(1, static_cast<std::int64_t>(reps.size())));
  return d;
}

ParamTensor weighted_sum(const std::vector<ParamTensor>& tensors, const std::vector<Rational>& weights) {
  if (tensors.empty() || tensors.size() != weights.size())
    fail(ErrorKind::internal, "one weight per domain variant is needed");
  ParamTensor sum = scaled(tensors[0], weights[0]);
  for (std::size_t i = 1; i < tensors.size(); ++i) sum = add(sum, scaled(tensors[i], weights[i]));
  return sum;
}

TensorSpec field_expansion_spec(const TensorSpec& spec, QuantityKind field) {
  if (spec.rank + 1 > max_rank)
    fail(ErrorKind::too_large, "the field expansion of " + spec.name + " would have rank " + std::to_string(spec.rank + 1),
         spec.name, "responses of rank " + std::to_string(max_rank - 1) + " or less in a field");
  const bool axial = field == QuantityKind::axial_odd || field == QuantityKind::axial_even;
  const bool odd = field == QuantityKind::axial_odd || field == QuantityKind::polar_odd;
  const char* symbol = field == QuantityKind::axial_odd ? "B" : field == QuantityKind::polar_odd ? "j" : "E";
  TensorSpec k = spec;
  k.name = spec.name + symbol;
  if (static_cast<int>(spec.letters.size()) == spec.rank)
    for (char c : std::string("defghpqrstuvw"))
      if (spec.letters.find(c) == std::string::npos) {
        k.letters = spec.letters + c;
        break;
      }
  k.rank = spec.rank + 1;
  k.axial = spec.axial != axial;
  k.time_odd = spec.time_odd != odd;
  for (auto& s : k.symmetries) s.perm.push_back(spec.rank);
  if (!k.onsager.empty()) k.onsager.push_back(spec.rank); // the field index stays; T(B) = Tᵀ(-B) is carried by the parity
  k.jahn.clear();
  return k;
}

FieldLinearTerm field_linear_term(const PointGroup& parent, const PointGroup& child, const TensorSpec& spec,
                                  const LabField& field, const Frame& frame, const std::vector<Rational>& weights) {
  FieldLinearTerm t;
  t.field = field;
  t.expansion = field_expansion_spec(spec, field.kind);
  t.form = allowed_form(t.expansion, child, frame);
  // The unit field in the sample frame: f_i = ê_i·d / (|ê_i| |d|).
  const QSqrt3 d2 = dot(field.direction, field.direction);
  if (!d2.is_rational()) fail(ErrorKind::bad_geometry, "the field direction has no rational squared length", field.label);
  std::array<Surd, 3> f;
  for (int i = 0; i < 3; ++i) {
    const Rational n2 = dot(frame.axes[i], frame.axes[i]).rational_part();
    f[i] = Surd(dot(frame.axes[i], field.direction)) * Surd::sqrt_of(Rational(1) / (n2 * d2.rational_part()));
  }
  const ParamTensor k = ParamTensor::of(t.form);
  const int full = static_cast<int>(k.components.size()) / 3;
  for (const auto& g : parent.coset_representatives(child)) {
    ParamTensor gk = apply_operation(k, operation_in_frame(g.R, frame), t.expansion, g.primed, g.det());
    ParamTensor v;
    v.rank = spec.rank;
    v.components.resize(full);
    for (int code = 0; code < full; ++code)
      for (int a = 0; a < 3; ++a)
        if (!f[a].is_zero() && !gk.components[code * 3 + a].empty())
          v.components[code] = combine(v.components[code], gk.components[code * 3 + a], f[a]);
    t.variants.push_back(std::move(v));
  }
  t.average = weighted_sum(t.variants, weights);
  return t;
}

} // namespace ts
