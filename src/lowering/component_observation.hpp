// Observations given as tensor components: "chi_xxx is nonzero" in the sample
// frame, for the time-even (i-type) version of a tensor, the time-odd (c-type)
// version, or either. Turned into the predicate of the inverse search.
#pragma once

#include "lowering/inverse_search.hpp"
#include "tensor/allowed_form.hpp"

#include <string>
#include <vector>

namespace ts {

enum class TimeParity { i_type, c_type, either };

TimeParity parse_time_parity(const std::string& text, const std::string& where); // "i", "c", "either"
const char* time_parity_name(TimeParity p); // "i-type", "c-type", "i-type or c-type"

struct ComponentObservation {
  TensorSpec spec;                 // the tensor as given; its time parity is set by `parity`
  std::vector<std::string> names;  // as observed: chi_xxx (sample-frame components)
  std::vector<int> codes;          // full multi-index codes of the same components
  TimeParity parity = TimeParity::either;
  bool all = false;                // every listed component nonzero; false: at least one (e.g. P in any direction)
  Frame frame;                     // the sample frame of the components
};

// The time-even and/or time-odd versions of a spec that the parity asks for, i-type first.
std::vector<TensorSpec> parity_versions(const TensorSpec& spec, TimeParity parity);

// Names such as "chi_xxx" or "xxx" (letters x, y, z; the prefix, when given,
// must be the tensor's name). Throws Error(bad_spec) naming `where` and the
// valid forms.
std::vector<int> component_codes(const TensorSpec& spec, const std::vector<std::string>& names,
                                 const std::string& where);

// True when some (all = false) or every (all = true) observed component is
// nonzero in the allowed form of `version` in g.
bool shows_components(const TensorSpec& version, const std::vector<int>& codes, const PointGroup& g,
                      const Frame& frame, bool all = false);

// The predicate (allowed in some version) and the equal-domain average check.
Observation observation_of(const ComponentObservation& c);

} // namespace ts
