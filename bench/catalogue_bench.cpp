// tensorsieve_bench: how fast the exact engine is, printed as figures beside
// their targets (docs/performance.md records a run and the machine).
//
// What it times, single-threaded, with std::chrono::steady_clock:
//   - GroupCatalogue::load (TOML parsing and derivation of the 122 types);
//   - the whole catalogue of exact allowed FORMS (allowed_form, with every
//     component as an exact combination) of the specs below in all 122
//     magnetic point-group types, cold (first pass, generators still to be
//     found) and as the median of repeated passes;
//   - single rank-5 and rank-6 tensors without index symmetry in m-3m, 6/mmm
//     and -3 (rank 5 also in 432, 622, 3), each from a fresh group (generators
//     re-derived every run);
//   - probes of the slower exact paths, each in a child process with a time
//     limit: Gaussian elimination over Q(√3) for groups that are monomial in
//     no basis, and forms rotated into a sample frame (surds);
//   - peak memory (getrusage ru_maxrss), of this process and of the largest probe.
// Targets, on one core of the 2-core reference machine: whole catalogue
// < 0.5 s, any single rank-6 form < 0.2 s, peak memory < 200 MB. A missed
// target is reported, never turned into a failing exit status: speed is shown,
// not asserted.
#include "bench_clock.hpp"
#include "fit_bench.hpp"
#include "inverse_bench.hpp"

#include "core/data_dir.hpp"
#include "core/error.hpp"
#include "geometry/sample_frame.hpp"
#include "report/html_report.hpp"
#include "report/report_format.hpp"
#include "report/scenario_report.hpp"
#include "scenario/scenario_run.hpp"

#include <numeric>
#include "group/group_catalogue.hpp"
#include "tensor/allowed_form.hpp"

#include <algorithm>
#include <cstdio>
#include <cstdlib>
#include <functional>
#include <iostream>
#include <map>
#include <string>
#include <thread>
#include <unistd.h>
#include <vector>

