#include "fit/probe_sum.hpp"

#include "response/response_catalogue.hpp"

#include <algorithm>
#include <map>
#include <tuple>

namespace ts {

ProbeModel probe_sum(const ScenarioResult& res, const BarResult& bar, const PointGroup& group, Probe probe,
                     int harmonic, LockInReading reading) {
  ProbeModel model;
  using Key = std::tuple<Frequency, bool, int, int>;
  std::map<Key, ModelFunction> merged;
  std::map<std::string, int> name_count;
  struct Pending {
    std::size_t part;
    AllowedForm form;
    PartSignal signal;
    Surd factor;
  };
  std::vector<Pending> pending;
  for (const auto& bs : bar.signals) {
    const PartForms& p = res.parts[bs.part];
    AllowedForm form = allowed_form(p.spec, group, res.frame);
    if (form.independent() == 0) continue;
    PartSignal sig = bar_signal(*p.catalogue_part, form, bar.measurement);
    if (sig.needs_field) continue;
    const ProbeSignal& ps = probe == Probe::longitudinal ? sig.longitudinal : sig.transverse;
    if (!ps.reads()) continue;
    Surd factor;
    for (const auto& h : sig.harmonics)
      if (h.harmonic == harmonic) factor = reading == LockInReading::y ? h.y : h.x;
    if (factor.is_zero()) continue;
    for (int j = 0; j < form.independent(); ++j) ++name_count[form.parameter_name(j)];
    pending.push_back({bs.part, std::move(form), std::move(sig), factor});
  }
  std::map<std::string, int> parity_count; // names with the parity suffix, over parts
  for (const auto& pd : pending)
    for (int j = 0; j < pd.form.independent(); ++j) {
      const std::string name = pd.form.parameter_name(j);
      if (name_count[name] > 1) ++parity_count[name + (res.parts[pd.part].spec.time_odd ? "(c)" : "(i)")];
    }
  for (auto& pd : pending) {
    const PartForms& p = res.parts[pd.part];
    const ProbeSignal& ps = probe == Probe::longitudinal ? pd.signal.longitudinal : pd.signal.transverse;
    model.parts.push_back(p.response_id + ": " + p.part_label);
    std::vector<int> global(pd.form.independent(), -1);
    auto global_of = [&](int j) {
      if (global[j] < 0) {
        // Two parts with a parameter of one name (the i-type and c-type parts of a
        // response, or two responses) keep them apart: by parity, then by response.
        std::string name = pd.form.parameter_name(j);
        if (name_count[name] > 1) name += p.spec.time_odd ? "(c)" : "(i)";
        if (parity_count[name] > 1) name += "@" + p.response_id;
        auto it = std::find(model.parameters.begin(), model.parameters.end(), name);
        if (it == model.parameters.end()) {
          model.parameters.push_back(name);
          model.parameter_parts.push_back(p.response_id + ": " + p.part_label);
          it = model.parameters.end() - 1;
        }
        global[j] = static_cast<int>(it - model.parameters.begin());
      }
      return global[j];
    };
    for (const auto& t : ps.terms) {
      Key key{t.k, t.sine, pd.signal.field_order, pd.signal.current_order};
      ModelFunction& f = merged[key];
      f.angles.k = t.k;
      f.angles.sine = t.sine;
      f.field_power = pd.signal.field_order;
      f.current_power = pd.signal.current_order;
      for (const auto& lt : t.coefficient) {
        const int g = global_of(lt.parameter);
        const Surd c = lt.coefficient * pd.factor;
        auto it = std::find_if(f.coefficient.begin(), f.coefficient.end(), [g](const auto& e) { return e.first == g; });
        if (it == f.coefficient.end()) f.coefficient.emplace_back(g, c);
        else it->second += c;
      }
    }
  }
  for (auto& [key, f] : merged) {
    f.coefficient.erase(std::remove_if(f.coefficient.begin(), f.coefficient.end(),
                                       [](const auto& e) { return e.second.is_zero(); }),
                        f.coefficient.end());
    std::sort(f.coefficient.begin(), f.coefficient.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
    if (!f.coefficient.empty()) model.functions.push_back(f);
  }
  return model;
}

} // namespace ts
