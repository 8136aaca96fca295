// tensorsieve run SCENARIO.toml | sample GROUP --cut ... --lower KIND:VALUE ...
#include "cli/commands.hpp"
#include "cli/figure_options.hpp"
#include "cli/report_options.hpp"
#include "cli/sample_options.hpp"
#include "core/error.hpp"
#include "geometry/bar_measurement.hpp"
#include "lowering/structure_file.hpp"
#include "report/scenario_report.hpp"

#include <algorithm>
#include <memory>

namespace ts::cli {

void setup_run(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    FigureOptions figures;
    ReportOptions report;
    std::string file, fractions;
    std::vector<std::string> orders;
    std::size_t max_steps = Scenario{}.max_steps;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("run", "run a scenario file: crystal, cut, lowering steps, responses, observations");
  cmd->add_option("scenario", o->file, "scenario TOML file (docs/scenarios.md)")->required();
  add_fractions_option(*cmd, o->fractions);
  add_order_option(*cmd, o->orders);
  cmd->add_option("--max-steps", o->max_steps, "refuse a chain of more lowering steps than this")
      ->capture_default_str();
  add_figure_options(*cmd, o->figures);
  add_report_options(*cmd, o->report);
  add_output_options(*cmd, o->out, true);
  cmd->callback([o] {
    check_brief(o->report, o->out);
    Scenario sc = load_scenario(o->file);
    sc.max_steps = o->max_steps;
    apply_fractions_option(o->fractions, sc);
    apply_order_options(o->orders, sc);
    apply_figure_options(o->figures, sc);
    apply_only_option(o->report, sc);
    if (sc.observations.empty()) {
      emit_scenario(o->out, run_scenario(sc), nullptr, o->report.brief, o->figures);
      return;
    }
    // The observations are answered against the group the chain ends in, as `observe` does.
    const ObservationRun run = run_observations(sc);
    emit_scenario(o->out, run.scenario, &run, o->report.brief, o->figures);
  });
}

void setup_sample(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    FigureOptions figures;
    SampleOptions sample;
    ReportOptions report;
    std::string fractions;
    std::vector<std::string> bars, layouts, rosette, layout_directions, layout_fields, shg, shg_channels, kerr,
        pump_probe, photocurrent, pump_polarisations, orders;
    bool shg_local_field = false;
    std::string shg_indices;
    std::string waveform = "sine";
    std::string structure_file, occupancy = "refuse";
    double symprec = StructureFileOptions{}.symprec;
    std::size_t max_atoms = StructureFileOptions{}.max_atoms;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("sample", "one-off scenario from options: group, cut, lowering steps, responses");
  add_sample_options(*cmd, o->sample, false);
  cmd->add_option("--structure-file", o->structure_file, "parent crystal from a CIF or mCIF file instead of a group");
  cmd->add_option("--occupancy", o->occupancy, "partial occupancy in the file: refuse (default) or ignore");
  cmd->add_option("--symprec", o->symprec, "distance tolerance for the file, Angstrom")->capture_default_str();
  cmd->add_option("--max-atoms", o->max_atoms, "refuse a file whose cell holds more atoms than this")
      ->capture_default_str();
  // One value per occurrence, taken as written: CLI11 would otherwise read "[V2]" as a
  // bracketed list and strip the brackets of a Jahn symbol.
  cmd->add_option("--response", o->sample.sc.responses,
                  "response id from `tensorsieve responses`, or all, transport, optics, equilibrium (repeatable)")
      ->allow_extra_args(false);
  cmd->add_option("--tensor", o->sample.sc.tensors, "extra tensor spec, e.g. \"[[V2]2]\" (repeatable)")
      ->allow_extra_args(false);
  cmd->add_flag("--domains", o->sample.sc.domains, "orientation domains of the lowering and their average");
  add_fractions_option(*cmd, o->fractions);
  add_order_option(*cmd, o->orders);
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
                  "candidate in-plane bar directions for --layout, e.g. [100];[110] (or repeat the option)")
      ->allow_extra_args(false)
      ->delimiter(';');
  cmd->add_option("--layout-fields", o->layout_fields,
                  "field geometries each candidate bar is measured in (default along-current,across-current,normal)")
      ->delimiter(',');
  cmd->add_option("--shg", o->shg,
                  "second-harmonic polarimetry GEOMETRY[:INCIDENCE[:AZIMUTH]] (repeatable): reflection or "
                  "transmission; INCIDENCE any (default) or degrees from the normal (0, 15, ..., 75); AZIMUTH "
                  "rotating (default) or degrees (multiple of 15)");
  cmd->add_option("--shg-channels", o->shg_channels,
                  "polariser-analyser channels for --shg, e.g. PP,PS,SP,SS (default), rotating-P, 45-S")
      ->delimiter(',');
  cmd->add_flag("--shg-local-field", o->shg_local_field,
                "apply Fresnel / local-field factors to --shg (reflection), as symbols Lx_w ... Lz_2w in the amplitudes");
  cmd->add_option("--shg-indices", o->shg_indices,
                  "refractive indices for the factors of --shg (implies --shg-local-field; needs a fixed incidence): "
                  "N_AMBIENT,N_OMEGA,N_2OMEGA or N_OMEGA,N_2OMEGA, complex allowed, e.g. 1,2.2+0.01i,2.3+0.05i");
  cmd->add_option("--kerr", o->kerr,
                  "magneto-optics for a MAGNETISATION direction (repeatable): in-plane, normal, any, [uvw] or "
                  "in-plane:ANGLE; reports the Kerr geometries the group allows and the quadratic terms")
      ->allow_extra_args(false);
  cmd->add_option("--pump-probe", o->pump_probe,
                  "pump-probe on the final group INCIDENCE[:AZIMUTH] (repeatable): the torque of each pump "
                  "polarisation on the last moment step's direction and which Kerr/Faraday probe sees it");
  cmd->add_option("--photocurrent", o->photocurrent,
                  "in-plane photocurrents INCIDENCE[:AZIMUTH] (repeatable) per pump polarisation, and the "
                  "electrode pair that reads them");
  cmd->add_option("--pump-polarisations", o->pump_polarisations,
                  "pump polarisations for --pump-probe and --photocurrent, e.g. circular+,circular-,linear:30 "
                  "(default circular+,circular-,linear,elliptical)")
      ->delimiter(',');
  add_figure_options(*cmd, o->figures);
  add_report_options(*cmd, o->report);
  add_output_options(*cmd, o->out, true);
  cmd->callback([o] {
    check_brief(o->report, o->out);
    Scenario sc = scenario_from_options(o->sample);
    // "45" or "45:rotating": the angle of incidence and the sample azimuth of a pump.
    auto beam = [&](PumpBeamSpec& spec, const std::string& option, const std::string& text) {
      const std::size_t colon = text.find(':');
      spec.incidence = text.substr(0, colon);
      spec.azimuth = colon == std::string::npos ? std::string("rotating") : text.substr(colon + 1);
      spec.name = option.substr(2) + " (" + text + ")";
      spec.polarisations = o->pump_polarisations;
      spec.where = option + " " + text;
      spec.bad_value = ErrorKind::usage;
    };
    for (const auto& p : o->pump_probe) {
      PumpProbeSpec spec;
      beam(spec, "--pump-probe", p);
      sc.pump_probe.push_back(spec);
    }
    for (const auto& p : o->photocurrent) {
      PhotocurrentSpec spec;
      beam(spec, "--photocurrent", p);
      sc.photocurrents.push_back(spec);
    }
    if (!o->pump_polarisations.empty() && o->pump_probe.empty() && o->photocurrent.empty())
      fail(ErrorKind::usage, "--pump-polarisations needs --pump-probe or --photocurrent", "--pump-polarisations",
           "--photocurrent 45 --pump-polarisations circular+,circular-");
    apply_figure_options(o->figures, sc);
    // Optical questions without --response ask for the responses they read.
    const bool default_responses = sc.responses.empty() && sc.tensors.empty();
    for (const auto& k : o->kerr) sc.kerr.push_back({"magneto-optics (" + k + ")", k, "--kerr " + k, ErrorKind::usage});
    if (!o->kerr.empty() && default_responses)
      sc.responses = {"magneto-optic-kerr", "magnetic-linear-birefringence"};
    std::optional<RefractiveIndices> indices;
    if (!o->shg_indices.empty()) indices = parse_indices_option(o->shg_indices, "--shg-indices");
    for (const auto& s : o->shg) {
      ShgSpec spec = parse_shg_option(s, "--shg " + s);
      spec.channels = o->shg_channels;
      spec.local_field = o->shg_local_field || indices.has_value();
      spec.indices = indices;
      sc.shg.push_back(spec);
    }
    if (!o->shg_channels.empty() && o->shg.empty())
      fail(ErrorKind::usage, "--shg-channels needs --shg", "--shg-channels", "--shg reflection:45 --shg-channels PP,SS");
    if ((o->shg_local_field || indices) && o->shg.empty())
      fail(ErrorKind::usage, "local-field factors need --shg", o->shg_local_field ? "--shg-local-field" : "--shg-indices",
           "--shg reflection:45 --shg-indices 1,2.2+0.01i,2.3+0.05i");
    if (!o->shg.empty() && default_responses) sc.responses.push_back("electric-dipole-shg");
    if (!o->pump_probe.empty() && default_responses) sc.responses.push_back("inverse-faraday");
    if (!o->photocurrent.empty() && default_responses) sc.responses.push_back("photogalvanic");
    apply_fractions_option(o->fractions, sc);
    apply_order_options(o->orders, sc);
    // Neither given: the empty group symbol is refused by the catalogue with its own message.
    if (!sc.group.empty() && !o->structure_file.empty())
      fail(ErrorKind::usage, "give the parent crystal once: a point group or --structure-file", "group/--structure-file",
           "tensorsieve sample m-3m ..., or tensorsieve sample --structure-file crystal.mcif ...");
    // Checked even without a file, so a mistyped word is never silently ignored.
    const OccupancyPolicy occupancy = parse_occupancy_policy(o->occupancy, "--occupancy", ErrorKind::usage);
    parse_waveform(o->waveform, "--waveform", ErrorKind::usage);
    if (!o->structure_file.empty()) {
      StructureFileOptions options;
      options.occupancy = occupancy;
      if (!(o->symprec > 0 && o->symprec < 1))
        fail(ErrorKind::usage, "symprec out of range", "--symprec", "0 < symprec < 1 Angstrom");
      options.symprec = o->symprec;
      if (o->max_atoms < 1) fail(ErrorKind::usage, "--max-atoms must be at least 1", "--max-atoms", "e.g. 20000");
      options.max_atoms = o->max_atoms;
      sc.structure = read_structure_file(o->structure_file, options);
    }
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
        // A sign only in front, then 1 to 4 digits: "-", "15-" and "1-5" are no angles.
        const std::size_t first_digit = !a.empty() && a[0] == '-' ? 1 : 0;
        bool ok = a.size() > first_digit && a.size() - first_digit <= 4 &&
                  a.find_first_not_of("0123456789", first_digit) == std::string::npos && std::stoi(a) % 15 == 0;
        if (!ok)
          fail(ErrorKind::usage, "rosette angle '" + a + "' is not a multiple of 15 degrees", "--rosette",
               "e.g. --rosette 0,30,45,90");
        spec.rosette.push_back(std::stoi(a));
      }
      sc.layouts.push_back(spec);
      if (!spec.response.empty() &&
          std::find(sc.responses.begin(), sc.responses.end(), spec.response) == sc.responses.end())
        sc.responses.push_back(spec.response);
    }
    if (!o->rosette.empty() && o->layouts.empty())
      fail(ErrorKind::usage, "--rosette needs --layout", "--rosette", "--layout second-order-conductivity:2 --rosette 0,45,90");
    if (sc.responses.empty() && sc.tensors.empty())
      fail(ErrorKind::usage, "ask for at least one response or tensor", "--response/--tensor",
           "--response anomalous-hall, or --tensor \"V[V2]\"");
    apply_only_option(o->report, sc);
    emit_scenario(o->out, run_scenario(sc), nullptr, o->report.brief, o->figures);
  });
}

} // namespace ts::cli
