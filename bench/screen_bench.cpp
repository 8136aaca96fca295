// tensorsieve_screen_bench: structures per second of `tensorsieve screen`, on
// 1 and 2 worker processes, for 1000 invented structures written as mCIF files.
//
// The structures are tilted perovskites (the 15 Glazer systems, 40-atom
// supercells, from build_tilted_perovskite) with random collinear moments on
// the 8 B sites: a random sign per site from a fixed generator state and an axis drawn from
// [100], [001], [110], [111]. They are invented data for timing only. The
// program prints the rate of the symmetry search alone (reading the file and
// spglib's magnetic search) beside the rate of the whole screening, so the
// share of the tensor work can be read off. Figures are printed, never
// asserted (docs/performance.md).
#include "bench_clock.hpp"

#include "lowering/glazer_tilts.hpp"
#include "lowering/structure_file.hpp"
#include "lowering/structure_symmetry.hpp"
#include "lowering/structure_table.hpp"
#include "scenario/screening.hpp"

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>
#include <random>
#include <sstream>
#include <thread>

#include <unistd.h>

namespace fs = std::filesystem;

namespace {

std::string invented_mcif(const ts::CrystalStructure& cell, const std::array<double, 3>& axis, std::mt19937& random,
                          int serial) {
  std::ostringstream os;
  os.precision(8);
  os << "# invented for the screening benchmark\ndata_bench_" << serial << "\n";
  const char* names[3] = {"a", "b", "c"};
  for (int i = 0; i < 3; ++i) {
    for (int j = 0; j < 3; ++j)
      if (i != j && std::fabs(cell.lattice[i][j]) > 1e-9) {
        std::fprintf(stderr, "tensorsieve_screen_bench: tilted cell is not orthogonal\n");
        std::exit(1);
      }
    os << "_cell_length_" << names[i] << " " << cell.lattice[i][i] << "\n";
  }
  os << "_cell_angle_alpha 90\n_cell_angle_beta 90\n_cell_angle_gamma 90\n";
  os << "loop_\n_atom_site_label\n_atom_site_type_symbol\n_atom_site_fract_x\n_atom_site_fract_y\n_atom_site_fract_z\n";
  for (std::size_t k = 0; k < cell.sites.size(); ++k) {
    const auto& s = cell.sites[k];
    os << s.species << k + 1 << " " << s.species << " " << s.frac[0] << " " << s.frac[1] << " " << s.frac[2] << "\n";
  }
  os << "loop_\n_atom_site_moment.label\n_atom_site_moment.crystalaxis_x\n_atom_site_moment.crystalaxis_y\n"
        "_atom_site_moment.crystalaxis_z\n";
  std::bernoulli_distribution up(0.5);
  for (std::size_t k = 0; k < cell.sites.size(); ++k) {
    if (cell.sites[k].species != "B") continue;
    const double sign = up(random) ? 3.0 : -3.0;
    os << "B" << k + 1 << " " << sign * axis[0] << " " << sign * axis[1] << " " << sign * axis[2] << "\n";
  }
  return os.str();
}

// An n x n x n supercell of a cubic perovskite (a = 3.9 A, invented for timing), atom by atom.
std::string perovskite_supercell_toml(int n) {
  std::ostringstream os;
  os.precision(12);
  os << "[structure]\nlattice = [[" << 3.9 * n << ", 0, 0], [0, " << 3.9 * n << ", 0], [0, 0, " << 3.9 * n
     << "]]\nsites = [\n";
  const std::pair<const char*, std::array<double, 3>> basis[] = {
      {"A", {0, 0, 0}}, {"B", {0.5, 0.5, 0.5}}, {"O", {0.5, 0.5, 0}}, {"O", {0.5, 0, 0.5}}, {"O", {0, 0.5, 0.5}}};
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j)
      for (int k = 0; k < n; ++k)
        for (const auto& [species, f] : basis)
          os << "{ species = \"" << species << "\", at = [" << (i + f[0]) / n << ", " << (j + f[1]) / n << ", "
             << (k + f[2]) / n << "] },\n";
  os << "]\n";
  return os.str();
}

// Large cells: reading a structure block (with the check that no two atoms share a spot)
// should grow linearly with the number of atoms; spglib's own search is timed beside it.
void large_cells() {
  std::printf("large cells (cubic perovskite supercells, structure TOML, 1 thread):\n");
  std::printf("  %7s  %12s  %14s  %12s\n", "atoms", "TOML parse", "our checks", "spglib");
  for (int n : {2, 4, 8, 12, 16}) {
    const std::string text = perovskite_supercell_toml(n);
    toml::table doc;
    const double parse = ts::bench::seconds_of([&] { doc = toml::parse(std::string_view(text), std::string_view("bench.toml")); });
    ts::CrystalStructure cell;
    const double read = ts::bench::seconds_of(
        [&] { cell = ts::parse_structure(*doc["structure"].as_table(), "bench.toml:[structure]"); });
    const double search = ts::bench::seconds_of([&] { ts::find_structure_symmetry(cell); });
    std::printf("  %7zu  %10.3f s  %12.3f s  %10.3f s\n", cell.sites.size(), parse, read, search);
  }
}

} // namespace

