// tensorsieve observe GROUP --cut ... --component chi_xxx --response ID | --scenario FILE.toml
#include "cli/commands.hpp"
#include "cli/sample_options.hpp"
#include "core/error.hpp"
#include "report/observation_report.hpp"

#include <memory>

namespace ts::cli {

void setup_observe(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    SampleOptions sample;
    ObservationRequest seen;
    std::string file;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("observe", "what an observed signal proves: the least symmetry breaking that allows it");
  add_sample_options(*cmd, o->sample, false);
  cmd->add_option("--scenario", o->file, "scenario TOML file with [[observation]] tables (docs/scenarios.md)");
  cmd->add_option("--response", o->seen.response, "response id from `tensorsieve responses`");
  cmd->add_option("--part", o->seen.part, "part number of the response (default: the part the components name)");
  cmd->add_option("--tensor", o->seen.tensor, "tensor spec, e.g. \"chi_abc: sym(abc)\"");
  cmd->add_option("--component", o->seen.components, "component seen nonzero, sample frame, e.g. chi_xxx (repeatable)");
  cmd->add_option("--type", o->seen.parity, "i (time-even), c (time-odd) or either (default)");
  cmd->add_option("--match", o->seen.match, "any (default: at least one component nonzero) or all (each of them)");
  cmd->add_option("--signal", o->seen.signal,
                  "a bar signal instead of components: PROBE:FUNCTION (a Fourier term seen, e.g. transverse:cos(phi)) or "
                  "PROBE@ANGLE (nonzero at that current azimuth, e.g. longitudinal@30)");
  cmd->add_option("--bar", o->seen.bar, "the bar of --signal, CURRENT[:FIELD] as for `sample --bar` (default rotating:any)")
      ->allow_extra_args(false);
  cmd->add_option("--label", o->seen.label, "words for the report");
  add_output_options(*cmd, o->out);
  cmd->callback([o] {
    Format f = parse_format(o->out.format);
    Scenario sc;
    if (!o->file.empty()) {
      if (!o->sample.sc.group.empty() || !o->seen.components.empty() || !o->seen.signal.empty())
        fail(ErrorKind::usage, "give either a scenario file or a group with its observation, not both", "--scenario",
             "observe --scenario film.toml, or observe m-3m --cut \"(001)\" --response ... --component ...");
      sc = load_scenario(o->file);
    } else {
      if (o->sample.sc.group.empty())
        fail(ErrorKind::usage, "no sample given", "observe", "a parent group (observe m-3m --cut \"(001)\" ...) or --scenario FILE");
      read_group(o->sample.sc.group, o->sample.colourless); // the note on a bare symbol, as in `form`
      sc = scenario_from_options(o->sample);
      ObservationRequest seen = o->seen;
      seen.where = "--response/--tensor/--component";
      if (seen.response.empty() == seen.tensor.empty())
        fail(ErrorKind::usage, "name what was observed with either --response or --tensor", seen.where,
             "--response second-order-conductivity --component chi_xxx");
      if (!seen.part.empty() && seen.part.find_first_not_of("0123456789") != std::string::npos)
        fail(ErrorKind::usage, "--part '" + seen.part + "' is not a part number", "--part", "1, 2, ...");
      if (seen.components.empty() == seen.signal.empty())
        fail(ErrorKind::usage, "give the observation as --component or as --signal", seen.where,
             "--component chi_xxx, or --signal transverse:cos(phi)");
      if (!seen.signal.empty() && seen.response.empty())
        fail(ErrorKind::usage, "--signal needs --response", "--signal", "--response second-order-conductivity");
      sc.observations.push_back(seen);
    }
    emit(o->out, write_observations(run_observations(sc), f));
  });
}

} // namespace ts::cli
