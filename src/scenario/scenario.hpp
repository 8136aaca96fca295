// A scenario: the sample in the cryostat described as data. The parent crystal
// (a point group, or a structure for spglib), its lattice parameters, the cut
// and sample frame, the lowering steps (distortions, order parameters, applied
// fields), and the responses of interest. Scenario files (TOML, schema in
// docs/scenarios.md) and the one-off CLI options both produce this value, so
// there is one path through the program.
#pragma once

#include "core/error.hpp"
#include "geometry/lattice_metric.hpp"
#include "geometry/local_field.hpp"
#include "lowering/structure_symmetry.hpp"

#include <map>

#include <optional>
#include <string>
#include <vector>

namespace ts {

enum class LoweringKind {
  strain, shear, polar, electric_field, moment, magnetic_field, current, magnetic_group, subgroup, tilts
};

struct LoweringStep {
  LoweringKind kind = LoweringKind::strain;
  std::string along;  // direction [uvw] (vectors, strain), first direction of a shear
  std::string second; // second direction of a shear
  std::string value;  // group symbol (magnetic_group, subgroup) or Glazer symbol (tilts)
  std::string label;  // optional words for the report
  std::string where;  // file:line or option, for messages
  ErrorKind bad_value = ErrorKind::bad_file; // exit kind of a bad value: usage for an option, bad_file in a file
};

// A Hall bar of the scenario (docs/hall-bars.md): its current direction,
// field geometry and drive, turned into a BarMeasurement once the sample frame
// is known.
struct BarSpec {
  std::string name;
  std::string current = "rotating";  // "rotating", "[uvw]" in plane, or degrees from sample x (multiple of 15)
  std::string field = "any";         // none, in-plane, normal, any, along-current, across-current, [uvw], in-plane:ANGLE
  std::string waveform = "sine";     // sine or cosine
  std::optional<double> current_rms, length, width, thickness; // A, m
  std::vector<std::string> responses; // catalogue ids; empty: every response of the scenario
  std::string where;
  ErrorKind bad_value = ErrorKind::bad_file; // usage for an option, bad_file in a file
};

// Which bars to pattern for one response at one harmonic (layout_design.hpp).
struct LayoutSpec {
  std::string response;
  int harmonic = 1;
  std::vector<std::string> directions; // in-plane crystal directions; empty with no rosette: low-index ones
  std::vector<int> rosette;            // bar angles from sample x in degrees (multiples of 15)
  std::vector<std::string> fields;     // field geometries per bar; empty: along, across, normal for field parts
  std::string where;
  ErrorKind bad_value = ErrorKind::bad_file; // usage for an option, bad_file in a file
};

// An observed signal for the inverse question (`tensorsieve observe`): the
// components seen nonzero of a catalogue response part or of a tensor spec.
struct ObservationRequest {
  std::string label;
  std::string response;                // catalogue id, or empty
  std::string part;                    // 1-based part number of the response; empty: the part named like the components
  std::string tensor;                  // tensor spec, or empty
  std::vector<std::string> components; // sample-frame names such as chi_xxx
  std::string parity = "either";       // i, c or either
  std::string match = "any";           // any: at least one component nonzero; all: each of them
  std::string signal;                  // a bar signal instead of components: "transverse:cos(phi)", "longitudinal@30"
  std::string bar = "rotating:any";    // the bar of a signal observation, CURRENT[:FIELD] as for --bar
  std::string where;                   // file:line or option, for messages
};

// A second-harmonic polarimetry setup (docs/optics.md): geometry, angle of
// incidence, sample azimuth and the polariser-analyser channels, turned into
// an OpticalMeasurement by run_scenario.
struct ShgSpec {
  std::string name;
  std::string geometry = "reflection";  // reflection or transmission
  std::string incidence = "any";        // "any" (θ a variable) or degrees from the normal, multiple of 15, 0-75
  std::string azimuth = "rotating";     // "rotating" or a fixed sample azimuth in degrees (multiple of 15)
  std::vector<std::string> channels;    // empty: PP, PS, SP, SS
  std::vector<std::string> responses;   // catalogue ids; empty: every SHG response of the scenario
  bool local_field = false;             // Fresnel / local-field factors as symbols (docs/optics.md)
  std::optional<RefractiveIndices> indices; // their numbers; given indices turn the factors on
  std::string where;
  ErrorKind bad_value = ErrorKind::bad_file; // usage for an option, bad_file in a file
};

// A magneto-optic question (docs/optics.md): the Kerr geometries the final
// group allows, and the quadratic terms of a magnetisation direction.
struct KerrSpec {
  std::string name;
  std::string magnetisation = "in-plane"; // in-plane, normal, any, [uvw], in-plane:ANGLE
  std::string where;
  ErrorKind bad_value = ErrorKind::bad_file; // usage for an option, bad_file in a file
};

// A magnetic phase of a pump-probe question (docs/optics.md): lowering steps
// applied to the last group of the chain (a spin reorientation is two sibling
// phases of the same paramagnetic group), and the order vector the pump turns.
struct PumpPhaseSpec {
  std::string label;
  std::vector<LoweringStep> steps; // empty: the last group of the chain itself
  std::string order;               // crystal direction [uvw]; empty: the last moment step's direction
  std::string where;
};

// A pump beam (docs/optics.md): angle of incidence, sample azimuth and the
// polarisations asked about.
struct PumpBeamSpec {
  std::string name;
  std::string incidence = "0";            // degrees from the normal, multiple of 15, 0-75
  std::string azimuth = "rotating";       // or a fixed sample azimuth (multiple of 15)
  std::vector<std::string> polarisations; // empty: circular+, circular-, linear, elliptical
  std::string where;
  ErrorKind bad_value = ErrorKind::bad_file; // usage for an option, bad_file in a file
};

// A pump beam on magnetic phases: the torque it exerts and which Kerr or
// Faraday probe reads the precession, per phase.
struct PumpProbeSpec : PumpBeamSpec {
  std::vector<PumpPhaseSpec> phases; // empty: the chain's last group
};

// Photocurrents of a film under a pump beam: the in-plane current per
// polarisation and the electrode pair that reads it. Most in-plane currents
// need oblique incidence, hence the default.
struct PhotocurrentSpec : PumpBeamSpec {
  PhotocurrentSpec() { incidence = "45"; }
};

// Figures of the scenario (docs/figures.md): illustrative parameter values,
// the illustrative angle of incidence for setups whose θ is a variable, and
// where and in which formats to write them ([figures] table, --figures).
struct FigureSpec {
  bool present = false;
  std::map<std::string, double> values;
  std::optional<int> incidence;
  std::vector<std::string> formats; // svg, pdf, png; empty: svg and pdf
  std::string directory;            // empty: no files (the JSON and HTML reports still carry the figures)
  std::string where;
};

// A measured scan to compare with every symmetry hypothesis (docs/fit.md): the
// data file and which measurement of the scenario it is.
struct FitSpec {
  std::string name;
  std::string data;                // scan file; in a scenario file, relative to the scenario
  std::string data_as_written;     // the scan file as the scenario or --data names it: what reports print
  std::string bar;                 // [[bar]] name or 1-based number (transport); empty: the first bar
  std::string shg;                 // [[shg]] name or 1-based number (optical scans); empty: the first setup
  std::string probe = "transverse"; // longitudinal or transverse
  int harmonic = 1;                // lock-in harmonic of the drive (0: DC)
  std::string reading = "auto";    // x, y or auto (the reading the bar's parts give at that harmonic)
  int floor = 1;                   // smallest group order among the hypotheses
  bool offset = false;             // fit an unknown offset between the stage angle and sample x
  double alpha = 0.01;             // significance level of the rejections
  std::string where;
  ErrorKind bad_value = ErrorKind::bad_file; // usage for an option, bad_file in a file
};

struct Scenario {
  std::string title;
  std::string source = "command line";
  std::string group;                 // parent point group symbol (empty when a structure is given)
  bool assume_nonmagnetic = true;    // add 1' to a parent symbol without primes or 1'
  std::optional<CrystalStructure> structure;
  // The symmetry search's answer for `structure`, when the caller already has
  // it (screening asks for it first, to look its group up in a cache); else
  // run_scenario searches.
  std::optional<StructureSymmetry> structure_symmetry;
  LatticeMetric metric;
  std::string cut;                   // "(110)", "[111]", "(11-20)"; empty: bulk
  bool equivalent_faces = false;     // a free-standing slab with identical faces keeps operations that flip n
  std::string x, z;                  // sample x (in plane); z only without a cut
  std::vector<LoweringStep> steps;
  // Every step repeats each form for each response (and its domains), so the
  // work and the report grow with steps x responses; run_scenario refuses a
  // longer chain than this. The command line lifts it (--max-steps).
  std::size_t max_steps = 64;
  std::vector<std::string> responses; // catalogue ids
  std::vector<std::string> tensors;   // extra tensor specs
  bool domains = false;
  std::vector<BarSpec> bars;
  std::vector<LayoutSpec> layouts;
  // Orders of expansion in B or M asked for, by response id (`[expansion]` table,
  // `--order RESPONSE=N`); responses not named keep their catalogue order.
  std::map<std::string, int> expansion_orders;
  std::string expansion_where;
  ErrorKind expansion_bad_value = ErrorKind::bad_file;
  std::vector<Rational> domain_fractions; // volume fractions of the variants; empty: equal
  std::string fractions_where;            // file:line or option of the fractions
  std::vector<ObservationRequest> observations; // [[observation]] tables
  std::vector<ShgSpec> shg;                      // [[shg]] tables
  std::vector<KerrSpec> kerr;                    // [[kerr]] tables
  std::vector<PumpProbeSpec> pump_probe;         // [[pump_probe]] tables
  std::vector<PhotocurrentSpec> photocurrents;   // [[photocurrent]] tables
  FigureSpec figures;                            // [figures] table
  std::vector<FitSpec> fits;                     // [[fit]] tables
};

Scenario load_scenario(const std::string& path); // throws Error(bad_file / ...) with file:line:column
// From a TOML table already in memory: scenario/scenario_table.hpp.
// The same from the text of a file; `path` names it in messages.
Scenario parse_scenario(const std::string& text, const std::string& path);
LoweringKind parse_lowering_kind(const std::string& text, const std::string& where, ErrorKind bad_value);
const char* lowering_kind_name(LoweringKind k);
// "strain:[001]", "field:[1-10]", "shear:[100],[010]", "magnetic-group:4'/m'm'm", "tilts:a0a0c-"
LoweringStep parse_lowering_option(const std::string& text, const std::string& where,
                                   ErrorKind bad_value = ErrorKind::usage);
// "--bar [100]:in-plane" -> current "[100]", field "in-plane" (the field part is optional).
BarSpec parse_bar_option(const std::string& text, const std::string& where);
// "--layout second-order-conductivity:2" -> response and harmonic.
LayoutSpec parse_layout_option(const std::string& text, const std::string& where);
// "--shg reflection:45:rotating" -> geometry, incidence (default any), azimuth (default rotating).
ShgSpec parse_shg_option(const std::string& text, const std::string& where);
// "--shg-indices 1,2.2+0.01i,2.3+0.05i" -> the ambient, n(ω) and n(2ω); with two
// values the ambient is 1.
RefractiveIndices parse_indices_option(const std::string& text, const std::string& where);
// "0.25", "1/4" or "1"; a fraction between 0 and 1, exactly. Throws Error(usage) naming `where`.
Rational parse_fraction(const std::string& text, const std::string& where, ErrorKind bad_value);

} // namespace ts
