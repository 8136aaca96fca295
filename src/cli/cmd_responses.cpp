// tensorsieve responses | response ID GROUP
#include "cli/commands.hpp"
#include "cli/frame_options.hpp"
#include "core/error.hpp"
#include "group/group_catalogue.hpp"
#include "report/response_report.hpp"

#include <memory>

namespace ts::cli {

namespace {

void setup_response_list(CLI::App& app) {
  auto o = std::make_shared<OutputOptions>();
  auto* cmd = app.add_subcommand("responses", "list the catalogue of physical responses (ids for `response`)");
  add_output_options(*cmd, *o);
  cmd->callback([o] {
    const auto& cat = ResponseCatalogue::builtin();
    emit(*o, write_response_list(cat.responses(), parse_format(o->format)));
  });
}

void setup_response_form(CLI::App& app) {
  struct Opts {
    OutputOptions out;
    std::string id, group, view = "auto";
    FrameOptions frame;
    bool colourless = false;
  };
  auto o = std::make_shared<Opts>();
  auto* cmd = app.add_subcommand("response", "describe a physical response and its allowed form in a point group");
  cmd->add_option("id", o->id, "response id or alias, e.g. anomalous-hall, shg, bcd (`tensorsieve responses`)")
      ->required();
  cmd->add_option("group", o->group, kGroupSymbolHelp)->required();
  add_frame_options(*cmd, o->frame);
  cmd->add_option("--view", o->view, "auto, components, matrix, dmatrix or voigt")->capture_default_str();
  add_colourless_flag(*cmd, o->colourless);
  add_output_options(*cmd, o->out);
  cmd->callback([o] {
    const Response& r = ResponseCatalogue::builtin().get(o->id);
    const NamedGroup& g = read_group(o->group, o->colourless);
    View view = parse_view(o->view);
    Format format = parse_format(o->out.format);
    FrameContext fc;
    Frame frame = frame_from_options(o->frame, g, &fc);
    emit(o->out, write_response(r, response_forms(r, g.group, frame), GroupContext::of(g), fc, format, view));
  });
}

} // namespace

void setup_responses(CLI::App& app) {
  setup_response_list(app);
  setup_response_form(app);
}

} // namespace ts::cli
