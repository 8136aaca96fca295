#include "geometry/layout_design.hpp"

#include "core/error.hpp"

#include "geometry/svd_rank.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <numeric>
#include <set>

namespace ts {

namespace {

Eigen::MatrixXd matrix_of(const std::vector<const LayoutRow*>& rows, int cols) {
  Eigen::MatrixXd m(static_cast<Eigen::Index>(rows.size()), cols);
  for (std::size_t r = 0; r < rows.size(); ++r)
    for (int c = 0; c < cols; ++c) m(static_cast<Eigen::Index>(r), c) = rows[r]->coefficients[c].to_double();
  return m;
}

using RankCond = RankCondition;

RankCond rank_and_condition(const std::vector<const LayoutRow*>& rows, int cols) {
  if (rows.empty() || cols == 0) return {};
  return svd_rank(matrix_of(rows, cols));
}

std::string degrees_text(double deg) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.2f°", deg);
  std::string s = buf;
  if (s.size() > 4 && s.compare(s.size() - 5, 5, ".00°") == 0) s = s.substr(0, s.size() - 5) + "°";
  return s;
}

} // namespace

std::vector<LayoutCandidate> layout_candidates(const std::vector<std::string>& directions,
                                               const std::vector<int>& rosette, const SampleFrame& sf,
                                               const std::string& system, LatticeKind lattice,
                                               const LatticeMetric& metric, const std::string& where) {
  std::vector<LayoutCandidate> out;
  auto add = [&](const std::string& current) {
    LayoutCandidate c;
    c.bar.where = where;
    set_bar_current(c.bar, current, sf, system, lattice, metric);
    double ang = std::atan2(c.bar.u[1].to_double(), c.bar.u[0].to_double()) * 180.0 / M_PI;
    if (ang < -1e-9) ang += 360;
    c.azimuth_deg = static_cast<int>(std::lround(ang)) % 360;
    c.azimuth = degrees_text(ang);
    c.label = c.bar.current_label;
    out.push_back(c);
  };
  if (!rosette.empty()) {
    for (int a : rosette) add(std::to_string(a));
    return out;
  }
  if (!directions.empty()) {
    for (const auto& d : directions) add(d);
    return out;
  }
  // Low-index in-plane directions, one per line (d and -d are the same bar).
  std::vector<std::array<Surd, 3>> seen;
  for (long u = -2; u <= 2; ++u)
    for (long v = -2; v <= 2; ++v)
      for (long w = -2; w <= 2; ++w) {
        if (u == 0 && v == 0 && w == 0) continue;
        if (std::gcd(std::gcd(std::labs(u), std::labs(v)), std::labs(w)) != 1) continue;
        std::string text = direction_str({u, v, w});
        Vec3 d;
        try {
          d = metric_direction(parse_direction(text, where), system, lattice, metric, where);
        } catch (const Error&) {
          continue; // needs lattice parameters that are not given
        }
        if (!dot(d, sf.normal).is_zero()) continue;
        std::array<Surd, 3> unit = sample_unit_vector(d, sf.frame, where);
        // One of each ± pair: the one at an azimuth in [0°, 180°).
        int sy = unit[1].sign(), sx = unit[0].sign();
        if (sy < 0 || (sy == 0 && sx < 0)) continue;
        bool dup = false;
        for (const auto& s : seen)
          if ((s[0] == unit[0] && s[1] == unit[1]) || (s[0] == -unit[0] && s[1] == -unit[1])) dup = true;
        if (dup) continue;
        seen.push_back(unit);
        add(text);
      }
  std::stable_sort(out.begin(), out.end(),
                   [](const LayoutCandidate& a, const LayoutCandidate& b) { return a.bar.u[0].to_double() > b.bar.u[0].to_double(); });
  return out;
}

