// Fitting a measured scan against every symmetry hypothesis (docs/fit.md).
//
// Each hypothesis (hypotheses.hpp) gives the model of the measurement: for a
// transport scan the probe sum at the lock-in harmonic (probe_sum.hpp), linear
// in its coefficients; for an SHG scan the intensity |A|² of each channel,
// quadratic in the complex susceptibility. Linear models are fitted by
// weighted least squares through the singular value decomposition of the
// weighted design matrix (Eigen's JacobiSVD: its rank says when the scan cannot
// separate the model's functions); quadratic models and an unknown stage offset φ0 by
// Levenberg–Marquardt with derivatives built exactly by GiNaC (diff) and
// compiled once (compiled_expression.hpp), from several starting points.
//
// Fits are floating point by nature: they rank hypotheses whose models were
// derived exactly, and never decide whether a component is allowed.
#pragma once

#include "fit/hypotheses.hpp"
#include "fit/probe_sum.hpp"
#include "fit/scan_table.hpp"
#include "scenario/scenario_run.hpp"

#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace ts {

// A fitted quantity: the coefficient of one model function (transport), a
// real or imaginary part of a susceptibility (SHG), or the offset φ0.
struct FitParameter {
  std::string name;  // "cos(3*phi)", "Re chi_xxy", "phi0 (deg)"
  // What it measures, exactly: Σ factor·parameter (empty for φ0 and SHG parts).
  std::vector<std::pair<std::string, Surd>> meaning;
  double value = 0, error = 0; // error: one standard deviation
};

// An F-test of a hypothesis against a larger model that contains it (a subgroup's).
struct NestedTest {
  std::string against; // the larger hypothesis
  double f = 0;
  int d1 = 0, d2 = 0;
  double p = 1;        // P(F >= f) if the smaller model holds
};

struct HypothesisFit {
  Hypothesis hypothesis;
  std::vector<PointGroup> groups;      // the hypothesis' group and those of same_model (nested tests)
  std::vector<std::string> same_model; // further hypotheses whose model on this scan is the same
  std::vector<std::string> functions;  // the model's functions, for people ("cos(3*phi)")
  std::vector<std::string> tensor_parameters; // free parameters that enter
  bool fitted = true;
  std::string not_fitted; // why not (aliasing, too few points)
  std::vector<FitParameter> parameters;
  std::vector<std::string> degenerate; // what the scan cannot separate in this model
  std::string offset_note;             // how the offset was treated
  int k = 0, dof = 0;                  // fitted parameters (the model's rank), N - k
  double chi2 = 0;                     // Σ((y - f)/σ)² with uncertainties, else the residual sum of squares
  double chi2_per_dof = 0, rms = 0, aic = 0, bic = 0, weight = 0;
  std::optional<double> p_value;       // P(χ² >= chi2) with uncertainties
  std::optional<NestedTest> nested;
  bool rejected = false;
  std::string rejected_because;
  std::vector<double> model;           // the fitted model at each point
  // The fitted model on a fine grid of the scan's angle (figures): per channel for SHG.
  std::vector<std::vector<double>> curve;
  double rank_key = 0;                 // for sorting: the criterion used (AIC)
};

struct FitVerdict {
  std::string accepted;             // the highest-symmetry hypothesis not rejected; empty when all are
  std::string accepted_origin;
  std::vector<std::string> breaking;  // the symmetry breaking the data require, in words
  std::vector<std::string> undecided; // what the data cannot decide
};

struct FitResult {
  std::string name, data;            // the fit's name and its scan file as the user named it
  std::string kind;                  // "transport" or "SHG"
  std::string measurement;           // bar, probe, harmonic, reading, or the optical setup, in words
  std::string parent;                // the last sample group of the scenario
  std::size_t points = 0;
  bool uncertainties = false;
  bool offset = false;
  double alpha = 0.01;
  std::vector<HypothesisFit> hypotheses; // ranked: best (lowest AIC) first; unfitted last
  FitVerdict verdict;
  // The models every writer and figure shows, as indices into `hypotheses`: the
  // accepted hypothesis first, then the other fitted ones among the three best
  // ranked, in rank order. Chosen once, where the ranking is made (rank_and_judge).
  std::vector<std::size_t> shown_models;
  // The data for figures: the scan angle (degrees), the reading, its uncertainty
  // (empty without), the channel of each point (SHG) and the channels in order.
  std::string abscissa;
  std::vector<double> angle_deg, value, sigma;
  std::vector<std::string> channel, channels;
  std::vector<double> curve_deg; // the fine grid of HypothesisFit::curve
};

// One fit of a scenario's measurement against the scan in `data`.
FitResult fit_scan(const ScenarioResult& res, const FitSpec& spec, const ScanTable& data);

// Every [[fit]] of a scenario (reading each scan file), or `extra` when given.
struct FitRun {
  ScenarioResult scenario;
  std::vector<FitResult> fits;
};
FitRun run_fits(const Scenario& sc);

} // namespace ts
