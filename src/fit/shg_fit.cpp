#include "fit/shg_fit.hpp"

#include "core/error.hpp"
#include "fit/compiled_expression.hpp"
#include "fit/fit_verdict.hpp"
#include "fit/levenberg_marquardt.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <random>
#include <set>

namespace ts {

namespace {

constexpr double kPi = 3.14159265358979323846;

const ShgResult& pick_setup(const ScenarioResult& res, const FitSpec& spec) {
  if (res.shg.empty())
    fail(spec.bad_value, "an optical scan needs the SHG setup it was measured with, and the scenario has none", spec.where,
         "an [[shg]] table in the scenario (docs/optics.md), or --shg reflection:45");
  if (spec.shg.empty()) return res.shg.front();
  for (std::size_t i = 0; i < res.shg.size(); ++i)
    if (res.shg[i].measurement.name == spec.shg || std::to_string(i + 1) == spec.shg) return res.shg[i];
  fail(spec.bad_value, "no SHG setup '" + spec.shg + "' in the scenario", spec.where, "an [[shg]] name or number");
}

// The real function g(φ - φ0) of one parameter in one channel at a fixed angle of incidence.
GiNaC::ex channel_function(const ThetaTrig& f, double theta, const GiNaC::symbol& phi, const GiNaC::ex& phi0) {
  GiNaC::ex out = 0;
  for (const auto& [mono, poly] : f.terms()) {
    const double m = std::pow(std::cos(theta), mono.cos_theta) * std::pow(std::sin(theta), mono.sin_theta);
    for (const auto& [k, c] : poly.terms()) {
      const GiNaC::ex arg = k[static_cast<int>(Angle::phi)] * (phi - phi0);
      out += m * (c.re.to_double() * GiNaC::cos(arg) - c.im.to_double() * GiNaC::sin(arg));
    }
  }
  return out;
}

struct Channel {
  OpticalChannel channel;
  std::vector<std::size_t> points;
};

struct Source {
  const PartForms* part;
  std::size_t index;
};

} // namespace

void fit_shg(const ScenarioResult& res, const FitSpec& spec, const ScanTable& data,
             const std::vector<Hypothesis>& hypotheses, FitResult& out) {
  const ShgResult& setup = pick_setup(res, spec);
  const OpticalMeasurement& m = setup.measurement;
  if (!m.incidence_deg)
    fail(spec.bad_value, "the SHG setup '" + m.name + "' leaves the angle of incidence free; a fit needs its value",
         m.where, "incidence = 45 (degrees) in the [[shg]] table");
  if (!m.azimuth_rotating)
    fail(spec.bad_value, "the SHG setup '" + m.name + "' keeps the sample azimuth fixed; the fit reads an azimuth scan",
         m.where, "azimuth = \"rotating\"");
  if (m.local_field.applied)
    fail(spec.bad_value, "the fit takes the bare amplitudes; the setup '" + m.name + "' applies local-field factors",
         m.where, "an [[shg]] setup without local_field and indices for the fit (the factors only scale the channels)");
  if (!data.has(ScanQuantity::phi) || !data.has(ScanQuantity::channel))
    fail(ErrorKind::bad_file, "an optical scan needs the sample azimuth and the channel of each point", data.path,
         "columns azimuth_deg (or phi_deg), channel and intensity");
  for (ScanQuantity q : {ScanQuantity::phi_b, ScanQuantity::theta_b, ScanQuantity::field, ScanQuantity::current})
    if (data.has(q))
      fail(ErrorKind::bad_file, "column '" + data.header_of(q) + "' has no place in an SHG azimuth scan", data.path,
           "azimuth_deg, channel, intensity and optionally sigma");
  const double theta = *m.incidence_deg * kPi / 180;

  std::vector<Channel> channels;
  for (std::size_t k = 0; k < data.points(); ++k) {
    const std::string& name = data.channels[k];
    auto it = std::find_if(channels.begin(), channels.end(), [&](const Channel& c) { return c.channel.name == name; });
    if (it == channels.end()) {
      const std::string where = data.path + ":" + std::to_string(data.lines[k]);
      OpticalChannel oc = parse_optical_channel(name, where);
      if (oc.in.rotating || oc.out.rotating)
        fail(ErrorKind::bad_file, "channel '" + name + "' turns a polariser; the fit reads azimuth scans", where,
             "channels with fixed polariser and analyser: PP, PS, SP, SS, 45-S ...");
      oc.name = name;
      channels.push_back({oc, {}});
      it = channels.end() - 1;
    }
    it->points.push_back(k);
  }
  const std::size_t N = data.points();
  const std::vector<double>& phi = data.column(ScanQuantity::phi);
  const std::vector<double>& y = data.column(ScanQuantity::intensity);
  std::vector<double> w(N, 1.0);
  if (out.uncertainties)
    for (std::size_t k = 0; k < N; ++k) w[k] = 1.0 / data.column(ScanQuantity::sigma)[k];
  std::vector<std::size_t> channel_of(N);
  for (std::size_t c = 0; c < channels.size(); ++c)
    for (std::size_t k : channels[c].points) channel_of[k] = c;

  out.kind = "SHG";
  out.measurement = "SHG setup '" + m.name + "' (" + optics_mode_name(m.mode) + ", incidence " +
                    std::to_string(*m.incidence_deg) + "°), sample azimuth scan, channels ";
  for (std::size_t c = 0; c < channels.size(); ++c) {
    out.measurement += (c ? ", " : "") + channels[c].channel.name;
    out.channels.push_back(channels[c].channel.name);
  }
  out.abscissa = "azimuth (deg)";
  for (double a : phi) out.angle_deg.push_back(a * 180 / kPi);
  out.value = y;
  out.channel = data.channels;
  if (out.uncertainties) out.sigma = data.column(ScanQuantity::sigma);
  for (int d = 0; d <= 360; d += 2) out.curve_deg.push_back(d);

  // The sources; a part that is a special case of another with the same roles and
  // time parity (the Kleinman-symmetric χ of the general χ) adds nothing.
  std::vector<Source> sources;
  for (const auto& s : setup.sources) {
    const PartForms& p = res.parts[s.part];
    bool special = false;
    for (const auto& o : setup.sources) {
      const PartForms& q = res.parts[o.part];
      if (o.part == s.part || q.catalogue_part->indices != p.catalogue_part->indices || q.spec.time_odd != p.spec.time_odd)
        continue;
      // In the last group of the chain the general part has at least as many parameters.
      const int cp = p.forms.back().independent(), cq = q.forms.back().independent();
      if (cq > cp || (cq == cp && o.part < s.part)) special = true;
    }
    if (!special) sources.push_back({&p, s.part});
  }

  struct Model {
    std::vector<std::string> names;              // parameter names
    std::vector<std::vector<ThetaTrig>> g;       // [parameter][channel]
    std::vector<std::vector<Harmonic>> harmonics; // per channel: harmonics of |A|²
    Eigen::MatrixXd values;                       // g at the data points (N × P), for merging
  };
  std::vector<std::pair<Model, std::size_t>> models; // model and index into out.hypotheses
  for (const auto& hyp : hypotheses) {
    Model md;
    md.harmonics.assign(channels.size(), {});
    std::vector<std::vector<ChannelAmplitude>> amps; // [source][channel]
    std::vector<AllowedForm> forms;
    for (const auto& s : sources) forms.push_back(allowed_form(s.part->spec, hyp.group, res.frame));
    std::set<std::string> seen;
    for (std::size_t si = 0; si < sources.size(); ++si) {
      std::vector<ChannelAmplitude> per;
      for (const auto& c : channels)
        per.push_back(shg_amplitude(*sources[si].part->catalogue_part, forms[si], channel_vectors(m, c.channel)));
      for (int j = 0; j < forms[si].independent(); ++j) {
        std::vector<ThetaTrig> gj;
        bool any = false;
        for (const auto& a : per) {
          gj.push_back(a.per_parameter[static_cast<std::size_t>(j)]);
          any = any || !gj.back().is_zero();
        }
        if (!any) continue;
        std::string name = forms[si].parameter_name(j);
        if (seen.count(name)) name += " (" + sources[si].part->part_label + ")";
        seen.insert(name);
        md.names.push_back(name);
        md.g.push_back(gj);
      }
      amps.push_back(std::move(per));
    }
    for (std::size_t c = 0; c < channels.size(); ++c) {
      std::set<Harmonic> hs;
      for (std::size_t a = 0; a < amps.size(); ++a)
        for (std::size_t b = 0; b < amps.size(); ++b)
          for (const auto& h : product_harmonics(amps[a][c], amps[b][c])) hs.insert(h);
      md.harmonics[c].assign(hs.begin(), hs.end());
    }
    const std::size_t P = md.names.size();
    md.values = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(N), static_cast<Eigen::Index>(P));
    for (std::size_t j = 0; j < P; ++j)
      for (std::size_t k = 0; k < N; ++k)
        md.values(static_cast<Eigen::Index>(k), static_cast<Eigen::Index>(j)) =
            theta_trig_value(md.g[j][channel_of[k]], theta, {phi[k], 0, 0, 0, 0, 0}, {}).real();
    // The same model: the amplitudes span the same functions on this scan.
    bool merged = false;
    for (auto& [other, index] : models) {
      auto rank = [](const Eigen::MatrixXd& A) {
        if (A.cols() == 0) return 0;
        Eigen::JacobiSVD<Eigen::MatrixXd> svd(A);
        int r = 0;
        for (Eigen::Index i = 0; i < svd.singularValues().size(); ++i)
          if (svd.singularValues()(i) > 1e-9 * svd.singularValues()(0)) ++r;
        return r;
      };
      Eigen::MatrixXd both(static_cast<Eigen::Index>(N), md.values.cols() + other.values.cols());
      both << md.values, other.values;
      const int r1 = rank(md.values), r2 = rank(other.values), r12 = rank(both);
      if (r1 == r2 && r12 == r1) {
        out.hypotheses[index].same_model.push_back(hyp.symbol);
        out.hypotheses[index].groups.push_back(hyp.group);
        merged = true;
        break;
      }
    }
    if (merged) continue;
    HypothesisFit h;
    h.hypothesis = hyp;
    h.groups.push_back(hyp.group);
    h.tensor_parameters = md.names;
    for (std::size_t c = 0; c < channels.size(); ++c) {
      std::string fs;
      for (const auto& hm : md.harmonics[c]) fs += (fs.empty() ? "" : ", ") + harmonic_text(hm);
      h.functions.push_back(channels[c].channel.name + ": " + (fs.empty() ? "dark" : fs));
    }
    // Aliasing: the intensity harmonics of each channel sampled at its azimuths.
    for (std::size_t c = 0; c < channels.size() && h.fitted; ++c) {
      const auto& hs = md.harmonics[c];
      const auto& pts = channels[c].points;
      if (hs.empty()) continue;
      Eigen::MatrixXd F(static_cast<Eigen::Index>(pts.size()), static_cast<Eigen::Index>(hs.size()));
      for (std::size_t i = 0; i < pts.size(); ++i)
        for (std::size_t t = 0; t < hs.size(); ++t) {
          FourierTerm ft;
          ft.k = hs[t].k;
          ft.sine = hs[t].sine;
          F(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(t)) = angle_function_double(ft, {phi[pts[i]], 0, 0, 0, 0, 0});
        }
      LinearSolution sol = solve_linear(F, Eigen::VectorXd::Zero(F.rows()));
      if (pts.size() < hs.size() || sol.rank < static_cast<int>(hs.size())) {
        std::string list;
        for (const auto& hm : hs) list += (list.empty() ? "" : ", ") + harmonic_text(hm);
        h.fitted = false;
        h.not_fitted = "channel " + channels[c].channel.name + ": its " + std::to_string(pts.size()) +
                       " azimuths cannot separate the intensity harmonics " + list +
                       " (harmonics above N/2 of N equally spaced angles alias); measure more azimuths instead of fitting";
      }
    }
    if (!h.fitted) {
      models.emplace_back(std::move(md), out.hypotheses.size());
      out.hypotheses.push_back(std::move(h));
      continue;
    }
    // The model, its exact derivatives (GiNaC) and their compiled forms.
    using namespace GiNaC;
    const symbol sphi("phi"), sphi0("phi0");
    std::vector<symbol> a, b;
    for (std::size_t j = 0; j < P; ++j) {
      a.emplace_back("a" + std::to_string(j));
      b.emplace_back("b" + std::to_string(j));
    }
    std::vector<symbol> vars{sphi};
    std::vector<symbol> fitted; // a_0..a_{P-1}, b_1..b_{P-1}, [phi0]
    for (std::size_t j = 0; j < P; ++j) fitted.push_back(a[j]);
    for (std::size_t j = 1; j < P; ++j) fitted.push_back(b[j]);
    const bool offset = spec.offset && P > 0;
    if (offset) fitted.push_back(sphi0);
    for (const auto& s : fitted) vars.push_back(s);
    std::vector<CompiledExpression> f_c;
    std::vector<std::vector<CompiledExpression>> d_c;
    for (std::size_t c = 0; c < channels.size(); ++c) {
      ex re = 0, im = 0;
      for (std::size_t j = 0; j < P; ++j) {
        const ex gj = channel_function(md.g[j][c], theta, sphi, offset ? ex(sphi0) : ex(0));
        re += a[j] * gj;
        if (j > 0) im += b[j] * gj;
      }
      const ex intensity = pow(re, 2) + pow(im, 2);
      f_c.emplace_back(intensity, vars);
      std::vector<CompiledExpression> d;
      for (const auto& s : fitted) d.emplace_back(intensity.diff(s), vars);
      d_c.push_back(std::move(d));
    }
    const std::size_t Q = fitted.size();
    auto evaluate = [&](const Eigen::VectorXd& q, Eigen::VectorXd& r, Eigen::MatrixXd& J) {
      r.resize(static_cast<Eigen::Index>(N));
      J.resize(static_cast<Eigen::Index>(N), static_cast<Eigen::Index>(Q));
      std::vector<double> v(1 + Q);
      for (std::size_t j = 0; j < Q; ++j) v[1 + j] = q(static_cast<Eigen::Index>(j));
      for (std::size_t k = 0; k < N; ++k) {
        v[0] = phi[k];
        const std::size_t c = channel_of[k];
        const auto row = static_cast<Eigen::Index>(k);
        r(row) = (y[k] - f_c[c].evaluate(v.data())) * w[k];
        for (std::size_t j = 0; j < Q; ++j) J(row, static_cast<Eigen::Index>(j)) = -d_c[c][j].evaluate(v.data()) * w[k];
      }
    };
    LmResult best;
    best.cost = INFINITY;
    if (Q == 0) {
      best.cost = 0;
      for (std::size_t k = 0; k < N; ++k) best.cost += y[k] * y[k] * w[k] * w[k];
      best.parameters = Eigen::VectorXd();
      best.jacobian = Eigen::MatrixXd(static_cast<Eigen::Index>(N), 0);
    } else {
      // Several starts: |A|² has sign and phase ambiguities and more than one minimum.
      double mean_y = 0, mean_g = 0;
      for (std::size_t k = 0; k < N; ++k) mean_y += std::fabs(y[k]) / N;
      for (Eigen::Index k = 0; k < md.values.rows(); ++k) mean_g += md.values.row(k).squaredNorm() / N;
      const double scale = mean_g > 0 ? std::sqrt(mean_y / mean_g) : 1.0;
      std::mt19937 rng(20261204u);
      std::normal_distribution<double> normal(0.0, 1.0);
      const int starts = 8;
      for (int s = 0; s < starts; ++s) {
        Eigen::VectorXd start(static_cast<Eigen::Index>(Q));
        for (std::size_t j = 0; j < Q; ++j) start(static_cast<Eigen::Index>(j)) = normal(rng) * scale;
        if (offset) start(static_cast<Eigen::Index>(Q - 1)) = 2 * kPi * s / starts;
        LmResult lm = levenberg_marquardt(evaluate, start);
        if (lm.cost < best.cost) best = lm;
      }
    }
    Eigen::MatrixXd JtJ = best.jacobian.transpose() * best.jacobian;
    int rank = 0;
    Eigen::MatrixXd cov = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(Q), static_cast<Eigen::Index>(Q));
    if (Q > 0) {
      Eigen::JacobiSVD<Eigen::MatrixXd> svd(JtJ, Eigen::ComputeFullU | Eigen::ComputeFullV);
      const auto& sv = svd.singularValues();
      for (Eigen::Index i = 0; i < sv.size(); ++i)
        if (sv(i) > 1e-12 * sv(0)) ++rank;
      Eigen::VectorXd inv = Eigen::VectorXd::Zero(sv.size());
      for (Eigen::Index i = 0; i < rank; ++i) inv(i) = 1.0 / sv(i);
      cov = svd.matrixV() * inv.asDiagonal() * svd.matrixU().transpose();
    }
    h.k = rank;
    h.chi2 = best.cost;
    const double dof = static_cast<double>(N) - rank;
    const double scale = out.uncertainties ? 1.0 : (dof > 0 ? best.cost / dof : 0.0);
    for (std::size_t j = 0; j < Q; ++j) {
      FitParameter fp;
      const std::string& s = fitted[j].get_name();
      if (s == "phi0") fp.name = "phi0 (deg)";
      else fp.name = (s[0] == 'a' ? "Re " : "Im ") + md.names[static_cast<std::size_t>(std::stoi(s.substr(1)))];
      const double conv = s == "phi0" ? 180 / kPi : 1.0;
      double v = best.parameters(static_cast<Eigen::Index>(j));
      if (s == "phi0") v = std::remainder(v, 2 * kPi);
      fp.value = v * conv;
      fp.error = std::sqrt(std::max(0.0, cov(static_cast<Eigen::Index>(j), static_cast<Eigen::Index>(j))) * scale) * conv;
      h.parameters.push_back(fp);
    }
    if (P > 0)
      h.degenerate.push_back("|A|² does not change under a common sign of every χ or under complex conjugation of every "
                             "χ (the sign of each imaginary part), so those are not measured");
    if (rank < static_cast<int>(Q))
      h.degenerate.push_back("the intensities fix only " + std::to_string(rank) + " of the " + std::to_string(Q) +
                             " real parameters (amplitudes that coincide in every channel, or a phase the channels do "
                             "not see); the errors of the others are not meaningful");
    if (offset)
      h.offset_note = "the stage offset φ0 is fitted; a symmetry of the model turns it into an equivalent value";
    // The model at the points and on the grid, per channel.
    std::vector<double> v(1 + Q);
    for (std::size_t j = 0; j < Q; ++j) v[1 + j] = best.parameters(static_cast<Eigen::Index>(j));
    h.model.assign(N, 0.0);
    for (std::size_t k = 0; k < N; ++k) {
      v[0] = phi[k];
      h.model[k] = Q ? f_c[channel_of[k]].evaluate(v.data()) : 0.0;
    }
    for (std::size_t c = 0; c < channels.size(); ++c) {
      std::vector<double> curve;
      for (double d : out.curve_deg) {
        v[0] = d * kPi / 180;
        curve.push_back(Q ? f_c[c].evaluate(v.data()) : 0.0);
      }
      h.curve.push_back(std::move(curve));
    }
    models.emplace_back(std::move(md), out.hypotheses.size());
    out.hypotheses.push_back(std::move(h));
  }
}

} // namespace ts
