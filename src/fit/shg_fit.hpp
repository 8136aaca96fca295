// Fitting a rotational-anisotropy SHG scan: the intensity of each channel is
// I = |A|² with A = Σ_j χ_j g_j(φ) linear in the complex free parameters χ_j of
// every second-harmonic source the hypothesis allows (optics_geometry.hpp).
// With χ_j = a_j + i b_j and real channel functions g_j (no local-field
// factors), I = (Σ a_j g_j)² + (Σ b_j g_j)²: one common phase is unobservable
// (b of the first parameter is fixed at 0), and so are a common sign and the
// complex conjugate of every χ; the fit reports what else it cannot fix.
#pragma once

#include "fit/scan_fit.hpp"

namespace ts {

void fit_shg(const ScenarioResult& res, const FitSpec& spec, const ScanTable& data,
             const std::vector<Hypothesis>& hypotheses, FitResult& out);

} // namespace ts
