// tensorsieve run SCENARIO.toml | sample GROUP --cut ... --lower KIND:VALUE ...
#include "cli/commands.hpp"
#include "cli/frame_options.hpp"
#include "core/error.hpp"
#include "report/scenario_report.hpp"

#include <algorithm>
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
    std::vector<std::string> lowerings, bars, layouts, rosette, layout_directions, layout_fields;
    std::string waveform = "sine";
    std::string a, b, c;
    bool colourless = false;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("sample", "one-off scenario from options: group, cut, lowering steps, responses");
  cmd->add_option("group", o->sc.group, "parent point group, e.g. m-3m (taken as non-magnetic, m-3m1')")->required();
  cmd->add_option("--cut", o->sc.cut, "surface or interface: (hkl), (hkil) or [uvw]");
  cmd->add_option("--x", o->sc.x, "in-plane direction for sample x");
  cmd->add_option("--z", o->sc.z, "sample z for a bulk sample (no cut)");
  cmd->add_flag("--equivalent-faces", o->sc.equivalent_faces, "free-standing slab with identical faces");
  cmd->add_option("--lower", o->lowerings,
                  "lowering step KIND:VALUE, in order: strain:[001], shear:[100],[010], polar:[110], "
                  "electric-field:[001], moment:[001], magnetic-field:[1-10], current:[100], "
                  "magnetic-group:4'/m'm'm, tilts:a0a0c-");
  cmd->add_option("--response", o->sc.responses, "response id from `tensorsieve responses` (repeatable)");
  cmd->add_option("--tensor", o->sc.tensors, "extra tensor spec (repeatable)");
  cmd->add_option("--a", o->a, "lattice parameter a");
  cmd->add_option("--b", o->b, "lattice parameter b");
  cmd->add_option("--c", o->c, "lattice parameter c");
  cmd->add_flag("--colourless", o->colourless, "take a group without primes literally, not as G1'");
  cmd->add_flag("--domains", o->sc.domains, "orientation domains of the lowering and their average");
  cmd->add_option("--bar", o->bars,
                  "a Hall bar CURRENT[:FIELD] (repeatable): CURRENT is rotating, an in-plane [uvw] or an angle from x "
                  "(multiple of 15°); FIELD is none, in-plane, normal, any, along-current, across-current, [uvw] or "
                  "in-plane:ANGLE (default any)")
      ->allow_extra_args(false); // keep "[100]" whole: CLI11 reads a bracketed value of a vector option as a list
  cmd->add_option("--waveform", o->waveform, "drive waveform of the bars: sine (default) or cosine");
  cmd->add_option("--layout", o->layouts, "design the bars to pattern for RESPONSE[:HARMONIC] (repeatable)");
  cmd->add_option("--rosette", o->rosette, "candidate bar angles from x in degrees for --layout, e.g. 0,30,45,90")
      ->delimiter(',');
  cmd->add_option("--layout-directions", o->layout_directions,
                  "candidate in-plane bar directions for --layout, e.g. [100],[110] (indices with commas: repeat the option)")
      ->allow_extra_args(false)
      ->delimiter(';');
  cmd->add_option("--layout-fields", o->layout_fields,
                  "field geometries each candidate bar is measured in (default along-current,across-current,normal)")
      ->delimiter(',');
  add_output_options(*cmd, o->out);
  cmd->callback([o] {
    Scenario sc = o->sc;
    sc.assume_nonmagnetic = !o->colourless;
    for (std::size_t i = 0; i < o->lowerings.size(); ++i)
      sc.steps.push_back(parse_lowering_option(o->lowerings[i], "--lower " + o->lowerings[i]));
    sc.metric = metric_option({"", "", o->a, o->b, o->c});
    for (const auto& b : o->bars) {
      BarSpec spec = parse_bar_option(b, "--bar " + b);
      spec.waveform = o->waveform;
      sc.bars.push_back(spec);
    }
    for (const auto& l : o->layouts) {
      LayoutSpec spec = parse_layout_option(l, "--layout " + l);
      spec.directions = o->layout_directions;
      spec.fields = o->layout_fields;
      for (const auto& a : o->rosette) {
        bool ok = !a.empty() && a.size() < 6 && a.find_first_not_of("-0123456789") == std::string::npos &&
                  std::stoi(a) % 15 == 0;
        if (!ok) fail(ErrorKind::usage, "rosette angle '" + a + "' is not a multiple of 15 degrees", "--rosette", "e.g. --rosette 0,30,45,90");
        spec.rosette.push_back(std::stoi(a));
      }
      sc.layouts.push_back(spec);
      if (std::find(sc.responses.begin(), sc.responses.end(), spec.response) == sc.responses.end())
        sc.responses.push_back(spec.response);
    }
    if (!o->rosette.empty() && o->layouts.empty())
      fail(ErrorKind::usage, "--rosette needs --layout", "--rosette", "--layout second-order-conductivity:2 --rosette 0,45,90");
    if (sc.responses.empty() && sc.tensors.empty())
      fail(ErrorKind::usage, "ask for at least one response or tensor", "--response/--tensor",
           "--response anomalous-hall, or --tensor \"V[V2]\"");
    emit(o->out, write_scenario(run_scenario(sc), parse_format(o->out.format)));
  });
}

} // namespace ts::cli
