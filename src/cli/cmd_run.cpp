// tensorsieve run SCENARIO.toml | sample GROUP --cut ... --lower KIND:VALUE ...
#include "cli/commands.hpp"
#include "cli/frame_options.hpp"
#include "core/error.hpp"
#include "report/scenario_report.hpp"

#include <memory>

namespace ts::cli {

void setup_run(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    std::string file;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("run", "run a scenario file: crystal, cut, lowering steps, responses");
  cmd->add_option("scenario", o->file, "scenario TOML file (docs/scenarios.md)")->required();
  add_output_options(*cmd, o->out);
  cmd->callback([o] {
    Format f = parse_format(o->out.format);
    emit(o->out, write_scenario(run_scenario(load_scenario(o->file)), f));
  });
}

void setup_sample(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    Scenario sc;
    std::vector<std::string> lowerings;
    std::string a, b, c;
    bool colourless = false;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("sample", "one-off scenario from options: group, cut, lowering steps, responses");
  cmd->add_option("group", o->sc.group, kGroupSymbolHelp)->required();
  cmd->add_option("--cut", o->sc.cut, "surface or interface: (hkl), (hkil) or [uvw]");
  cmd->add_option("--x", o->sc.x, "in-plane direction for sample x");
  cmd->add_option("--z", o->sc.z, "sample z for a bulk sample (no cut)");
  cmd->add_flag("--equivalent-faces", o->sc.equivalent_faces, "free-standing slab with identical faces");
  cmd->add_option("--lower", o->lowerings,
                  "lowering step KIND:VALUE, in order: strain:[001], shear:[100],[010], polar:[110], "
                  "electric-field:[001], moment:[001], magnetic-field:[1-10], current:[100], "
                  "subgroup:mm2 (structural), magnetic-group:4'/m'm'm (magnetic order), tilts:a0a0c-")
      ->allow_extra_args(false);
  // One value per occurrence, taken as written: CLI11 would otherwise read "[V2]" as a
  // bracketed list and strip the brackets of a Jahn symbol.
  cmd->add_option("--response", o->sc.responses, "response id from `tensorsieve responses`, or all, transport, optics, equilibrium (repeatable)")
      ->allow_extra_args(false);
  cmd->add_option("--tensor", o->sc.tensors, "extra tensor spec, e.g. \"[[V2]2]\" (repeatable)")
      ->allow_extra_args(false);
  cmd->add_option("--a", o->a, "lattice parameter a");
  cmd->add_option("--b", o->b, "lattice parameter b");
  cmd->add_option("--c", o->c, "lattice parameter c");
  add_colourless_flag(*cmd, o->colourless);
  cmd->add_flag("--domains", o->sc.domains, "orientation domains of the lowering and their average");
  add_output_options(*cmd, o->out);
  cmd->callback([o] {
    Scenario sc = o->sc;
    sc.assume_nonmagnetic = !o->colourless;
    for (std::size_t i = 0; i < o->lowerings.size(); ++i)
      sc.steps.push_back(parse_lowering_option(o->lowerings[i], "--lower " + o->lowerings[i]));
    sc.metric = metric_option({"", "", o->a, o->b, o->c});
    if (sc.responses.empty() && sc.tensors.empty())
      fail(ErrorKind::usage, "ask for at least one response or tensor", "--response/--tensor",
           "--response anomalous-hall, or --tensor \"V[V2]\"");
    emit(o->out, write_scenario(run_scenario(sc), parse_format(o->out.format)));
  });
}

} // namespace ts::cli
