// What a lock-in on one probe pair of a Hall bar really reads: the sum of every
// mechanism that contributes at that harmonic (docs/hall-bars.md, "What a probe
// reads"). Each term keeps its label: the mechanism, its order in the current,
// how it changes when the applied field or the magnetisation is reversed, its
// time character and the lock-in quadrature it lands in. For each pair of
// mechanisms that meet in one reading, the first handle that tells them apart,
// or "indistinguishable by symmetry" with the handle of the trade that remains.
//
// Parities: a term with p_B field and p_M magnetisation indices goes as
// (-1)^p_B and (-1)^p_M; a c-type coefficient is odd in whatever time-odd
// quantity made it allowed: the applied field of a lowering step, the
// magnetisation (a moment step, a magnetic order, a magnetic parent), or, with
// both present, only in the two reversed together.
#pragma once

#include "geometry/bar_signal.hpp"

#include <optional>
#include <string>
#include <vector>

namespace ts {

enum class Parity { even, odd, only_together };
const char* parity_text(Parity p); // "even", "odd", "odd with B and M together"

// The time-odd quantities that a part's allowed form was derived with.
struct TimeOddSources {
  bool field = false;          // a magnetic-field lowering step
  bool magnetisation = false;  // a moment or magnetic-order step, or a magnetic parent
};

// One mechanism offered to the sum: a bar part and its form in the sample frame.
struct SumInput {
  std::size_t part = 0;        // index in the caller's list of parts (or of background parts)
  bool background = false;     // added by the tool, not asked for (the Joule background)
  std::string response_id, response_name;
  const ResponsePart* catalogue_part = nullptr;
  const AllowedForm* form = nullptr;
  TimeOddSources sources;
};

enum class Quadrature { x, y, both };
const char* quadrature_text(Quadrature q); // "X", "Y", "X and Y"

struct SumMechanism {
  std::size_t part = 0;
  bool background = false;
  std::string response_id, label;  // label: "second-order-conductivity: Hall part, c-type, ..."
  std::string mechanism;           // the catalogue's words on what causes it
  int current_order = 0;           // n: V ∝ I^n
  int field_order = 0, magnetisation_order = 0;
  bool c_type = false;
  bool onsager_form = false;       // an Onsager-Kleiner form holding both characters: parity from its orders
  bool thermal = false;            // through the Joule-heating gradient
  bool field_driven = false;       // written for a driving field: read through -rho0^(n+1)
  Parity field_parity = Parity::even, magnetisation_parity = Parity::even;
  PartSignal signal;
};

struct SumTerm {
  std::size_t mechanism = 0;       // index into ProbeSum::mechanisms
  Quadrature quadrature = Quadrature::x;
  Surd x, y;                       // lock-in factors per R_n I_rms^n (DC: x)
  Surd dc;                         // the DC factor too, when the reading also stands for DC
  std::vector<FourierTerm> terms;  // the probe's signal S, in the part's own convention
};

// What separates two mechanisms that meet in one reading.
enum class Handle {
  field_reversal,
  magnetisation_reversal,
  bar_angle,
  field_angle,
  other_probe,     // the reading of the other probe pair tells them apart (the Hall test)
  current_scaling,
  none, // indistinguishable by symmetry
};
const char* handle_text(Handle h);

struct Separation {
  std::size_t a = 0, b = 0;        // mechanisms
  Handle handle = Handle::none;
  std::string detail;              // "odd vs even in B", "cos(3phi) only in b", ...
  bool same_parities = false, same_angle_functions = false;
  bool angles_overlap_partly = false; // some angle functions tell them apart, not all
  std::string other_handle;        // for Handle::none: what tells them apart beyond symmetry, with sources
};

struct ProbeReading {
  Probe probe = Probe::longitudinal;
  int harmonic = 0;                // 0: DC
  bool with_dc = false;            // the same terms also give a DC voltage (even powers of I): one reading for both
  std::vector<SumTerm> terms;
  std::vector<Separation> separations;
};

struct ProbeSum {
  std::vector<SumMechanism> mechanisms;
  std::vector<ProbeReading> readings;  // only readings with a term, by harmonic then probe
  std::vector<std::string> silent;     // labels of parts that no probe of this bar reads, with why
  bool magnetisation_follows_field = false; // both B and M parts read the one direction of the bar
  // Some mechanism is an expansion in the magnetisation: the bar's direction angles are
  // then the magnetisation's (φ_M, θ_M; the field only saturates it).
  bool angles_of_magnetisation() const {
    for (const auto& m : mechanisms)
      if (m.magnetisation_order > 0) return true;
    return false;
  }
};

// The Fourier content of a signal as exact vectors over the basis functions
// (frequency, cos/sin), one vector per parameter; used by the separation test
// and the measurement plan.
struct FunctionSpace {
  std::vector<std::pair<Frequency, bool>> basis;
  std::vector<std::vector<Surd>> vectors; // one per parameter that appears
};
FunctionSpace function_space(const std::vector<FourierTerm>& terms);

ProbeSum probe_sum(const std::vector<SumInput>& inputs, const BarMeasurement& bar);

// The parities of a part's terms from its indices, its time character and the
// sources its form was derived with.
void set_parities(SumMechanism& m, const TimeOddSources& sources);

} // namespace ts
