// The report of `tensorsieve observe`: the sample's group, and for each observed
// signal whether that group allows it or which minimal symmetry breakings do,
// with what would produce each and what equal domains do to it.
#pragma once

#include "report/report_format.hpp"
#include "scenario/observation_run.hpp"

#include <string>

namespace ts {

std::string write_observations(const ObservationRun& run, Format format);

} // namespace ts
