// Running a scenario: the chain of groups from the bulk crystal through the
// cut and every lowering step, the sample frame, the allowed forms of each
// response part at each step, what each step switches on, and the domain
// variants of the lowering.
#pragma once

#include "device/measurement_plan.hpp"
#include "device/probe_sum.hpp"
#include "geometry/layout_design.hpp"
#include "geometry/optics_geometry.hpp"
#include "geometry/optics_kerr.hpp"
#include "geometry/optics_pump.hpp"
#include "geometry/sample_frame.hpp"
#include "group/identify.hpp"
#include "lowering/domains.hpp"
#include "scenario/scenario.hpp"
#include "tensor/allowed_form.hpp"

#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace ts {

struct ChainStep {
  std::string label;        // "bulk", "cut (110), interface", "moment ∥ [001]"
  std::string quantity;     // how the imposed quantity transforms, empty for the bulk
  PointGroup group;         // in the crystal frame
  Identification id;
  std::string sample_symbol; // HM symbol of a tabulated setting matching the sample frame, else empty
  std::string readable_symbol; // for people: the type, and for a non-standard setting its elements in words
  std::vector<std::string> lost; // operations the step removed (crystal-frame symbols)
};

// What a planar Hall bar can do with an allowed part.
enum class PlanarReading { not_a_bar_part, forbidden, readable, not_readable };
const char* planar_reading_text(PlanarReading r);

struct PartForms {
  std::string response_id, response_name, part_label;
  const ResponsePart* catalogue_part = nullptr; // null for an extra tensor
  // A part generated for an expansion order the scenario asked for is owned here
  // (catalogue_part points into it), so copies of the result stay valid.
  std::shared_ptr<const ResponsePart> generated_part;
  TensorSpec spec;
  std::optional<TensorSpec> excluded; // a piece the response does not see (counts subtract it)
  std::vector<AllowedForm> forms;     // one per chain step, in the sample frame
  std::vector<int> counts;            // independent components the response sees, per step
  // An expansion in B (or M) is evaluated without the steps that apply that
  // field (or moment): the field enters through its powers, not twice.
  std::vector<bool> field_step_skipped; // per step: this step's field was not applied to this part
  std::vector<PlanarReading> planar;    // per step, for a general planar bar (current and field free)
  TimeOddSources sources;               // what made a c-type form allowed at the last step
  // The group the final form was solved in when field steps were left out (its
  // title names this group, not the chain's last); empty when it is the chain's last.
  std::optional<ChainStep> evaluated_in;
  // Allowed in the last group, forbidden once the magnetic-field steps are left out
  // (moment, magnetic order and a magnetic parent kept): the applied field induces
  // it, no magnetic order of the scenario makes it spontaneous.
  bool induced_by_field = false;
  // induced_by_field for a first-harmonic, time-odd Hall part: the ordinary or
  // in-plane Hall effect of the applied field, not a spontaneous one.
  bool field_induced_hall = false;
  // Per step, what every format prints: "allowed" or "forbidden", or for a bar
  // part how a general planar bar reads it (planar_reading_text).
  std::vector<std::string> verdicts;
  // The last step that switched the part on (zero components before, some after).
  std::optional<std::size_t> switched_on_at;
};

// The signals of one bar: one entry per bar part of the requested responses.
// With domains asked for: the bar's reading of the part averaged over the domain
// variants (the domain section's average, contracted like the single domain), at
// zero field and, for each applied field step, the part linear in that field.
struct DomainAveragedSignal {
  std::string field_label; // empty: at zero field; else the applied field (per unit field)
  AllowedForm names;       // the form whose parameters the signal is written in
  PartSignal signal;
};

struct BarPartSignal {
  std::size_t part = 0; // index into parts
  PartSignal signal;
  std::vector<DomainAveragedSignal> domain_averaged;
};

// A requested part that no probe reads, and why (a spin polarisation, a tensor without roles).
struct BarUnreadPart {
  std::size_t part = 0; // index into parts
  std::string reason;
};

// The Fourier terms that tell the parts a bar reads apart: for one current order
// and probe that two parts or more read, every angle function the probe shows
// and the parts that show it; a function shown by one part alone separates it.
struct BarSeparationRow {
  Frequency k{};
  bool sine = false;
  std::string field_role;         // "M" when the field angles are those of the magnetisation
  std::vector<std::size_t> parts; // indices into parts, in the order of the bar's signals
};
struct BarSeparation {
  int current_order = 0;
  Probe probe = Probe::longitudinal;
  std::vector<BarSeparationRow> rows; // by frequency, cosine before sine
};

