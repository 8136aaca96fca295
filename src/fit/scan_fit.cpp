#include "fit/scan_fit.hpp"

#include "core/error.hpp"
#include "fit/compiled_expression.hpp"
#include "fit/fit_verdict.hpp"
#include "fit/levenberg_marquardt.hpp"
#include "fit/shg_fit.hpp"
#include "geometry/signal_expression.hpp"
#include "group/group_catalogue.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <numeric>
#include <sstream>

namespace ts {

namespace {

constexpr double kPi = 3.14159265358979323846;

const BarResult& pick_bar(const ScenarioResult& res, const FitSpec& spec) {
  if (res.bars.empty())
    fail(spec.bad_value, "a transport fit needs the bar the scan was measured on, and the scenario has none", spec.where,
         "a [[bar]] table in the scenario (docs/hall-bars.md), or --bar CURRENT:FIELD");
  if (spec.bar.empty()) return res.bars.front();
  for (std::size_t i = 0; i < res.bars.size(); ++i)
    if (res.bars[i].measurement.name == spec.bar || std::to_string(i + 1) == spec.bar) return res.bars[i];
  std::string names;
  for (std::size_t i = 0; i < res.bars.size(); ++i)
    names += (i ? ", " : "") + std::to_string(i + 1) +
             (res.bars[i].measurement.name.empty() ? "" : " ('" + res.bars[i].measurement.name + "')");
  fail(spec.bad_value, "no bar '" + spec.bar + "' in the scenario", spec.where, "a bar number or name: " + names);
}

Probe parse_probe(const FitSpec& spec) {
  if (spec.probe == "longitudinal" || spec.probe == "L" || spec.probe == "parallel") return Probe::longitudinal;
  if (spec.probe == "transverse" || spec.probe == "T" || spec.probe == "hall") return Probe::transverse;
  fail(spec.bad_value, "unknown probe '" + spec.probe + "'", spec.where, "longitudinal or transverse");
}

// The angle columns a bar's geometry needs: what turns during the scan.
std::vector<ScanQuantity> bar_angles(const BarMeasurement& m) {
  std::vector<ScanQuantity> q;
  if (m.rotating) q.push_back(ScanQuantity::phi);
  if (m.field == FieldGeometry::in_plane || m.field == FieldGeometry::any) q.push_back(ScanQuantity::phi_b);
  if (m.field == FieldGeometry::any) q.push_back(ScanQuantity::theta_b);
  return q;
}

std::string function_text(const ModelFunction& f, bool with_b, bool with_i) {
  std::string s = angle_function_text(f.angles);
  if (with_b && f.field_power > 0) s += "·B" + (f.field_power > 1 ? "^" + std::to_string(f.field_power) : std::string());
  if (with_i && f.current_power > 0) s += "·I" + (f.current_power > 1 ? "^" + std::to_string(f.current_power) : std::string());
  return s;
}

struct Points {
  std::size_t n = 0;
  std::vector<std::array<double, angle_count>> radians;
  std::vector<double> b, i, y, w; // field, current, reading, 1/σ
};

double function_value(const ModelFunction& f, const Points& p, std::size_t k, bool with_b, bool with_i) {
  double v = angle_function_double(f.angles, p.radians[k]);
  if (with_b) v *= std::pow(p.b[k], f.field_power);
  if (with_i) v *= std::pow(p.i[k], f.current_power);
  return v;
}

// The design matrix and the readings, each row divided by its uncertainty.
void weighted_design(const std::vector<ModelFunction>& fs, const Points& p, bool with_b, bool with_i,
                     Eigen::MatrixXd& F, Eigen::VectorXd& y) {
  F.resize(static_cast<Eigen::Index>(p.n), static_cast<Eigen::Index>(fs.size()));
  y.resize(static_cast<Eigen::Index>(p.n));
  for (std::size_t k = 0; k < p.n; ++k) {
    y(static_cast<Eigen::Index>(k)) = p.y[k] * p.w[k];
    for (std::size_t t = 0; t < fs.size(); ++t)
      F(static_cast<Eigen::Index>(k), static_cast<Eigen::Index>(t)) = function_value(fs[t], p, k, with_b, with_i) * p.w[k];
  }
}

// The transport model with a stage offset φ0: every in-plane angle of the scan is
// the angle from sample x plus φ0. Built with GiNaC, differentiated exactly and
// compiled once; the coefficients come from the linear fit at the best φ0 of a grid.
void fit_offset(HypothesisFit& h, const std::vector<ModelFunction>& fs, const Points& p, bool with_b, bool with_i,
                LinearSolution& lin) {
  using namespace GiNaC;
  const symbol phi("phi"), phib("phi_B"), thetab("theta_B"), B("B"), I("I"), phi0("phi0");
  std::vector<symbol> c;
  for (std::size_t t = 0; t < fs.size(); ++t) c.emplace_back("c" + std::to_string(t));
  ex model = 0;
  int period = 0; // the model repeats when φ0 turns by 360°/period
  for (std::size_t t = 0; t < fs.size(); ++t) {
    const auto& k = fs[t].angles.k;
    const int kp = k[static_cast<int>(Angle::phi)], kb = k[static_cast<int>(Angle::phi_b)];
    period = std::gcd(period, std::abs(kp + kb));
    ex arg = kp * (phi - phi0) + kb * (phib - phi0) + k[static_cast<int>(Angle::theta_b)] * thetab;
    ex term = c[t] * (fs[t].angles.sine ? sin(arg) : cos(arg));
    if (with_b) term *= pow(B, fs[t].field_power);
    if (with_i) term *= pow(I, fs[t].current_power);
    model += term;
  }
  if (period == 0) {
    h.offset_note = "the model does not turn with the sample (isotropic in the plane): an offset φ0 changes nothing";
    return;
  }
  std::vector<symbol> vars{phi, phib, thetab, B, I};
  for (const auto& s : c) vars.push_back(s);
  vars.push_back(phi0);
  const CompiledExpression f(model, vars);
  std::vector<CompiledExpression> d;
  for (const auto& s : c) d.emplace_back(model.diff(s), vars);
  d.emplace_back(model.diff(phi0), vars);
  const std::size_t T = fs.size(), P = T + 1;
  // The values of the point's variables (angles, B, I) at the head of the argument list.
  auto load_point = [&p](std::vector<double>& v, std::size_t k) {
    v[0] = p.radians[k][0];
    v[1] = p.radians[k][1];
    v[2] = p.radians[k][2];
    v[3] = p.b.empty() ? 1.0 : p.b[k];
    v[4] = p.i.empty() ? 1.0 : p.i[k];
  };
  auto evaluate = [&](const Eigen::VectorXd& q, Eigen::VectorXd& r, Eigen::MatrixXd& J) {
    r.resize(static_cast<Eigen::Index>(p.n));
    J.resize(static_cast<Eigen::Index>(p.n), static_cast<Eigen::Index>(P));
    std::vector<double> v(5 + P);
    for (std::size_t j = 0; j < P; ++j) v[5 + j] = q(static_cast<Eigen::Index>(j));
    for (std::size_t k = 0; k < p.n; ++k) {
      load_point(v, k);
      const auto row = static_cast<Eigen::Index>(k);
      r(row) = (p.y[k] - f.evaluate(v.data())) * p.w[k];
      for (std::size_t j = 0; j < P; ++j) J(row, static_cast<Eigen::Index>(j)) = -d[j].evaluate(v.data()) * p.w[k];
    }
  };
  // Start: the linear fit at each φ0 of a grid over one period.
  const int steps = 90;
  double best_cost = INFINITY;
  Eigen::VectorXd start(static_cast<Eigen::Index>(P));
  for (int s = 0; s < steps; ++s) {
    const double off = 2 * kPi / period * s / steps;
    Points shifted = p;
    for (auto& a : shifted.radians) {
      a[0] -= off;
      a[1] -= off;
    }
    Eigen::MatrixXd F;
    Eigen::VectorXd y;
    weighted_design(fs, shifted, with_b, with_i, F, y);
    LinearSolution sol = solve_linear(F, y);
    if (sol.rank == static_cast<int>(T) && sol.cost < best_cost) {
      best_cost = sol.cost;
      start.head(static_cast<Eigen::Index>(T)) = sol.c;
      start(static_cast<Eigen::Index>(T)) = off;
    }
  }
  if (!std::isfinite(best_cost)) return;
  LmResult lm = levenberg_marquardt(evaluate, start);
  Eigen::JacobiSVD<Eigen::MatrixXd> svd(lm.jacobian);
  const auto& sv = svd.singularValues();
  if (sv(sv.size() - 1) <= 1e-7 * sv(0)) {
    h.offset_note = "an offset φ0 between the stage and sample x trades against the mix of cos and sin terms in this "
                    "model, so the scan cannot fix it; fitted without an offset";
    return;
  }
  // Accept: the coefficients and φ0, with errors from (JᵀJ)⁻¹.
  const Eigen::MatrixXd cov = (lm.jacobian.transpose() * lm.jacobian).inverse();
  lin.c = lm.parameters.head(static_cast<Eigen::Index>(T));
  lin.covariance = cov;
  lin.cost = lm.cost;
  double off = std::remainder(lm.parameters(static_cast<Eigen::Index>(T)), 2 * kPi / period);
  FitParameter fp;
  fp.name = "phi0 (deg)";
  fp.value = off * 180 / kPi;
  fp.error = std::sqrt(cov(static_cast<Eigen::Index>(T), static_cast<Eigen::Index>(T))) * 180 / kPi;
  h.parameters.push_back(fp);
  h.offset_note = "the stage offset φ0 is fitted; the model repeats every " + std::to_string(360 / period) +
                  (360 % period ? "." + std::to_string((3600 / period) % 10) : std::string()) +
                  "°, so φ0 is known modulo that angle";
  h.k = static_cast<int>(T) + 1;
  // The model at the points, with the fitted offset.
  h.model.assign(p.n, 0.0);
  std::vector<double> v(5 + P);
  for (std::size_t j = 0; j < P; ++j) v[5 + j] = lm.parameters(static_cast<Eigen::Index>(j));
  for (std::size_t k = 0; k < p.n; ++k) {
    load_point(v, k);
    h.model[k] = f.evaluate(v.data());
  }
}

std::string describe_functions(const std::vector<std::string>& names, const Eigen::VectorXd& null) {
  std::string s;
  for (Eigen::Index t = 0; t < null.size(); ++t)
    if (std::fabs(null(t)) > 1e-6) s += (s.empty() ? "" : ", ") + names[static_cast<std::size_t>(t)];
  return s;
}

void fit_transport(const ScenarioResult& res, const FitSpec& spec, const ScanTable& data,
                   const std::vector<Hypothesis>& hyps, FitResult& out) {
  const BarResult& bar = pick_bar(res, spec);
  const Probe probe = parse_probe(spec);
  const BarMeasurement& m = bar.measurement;
  // Which lock-in reading: asked, or the one the bar's parts give at this harmonic.
  LockInReading reading = LockInReading::x;
  if (spec.harmonic == 0) reading = LockInReading::dc;
  else if (spec.reading == "y" || spec.reading == "Y") reading = LockInReading::y;
  else if (spec.reading == "auto") {
    bool x = false, y = false;
    for (const auto& s : bar.signals)
      for (const auto& hf : s.signal.harmonics)
        if (hf.harmonic == spec.harmonic) {
          x = x || !hf.x.is_zero();
          y = y || !hf.y.is_zero();
        }
    reading = x || !y ? LockInReading::x : LockInReading::y;
  } else if (spec.reading != "x" && spec.reading != "X") {
    fail(spec.bad_value, "unknown reading '" + spec.reading + "'", spec.where, "x, y or auto");
  }
  // The data column of that reading.
  ScanQuantity column = ScanQuantity::value;
  if (!data.has(ScanQuantity::value)) {
    column = reading == LockInReading::y ? ScanQuantity::y : ScanQuantity::x;
    if (!data.has(column))
      fail(ErrorKind::bad_file,
           std::string("the fit reads the ") + (reading == LockInReading::y ? "Y (quadrature)" : "X (in-phase)") +
               " output of the lock-in at harmonic " + std::to_string(spec.harmonic) + ", and the scan has no such column",
           data.path, std::string("a column ") + (reading == LockInReading::y ? "Y" : "X") +
                          " (e.g. " + (reading == LockInReading::y ? "Y_uV" : "X_uV") + ") or V, or reading = \"" +
                          (reading == LockInReading::y ? "x" : "y") + "\"");
  }
  if (data.has(ScanQuantity::intensity) || data.has(ScanQuantity::channel))
    fail(ErrorKind::bad_file, "an optical scan (intensity, channel) given for a transport fit", data.path,
         "a transport scan with X, Y or V, or an [[shg]] setup for an optical scan");
  const auto needed = bar_angles(m);
  for (ScanQuantity q : needed)
    if (!data.has(q))
      fail(ErrorKind::bad_file, std::string("the bar's geometry turns ") + scan_quantity_name(q) +
                                    " during the scan, and the file has no column for it",
           data.path, std::string("a column ") + scan_quantity_name(q) + "_deg");
  for (ScanQuantity q : {ScanQuantity::phi, ScanQuantity::phi_b, ScanQuantity::theta_b})
    if (data.has(q) && std::find(needed.begin(), needed.end(), q) == needed.end())
      fail(ErrorKind::bad_file, "column '" + data.header_of(q) + "' varies an angle the bar keeps fixed", data.path,
           std::string("a bar whose geometry turns it (current = \"rotating\", field = \"in-plane\" or \"any\"), or a "
                       "scan without that column; the bar has current ") + m.current_label + ", field " + m.field_label);

  Points p;
  p.n = data.points();
  const bool with_b = data.has(ScanQuantity::field), with_i = data.has(ScanQuantity::current);
  p.radians.assign(p.n, std::array<double, angle_count>{});
  for (std::size_t k = 0; k < p.n; ++k) {
    if (data.has(ScanQuantity::phi)) p.radians[k][0] = data.column(ScanQuantity::phi)[k];
    if (data.has(ScanQuantity::phi_b)) p.radians[k][1] = data.column(ScanQuantity::phi_b)[k];
    if (data.has(ScanQuantity::theta_b)) p.radians[k][2] = data.column(ScanQuantity::theta_b)[k];
  }
  if (with_b) p.b = data.column(ScanQuantity::field);
  if (with_i) p.i = data.column(ScanQuantity::current);
  p.y = data.column(column);
  p.w.assign(p.n, 1.0);
  if (out.uncertainties)
    for (std::size_t k = 0; k < p.n; ++k) p.w[k] = 1.0 / data.column(ScanQuantity::sigma)[k];

  out.kind = "transport";
  out.measurement = std::string(probe == Probe::longitudinal ? "longitudinal" : "transverse") + " probe, " +
                    (spec.harmonic == 0 ? std::string("DC") : std::to_string(spec.harmonic) + "ω") + " " +
                    (reading == LockInReading::y ? "Y" : reading == LockInReading::dc ? "reading" : "X") + " (column " +
                    data.header_of(column) + "), bar " + (m.name.empty() ? std::string() : "'" + m.name + "' ") +
                    "with current " + m.current_label + ", field " + m.field_label + ", " +
                    (m.waveform == Waveform::sine ? "sine" : "cosine") + " drive";
  // Abscissa for figures: the first angle that turns.
  ScanQuantity abscissa = needed.empty() ? ScanQuantity::phi : needed.front();
  if (!needed.empty()) {
    out.abscissa = std::string(scan_quantity_name(abscissa)) + " (deg)";
    for (double a : data.column(abscissa)) out.angle_deg.push_back(a * 180 / kPi);
  }
  out.value = p.y;
  if (out.uncertainties) out.sigma = data.column(ScanQuantity::sigma);
  const bool curves = needed.size() == 1 && !with_b && !with_i;
  if (curves)
    for (int d = 0; d <= 360; d += 2) out.curve_deg.push_back(d);

  // One fit per distinct model: hypotheses whose models have the same functions
  // give the same fit on this scan.
  std::map<std::string, std::size_t> by_model;
  for (const auto& hyp : hyps) {
    ProbeModel pm = probe_sum(res, bar, hyp.group, probe, spec.harmonic, reading);
    // Powers of B or I that the scan does not vary are constants: merge such functions.
    std::vector<ModelFunction> fs;
    for (auto f : pm.functions) {
      if (!with_b) f.field_power = 0;
      if (!with_i) f.current_power = 0;
      auto it = std::find_if(fs.begin(), fs.end(), [&](const ModelFunction& g) { return same_function(f, g); });
      if (it == fs.end()) {
        fs.push_back(f);
        continue;
      }
      for (const auto& [g, c] : f.coefficient) {
        auto e = std::find_if(it->coefficient.begin(), it->coefficient.end(), [g = g](const auto& x) { return x.first == g; });
        if (e == it->coefficient.end()) it->coefficient.emplace_back(g, c);
        else e->second += c;
      }
    }
    std::string key;
    std::vector<std::string> names;
    for (const auto& f : fs) names.push_back(function_text(f, with_b, with_i));
    for (const auto& n : names) key += n + ";";
    auto known = by_model.find(key);
    if (known != by_model.end()) {
      HypothesisFit& h = out.hypotheses[known->second];
      h.same_model.push_back(hyp.symbol);
      h.groups.push_back(hyp.group);
      continue;
    }
    by_model[key] = out.hypotheses.size();
    HypothesisFit h;
    h.hypothesis = hyp;
    h.groups.push_back(hyp.group);
    h.functions = names;
    h.tensor_parameters = pm.parameters;
    const std::size_t T = fs.size();
    // A model with as many functions as points passes through every point:
    // no residual is left to judge it by (its AIC would run to minus infinity).
    if (T >= p.n && hyp.from_chain)
      fail(ErrorKind::bad_file,
           "the scan has " + std::to_string(p.n) + (p.n == 1 ? " point" : " points") + ", no more than the " +
               std::to_string(T) + (T == 1 ? " function" : " functions") + " of the model of " + hyp.symbol + " (" + hyp.origin + ")",
           data.path, "at least " + std::to_string(T + 1) + " points, and more to test it: every extra point is a degree of freedom");
    if (T >= p.n) {
      h.fitted = false;
      h.not_fitted = "the model has " + std::to_string(T) + " functions and the scan " + std::to_string(p.n) +
                     " points: a fit needs more points than functions";
      out.hypotheses.push_back(std::move(h));
      continue;
    }
    Eigen::MatrixXd F;
    Eigen::VectorXd y;
    weighted_design(fs, p, with_b, with_i, F, y);
    LinearSolution sol = solve_linear(F, y);
    if (sol.rank < static_cast<int>(T)) {
      // The functions are independent, so a rank deficit comes from where the scan sampled them.
      h.fitted = false;
      h.not_fitted = "the scan's angles cannot separate " + describe_functions(names, sol.null_vector) +
                     ": on these points they are linearly dependent (too few or too regularly spaced angles for the "
                     "harmonics of the model: with N equally spaced angles, harmonics above N/2 alias); measure more "
                     "angles instead of fitting";
      out.hypotheses.push_back(std::move(h));
      continue;
    }
    h.k = static_cast<int>(T);
    if (spec.offset && T > 0) fit_offset(h, fs, p, with_b, with_i, sol);
    const double dof = static_cast<double>(p.n) - h.k;
    // Without uncertainties the covariance is scaled by the residual variance.
    const double scale = out.uncertainties ? 1.0 : (dof > 0 ? sol.cost / dof : 0.0);
    for (std::size_t t = 0; t < T; ++t) {
      FitParameter fp;
      fp.name = names[t];
      for (const auto& [g, c] : fs[t].coefficient) fp.meaning.emplace_back(pm.parameters[static_cast<std::size_t>(g)], c);
      fp.value = sol.c(static_cast<Eigen::Index>(t));
      fp.error = std::sqrt(sol.covariance(static_cast<Eigen::Index>(t), static_cast<Eigen::Index>(t)) * scale);
      h.parameters.push_back(fp);
    }
    if (!h.parameters.empty() && h.parameters.front().name == "phi0 (deg)") {
      // The offset was fitted first: scale its error too and keep it last.
      FitParameter off = h.parameters.front();
      off.error *= std::sqrt(scale);
      h.parameters.erase(h.parameters.begin());
      h.parameters.push_back(off);
    }
    h.chi2 = sol.cost;
    if (h.model.empty()) {
      h.model.assign(p.n, 0.0);
      for (std::size_t k = 0; k < p.n; ++k)
        for (std::size_t t = 0; t < T; ++t) h.model[k] += sol.c(static_cast<Eigen::Index>(t)) * function_value(fs[t], p, k, with_b, with_i);
      if (curves) {
        Points grid;
        grid.n = out.curve_deg.size();
        grid.radians.assign(grid.n, std::array<double, angle_count>{});
        for (std::size_t k = 0; k < grid.n; ++k) grid.radians[k][static_cast<int>(abscissa)] = out.curve_deg[k] * kPi / 180;
        std::vector<double> curve(grid.n, 0.0);
        for (std::size_t k = 0; k < grid.n; ++k)
          for (std::size_t t = 0; t < T; ++t) curve[k] += sol.c(static_cast<Eigen::Index>(t)) * function_value(fs[t], grid, k, false, false);
        h.curve.push_back(curve);
      }
    }
    // Parameters that the scan sees only in combination.
    if (pm.parameters.size() > T) {
      h.degenerate.push_back(std::to_string(pm.parameters.size()) + " tensor parameters enter through " +
                             std::to_string(T) + " functions: the scan measures only the " + std::to_string(T) +
                             " combinations listed with the coefficients");
    } else {
      Eigen::MatrixXd M = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(T), static_cast<Eigen::Index>(pm.parameters.size()));
      for (std::size_t t = 0; t < T; ++t)
        for (const auto& [g, c] : fs[t].coefficient) M(static_cast<Eigen::Index>(t), g) = c.to_double();
      Eigen::JacobiSVD<Eigen::MatrixXd> svd(M);
      int rank = 0;
      for (Eigen::Index i = 0; i < svd.singularValues().size(); ++i)
        if (svd.singularValues()(i) > 1e-9 * svd.singularValues()(0)) ++rank;
      if (rank < static_cast<int>(pm.parameters.size()))
        h.degenerate.push_back("the " + std::to_string(pm.parameters.size()) + " tensor parameters enter through only " +
                               std::to_string(rank) + " independent combinations");
    }
    out.hypotheses.push_back(std::move(h));
  }
}

} // namespace

