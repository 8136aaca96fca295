// A scenario: the sample in the cryostat described as data. The parent crystal
// (a point group, or a structure for spglib), its lattice parameters, the cut
// and sample frame, the lowering steps (distortions, order parameters, applied
// fields), and the responses of interest. Scenario files (TOML, schema in
// docs/scenarios.md) and the one-off CLI options both produce this value, so
// there is one path through the program.
#pragma once

#include "lowering/cut.hpp"
#include "core/error.hpp"
#include "lowering/structure_symmetry.hpp"

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

struct Scenario {
  std::string title;
  std::string source = "command line";
  std::string group;                 // parent point group symbol (empty when a structure is given)
  bool assume_nonmagnetic = true;    // add 1' to a parent symbol without primes or 1'
  std::optional<CrystalStructure> structure;
  LatticeMetric metric;
  std::string cut;                   // "(110)", "[111]", "(11-20)"; empty: bulk
  bool equivalent_faces = false;     // a free-standing slab with identical faces keeps operations that flip n
  std::string x, z;                  // sample x (in plane); z only without a cut
  std::vector<LoweringStep> steps;
  std::vector<std::string> responses; // catalogue ids
  std::vector<std::string> tensors;   // extra tensor specs
  bool domains = false;
};

Scenario load_scenario(const std::string& path); // throws Error(bad_file / ...) with file:line:column
// The same from the text of a file; `path` names it in messages.
Scenario parse_scenario(const std::string& text, const std::string& path);
LoweringKind parse_lowering_kind(const std::string& text, const std::string& where, ErrorKind bad_value);
const char* lowering_kind_name(LoweringKind k);
// "strain:[001]", "field:[1-10]", "shear:[100],[010]", "magnetic-group:4'/m'm'm", "tilts:a0a0c-"
LoweringStep parse_lowering_option(const std::string& text, const std::string& where);

} // namespace ts