struct BarResult {
  BarMeasurement measurement;
  std::vector<BarPartSignal> signals;
  ProbeSum sum; // every mechanism together, per probe and harmonic, with the Joule background
  std::vector<BarUnreadPart> unread;
  std::vector<BarSeparation> separations; // by current order, longitudinal first
};

struct LayoutResult {
  LayoutSpec spec;
  MeasurementPlan plan;           // every mechanism the probes read at the harmonic, together
  std::vector<std::size_t> parts; // index into parts, one per design
  std::vector<LayoutDesign> designs; // each part of spec.response on its own
};

// A relation C = factor·anchor of the previous step that a lowering broke.
struct BrokenRelation {
  std::string component, anchor;
  Surd factor;
};

struct StepChange {
  std::size_t step = 0;            // chain index (>= 1)
  std::size_t part = 0;            // index into parts
  int before = 0, after = 0;       // independent components
  std::vector<std::string> switched_on;    // components zero before, nonzero after
  std::vector<BrokenRelation> broken;      // relations of the previous step that no longer hold
};

// Orientation domains of the spontaneous steps (distortions, polar and magnetic
// order, tilts) after the cut. Applied fields and currents form no domains:
// every variant sees them in the lab frame (the terms linear in each field).
struct DomainReport {
  std::size_t part = 0;
  std::size_t from_step = 0;  // chain step whose group the domains break (the cut, or the bulk)
  PointGroup domain_group;    // the group of variant 1: the spontaneous steps only
  std::string domain_symbol;  // the standard symbol of domain_group's type, for the writers
  AllowedForm form;           // the part's form in domain_group, sample frame
  DomainAnalysis analysis;    // analysis.average is weighted by `fractions` when they are given
  std::vector<Rational> fractions;        // volume fractions of the variants; empty: equal
  std::vector<FieldLinearTerm> in_field;  // one per applied field step, in the order of the steps
};

// What one SHG source part radiates into each channel of a setup.
// What a source radiates into one channel, in the form every writer prints: the
// amplitude as Fourier terms in the turning angle, and the harmonics of the
// amplitude and of the intensity |A|² (exact: from the terms, not from samples).
struct ShgChannelSignal {
  std::vector<OpticalTerm> terms;
  std::vector<Harmonic> amplitude_harmonics, intensity_harmonics;
};

struct ShgSource {
  std::size_t part = 0;                   // index into parts
  std::vector<ChannelAmplitude> channels; // one per channel of the measurement
  std::vector<ShgChannelSignal> signals;  // one per channel, derived from `channels`
};

// An i-type and a c-type source that both radiate into a channel interfere:
// I± = |A_i|² + |A_c|² ± 2 Re(A_i A_c*) for the two 180° domains (the c-type
// amplitude follows the time-odd order parameter, the i-type one does not).
struct ShgInterference {
  std::size_t i_source = 0, c_source = 0;       // indices into ShgResult::sources
  std::vector<std::vector<Harmonic>> cross;    // per channel: harmonics of the cross term (empty: none)
};

struct ShgResult {
  OpticalMeasurement measurement;
  std::vector<ShgSource> sources;
  std::vector<ShgInterference> interference;
  std::vector<std::string> dark_channels; // channels no source radiates into, for every parameter value
};

struct KerrResult {
  std::string name, where;
  std::string magnetisation_label;
  std::optional<std::size_t> g_part, q_part; // indices into parts
  std::vector<KerrReading> kerr;             // when g_part is set
  std::vector<VoigtReading> voigt;           // when q_part is set
  // The moment (an axial time-odd vector) allowed in the final group, sample frame,
  // and whether the question's fixed magnetisation direction lies outside it.
  std::optional<AllowedForm> moment_form;
  bool magnetisation_outside_group = false;
  // Some Kerr geometry is allowed: the group admits a gyration vector.
  bool gyration_allowed() const {
    for (const auto& k : kerr)
      if (k.allowed()) return true;
    return false;
  }
};

// A vector response (effective field, current) per sample axis.
using VectorTerms = std::array<std::vector<FourierTerm>, 3>;

