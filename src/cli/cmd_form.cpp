// tensorsieve form GROUP SPEC | survey SPEC
#include "cli/commands.hpp"
#include "cli/frame_options.hpp"
#include "core/error.hpp"
#include "report/form_report.hpp"
#include "report/group_report.hpp"

#include <memory>

namespace ts::cli {

void setup_form(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    std::string group, spec, view = "auto";
    FrameOptions frame;
    bool colourless = false;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("form", "the symmetry-allowed form of a tensor in a point group");
  cmd->add_option("group", o->group, kGroupSymbolHelp)->required();
  cmd->add_option("spec", o->spec, "tensor: Jahn symbol (V[V2]) or index spec (\"d_ijk: polar, sym(jk)\")")->required();
  add_frame_options(*cmd, o->frame);
  cmd->add_option("--view", o->view, "auto, components, matrix, dmatrix or voigt")->capture_default_str();
  add_colourless_flag(*cmd, o->colourless);
  add_output_options(*cmd, o->out);
  cmd->callback([o] {
    const NamedGroup& g = read_group(o->group, o->colourless);
    TensorSpec spec = parse_tensor_spec(o->spec);
    View view = parse_view(o->view);
    Format format = parse_format(o->out.format);
    FrameContext fc;
    Frame frame = frame_from_options(o->frame, g, &fc);
    AllowedForm form = allowed_form(spec, g.group, frame);
    emit(o->out, write_form(form, GroupContext::of(g), fc, format, view));
  });
}

void setup_survey(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    std::string spec;
    bool magnetic = false, colourless = false;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("survey", "count a tensor's independent components in every point group");
  cmd->add_option("spec", o->spec, "tensor: Jahn symbol or index spec")->required();
  cmd->add_flag("-m,--magnetic", o->magnetic,
                "survey the 122 magnetic point-group types (default: the 32 classes as non-magnetic crystals, G1')");
  cmd->add_flag("--colourless", o->colourless,
                "survey the 32 classes as colourless groups G (magnetic order, no time reversal), not as G1'");
  add_output_options(*cmd, o->out);
  cmd->callback([o] {
    TensorSpec spec = parse_tensor_spec(o->spec);
    const auto groups = survey_groups(GroupCatalogue::builtin(), o->magnetic, o->colourless);
    emit(o->out, write_survey(spec, survey(spec, groups), parse_format(o->out.format)));
  });
}

} // namespace ts::cli
