// The Python module `tensorsieve` (compiled part, imported as
// tensorsieve._tensorsieve by python/tensorsieve/__init__.py). Like the CLI it
// is a thin client: every function calls the library and returns the same
// JSON report the CLI writes with -f json, as Python dicts and lists, so the
// two can never disagree. Errors raise tensorsieve.Error with the CLI's
// located message.
#include "cli/frame_options.hpp"
#include "core/data_dir.hpp"
#include "core/error.hpp"
#include "fit/scan_fit.hpp"
#include "group/group_catalogue.hpp"
#include "group/identify.hpp"
#include "lowering/structure_file.hpp"
#include "report/fit_report.hpp"
#include "report/form_report.hpp"
#include "report/group_report.hpp"
#include "report/json_text.hpp"
#include "report/observation_report.hpp"
#include "report/scenario_report.hpp"
#include "report/screen_report.hpp"
#include "report/response_report.hpp"
#include "scenario/scenario_run.hpp"
#include "scenario/scenario_table.hpp"
#include "scenario/screening.hpp"
#include "tensor/survey.hpp"

#include <pybind11/pybind11.h>
#include <pybind11/stl.h>

#include <string>
#include <vector>

namespace py = pybind11;
using namespace ts;

namespace {

py::object parse_json(const std::string& text) { return py::module_::import("json").attr("loads")(text); }

// Dict -> TOML table, so a scenario given as a dict goes through the same
// reader (and the same checks and messages) as a scenario file.
toml::table table_from_dict(const py::dict& d, const std::string& where);

toml::array array_from_list(const py::list& l, const std::string& where);

void insert_value(toml::table& t, const std::string& key, const py::handle& v, const std::string& where) {
  const std::string field = where + "." + key;
  if (py::isinstance<py::bool_>(v)) t.insert(key, v.cast<bool>());
  else if (py::isinstance<py::int_>(v)) t.insert(key, v.cast<std::int64_t>());
  else if (py::isinstance<py::float_>(v)) t.insert(key, v.cast<double>());
  else if (py::isinstance<py::str>(v)) t.insert(key, v.cast<std::string>());
  else if (py::isinstance<py::dict>(v)) t.insert(key, table_from_dict(v.cast<py::dict>(), field));
  else if (py::isinstance<py::list>(v) || py::isinstance<py::tuple>(v)) t.insert(key, array_from_list(py::list(py::reinterpret_borrow<py::object>(v)), field));
  else
    fail(ErrorKind::bad_file, "unsupported value of type " + std::string(py::str(v.get_type().attr("__name__"))),
         field, "str, int, float, bool, list or dict, as in a TOML scenario file");
}

toml::array array_from_list(const py::list& l, const std::string& where) {
  toml::array a;
  for (std::size_t i = 0; i < l.size(); ++i) {
    toml::table holder;
    insert_value(holder, "v", l[i], where + "[" + std::to_string(i) + "]");
    a.push_back(*holder.get("v"));
  }
  return a;
}

toml::table table_from_dict(const py::dict& d, const std::string& where) {
  toml::table t;
  for (const auto& [k, v] : d) {
    if (!py::isinstance<py::str>(k)) fail(ErrorKind::bad_file, "keys must be strings", where, "a dict like a TOML table");
    insert_value(t, k.cast<std::string>(), v, where);
  }
  return t;
}

// One meaning for a symbol, as on the command line: no primes is a non-magnetic
// crystal (the grey group); colourless=True asks for the group without time reversal.
const NamedGroup& named(const std::string& symbol, bool colourless) {
  return GroupCatalogue::builtin().get(symbol, colourless ? PlainSymbol::colourless : PlainSymbol::nonmagnetic);
}

cli::FrameOptions frame_options(const std::string& z, const std::string& x) {
  cli::FrameOptions o;
  o.z = z;
  o.x = x;
  return o;
}

py::object form(const std::string& group, const std::string& spec, const std::string& z, const std::string& x,
                bool colourless) {
  const NamedGroup& g = named(group, colourless);
  const TensorSpec parsed = parse_tensor_spec(spec);
  FrameContext fc;
  const Frame frame = cli::frame_from_options(frame_options(z, x), g, &fc);
  return parse_json(write_form(allowed_form(parsed, g.group, frame), GroupContext::of(g), fc, Format::json,
                               View::automatic));
}

py::object group(const std::string& symbol, bool subgroups, bool colourless) {
  const auto& cat = GroupCatalogue::builtin();
  return parse_json(write_group_description(describe_group(named(symbol, colourless), subgroups, cat), Format::json));
}

// The operations of a group as exact matrices (entries as strings sympy
// parses, such as "-1/2" and "sqrt(3)/2"), in the group's Cartesian frame.
py::list operations(const std::string& symbol, bool colourless) {
  const NamedGroup& g = named(symbol, colourless);
  py::list out;
  for (const auto& op : g.group.operations()) {
    py::list rows;
    for (int i = 0; i < 3; ++i) {
      py::list row;
      for (int j = 0; j < 3; ++j) row.append(op.R(i, j).str());
      rows.append(row);
    }
    py::dict d;
    d["symbol"] = op.symbol(g.group.lattice());
    d["matrix"] = rows;
    d["primed"] = op.primed;
    out.append(d);
  }
  return out;
}

py::object groups(bool magnetic) {
  const auto& cat = GroupCatalogue::builtin();
  return parse_json(write_group_list(magnetic ? cat.types() : cat.crystallographic_types(), Format::json));
}

py::object identify_operations(const std::vector<std::string>& symbols, const std::string& lattice_name) {
  if (lattice_name != "orthogonal" && lattice_name != "hexagonal")
    fail(ErrorKind::usage, "unknown lattice '" + lattice_name + "'", "lattice", "orthogonal or hexagonal");
  const LatticeKind lattice = lattice_name == "hexagonal" ? LatticeKind::hexagonal : LatticeKind::orthogonal;
  std::vector<Operation> gens;
  for (std::size_t i = 0; i < symbols.size(); ++i)
    gens.push_back(parse_operation(symbols[i], lattice, "operation " + std::to_string(i + 1)));
  PointGroup g = PointGroup::generate(gens, lattice, 96, "the generators");
  require_lattice_group(g, "the generators");
  return parse_json(write_identification(g, identify(g, GroupCatalogue::builtin()), Format::json));
}

py::object responses() { return parse_json(write_response_list(ResponseCatalogue::builtin().responses(), Format::json)); }

py::object response(const std::string& id, const std::string& group, const std::string& z, const std::string& x,
                    bool colourless) {
  const Response& r = ResponseCatalogue::builtin().get(id);
  const NamedGroup& g = named(group, colourless);
  FrameContext fc;
  const Frame frame = cli::frame_from_options(frame_options(z, x), g, &fc);
  return parse_json(write_response(r, response_forms(r, g.group, frame), GroupContext::of(g), fc, Format::json,
                                   View::automatic));
}

// A scenario given as a dict (the keys of a scenario file) or as a TOML file path.
Scenario scenario_of(const py::object& source) {
  if (py::isinstance<py::dict>(source))
    return scenario_from_table(table_from_dict(source.cast<py::dict>(), "scenario"), "scenario dict");
  return load_scenario(py::str(source).cast<std::string>());
}

py::object scenario(const py::object& source) {
  const Scenario sc = scenario_of(source);
  // As `run`: a scenario with observations is answered after its report.
  // Figures as in `run -f json`: their samples when the scenario has a [figures] table.
  if (!sc.observations.empty()) {
    const ObservationRun run = run_observations(sc);
    return parse_json(write_scenario_with_observations(run, report_figures(run.scenario, false), Format::json));
  }
  const ScenarioResult r = run_scenario(sc);
  return parse_json(write_scenario(r, report_figures(r, false), Format::json));
}

// As `observe --scenario FILE`: the observations alone, against the group the scenario ends in.
py::object observe_report(const py::object& source) {
  return parse_json(write_observations(run_observations(scenario_of(source)), Format::json));
}

py::object survey_report(const std::string& spec, bool magnetic, bool colourless) {
  const TensorSpec parsed = parse_tensor_spec(spec);
  const auto groups = survey_groups(GroupCatalogue::builtin(), magnetic, colourless);
  return parse_json(write_survey(parsed, ts::survey(parsed, groups), Format::json));
}

// A scan fit (docs/fit.md): the scan is a file path, or a dict of columns (header
// with its unit -> a sequence of numbers, numpy arrays included; "channel" -> a
// sequence of strings). Returns the JSON of `tensorsieve fit -f json` for this one
// fit, with the fitted model at every point added to each hypothesis as a numpy
// array when numpy is importable (a list otherwise).
py::object fit(const py::object& source, const py::object& data, const std::string& bar, const std::string& probe,
               int harmonic, const std::string& reading, const std::string& shg, int floor, bool offset, double alpha) {
  Scenario sc = py::isinstance<py::dict>(source)
                    ? scenario_from_table(table_from_dict(source.cast<py::dict>(), "scenario"), "scenario dict")
                    : load_scenario(py::str(source).cast<std::string>());
  FitSpec spec;
  spec.name = "fit";
  spec.bar = bar;
  spec.probe = probe;
  spec.harmonic = harmonic;
  spec.reading = reading;
  spec.shg = shg;
  spec.floor = floor;
  spec.offset = offset;
  spec.alpha = alpha;
  spec.where = "fit()";
  spec.bad_value = ErrorKind::usage;
  if (harmonic < 0 || harmonic > 5) fail(ErrorKind::usage, "harmonic out of range", "harmonic", "0 to 5");
  if (floor < 1) fail(ErrorKind::usage, "floor must be at least 1", "floor", "a group order, 1 to 192");
  if (!(alpha > 0 && alpha < 0.5)) fail(ErrorKind::usage, "alpha must lie between 0 and 0.5", "alpha", "0.01");
  ScanTable table;
  if (py::isinstance<py::dict>(data)) {
    std::vector<std::pair<std::string, std::vector<double>>> columns;
    std::vector<std::string> channels;
    for (const auto& [key, value] : data.cast<py::dict>()) {
      const std::string name = py::str(key).cast<std::string>();
      if (name == "channel") {
        for (const auto& c : value) channels.push_back(py::str(c).cast<std::string>());
        continue;
      }
      std::vector<double> v;
      for (const auto& x : value) v.push_back(x.cast<double>());
      columns.emplace_back(name, std::move(v));
    }
    table = scan_table_from_arrays(columns, channels, "data dict");
  } else {
    table = read_scan_table(py::str(data).cast<std::string>());
  }
  FitRun run;
  run.scenario = run_scenario(sc);
  run.fits.push_back(fit_scan(run.scenario, spec, table));
  py::object out = parse_json(write_fits(run, Format::json))["fits"][py::int_(0)];
  py::object numpy = py::none();
  try {
    numpy = py::module_::import("numpy");
  } catch (const py::error_already_set&) {
    numpy = py::none(); // numpy is optional: lists instead of arrays
  }
  py::list hyps = out["hypotheses"];
  const auto& fits = run.fits.front().hypotheses;
  for (std::size_t i = 0; i < fits.size(); ++i) {
    py::list model;
    for (double v : fits[i].model) model.append(v);
    hyps[i]["model"] = numpy.is_none() ? py::object(model) : numpy.attr("asarray")(model);
  }
  return out;
}

StructureFileOptions file_options(const std::string& occupancy, double symprec) {
  StructureFileOptions o;
  o.occupancy = parse_occupancy_policy(occupancy, "occupancy", ErrorKind::usage);
  if (!(symprec > 0 && symprec < 1)) fail(ErrorKind::usage, "symprec out of range", "symprec", "0 < symprec < 1 Angstrom");
  o.symprec = symprec;
  return o;
}

py::list screen(const std::vector<std::string>& paths, const std::vector<std::string>& response_ids,
                const std::vector<std::string>& cuts, unsigned jobs, const std::string& occupancy, double symprec) {
  ScreenRequest request;
  request.responses = response_ids;
  request.cuts = cuts;
  request.options = file_options(occupancy, symprec);
  request.files = collect_structure_files(paths);
  std::vector<ScreenRow> rows;
  {
    // The worker processes run without the interpreter (they never touch Python).
    py::gil_scoped_release free_python;
    rows = screen_structures(request, jobs);
  }
  py::list out;
  const py::object loads = py::module_::import("json").attr("loads");
  std::string all = write_screen(request, rows, ScreenFormat::jsonl);
  std::size_t start = 0;
  for (std::size_t end = all.find('\n'); end != std::string::npos; start = end + 1, end = all.find('\n', start))
    out.append(loads(all.substr(start, end - start)));
  return out;
}

py::dict structure(const std::string& path, const std::string& occupancy, double symprec) {
  Scenario sc;
  sc.source = path;
  sc.structure = read_structure_file(path, file_options(occupancy, symprec));
  const ScenarioResult res = run_scenario(sc);
  const StructureSymmetry& sym = *res.structure_symmetry;
  py::dict d;
  d["file"] = path;
  d["atoms"] = sc.structure->sites.size();
  d["magnetic"] = sc.structure->magnetic;
  d["point_group"] = res.chain.front().id.type->symbol;
  d["setting"] = res.chain.front().id.same_setting ? res.chain.front().id.same_setting->symbol : "";
  d["operations"] = [&] {
    py::list ops;
    for (const auto& op : res.chain.front().group.operations()) ops.append(op.symbol(res.chain.front().group.lattice()));
    return ops;
  }();
  d["space_group"] = sym.space_group_symbol;
  d["space_group_number"] = sym.space_group_number;
  d["bns_number"] = sym.bns_number;
  d["uni_number"] = sym.magnetic_uni_number;
  d["magnetic_type"] = sym.magnetic_type;
  d["notes"] = structure_symmetry_notes(*sc.structure, sym);
  return d;
}

} // namespace

