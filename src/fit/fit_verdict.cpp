#include "fit/fit_verdict.hpp"

#include "fit/fit_statistics.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

namespace ts {

LinearSolution solve_linear(const Eigen::MatrixXd& F, const Eigen::VectorXd& y) {
  LinearSolution s;
  const Eigen::Index T = F.cols();
  s.c = Eigen::VectorXd::Zero(T);
  s.covariance = Eigen::MatrixXd::Zero(T, T);
  if (T == 0) {
    s.cost = y.squaredNorm();
    return s;
  }
  // The full V: with fewer points than functions a null vector lies beyond the thin V.
  Eigen::JacobiSVD<Eigen::MatrixXd> svd(F, Eigen::ComputeThinU | Eigen::ComputeFullV);
  const Eigen::VectorXd& sv = svd.singularValues();
  // Singular values below 1e-9 of the largest count as zero (as for the layout designs).
  const double tol = 1e-9 * (sv.size() ? sv(0) : 0.0);
  for (Eigen::Index i = 0; i < sv.size(); ++i)
    if (sv(i) > tol) ++s.rank;
  if (s.rank < T) {
    s.null_vector = svd.matrixV().col(T - 1);
    return s;
  }
  const Eigen::VectorXd inv = sv.cwiseInverse();
  s.c = svd.matrixV() * (inv.asDiagonal() * (svd.matrixU().transpose() * y));
  s.covariance = svd.matrixV() * inv.cwiseAbs2().asDiagonal() * svd.matrixV().transpose();
  s.cost = (y - F * s.c).squaredNorm();
  return s;
}

namespace {

std::string fixed(double v, int digits) {
  std::ostringstream o;
  o.precision(digits);
  o << v;
  return o.str();
}

// Whether every operation of `small` lies in `big` (small ⊆ big).
bool inside(const PointGroup& small, const PointGroup& big) { return small.is_subgroup_of(big); }

} // namespace

void rank_and_judge(FitResult& r, const PointGroup& parent) {
  const double N = static_cast<double>(r.points);
  for (auto& h : r.hypotheses) {
    if (!h.fitted) continue;
    h.dof = static_cast<int>(r.points) - h.k;
    if (r.uncertainties) {
      h.aic = h.chi2 + 2.0 * h.k;
      h.bic = h.chi2 + h.k * std::log(N);
      if (h.dof > 0) {
        h.chi2_per_dof = h.chi2 / h.dof;
        h.p_value = chi2_upper_tail(h.chi2, h.dof);
      }
    } else {
      // σ unknown: the Gaussian likelihood with σ estimated from the residuals.
      const double rss = std::max(h.chi2, 1e-300 * N);
      h.aic = N * std::log(rss / N) + 2.0 * h.k;
      h.bic = N * std::log(rss / N) + h.k * std::log(N);
      if (h.dof > 0) h.chi2_per_dof = h.chi2 / h.dof;
    }
    h.rms = h.dof > 0 ? std::sqrt(h.chi2 / h.dof) : 0.0;
    h.rank_key = h.aic;
  }
  // Akaike weights over the fitted hypotheses.
  double best = INFINITY;
  for (const auto& h : r.hypotheses)
    if (h.fitted) best = std::min(best, h.aic);
  double total = 0;
  for (auto& h : r.hypotheses)
    if (h.fitted) total += (h.weight = std::exp(-0.5 * (h.aic - best)));
  for (auto& h : r.hypotheses)
    if (h.fitted && total > 0) h.weight /= total;
  // Nested tests: each hypothesis against the largest fitted model of a subgroup.
  for (auto& h : r.hypotheses) {
    if (!h.fitted) continue;
    const HypothesisFit* bigger = nullptr;
    for (const auto& o : r.hypotheses) {
      if (&o == &h || !o.fitted || o.k <= h.k || o.dof <= 0) continue;
      const bool sub = std::any_of(o.groups.begin(), o.groups.end(),
                                   [&](const PointGroup& g) { return inside(g, h.groups.front()); });
      if (sub && (!bigger || o.k > bigger->k || (o.k == bigger->k && o.chi2 < bigger->chi2))) bigger = &o;
    }
    if (bigger) {
      NestedTest t;
      t.against = bigger->hypothesis.symbol;
      t.d1 = bigger->k - h.k;
      t.d2 = bigger->dof;
      const double denom = bigger->chi2 / t.d2;
      t.f = denom > 0 ? ((h.chi2 - bigger->chi2) / t.d1) / denom : (h.chi2 > bigger->chi2 ? INFINITY : 0.0);
      t.p = std::isfinite(t.f) ? f_upper_tail(t.f, t.d1, t.d2) : 0.0;
      h.nested = t;
    }
    if (h.p_value && *h.p_value < r.alpha) {
      h.rejected = true;
      h.rejected_because = "χ² = " + fixed(h.chi2, 4) + " for " + std::to_string(h.dof) +
                           " degrees of freedom: P = " + fixed(*h.p_value, 3) + " < " + fixed(r.alpha, 3);
    } else if (h.nested && h.nested->p < r.alpha) {
      h.rejected = true;
      h.rejected_because = "F-test against " + h.nested->against + ": F = " + fixed(h.nested->f, 4) + ", P = " +
                           fixed(h.nested->p, 3) + " < " + fixed(r.alpha, 3);
    }
  }
  // Ranking: the fitted ones by AIC (ties: the larger group first), then the unfitted.
  std::stable_sort(r.hypotheses.begin(), r.hypotheses.end(), [](const HypothesisFit& a, const HypothesisFit& b) {
    if (a.fitted != b.fitted) return a.fitted;
    if (!a.fitted) return false;
    if (std::fabs(a.aic - b.aic) > 1e-9 * (1 + std::fabs(a.aic))) return a.aic < b.aic;
    return a.groups.front().order() > b.groups.front().order();
  });

  // The verdict: the highest symmetry the data do not reject (ties: the better AIC).
  FitVerdict& v = r.verdict;
  const HypothesisFit* accepted = nullptr;
  for (const auto& h : r.hypotheses) {
    if (!h.fitted || h.rejected) continue;
    if (!accepted || h.groups.front().order() > accepted->groups.front().order()) accepted = &h;
  }
  const HypothesisFit* parent_fit = nullptr;
  for (const auto& h : r.hypotheses)
    if (std::any_of(h.groups.begin(), h.groups.end(), [&](const PointGroup& g) { return g == parent; })) parent_fit = &h;
  if (!accepted) {
    v.breaking.push_back("every hypothesis is rejected: the data hold more than any symmetry-allowed model of this "
                         "measurement (another mechanism or harmonic, a misaligned probe that mixes the longitudinal "
                         "signal into the transverse one, drift, or uncertainties that are too small)");
  } else {
    v.accepted = accepted->hypothesis.symbol;
    v.accepted_origin = accepted->hypothesis.origin;
    const bool is_parent = std::any_of(accepted->groups.begin(), accepted->groups.end(),
                                       [&](const PointGroup& g) { return g == parent; });
    if (accepted->hypothesis.from_chain || is_parent) {
      v.breaking.push_back("no symmetry breaking beyond the scenario is needed: " + accepted->hypothesis.symbol + " (" +
                           accepted->hypothesis.origin + ") describes the data");
    } else {
      std::string s = "the data require lowering " + (parent_fit ? parent_fit->hypothesis.symbol : std::string("the sample group")) +
                      " to " + accepted->hypothesis.symbol;
      if (parent_fit && parent_fit->rejected) s += " (the higher symmetry is rejected: " + parent_fit->rejected_because + ")";
      if (!accepted->hypothesis.producers.empty()) {
        s += "; what imposes it: ";
        for (std::size_t i = 0; i < accepted->hypothesis.producers.size(); ++i)
          s += (i ? "; or " : "") + accepted->hypothesis.producers[i];
      } else {
        s += "; no single vector or strain imposes it (a combination, or an order of higher rank)";
      }
      v.breaking.push_back(s);
    }
    if (!accepted->same_model.empty()) {
      std::string s = "this scan gives the same model for " + accepted->hypothesis.symbol + " and ";
      for (std::size_t i = 0; i < accepted->same_model.size(); ++i) s += (i ? ", " : "") + accepted->same_model[i];
      v.undecided.push_back(s + ": it cannot tell them apart (another probe, harmonic or field geometry may)");
    }
    for (const auto& d : accepted->degenerate) v.undecided.push_back(accepted->hypothesis.symbol + ": " + d);
    if (!accepted->offset_note.empty()) v.undecided.push_back(accepted->hypothesis.symbol + ": " + accepted->offset_note);
    // Lower symmetries that fit about as well are allowed by the data, not required.
    int better = 0; // at most two such lines: the ranking table has the rest
    for (const auto& h : r.hypotheses)
      if (&h != accepted && h.fitted && !h.rejected && h.weight > accepted->weight && better++ < 2)
        v.undecided.push_back("the lower symmetry " + h.hypothesis.symbol + " has the better Akaike weight (" +
                              fixed(h.weight, 3) + " against " + fixed(accepted->weight, 3) +
                              ") but its extra terms are not significant at " + fixed(r.alpha, 3));
  }
  for (const auto& h : r.hypotheses)
    if (!h.fitted) v.undecided.push_back(h.hypothesis.symbol + " not fitted: " + h.not_fitted);

  // The models shown (reports, figures, JSON): the accepted one first, then the
  // fitted ones among the best ranked.
  constexpr std::size_t best_ranked = 3;
  r.shown_models.clear();
  if (accepted) r.shown_models.push_back(static_cast<std::size_t>(accepted - r.hypotheses.data()));
  std::size_t ranked = 0;
  for (std::size_t i = 0; i < r.hypotheses.size() && ranked < best_ranked; ++i) {
    if (!r.hypotheses[i].fitted) continue;
    ++ranked;
    if (&r.hypotheses[i] != accepted) r.shown_models.push_back(i);
  }
}

} // namespace ts