// One pump polarisation in one phase: the effective field of each pump part,
// its torque l0 × H along the two deviation axes, and whether some part
// exerts a torque along each.
struct PumpDrive {
  std::string polarisation;
  std::vector<VectorTerms> field;                               // per pump part
  std::vector<std::array<std::vector<FourierTerm>, 2>> torque;  // per pump part, per deviation axis
  std::array<bool, 2> drives{};
};

// A magneto-optic probe of the precession: whether it reads, to first order,
// a turn of the order vector along each deviation axis (static reading) or the
// dynamic moment l0 × δl that accompanies it, and whether it sees the
// precession each pump polarisation starts.
struct ProbeView {
  std::string probe, reads;
  std::array<bool, 2> order{}, moment{};
  std::vector<bool> sees; // per polarisation
};

struct PumpPhase {
  std::string label, where;
  std::string group;          // the phase's magnetic group, for people
  std::string order_label;    // "[100] = +x"
  int order_axis = 2, order_sign = 1; // sample axis of the order vector
  std::array<int, 2> deviation_axes{};
  std::vector<std::string> part_titles; // per pump part: "inverse-faraday: inverse Faraday effect, i-type"
  std::vector<bool> helicity_odd;       // per pump part: driven by the light's spin (reverses with helicity)
  std::vector<AllowedForm> forms;       // per pump part, in the phase group (sample frame)
  AllowedForm k_order, k_moment;        // how the gyration vector follows δl (twisted law) and a moment
  std::vector<PumpDrive> drives;        // per polarisation
  std::vector<ProbeView> probes;
};

struct PumpProbeResult {
  PumpSetup setup;
  std::vector<PumpPhase> phases;
};

// The in-plane current of one polarisation: per photocurrent part, and which
// electrode pair (along sample x, along sample y) reads the whole current and
// its helicity-odd part.
struct PhotocurrentRow {
  std::string polarisation;
  std::vector<VectorTerms> current; // per part
  std::array<bool, 2> pair_reads{}, odd_pair_reads{};
};

struct PhotocurrentResult {
  PumpSetup setup;
  std::vector<std::size_t> parts;  // into ScenarioResult::parts (final group)
  std::vector<bool> helicity_odd;  // per part
  std::vector<PhotocurrentRow> rows;
};

struct ScenarioResult {
  Scenario scenario;
  std::string parent_note;   // e.g. "m-3m taken as non-magnetic: m-3m1'"
  std::optional<StructureSymmetry> structure_symmetry; // what the search found, when the parent is a structure
  Frame frame;
  SampleFrame sample;
  std::string system;           // crystal system of the parent
  LatticeMetric metric;         // as given, or from the structure's cell
  std::array<std::string, 3> frame_labels;
  std::vector<ChainStep> chain;
  std::vector<PartForms> parts;
  // Mechanisms a bar reads whether asked for or not (the Joule-heating background),
  // evaluated like parts when the scenario has bars or layouts and did not list them.
  std::vector<PartForms> background;
  std::vector<StepChange> changes;
  std::vector<DomainReport> domains;
  std::vector<BarResult> bars;
  std::vector<LayoutResult> layouts;
  std::vector<ShgResult> shg;
  std::vector<KerrResult> kerr;
  std::vector<PumpProbeResult> pump_probe;
  std::vector<PhotocurrentResult> photocurrents;
};

ScenarioResult run_scenario(const Scenario& scenario);

// The mechanisms a bar's probes sum: the scenario's bar parts (those of the
// responses in `only`, when given) and the background parts, each with its form
// at the last step. The result must outlive the inputs' pointers.
std::vector<SumInput> probe_sum_inputs(const ScenarioResult& res, const std::vector<std::string>& only);

// HM symbol of a tabulated setting whose axes are the sample frame's, else empty.
std::string sample_symbol(const PointGroup& g, const Identification& id, const Frame& frame);
// What a person reads for a group: its sample-frame symbol (4mm1', mm'2'), or the
// type when no setting is tabulated in the sample frame; for a setting written with
// 1 positions (m11, m111', 112/m) the type with its elements in words,
// "m1' (mirror ⊥ [100])". With `with_words`, the elements in words always follow
// (a list of subgroups that differ only in orientation).
std::string readable_symbol(const PointGroup& g, const Identification& id, const std::string& sample_symbol,
                            bool with_words = false);

} // namespace ts