namespace ts::bench {

namespace {

// The built-in specs up to rank 4, each with a response it stands for
// (docs/responses.md).
struct CatalogueSpec {
  const char* text;
  const char* meaning;
};
const CatalogueSpec catalogue_specs[] = {
    // rank 1
    {"V", "polar vector: pyroelectric polarisation"},
    {"eV", "axial time-even vector"},
    {"aV", "polar time-odd vector: toroidal moment"},
    {"aeV", "axial time-odd vector: magnetisation, Hall vector"},
    // rank 2
    {"[V2]", "symmetric polar: dielectric tensor, symmetric conductivity"},
    {"{V2}", "antisymmetric polar pair"},
    {"a{V2}", "antisymmetric c-type pair: Hall part of the conductivity"},
    {"V2", "general polar rank 2"},
    {"aV2", "general c-type rank 2"},
    {"eV2", "axial rank 2: current-induced spin polarisation"},
    {"aeV2", "axial c-type rank 2: linear magnetoelectric tensor"},
    {"a[V2]", "symmetric c-type pair"},
    {"ae[V2]", "symmetric axial c-type pair"},
    {"sigma_ab: onsager(a,b)", "linear conductivity with the Onsager-Kleiner rule"},
    // rank 3
    {"V[V2]", "piezoelectric, SHG d, second-order conductivity (i-type)"},
    {"aV[V2]", "second-order conductivity, c-type part"},
    {"eV[V2]", "magnetic-dipole SHG, axial rank 3"},
    {"aeV[V2]", "axial c-type rank 3"},
    {"[V3]", "fully symmetric rank 3 (Kleinman-symmetric SHG)"},
    {"V3", "general polar rank 3"},
    {"aV3", "general c-type polar rank 3"},
    {"eV3", "general axial rank 3"},
    {"ae[V2]V", "piezomagnetic; symmetric odd-in-B magnetoresistance (c-type)"},
    {"rho_abk: axial, time-odd, onsager(a,b)", "field-linear resistivity with the Onsager-Kleiner rule"},
    // rank 4
    {"[[V2]2]", "elastic stiffness"},
    {"[V2][V2]", "electrostriction, photoelasticity, quadratic magnetoresistance"},
    {"a[V2][V2]", "c-type [V2][V2]"},
    {"V[V3]", "third-order conductivity, chi(3)"},
    {"aV[V3]", "third-order conductivity, c-type part"},
    {"[V4]", "fully symmetric rank 4"},
    {"V4", "general polar rank 4"},
    {"eV[V2]V", "electrical magnetochiral anisotropy (i-type)"},
    {"aeV[V2]V", "electrical magnetochiral anisotropy, c-type part"},
    {"rho_abkl: sym(kl), onsager(a,b)", "field-quadratic resistivity with the Onsager-Kleiner rule"},
};

struct Args {
  int repeats = 5;
  double probe_timeout = 30; // seconds for each slow-path probe
  bool per_spec = true;
  bool list = false;
};

Args parse_args(int argc, char** argv) {
  Args a;
  const std::string valid =
      "--repeats N (1..1000, default 5), --probe-timeout S (default 30), --no-per-spec, --list, --help";
  for (int i = 1; i < argc; ++i) {
    std::string s = argv[i];
    if (s == "--repeats") {
      if (i + 1 >= argc) fail(ErrorKind::usage, "--repeats needs a number", "--repeats", valid);
      std::string v = argv[++i];
      char* end = nullptr;
      long n = std::strtol(v.c_str(), &end, 10);
      if (v.empty() || *end != '\0' || n < 1 || n > 1000)
        fail(ErrorKind::usage, "'" + v + "' is not a repeat count", "--repeats", "an integer from 1 to 1000");
      a.repeats = static_cast<int>(n);
    } else if (s == "--probe-timeout") {
      if (i + 1 >= argc) fail(ErrorKind::usage, "--probe-timeout needs a number of seconds", "--probe-timeout", valid);
      std::string v = argv[++i];
      char* end = nullptr;
      double t = std::strtod(v.c_str(), &end);
      if (v.empty() || *end != '\0' || !(t > 0) || t > 86400)
        fail(ErrorKind::usage, "'" + v + "' is not a time in seconds", "--probe-timeout", "a number of seconds above 0, at most 86400");
      a.probe_timeout = t;
    } else if (s == "--no-per-spec") {
      a.per_spec = false;
    } else if (s == "--list") {
      a.list = true;
    } else if (s == "--help" || s == "-h") {
      std::printf("usage: tensorsieve_bench [--repeats N] [--probe-timeout S] [--no-per-spec] [--list]\n"
                  "  --repeats N    runs per figure; figures are medians (default 5)\n"
                  "  --probe-timeout S\n"
                  "                 stop each slow-path probe (a child process) after S seconds (default 30)\n"
                  "  --no-per-spec  skip the per-spec breakdown of the catalogue\n"
                  "  --list         print the catalogue's specs and exit\n");
      std::exit(0);
    } else {
      fail(ErrorKind::usage, "unknown argument '" + s + "'", "command line", valid);
    }
  }
  return a;
}

std::string target_ms(double ms) { return "< " + std::to_string(static_cast<int>(ms)) + " ms"; }

// A copy of the group with no cached generators, so each run pays for them.
PointGroup fresh(const PointGroup& g) { return PointGroup::from_closed_set(g.operations(), g.lattice()); }

struct Checksum {
  long forms = 0, parameters = 0, terms = 0;
  void add(const AllowedForm& f) {
    ++forms;
    parameters += f.independent();
    for (const auto& c : f.components) terms += static_cast<long>(c.size());
  }
};

// One big form timed from a fresh group. Rank 6 carries the single-form
// target. An exact-arithmetic failure is printed as the figure (and counts as a
// missed target) so that the remaining figures still appear.
void time_single_form(int repeats, const std::string& what, const TensorSpec& spec,
                      const std::function<AllowedForm()>& job) {
  const bool targeted = spec.rank == 6;
  int independent = -1;
  try {
    Timing t = time_repeated(repeats, [&] { independent = job().independent(); });
    std::string label = what + " (" + std::to_string(independent) + " independent)";
    if (targeted) print_figure(label, duration_text(t.median), target_ms(200), verdict(t.median < 0.2));
    else print_figure(label, duration_text(t.median));
  } catch (const Error& e) {
    std::string why = "FAILED: " + e.problem();
    if (targeted) {
      verdict(false);
      print_figure(what, "no result", target_ms(200), why);
    } else {
      print_figure(what, "no result", "no target", why);
    }
  }
}

// The same for the slower exact paths, in a child process with a time limit.
void time_probe_form(int repeats, double timeout, const std::string& what, const TensorSpec& spec,
                     const std::function<AllowedForm()>& job) {
  const bool targeted = spec.rank == 6;
  ProbeOutcome r = run_in_child(repeats, timeout, [&] { return job().independent(); });
  if (r.status == ProbeOutcome::ok) {
    std::string label = what + " (" + std::to_string(r.independent) + " independent)";
    if (targeted) print_figure(label, duration_text(r.median), target_ms(200), verdict(r.median < 0.2));
    else print_figure(label, duration_text(r.median));
    return;
  }
  char limit[32];
  std::snprintf(limit, sizeof limit, "> %g s", timeout);
  std::string value = r.status == ProbeOutcome::timed_out ? std::string(limit) : "no result";
  std::string why = "FAILED: " + r.message;
  if (targeted) verdict(false);
  print_figure(what, value, targeted ? target_ms(200) : "no target", why);
}

// Start-up: the command-line tool run as a child process, against a bare
// `--version` (the floor: loading the program and its libraries). Every
// command that loads the group catalogue should stay within 1.5 times of it.
// Short runs are noisy, so each takes at least 11 runs. `run` is timed twice: on
// a two-line scenario (the start-up of the scenario path: its loader, both
// catalogues, one form) and on the default example, which adds the example's own
// work (every bar signal, domains, field terms).
void print_startup_figures(int repeats) {
  std::printf("\n");
  const int runs = std::max(repeats, 11);
  const std::string bin = TENSORSIEVE_BINARY, src = TENSORSIEVE_SOURCE_DIR;
  char scenario[] = "/tmp/tensorsieve-bench-XXXXXX.toml";
  const int fd = ::mkstemps(scenario, 5);
  bool have_scenario = fd >= 0;
  if (have_scenario) {
    const std::string text = "responses = [\"conductivity\"]\n[crystal]\ngroup = \"4mm\"\n";
    have_scenario = ::write(fd, text.data(), text.size()) == static_cast<ssize_t>(text.size());
    ::close(fd);
  }
  const std::vector<std::vector<std::string>> commands = {
      {"--version"},
      {"groups"},
      {"group", "4mm"},
      {"form", "4mm", "V"},
      {"response", "conductivity", "m-3m"},
      {"run", have_scenario ? std::string(scenario) : src + "/examples/missing-two-line-scenario.toml"},
      {"run", src + "/examples/strained-film.toml"},
  };
  double floor = 0;
  for (const auto& args : commands) {
    std::vector<std::string> argv{bin};
    argv.insert(argv.end(), args.begin(), args.end());
    std::vector<double> t;
    int status = 0;
    long faults = 0;
    for (int i = 0; i < runs && status == 0; ++i) t.push_back(seconds_of_process(argv, &status, &faults));
    std::string label = "start-up: tensorsieve";
    for (const auto& a : args)
      label += " " + (a.rfind(src + "/", 0) == 0 ? a.substr(src.size() + 1)
                      : a == scenario                ? std::string("(a two-line scenario: 4mm, conductivity)")
                                                     : a);
    if (status != 0) {
      print_figure(label, "no result", "no target", "FAILED: exit status " + std::to_string(status));
      continue;
    }
    const double median = median_of(t);
    const std::string with_faults = duration_text(median) + " " + std::to_string(faults) + " pf";
    if (&args == &commands.front()) {
      floor = median;
      print_figure(label + " (the floor)", with_faults);
      continue;
    }
    if (floor == 0) { // --version itself failed: no floor to compare with
      print_figure(label, with_faults);
      continue;
    }
    char ratio[32];
    std::snprintf(ratio, sizeof ratio, ", %.2fx", median / floor);
    print_figure(label, with_faults, "< 1.5x --version", verdict(median < 1.5 * floor) + ratio);
  }
  if (fd >= 0) ::unlink(scenario);
}

int run(const Args& args) {
  const int R = args.repeats;
  std::vector<TensorSpec> specs;
  for (const auto& s : catalogue_specs) specs.push_back(parse_tensor_spec(s.text));
  if (args.list) {
    for (std::size_t i = 0; i < specs.size(); ++i)
      std::printf("%-40s rank %d  %s\n", catalogue_specs[i].text, specs[i].rank, catalogue_specs[i].meaning);
    return 0;
  }
  const std::string data = data_directory();
  std::printf("tensorsieve_bench %s: timings of the exact engine\n", TENSORSIEVE_VERSION);
  std::printf("  clock std::chrono::steady_clock; 1 thread (hardware threads: %u); %d runs per figure, "
              "median unless marked\n",
              std::thread::hardware_concurrency(), R);
  std::printf("  slow-path probes run in child processes, each stopped after %g s\n", args.probe_timeout);
  std::printf("  data directory %s\n\n", data.c_str());
  print_header();

  // ---- group catalogue load --------------------------------------------------
  std::unique_ptr<GroupCatalogue> cat;
  Timing load = time_repeated(R, [&] { cat = GroupCatalogue::load(data); });
  print_figure("group catalogue load (GroupCatalogue::load), first run", duration_text(load.first));
  print_figure("group catalogue load (GroupCatalogue::load), median", duration_text(load.median));
  Timing table = time_repeated(R, [&] { cat = GroupCatalogue::load_with_table(data); });
  print_figure("group catalogue from the built table (load_with_table), median", duration_text(table.median));
  const auto types = cat->types();
  print_figure("magnetic point-group types in the catalogue", std::to_string(types.size()));
  print_startup_figures(R);

  // ---- the writers on the default example ----------------------------------------
  // The text report wrapped to a terminal of 80 columns, and the HTML page: the
  // summary, the whole report rendered from the Markdown writer, every figure drawn.
  {
    const ScenarioResult example = run_scenario(load_scenario(std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml"));
    set_text_width(80);
    Timing wrapped = time_repeated(R, [&] { (void)wrap_text(write_scenario(example, std::nullopt, Format::text), 80); });
    set_text_width(0);
    print_figure("default example: text report wrapped to 80 columns, median", duration_text(wrapped.median));
    Timing page = time_repeated(R, [&] { (void)write_scenario_html(example, *report_figures(example, true)); });
    print_figure("default example: HTML page with its figures, median", duration_text(page.median));
  }

  // ---- the whole catalogue of forms --------------------------------------------
  const long n_forms = static_cast<long>(specs.size() * types.size());
  std::vector<std::vector<double>> per_spec(specs.size());
  Checksum sum;
  std::vector<double> passes;
  for (int pass = 0; pass < R; ++pass) {
    Checksum c;
    double total = seconds_of([&] {
      for (std::size_t s = 0; s < specs.size(); ++s) {
        double t = seconds_of([&] {
          for (const auto* g : types) c.add(allowed_form(specs[s], g->group));
        });
        per_spec[s].push_back(t);
      }
    });
    passes.push_back(total);
    if (pass == 0) sum = c;
    else if (c.parameters != sum.parameters || c.terms != sum.terms)
      fail(ErrorKind::internal, "the catalogue gave different forms on pass " + std::to_string(pass + 1));
  }
  const double cold = passes.front(), warm = median_of(passes);
  print_figure("catalogue: specs (rank 1-4, listed by --list)", std::to_string(specs.size()));
  print_figure("catalogue: forms (specs x types)", std::to_string(n_forms));
  print_figure("catalogue: sum of independent parameters", std::to_string(sum.parameters));
  print_figure("catalogue: sum of nonzero reduced-component terms", std::to_string(sum.terms));
  print_figure("catalogue wall time, first pass (cold)", duration_text(cold), target_ms(500),
               verdict(cold < 0.5));
  print_figure("catalogue wall time, median of passes", duration_text(warm), target_ms(500),
               verdict(warm < 0.5));
  print_figure("catalogue time per form, first pass", duration_text(cold / n_forms));
  print_figure("catalogue time per form, median pass", duration_text(warm / n_forms));

  std::map<SolverPath, int> paths;
  for (const auto* g : types) ++paths[solver_path(g->group)];
  print_figure("types solved by signed permutations (orbits)",
               std::to_string(paths[SolverPath::signed_permutation]));
  print_figure("types solved in the circular basis x+-iy, z (orbits)",
               std::to_string(paths[SolverPath::circular_basis]));
  print_figure("types solved by elimination over Q(sqrt 3)",
               std::to_string(paths[SolverPath::general_elimination]));

  Timing counts = time_repeated(R, [&] {
    long p = 0;
    for (const auto& s : specs)
      for (const auto* g : types) p += independent_count(s, g->group);
    if (p != sum.parameters) fail(ErrorKind::internal, "independent_count disagrees with allowed_form");
  });
  print_figure("counts only (independent_count, survey path), median", duration_text(counts.median));

  if (args.per_spec) {
    std::printf("\n");
    for (std::size_t s = 0; s < specs.size(); ++s)
      print_figure("  row of " + std::to_string(types.size()) + " forms: " + catalogue_specs[s].text,
                   duration_text(median_of(per_spec[s])));
  }

  // ---- single big tensors ----------------------------------------------------------
  std::printf("\n");
  struct Big {
    const char* spec;
    const char* group;
  };
  // The three centrosymmetric groups kill every odd-rank polar tensor, so V5
  // is also timed in their rotation subgroups, where it has a real form.
  const Big bigs[] = {{"V5", "m-3m"}, {"V5", "6/mmm"}, {"V5", "-3"}, {"V5", "432"}, {"V5", "622"},
                      {"V5", "3"},    {"V6", "m-3m"},  {"V6", "6/mmm"}, {"V6", "-3"}};
  for (const auto& b : bigs) {
    TensorSpec spec = parse_tensor_spec(b.spec);
    const PointGroup& G = cat->get(b.group).group;
    time_single_form(R, "rank " + std::to_string(spec.rank) + ": " + b.spec + " in " + b.group, spec,
                     [&] { return allowed_form(spec, fresh(G)); });
  }

  // ---- the slower exact paths --------------------------------------------------------
  {
    // m-3m turned by 30° about z: its 4-folds about x and y are monomial in
    // neither the Cartesian nor the circular basis, so the solver eliminates.
    Mat3 Q;
    Q.m[0] = {QSqrt3(0, Rational(1, 2)), QSqrt3(Rational(-1, 2)), QSqrt3(0)};
    Q.m[1] = {QSqrt3(Rational(1, 2)), QSqrt3(0, Rational(1, 2)), QSqrt3(0)};
    Q.m[2] = {QSqrt3(0), QSqrt3(0), QSqrt3(1)};
    const PointGroup turned = cat->get("m-3m").group.conjugated(Q);
    if (solver_path(turned) != SolverPath::general_elimination)
      fail(ErrorKind::internal, "the turned m-3m was expected to need elimination");
    for (const char* s : {"[[V2]2]", "V4", "V6"}) {
      TensorSpec spec = parse_tensor_spec(s);
      time_probe_form(R, args.probe_timeout, "rotated setting: " + std::string(s) + " in m-3m turned 30 deg about z",
                      spec, [&] { return allowed_form(spec, fresh(turned)); });
    }
    // 6/mmm with its 6-fold along x, as a structure whose c axis lies along x
    // arrives from spglib: the in-plane rotations are monomial in no basis.
    Mat3 P;
    P.m[0] = {QSqrt3(0), QSqrt3(0), QSqrt3(1)};
    P.m[1] = {QSqrt3(1), QSqrt3(0), QSqrt3(0)};
    P.m[2] = {QSqrt3(0), QSqrt3(1), QSqrt3(0)};
    const PointGroup sideways = cat->get("6/mmm").group.conjugated(P);
    for (const char* s : {"[[V2]2]", "V4", "V6"}) {
      TensorSpec spec = parse_tensor_spec(s);
      time_probe_form(R, args.probe_timeout, "rotated setting: " + std::string(s) + " in 6/mmm with the 6-fold along x",
                      spec, [&] { return allowed_form(spec, fresh(sideways)); });
    }
    // A sample frame z ∥ [111], x ∥ [1-10]: components become surds (√2, √6).
    const NamedGroup& cubic = cat->get("m-3m");
    Frame frame = build_sample_frame({"", "[111]", "[1-10]", "bench"}, "cubic", cubic.group.lattice(), {}).frame;
    for (const char* s : {"[[V2]2]", "V6"}) {
      TensorSpec spec = parse_tensor_spec(s);
      time_probe_form(R, args.probe_timeout, "surds: " + std::string(s) + " in m-3m, z || [111], x || [1-10]", spec,
                      [&] { return allowed_form(spec, fresh(cubic.group), frame); });
    }
  }

  // ---- Measured lattice parameters: big exact rationals in the sample frame --------------
  {
    std::printf("\n");
    for (const char* group : {"4/mmm", "mmm"}) {
      Scenario sc;
      sc.group = group;
      sc.cut = "(123)";
      sc.metric.a = Rational(39051, 10000);
      sc.metric.b = std::string(group) == "mmm" ? Rational(40123, 10000) : Rational(39051, 10000);
      sc.metric.c = Rational(41023, 10000);
      sc.tensors = {"V6"};
      Timing t = time_repeated(1, [&] { (void)run_scenario(sc); });
      print_figure("measured lattice: V6 in " + std::string(group) + ", bulk and (123) cut, a, b, c to 5 digits",
                   duration_text(t.median));
    }
  }

  // ---- Hall bars: signals and a layout design over 26 directions and 12 responses ---------
  {
    std::printf("\n");
    Scenario sc;
    sc.group = "m-3m";
    sc.cut = "(001)";
    LoweringStep strain;
    strain.kind = LoweringKind::strain;
    strain.along = "[120]";
    sc.steps.push_back(strain); // a low-symmetry film: many parameters for every response
    sc.responses = {"conductivity", "resistivity", "ordinary-hall", "anomalous-hall", "magnetoconductivity-linear",
                    "magnetoconductivity-quadratic", "anisotropic-magnetoresistance", "in-plane-hall",
                    "magnetochiral-anisotropy", "second-order-conductivity", "berry-curvature-dipole",
                    "third-order-conductivity"};
    std::vector<std::string> directions;
    for (long u = 0; u <= 5 && directions.size() < 26; ++u)
      for (long v = -5; v <= 5 && directions.size() < 26; ++v)
        if (std::gcd(u, std::labs(v)) == 1 && (u > 0 || v > 0)) directions.push_back(direction_str({u, v, 0}));
    BarSpec bar;
    bar.current = "rotating";
    bar.field = "any";
    Scenario with_bar = sc;
    with_bar.bars.push_back(bar);
    Timing t = time_repeated(R, [&] { (void)run_scenario(with_bar); });
    print_figure("bars: 12 responses, one rotating bar, field in any direction", duration_text(t.median));
    Scenario with_layout = sc;
    for (const auto& id : sc.responses) {
      LayoutSpec l;
      l.response = id;
      l.harmonic = id == "second-order-conductivity" || id == "magnetochiral-anisotropy" ? 2
                   : id == "third-order-conductivity" ? 3 : 1;
      l.directions = directions;
      l.fields = {"along-current", "across-current"};
      with_layout.layouts.push_back(l);
    }
    Timing tl = time_repeated(R, [&] { (void)run_scenario(with_layout); });
    print_figure("layout: 12 responses, 26 low-index directions, 2 field geometries", duration_text(tl.median), "< 1 s",
                 verdict(tl.median < 1.0));
  }
  // ---- what a probe reads: sums and plans over every mechanism at a harmonic ------------
  {
    std::printf("\n");
    Scenario sc = load_scenario(std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml");
    const ScenarioResult res = run_scenario(sc);
    const auto inputs = probe_sum_inputs(res, {});
    Timing ts = time_repeated(R, [&] { (void)probe_sum(inputs, res.bars.at(0).measurement); });
    print_figure("probe sums: default example's bar, every mechanism per probe and harmonic", duration_text(ts.median));
    const LatticeKind lattice = res.chain.front().group.lattice();
    PlanGeometry geometry{&res.sample, res.system, lattice, res.metric, Waveform::sine};
    const LayoutSpec& l = sc.layouts.at(0);
    auto candidates = layout_candidates(l.directions, l.rosette, res.sample, res.system, lattice, res.metric, "bench");
    Timing tp = time_repeated(R, [&] { (void)design_plan(inputs, 2, candidates, l.fields, geometry); });
    print_figure("plan: default example at 2ω, every mechanism together (exact rank)", duration_text(tp.median),
                 "< 0.1 s", verdict(tp.median < 0.1));

    Scenario film;
    film.group = "m-3m";
    film.cut = "(111)";
    LoweringStep field;
    field.kind = LoweringKind::magnetic_field;
    field.along = "[1-10]";
    film.steps.push_back(field);
    film.responses = {"second-order-conductivity", "berry-curvature-dipole", "intrinsic-nonlinear-hall",
                      "magnetochiral-anisotropy", "unidirectional-magnetoresistance"};
    LayoutSpec plan2;
    plan2.harmonic = 2;
    plan2.fields = {"along-current", "across-current"};
    film.layouts.push_back(plan2);
    const ScenarioResult fr = run_scenario(film);
    const auto film_inputs = probe_sum_inputs(fr, {});
    auto film_candidates = layout_candidates({}, {}, fr.sample, fr.system, fr.chain.front().group.lattice(), fr.metric,
                                             "bench");
    PlanGeometry fg{&fr.sample, fr.system, fr.chain.front().group.lattice(), fr.metric, Waveform::sine};
    MeasurementPlan shown = design_plan(film_inputs, 2, film_candidates, plan2.fields, fg);
    Timing tf = time_repeated(R, [&] { (void)design_plan(film_inputs, 2, film_candidates, plan2.fields, fg); });
    print_figure("plan: (111) film in a field, " + std::to_string(shown.mechanisms.size()) + " mechanisms, " +
                     std::to_string(shown.columns.size()) + " unknowns, " + std::to_string(film_candidates.size()) +
                     " directions at 2ω",
                 duration_text(tf.median), "< 0.1 s", verdict(tf.median < 0.1));

    Scenario torques = load_scenario(std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/magnetised-film-harmonic-hall.toml");
    Timing tt = time_repeated(R, [&] { (void)run_scenario(torques); });
    print_figure("run: harmonic Hall to third order in m (rank-6 expansion), sums and plan", duration_text(tt.median));
  }
  // ---- light-driven: pump-probe across a spin reorientation, photocurrents of a film -------
  {
    Scenario sc;
    sc.group = "mm2"; // polar: photocurrents flow; each moment direction gives a magnetic phase
    sc.z = "[001]";
    sc.responses = {"inverse-faraday", "photogalvanic"};
    PumpProbeSpec pp;
    pp.azimuth = "rotating";
    pp.incidence = "45";
    for (const char* moment : {"[100]", "[001]", "[010]"}) {
      PumpPhaseSpec ph;
      ph.steps.push_back(parse_lowering_option(std::string("moment:") + moment, "bench"));
      pp.phases.push_back(ph);
    }
    sc.pump_probe.push_back(pp);
    PhotocurrentSpec pc;
    sc.photocurrents.push_back(pc);
    Timing t = time_repeated(R, [&] { (void)run_scenario(sc); });
    print_figure("pump-probe (3 phases) and photocurrents, mm2, 4 polarisations", duration_text(t.median));
  }
  print_inverse_figures(R);
  print_fit_figures(R);

  // ---- memory and summary ---------------------------------------------------------------
  std::printf("\n");
  char mem[32];
  const double mib = peak_memory_mib();
  std::snprintf(mem, sizeof mem, "%.1f MiB", mib);
  print_figure("peak memory, benchmark process (getrusage ru_maxrss)", mem, "< 200 MB",
               verdict(mib * 1.048576 < 200.0));
  const double child = peak_memory_children_mib();
  std::snprintf(mem, sizeof mem, "%.1f MiB", child);
  print_figure("peak memory, largest probe process (RUSAGE_CHILDREN)", mem, "< 200 MB",
               verdict(child * 1.048576 < 200.0));
  std::printf("\ntargets met: %d of %d\n", targets_met(), targets_checked());
  return 0;
}

} // namespace
} // namespace ts::bench

int main(int argc, char** argv) {
  try {
    return ts::bench::run(ts::bench::parse_args(argc, argv));
  } catch (const ts::Error& e) {
    std::cerr << "tensorsieve_bench: error: " << e.what() << "\n";
    return e.exit_code();
  } catch (const std::exception& e) {
    std::cerr << "tensorsieve_bench: internal error: " << e.what() << "\n";
    return static_cast<int>(ts::ErrorKind::internal);
  }
}