FitResult fit_scan(const ScenarioResult& res, const FitSpec& spec, const ScanTable& data) {
  FitResult out;
  out.name = spec.name;
  // The file as the user named it: a report printed on one machine and read on another
  // shows no folder of the first (the path itself is relative to the scenario).
  out.data = spec.data_as_written.empty() ? data.path : spec.data_as_written;
  out.points = data.points();
  out.uncertainties = data.has(ScanQuantity::sigma);
  out.offset = spec.offset;
  out.alpha = spec.alpha;
  const std::vector<Hypothesis> hyps = fit_hypotheses(res, spec.floor);
  if (hyps.empty())
    fail(spec.bad_value, "no hypothesis has at least " + std::to_string(spec.floor) + " operations", spec.where,
         "a floor no larger than the order of the scenario's last group");
  // The parent of the subgroups: the last sample group of the chain.
  PointGroup parent = hyps.front().group;
  for (const auto& h : hyps)
    if (h.from_chain) parent = h.group;
  {
    Identification id = identify(parent, GroupCatalogue::builtin());
    out.parent = readable_symbol(parent, id, sample_symbol(parent, id, res.frame), true);
  }
  if (data.has(ScanQuantity::intensity)) fit_shg(res, spec, data, hyps, out);
  else fit_transport(res, spec, data, hyps, out);
  // Fewer points than parameters: refused for the fitted models, said for each.
  rank_and_judge(out, parent);
  return out;
}

FitRun run_fits(const Scenario& sc) {
  if (sc.fits.empty())
    fail(ErrorKind::usage, "the scenario has no [[fit]] table and no scan was given", sc.source,
         "a [[fit]] table with data = \"scan.csv\" (docs/fit.md), or tensorsieve fit FILE --data scan.csv");
  FitRun run;
  // Every scan is read before anything is fitted: a file that does not parse stops the run.
  std::vector<ScanTable> tables;
  for (const auto& f : sc.fits) tables.push_back(read_scan_table(f.data));
  run.scenario = run_scenario(sc);
  for (std::size_t i = 0; i < sc.fits.size(); ++i) run.fits.push_back(fit_scan(run.scenario, sc.fits[i], tables[i]));
  return run;
}

} // namespace ts
