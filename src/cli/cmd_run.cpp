// tensorsieve run SCENARIO.toml | sample GROUP --cut ... --lower KIND:VALUE ...
#include "cli/commands.hpp"
#include "cli/sample_options.hpp"
#include "core/error.hpp"
#include "report/scenario_report.hpp"

#include <memory>

namespace ts::cli {

void setup_run(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    std::string file, fractions;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("run", "run a scenario file: crystal, cut, lowering steps, responses");
  cmd->add_option("scenario", o->file, "scenario TOML file (docs/scenarios.md)")->required();
  add_fractions_option(*cmd, o->fractions);
  add_output_options(*cmd, o->out);
  cmd->callback([o] {
    Format f = parse_format(o->out.format);
    Scenario sc = load_scenario(o->file);
    apply_fractions_option(o->fractions, sc);
    emit(o->out, write_scenario(run_scenario(sc), f));
  });
}

void setup_sample(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    SampleOptions sample;
    std::string fractions;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("sample", "one-off scenario from options: group, cut, lowering steps, responses");
  add_sample_options(*cmd, o->sample, true);
  cmd->add_option("--response", o->sample.sc.responses, "response id from `tensorsieve responses` (repeatable)");
  cmd->add_option("--tensor", o->sample.sc.tensors, "extra tensor spec (repeatable)");
  cmd->add_flag("--domains", o->sample.sc.domains, "orientation domains of the lowering and their average");
  add_fractions_option(*cmd, o->fractions);
  add_output_options(*cmd, o->out);
  cmd->callback([o] {
    Scenario sc = scenario_from_options(o->sample);
    apply_fractions_option(o->fractions, sc);
    if (sc.responses.empty() && sc.tensors.empty())
      fail(ErrorKind::usage, "ask for at least one response or tensor", "--response/--tensor",
           "--response anomalous-hall, or --tensor \"V[V2]\"");
    emit(o->out, write_scenario(run_scenario(sc), parse_format(o->out.format)));
  });
}

} // namespace ts::cli