PYBIND11_MODULE(_tensorsieve, m) {
  m.doc() = "tensorsieve: symmetry-allowed responses of crystals, films and interfaces (exact, Neumann's principle)";
  static py::exception<Error> error_type(m, "Error");
  py::register_exception_translator([](std::exception_ptr p) {
    try {
      if (p) std::rethrow_exception(p);
    } catch (const Error& e) {
      py::object err = py::reinterpret_borrow<py::object>(error_type)(e.what());
      err.attr("problem") = e.problem();
      err.attr("where") = e.location();
      err.attr("valid") = e.valid();
      err.attr("exit_code") = e.exit_code();
      PyErr_SetObject(error_type.ptr(), err.ptr());
    }
  });
  m.attr("__version__") = TENSORSIEVE_VERSION;
  m.def("_prefer_data_directory", &prefer_data_directory, py::arg("root"),
        "read groups/ and the response catalogue from ROOT (the copy a pip-installed package carries)");
  m.def("_data_directory", &data_directory, "the directory groups/ and the response catalogue are read from");
  m.def("form", &form, py::arg("group"), py::arg("spec"), py::arg("z") = "", py::arg("x") = "",
        py::arg("colourless") = false,
        "allowed form of a tensor spec in a point group (the JSON of `tensorsieve form GROUP SPEC -f json`)");
  m.def("group", &group, py::arg("symbol"), py::arg("subgroups") = false, py::arg("colourless") = false,
        "one point group, as `tensorsieve group`");
  m.def("operations", &operations, py::arg("symbol"), py::arg("colourless") = false,
        "operations of a point group with exact Cartesian matrices (entries as sympy-parsable strings)");
  m.def("groups", &groups, py::arg("magnetic") = false, "the 32 classes, or the 122 magnetic types");
  m.def("identify", &identify_operations, py::arg("operations"), py::arg("lattice") = "orthogonal",
        "name the point group generated by operation symbols such as \"4+ [001]\", \"m' [100]\"");
  m.def("responses", &responses, "the response catalogue");
  m.def("response", &response, py::arg("id"), py::arg("group"), py::arg("z") = "", py::arg("x") = "",
        py::arg("colourless") = false,
        "one response in one point group, as `tensorsieve response ID GROUP`");
  m.def("scenario", &scenario, py::arg("source"),
        "run a scenario given as a dict (the TOML schema of docs/scenarios.md) or a TOML file path");
  m.def("observe", &observe_report, py::arg("source"),
        "answer the [[observation]] tables of a scenario (dict or TOML file path), as `tensorsieve observe --scenario`");
  m.def("survey", &survey_report, py::arg("spec"), py::arg("magnetic") = false, py::arg("colourless") = false,
        "count a tensor's independent components in every point group, as `tensorsieve survey`");
  m.def("fit", &fit, py::arg("scenario"), py::arg("data"), py::arg("bar") = "", py::arg("probe") = "transverse",
        py::arg("harmonic") = 1, py::arg("reading") = "auto", py::arg("shg") = "", py::arg("floor") = 1,
        py::arg("offset") = false, py::arg("alpha") = 0.01,
        "fit a measured scan (file path or dict of arrays) against every symmetry hypothesis, as `tensorsieve fit`");
  m.def("structure", &structure, py::arg("path"), py::arg("occupancy") = "refuse", py::arg("symprec") = 1e-2,
        "read a CIF or mCIF file: point group, space group, BNS number, type and notes");
  m.def("screen", &screen, py::arg("paths"), py::arg("responses"), py::arg("cuts") = std::vector<std::string>{},
        py::arg("jobs") = 0u, py::arg("occupancy") = "refuse", py::arg("symprec") = 1e-2,
        "screen structure files: one dict per file, as `tensorsieve screen -f jsonl`");
  m.def("structure_files", &collect_structure_files, py::arg("paths"),
        "the structure files `screen` reads from files, folders and list files, in its order");
}