LayoutDesign design_layout(const ResponsePart& part, const AllowedForm& form, std::vector<LayoutCandidate> candidates,
                           const std::vector<std::string>& fields_in, const SampleFrame& sf,
                           const std::string& system, LatticeKind lattice, const LatticeMetric& metric) {
  LayoutDesign d;
  d.part = &part;
  d.parameters = form.independent();
  d.candidates = std::move(candidates);
  bool field_part = std::any_of(part.indices.begin(), part.indices.end(),
                                [](const std::string& r) { return r == "B" || r == "M"; });
  d.fields = field_part ? (fields_in.empty() ? std::vector<std::string>{"along-current", "across-current", "normal"}
                                             : fields_in)
                        : std::vector<std::string>{"none"};
  for (std::size_t c = 0; c < d.candidates.size(); ++c)
    for (const auto& f : d.fields) {
      BarMeasurement m = d.candidates[c].bar;
      set_bar_field(m, f, sf, system, lattice, metric);
      PartSignal ps = bar_signal(part, form, m);
      for (const ProbeSignal* p : {&ps.longitudinal, &ps.transverse}) {
        LayoutRow row;
        row.candidate = c;
        row.field = f;
        row.probe = p->probe;
        row.coefficients.assign(d.parameters, Surd());
        for (const auto& t : p->terms)
          if (t.k == Frequency{} && !t.sine)
            for (const auto& lt : t.coefficient) row.coefficients[lt.parameter] += lt.coefficient;
        d.rows.push_back(row);
      }
    }
  for (int j = 0; j < d.parameters; ++j)
    if (std::all_of(d.rows.begin(), d.rows.end(), [&](const LayoutRow& r) { return r.coefficients[j].is_zero(); }))
      d.unreadable.push_back(form.parameter_name(j));
  std::vector<const LayoutRow*> all;
  for (const auto& r : d.rows) all.push_back(&r);
  d.rank_all = rank_and_condition(all, d.parameters).rank;
  if (d.rank_all == 0) return d;

  auto rows_of = [&](const std::vector<std::size_t>& bars) {
    std::vector<const LayoutRow*> rs;
    for (const auto& r : d.rows)
      if (std::find(bars.begin(), bars.end(), r.candidate) != bars.end()) rs.push_back(&r);
    return rs;
  };
  // Smallest subsets first; every subset of a size is tried while that stays cheap.
  const std::size_t n = d.candidates.size();
  const double budget = 2e5;
  for (std::size_t k = 1; k <= n; ++k) {
    double combos = 1;
    for (std::size_t i = 0; i < k; ++i) combos = combos * double(n - i) / double(i + 1);
    std::vector<std::size_t> best;
    double best_cond = 0;
    if (combos <= budget) {
      std::vector<std::size_t> pick(k);
      std::function<void(std::size_t, std::size_t)> rec = [&](std::size_t start, std::size_t depth) {
        if (depth == k) {
          RankCond rc = rank_and_condition(rows_of(pick), d.parameters);
          if (rc.rank == d.rank_all && (best.empty() || rc.condition < best_cond - 1e-12)) {
            best = pick;
            best_cond = rc.condition;
          }
          return;
        }
        for (std::size_t i = start; i < n; ++i) {
          pick[depth] = i;
          rec(i + 1, depth + 1);
        }
      };
      rec(0, 0);
    } else {
      // Greedy: add the bar that raises the rank most (then conditions best).
      d.exhaustive = false;
      std::vector<std::size_t> cur;
      while (rank_and_condition(rows_of(cur), d.parameters).rank < d.rank_all) {
        std::size_t pick = n;
        RankCond pick_rc;
        for (std::size_t i = 0; i < n; ++i) {
          if (std::find(cur.begin(), cur.end(), i) != cur.end()) continue;
          auto trial = cur;
          trial.push_back(i);
          RankCond rc = rank_and_condition(rows_of(trial), d.parameters);
          if (pick == n || rc.rank > pick_rc.rank || (rc.rank == pick_rc.rank && rc.condition < pick_rc.condition)) {
            pick = i;
            pick_rc = rc;
          }
        }
        cur.push_back(pick);
      }
      best = cur;
      best_cond = rank_and_condition(rows_of(cur), d.parameters).condition;
      k = n; // stop
    }
    if (!best.empty()) {
      d.chosen = best;
      d.rank_chosen = d.rank_all;
      d.condition = best_cond;
      break;
    }
  }
  return d;
}

} // namespace ts