int main() {
  using namespace ts;
  const int count = 1000;
  const fs::path dir = fs::temp_directory_path() / ("tensorsieve-screen-bench-" + std::to_string(::getpid()));
  fs::create_directories(dir);
  std::vector<TiltedPerovskite> systems;
  for (const auto& g : all_glazer_tilt_systems()) systems.push_back(build_tilted_perovskite(parse_glazer_symbol(g)));
  const std::array<double, 3> axes[] = {{1, 0, 0}, {0, 0, 1}, {1, 1, 0}, {1, 1, 1}};
  std::mt19937 random(20261201);
  ScreenRequest request;
  for (int n = 0; n < count; ++n) {
    char name[32];
    std::snprintf(name, sizeof name, "s%04d.mcif", n);
    const auto& axis = axes[std::uniform_int_distribution<int>(0, 3)(random)];
    std::ofstream(dir / name) << invented_mcif(systems[static_cast<std::size_t>(n) % systems.size()].cell, axis, random, n);
    request.files.push_back((dir / name).string());
  }
  request.responses = {"anomalous-hall", "linear-magnetoelectric", "second-order-conductivity"};

  std::printf("tensorsieve screening benchmark: %d invented tilted-perovskite mCIF files (40 atoms each), "
              "responses anomalous-hall, linear-magnetoelectric, second-order-conductivity\n", count);
  std::printf("cores reported by the system: %u\n", std::thread::hardware_concurrency());
  // As a screening worker makes it: the library called in this process (a
  // worker is disposable; only a lone retry isolates every call).
  set_symmetry_library_isolation(false);
  const double search = bench::seconds_of([&] {
    for (const auto& f : request.files) {
      try {
        find_structure_symmetry(read_structure_file(f, request.options));
      } catch (const Error&) {
        // counted below, from the screening rows
      }
    }
  });
  set_symmetry_library_isolation(true);
  std::printf("  %-48s %8.1f structures/s\n", "symmetry search only (read + spglib), 1 process:", count / search);
  int failed = 0;
  double one_thread = 0;
  for (unsigned threads : {1u, 2u}) {
    std::vector<ScreenRow> rows;
    const double t = bench::seconds_of([&] { rows = screen_structures(request, threads); });
    failed = 0;
    for (const auto& r : rows) failed += r.error.empty() ? 0 : 1;
    const std::string label = "mixed folder (15 tilt systems), " + std::to_string(threads) +
                              (threads == 1 ? " worker process:" : " worker processes:");
    std::printf("  %-48s %8.1f structures/s", label.c_str(), count / t);
    if (threads == 1) std::printf("  (the search is %.0f%% of it)", 100 * search / t);
    if (threads == 1) one_thread = t;
    else std::printf("  (%.2fx the rate of 1 worker)", one_thread / t);
    std::printf("\n");
  }
  if (failed) std::printf("  %d of the files failed (see tensorsieve screen on the folder)\n", failed);
  // The same folder size with one tilt system and one moment axis throughout: every file
  // has the same group, so what files share is as large as it gets.
  ScreenRequest repeated = request;
  repeated.files.clear();
  const fs::path same = dir / "same";
  fs::create_directories(same);
  for (int n = 0; n < count; ++n) {
    char name[32];
    std::snprintf(name, sizeof name, "r%04d.mcif", n);
    std::mt19937 fixed(7); // the same moments in every file
    std::ofstream(same / name) << invented_mcif(systems.back().cell, axes[1], fixed, n);
    repeated.files.push_back((same / name).string());
  }
  double one_worker = 0;
  for (unsigned threads : {1u, 2u}) {
    const double t = bench::seconds_of([&] { screen_structures(repeated, threads); });
    const std::string label = "one repeated group, " + std::to_string(threads) +
                              (threads == 1 ? " worker process:" : " worker processes:");
    std::printf("  %-48s %8.1f structures/s", label.c_str(), count / t);
    if (threads == 1) one_worker = t;
    else std::printf("  (%.2fx the rate of 1 worker)", one_worker / t);
    std::printf("\n");
  }
  if (!std::getenv("TENSORSIEVE_BENCH_KEEP")) fs::remove_all(dir);
  large_cells();
  return 0;
}
