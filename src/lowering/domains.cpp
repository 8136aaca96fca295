#include "lowering/domains.hpp"

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

} // namespace ts
