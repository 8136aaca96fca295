#include "device/measurement_plan.hpp"

#include "core/error.hpp"
#include "device/surd_echelon.hpp"
#include "geometry/svd_rank.hpp"

#include <algorithm>
#include <map>
#include <set>
#include <tuple>

namespace ts {

namespace {

// How a column's reading changes sign: sB^eB · sM^eM.
struct ColumnParity {
  int e_b = 0, e_m = 0;
};

// One block of readings that the reversals and the current scaling can isolate:
// a bar, a field geometry, a probe and quadrature, a parity class and a power of I.
struct ClassKey {
  std::size_t candidate = 0;
  std::size_t field = 0;
  int probe = 0, quadrature = 0;
  int e_b = 0, e_m = 0, n = 0;
  bool operator<(const ClassKey& o) const {
    return std::tie(candidate, field, probe, quadrature, e_b, e_m, n) <
           std::tie(o.candidate, o.field, o.probe, o.quadrature, o.e_b, o.e_m, o.n);
  }
};

struct Block {
  ClassKey key;
  SurdRow row;
};

bool needs_direction(const SumMechanism& m) { return m.field_order + m.magnetisation_order > 0; }

RankCondition float_rank(const std::vector<const SurdRow*>& rows, int cols) {
  if (rows.empty() || cols == 0) return {};
  Eigen::MatrixXd a(static_cast<Eigen::Index>(rows.size()), cols);
  for (std::size_t r = 0; r < rows.size(); ++r)
    for (int c = 0; c < cols; ++c) a(static_cast<Eigen::Index>(r), c) = (*rows[r])[c].to_double();
  return svd_rank(a);
}

} // namespace

MeasurementPlan design_plan(const std::vector<SumInput>& inputs, int harmonic, std::vector<LayoutCandidate> candidates,
                            const std::vector<std::string>& fields_in, const PlanGeometry& geo) {
  MeasurementPlan plan;
  plan.harmonic = harmonic;
  plan.candidates = std::move(candidates);
  // The mechanisms at this harmonic: n >= k with n - k even, allowed, summed.
  std::vector<const SumInput*> used;
  for (const auto& in : inputs) {
    const ResponsePart& part = *in.catalogue_part;
    if (!part.summed || !is_bar_part(part) || in.form->independent() == 0) continue;
    if (part.harmonic < harmonic || (part.harmonic - harmonic) % 2 != 0) continue;
    SumMechanism m;
    m.part = in.part;
    m.background = in.background;
    m.response_id = in.response_id;
    m.label = in.response_id + ": " + part.label;
    m.mechanism = part.mechanism;
    BarMeasurement general; // only to know the part; its signal is taken per bar below
    m.signal = bar_signal(part, *in.form, general);
    m.current_order = m.signal.current_order;
    set_parities(m, in.sources);
    plan.mechanisms.push_back(std::move(m));
    used.push_back(&in);
  }
  const bool directional = std::any_of(plan.mechanisms.begin(), plan.mechanisms.end(), needs_direction);
  plan.fields = directional ? (fields_in.empty() ? std::vector<std::string>{"along-current", "across-current", "normal"}
                                                 : fields_in)
                            : std::vector<std::string>{"none"};
  // Columns: each parameter, twice for a coefficient odd only with B and M together.
  std::vector<std::vector<std::pair<std::size_t, ColumnParity>>> columns_of(plan.mechanisms.size());
  for (std::size_t i = 0; i < plan.mechanisms.size(); ++i) {
    const SumMechanism& m = plan.mechanisms[i];
    const AllowedForm& form = *used[i]->form;
    std::vector<std::pair<ColumnParity, std::string>> variants;
    if (m.field_parity == Parity::only_together) {
      variants.push_back({{(m.field_order + 1) % 2, m.magnetisation_order % 2}, " (odd in B)"});
      variants.push_back({{m.field_order % 2, (m.magnetisation_order + 1) % 2}, " (odd in M)"});
    } else {
      variants.push_back({{m.field_parity == Parity::odd ? 1 : 0, m.magnetisation_parity == Parity::odd ? 1 : 0}, ""});
    }
    for (const auto& [parity, suffix] : variants)
      for (int j = 0; j < form.independent(); ++j) {
        columns_of[i].push_back({plan.columns.size(), parity});
        plan.columns.push_back({i, j, form.parameter_name(j) + suffix});
      }
  }
  const int cols = static_cast<int>(plan.columns.size());
  if (cols == 0) return plan;

  // Class rows of every candidate reading.
  std::map<ClassKey, SurdRow> blocks;
  std::vector<bool> read(plan.mechanisms.size(), false);
  for (std::size_t c = 0; c < plan.candidates.size(); ++c)
    for (std::size_t f = 0; f < plan.fields.size(); ++f) {
      BarMeasurement bar = plan.candidates[c].bar;
      set_bar_field(bar, plan.fields[f], *geo.sample, geo.system, geo.lattice, geo.metric);
      bar.waveform = geo.waveform;
      for (std::size_t i = 0; i < plan.mechanisms.size(); ++i) {
        const SumMechanism& m = plan.mechanisms[i];
        PartSignal ps = bar_signal(*m.signal.part, *used[i]->form, bar);
        if (ps.needs_field) continue;
        const HarmonicFactor* factor = nullptr;
        for (const auto& h : ps.harmonics)
          if (h.harmonic == harmonic) factor = &h;
        if (!factor) continue;
        const Surd sign = m.field_driven ? Surd(Rational(-1)) : Surd(Rational(1));
        for (const ProbeSignal* p : {&ps.longitudinal, &ps.transverse}) {
          std::vector<Surd> value(static_cast<std::size_t>(used[i]->form->independent()));
          for (const auto& t : p->terms)
            if (t.k == Frequency{} && !t.sine)
              for (const auto& lt : t.coefficient) value[lt.parameter] += lt.coefficient;
          for (int q = 0; q < 2; ++q) {
            const Surd& lock = q == 0 ? factor->x : factor->y;
            if (lock.is_zero()) continue;
            for (const auto& [col, parity] : columns_of[i]) {
              const Surd v = value[plan.columns[col].parameter];
              if (v.is_zero()) continue;
              ClassKey key{c, f, static_cast<int>(p->probe), q, parity.e_b, parity.e_m, m.current_order};
              SurdRow& row = blocks[key];
              if (row.empty()) row.assign(cols, Surd());
              row[col] = row[col] + sign * lock * v;
              read[i] = true;
            }
          }
        }
      }
    }
  for (std::size_t i = 0; i < plan.mechanisms.size(); ++i)
    if (!read[i]) plan.unread.push_back(plan.mechanisms[i].label);

  std::vector<std::vector<const SurdRow*>> rows_of(plan.candidates.size());
  for (const auto& [key, row] : blocks) rows_of[key.candidate].push_back(&row);
  auto rows_for = [&](const std::vector<std::size_t>& bars) {
    std::vector<const SurdRow*> out;
    for (std::size_t b : bars) out.insert(out.end(), rows_of[b].begin(), rows_of[b].end());
    return out;
  };
  auto exact_rank = [&](const std::vector<std::size_t>& bars) {
    SurdEchelon e(cols);
    for (const SurdRow* r : rows_for(bars)) {
      if (e.full()) break;
      e.add(*r);
    }
    return e.rank();
  };
  std::vector<std::size_t> everyone(plan.candidates.size());
  for (std::size_t c = 0; c < everyone.size(); ++c) everyone[c] = c;
  plan.rank_all = exact_rank(everyone);
  if (plan.rank_all == 0) return plan;

  // Greedy: add the bar that raises the rank most (then conditions best) ...
  std::vector<std::size_t> chosen;
  int rank = 0;
  while (rank < plan.rank_all) {
    std::size_t pick = plan.candidates.size();
    RankCondition best;
    for (std::size_t c = 0; c < plan.candidates.size(); ++c) {
      if (std::find(chosen.begin(), chosen.end(), c) != chosen.end() || rows_of[c].empty()) continue;
      auto trial = chosen;
      trial.push_back(c);
      RankCondition rc = float_rank(rows_for(trial), cols);
      if (pick == plan.candidates.size() || rc.rank > best.rank ||
          (rc.rank == best.rank && rc.condition < best.condition))
        pick = c, best = rc;
    }
    if (pick == plan.candidates.size()) break;
    chosen.push_back(pick);
    rank = exact_rank(chosen);
  }
  // ... then drop any bar the others make redundant, and try exchanging each
  // chosen bar for an unchosen one that keeps the rank with a better condition.
  for (std::size_t k = chosen.size(); k-- > 0;) {
    auto fewer = chosen;
    fewer.erase(fewer.begin() + static_cast<std::ptrdiff_t>(k));
    if (!fewer.empty() && exact_rank(fewer) == plan.rank_all) chosen = fewer;
  }
  double condition = float_rank(rows_for(chosen), cols).condition;
  for (std::size_t k = 0; k < chosen.size(); ++k)
    for (std::size_t c = 0; c < plan.candidates.size(); ++c) {
      if (std::find(chosen.begin(), chosen.end(), c) != chosen.end() || rows_of[c].empty()) continue;
      auto trial = chosen;
      trial[k] = c;
      RankCondition rc = float_rank(rows_for(trial), cols);
      if (rc.rank == plan.rank_all && rc.condition < condition * (1 - 1e-9) && exact_rank(trial) == plan.rank_all) {
        chosen = trial;
        condition = rc.condition;
      }
    }
  std::sort(chosen.begin(), chosen.end());
  plan.chosen = chosen;
  plan.rank_chosen = exact_rank(chosen);
  if (plan.rank_chosen != plan.rank_all) fail(ErrorKind::internal, "measurement plan lost rank in the search");

  // Which handles the plan needs: merge the blocks a handle would separate and see
  // whether the exact rank drops.
  auto merged_rank = [&](bool merge_b, bool merge_m, bool merge_n) {
    std::map<ClassKey, SurdRow> merged;
    for (const auto& [key, row] : blocks) {
      if (std::find(chosen.begin(), chosen.end(), key.candidate) == chosen.end()) continue;
      ClassKey k = key;
      if (merge_b) k.e_b = 0;
      if (merge_m) k.e_m = 0;
      if (merge_n) k.n = 0;
      SurdRow& r = merged[k];
      if (r.empty()) r.assign(cols, Surd());
      for (int c = 0; c < cols; ++c)
        if (!row[c].is_zero()) r[c] = r[c] + row[c];
    }
    SurdEchelon e(cols);
    for (const auto& [k, r] : merged) e.add(r);
    return e.rank();
  };
  const bool has_b = std::any_of(blocks.begin(), blocks.end(), [](const auto& b) { return b.first.e_b == 1; });
  const bool has_m = std::any_of(blocks.begin(), blocks.end(), [](const auto& b) { return b.first.e_m == 1; });
  std::set<int> powers;
  for (const auto& [key, row] : blocks) powers.insert(key.n);
  if (has_b && merged_rank(true, false, false) < plan.rank_all) plan.handles.push_back("field reversal");
  if (has_m && merged_rank(false, true, false) < plan.rank_all) plan.handles.push_back("magnetisation reversal");
  if (powers.size() > 1 && merged_rank(false, false, true) < plan.rank_all)
    plan.handles.push_back("current scaling (two current amplitudes)");
  std::set<std::size_t> fields_used;
  for (const auto& [key, row] : blocks)
    if (std::find(chosen.begin(), chosen.end(), key.candidate) != chosen.end()) fields_used.insert(key.field);
  for (std::size_t f : fields_used) plan.fields_needed.push_back(plan.fields[f]);

  // The readings as taken: every sign of field and magnetisation (and two
  // currents) the handles need, for the condition number.
  std::vector<SurdRow> physical;
  const std::vector<int> sb = has_b ? std::vector<int>{1, -1} : std::vector<int>{1};
  const std::vector<int> sm = has_m ? std::vector<int>{1, -1} : std::vector<int>{1};
  const std::vector<int> scales = powers.size() > 1 ? std::vector<int>{1, 2} : std::vector<int>{1};
  std::map<std::tuple<std::size_t, std::size_t, int, int>, std::vector<const Block*>> readings;
  std::vector<Block> kept;
  for (const auto& [key, row] : blocks)
    if (std::find(chosen.begin(), chosen.end(), key.candidate) != chosen.end()) kept.push_back({key, row});
  for (const auto& b : kept) readings[{b.key.candidate, b.key.field, b.key.probe, b.key.quadrature}].push_back(&b);
  for (const auto& [where, parts] : readings)
    for (int b : sb)
      for (int m : sm)
        for (int s : scales) {
          SurdRow row(cols);
          for (const Block* blk : parts) {
            long factor = (blk->key.e_b && b < 0 ? -1 : 1) * (blk->key.e_m && m < 0 ? -1 : 1);
            for (int k = 0; k < blk->key.n; ++k) factor *= s;
            for (int c = 0; c < cols; ++c)
              if (!blk->row[c].is_zero()) row[c] = row[c] + blk->row[c] * Surd(Rational(factor));
          }
          physical.push_back(std::move(row));
        }
  std::vector<const SurdRow*> ptrs;
  for (const auto& r : physical) ptrs.push_back(&r);
  plan.condition = float_rank(ptrs, cols).condition;

  // Separation and the undetermined directions, from the exact echelon form.
  SurdEchelon e(cols);
  for (const SurdRow* r : rows_for(chosen)) e.add(*r);
  for (const auto& v : e.null_space()) {
    PlanCombination comb;
    for (int c = 0; c < cols; ++c)
      if (!v[c].is_zero()) comb.push_back({static_cast<std::size_t>(c), v[c]});
    // A null direction along one column alone is a parameter no reading sees.
    if (comb.size() == 1) plan.unseen.push_back(comb[0].first);
    else plan.undetermined.push_back(std::move(comb));
  }
  // A mechanism is separated when no undetermined direction links its parameters
  // to another mechanism's (a parameter no reading sees is listed on its own).
  for (std::size_t i = 0; i < plan.mechanisms.size(); ++i) {
    if (!read[i]) continue;
    bool linked = false;
    for (const auto& comb : plan.undetermined) {
      bool mine = false, other = false;
      for (const auto& [c, coef] : comb) (plan.columns[c].mechanism == i ? mine : other) = true;
      linked = linked || (mine && other);
    }
    (linked ? plan.not_separated : plan.separated).push_back(i);
  }
  return plan;
}

} // namespace ts
