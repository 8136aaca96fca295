#include "lowering/structure_table.hpp"

#include "core/error.hpp"
#include "data/toml_read.hpp"
#include "lowering/site_grid.hpp"

#include <spglib.h>
#include <stdio_ext.h>
#include <sys/wait.h>
#include <unistd.h>

#include <atomic>
#include <cerrno>
#include <cmath>
#include <cstring>
#include <functional>
#include <map>
#include <memory>
#include <set>
#include <sstream>

namespace ts {

namespace {

using Mat = std::array<std::array<double, 3>, 3>;
using IMat = std::array<std::array<int, 3>, 3>;

const char* const kSpglibValid =
    "atoms of one species further apart than symprec: merge atoms listed twice, or give a symprec below the "
    "shortest distance between two atoms that are not images of each other";

std::string number_text(double x) {
  std::ostringstream s;
  s.precision(10);
  s << x;
  return s.str();
}

// "cell.toml:7:14", the one position format of every file error, when toml++ knows the
// position (the file is the one the node was read from); the section named in `where` otherwise.
std::string locate(const std::string& where, const toml::source_region& r) {
  return toml_read::at(r.path && !r.path->empty() ? *r.path : where, r);
}

std::string locate(const std::string& where, const toml::node* n) { return n ? locate(where, n->source()) : where; }

[[noreturn]] void bad(const std::string& where, const toml::node* n, const std::string& field,
                      const std::string& problem, const std::string& valid) {
  fail(ErrorKind::bad_file, field + ": " + problem, locate(where, n), valid);
}

using toml_read::type_name;

double read_number(const toml::node& n, const std::string& where, const std::string& field,
                   const std::string& valid) {
  double x = 0;
  if (auto i = n.as_integer()) {
    x = static_cast<double>(i->get());
  } else if (auto f = n.as_floating_point()) {
    x = f->get();
  } else {
    bad(where, &n, field, std::string("expected a number, got ") + type_name(n), valid);
  }
  if (!std::isfinite(x)) bad(where, &n, field, "expected a finite number, got " + number_text(x), valid);
  return x;
}

std::array<double, 3> read_vec3(const toml::node& n, const std::string& where,
                                const std::string& field, const std::string& valid) {
  const toml::array* a = n.as_array();
  if (!a) bad(where, &n, field, std::string("expected an array of 3 numbers, got ") + type_name(n), valid);
  if (a->size() != 3)
    bad(where, &n, field, "expected 3 numbers, got " + std::to_string(a->size()), valid);
  std::array<double, 3> v{};
  for (std::size_t i = 0; i < 3; ++i)
    v[i] = read_number(*a->get(i), where, field + "[" + std::to_string(i + 1) + "]", valid);
  return v;
}

double det3(const Mat& m) {
  return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) -
         m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
         m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
}

Mat inverse3(const Mat& m) {
  const double d = det3(m);
  Mat r{};
  r[0][0] = (m[1][1] * m[2][2] - m[1][2] * m[2][1]) / d;
  r[0][1] = (m[0][2] * m[2][1] - m[0][1] * m[2][2]) / d;
  r[0][2] = (m[0][1] * m[1][2] - m[0][2] * m[1][1]) / d;
  r[1][0] = (m[1][2] * m[2][0] - m[1][0] * m[2][2]) / d;
  r[1][1] = (m[0][0] * m[2][2] - m[0][2] * m[2][0]) / d;
  r[1][2] = (m[0][2] * m[1][0] - m[0][0] * m[1][2]) / d;
  r[2][0] = (m[1][0] * m[2][1] - m[1][1] * m[2][0]) / d;
  r[2][1] = (m[0][1] * m[2][0] - m[0][0] * m[2][1]) / d;
  r[2][2] = (m[0][0] * m[1][1] - m[0][1] * m[1][0]) / d;
  return r;
}

double norm(const std::array<double, 3>& v) { return std::sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]); }

std::array<double, 3> to_cartesian(const Mat& lattice, const std::array<double, 3>& f) {
  std::array<double, 3> r{};
  for (int i = 0; i < 3; ++i)
    for (int k = 0; k < 3; ++k) r[i] += lattice[k][i] * f[k];
  return r;
}

// cos of an angle in degrees, exact at the angles cells are usually given with,
// so that a = b = c, 90, 90, 90 gives a lattice with exact zeros.
double cos_degrees(double deg) {
  if (deg == 90) return 0;
  if (deg == 60) return 0.5;
  if (deg == 120) return -0.5;
  return std::cos(deg * M_PI / 180);
}

Mat lattice_from_parameters(const toml::table& block, const std::string& where) {
  static const char* names[6] = {"a", "b", "c", "alpha", "beta", "gamma"};
  const std::string valid =
      "a, b, c > 0 in Angstrom and alpha, beta, gamma strictly between 0 and 180 degrees "
      "(alpha = angle(b, c), beta = angle(a, c), gamma = angle(a, b))";
  double p[6];
  for (int i = 0; i < 6; ++i) {
    const toml::node* n = block.get(names[i]);
    if (!n)
      bad(where, &block, names[i], "missing; the cell parameters need all six of a, b, c, alpha, beta, gamma",
          valid + ", or give lattice = [[ax, ay, az], [bx, by, bz], [cx, cy, cz]] instead");
    p[i] = read_number(*n, where, names[i], valid);
    if (i < 3 && p[i] <= 0) bad(where, n, names[i], "must be positive, got " + number_text(p[i]), valid);
    if (i >= 3 && (p[i] <= 0 || p[i] >= 180))
      bad(where, n, names[i], "must lie strictly between 0 and 180 degrees, got " + number_text(p[i]), valid);
  }
  Mat m{};
  if (!lattice_from_cell_parameters({p[0], p[1], p[2], p[3], p[4], p[5]}, &m))
    bad(where, block.get("alpha"), "alpha, beta, gamma",
        "these angles do not form a cell (each must be smaller than the sum of the other two, "
        "and all three below 360 together)",
        valid);
  return m;
}

Mat read_lattice(const toml::table& block, const std::string& where) {
  const toml::node* lat = block.get("lattice");
  bool any_parameter = false;
  for (const char* k : {"a", "b", "c", "alpha", "beta", "gamma"}) any_parameter |= block.contains(k);
  const std::string valid =
      "lattice = [[ax, ay, az], [bx, by, bz], [cx, cy, cz]] (rows a, b, c in Cartesian Angstrom), "
      "or a, b, c (Angstrom) and alpha, beta, gamma (degrees)";
  if (lat && any_parameter)
    bad(where, lat, "lattice", "given together with cell parameters (a, b, c, alpha, beta, gamma); give one of the two",
        valid);
  if (!lat && !any_parameter) bad(where, &block, "lattice", "missing", valid);
  Mat m{};
  if (lat) {
    const toml::array* rows = lat->as_array();
    if (!rows) bad(where, lat, "lattice", std::string("expected an array of 3 rows, got ") + type_name(*lat), valid);
    if (rows->size() != 3)
      bad(where, lat, "lattice", "expected 3 rows (a, b, c), got " + std::to_string(rows->size()), valid);
    for (std::size_t i = 0; i < 3; ++i)
      m[i] = read_vec3(*rows->get(i), where, "lattice[" + std::to_string(i + 1) + "]", valid);
  } else {
    m = lattice_from_parameters(block, where);
  }
  const double scale = norm(m[0]) * norm(m[1]) * norm(m[2]);
  if (scale == 0 || std::fabs(det3(m)) < 1e-6 * scale)
    bad(where, lat ? lat : &block, "lattice", "the three lattice vectors are (nearly) coplanar or zero",
        "three linearly independent vectors a, b, c");
  // A left-handed cell describes the same crystal, but spglib's magnetic search reads
  // out of bounds on one (a crash found by fuzzing), so it is refused with the remedy.
  if (det3(m) < 0)
    bad(where, lat ? lat : &block, "lattice", "the lattice vectors a, b, c are left-handed: a·(b × c) < 0",
        "a right-handed set: reverse one vector, or swap two");
  return m;
}

void reject_unknown_keys(const toml::table& t, const std::set<std::string>& known, const std::string& where,
                         const std::string& table) {
  const std::string file = t.source().path && !t.source().path->empty() ? *t.source().path : where;
  toml_read::check_keys(t, known, file, table);
}

AtomSite read_site(const toml::node& n, std::size_t index, const std::string& where, bool* has_moment) {
  const std::string name = "sites[" + std::to_string(index + 1) + "]";
  const std::string valid = std::string("{ species = \"Ti\", at = [x, y, z] (fractional), ") +
                            "moment = [mx, my, mz] (Cartesian, optional) }";
  const toml::table* t = n.as_table();
  if (!t) bad(where, &n, name, std::string("expected a table, got ") + type_name(n), valid);
  reject_unknown_keys(*t, {"species", "at", "moment"}, where, name);
  AtomSite site;
  const toml::node* sp = t->get("species");
  if (!sp) bad(where, t, name + ".species", "missing", valid);
  if (!sp->is_string()) bad(where, sp, name + ".species", std::string("expected a string, got ") + type_name(*sp), valid);
  site.species = sp->as_string()->get();
  if (site.species.empty()) bad(where, sp, name + ".species", "empty", valid);
  const toml::node* at = t->get("at");
  if (!at) bad(where, t, name + ".at", "missing", valid);
  site.frac = read_vec3(*at, where, name + ".at", valid);
  if (const toml::node* mo = t->get("moment")) {
    site.moment = read_vec3(*mo, where, name + ".moment", valid);
    *has_moment = true;
  }
  return site;
}

// Two atoms on one spot make spglib fail with a bare "too close" message; say which.
void reject_coincident_sites(const CrystalStructure& cell, const toml::array& sites, const std::string& where) {
  constexpr double too_close = 1e-3; // Angstrom
  SiteGrid grid(cell.lattice, too_close);
  for (std::size_t i = 0; i < cell.sites.size(); ++i) {
    for (std::size_t j : grid.candidates(cell.sites[i].frac)) {
      std::array<double, 3> d{};
      for (int k = 0; k < 3; ++k) {
        d[k] = cell.sites[i].frac[k] - cell.sites[j].frac[k];
        d[k] -= std::round(d[k]);
      }
      if (norm(to_cartesian(cell.lattice, d)) < too_close)
        bad(where, sites.get(i)->as_table()->get("at"), "sites[" + std::to_string(i + 1) + "].at",
            "lies on the same point as sites[" + std::to_string(j + 1) + "] (closer than 0.001 Angstrom)",
            "each atom at its own position; list an atom once");
    }
    grid.insert(cell.sites[i].frac, i);
  }
}

// What the symmetry search answers, as plain bytes: it is computed in a child
// process (run_isolated) and sent back through a pipe.
struct SpglibAnswer {
  bool ok = false, crashed = false;
  char problem[200] = {};
  int space_group_number = 0, uni_number = 0, magnetic_type = 0;
  char space_group_symbol[32] = {}, point_group_symbol[16] = {}, bns_number[24] = {};
  // Rows a, b, c of the basis the rotations are written in: the input lattice,
  // or the primitive cell of the structure when the input axes miss operations.
  double lattice[3][3] = {};
  bool primitive_basis = false;
  int n_operations = 0; // distinct (W, time reversal) pairs, spglib's order
  int rotations[192][3][3] = {};
  unsigned char time_reversals[192] = {};
};

void copy_text(char* to, std::size_t size, const char* from) {
  std::size_t n = 0;
  for (; from && from[n] && n + 1 < size; ++n) to[n] = from[n];
  while (n > 0 && to[n - 1] == ' ') --n;
  to[n] = 0;
}

void keep_operation(SpglibAnswer* a, const int (*rotation)[3], bool primed) {
  for (int k = 0; k < a->n_operations; ++k) {
    bool same = a->time_reversals[k] == (primed ? 1 : 0);
    for (int i = 0; i < 3 && same; ++i)
      for (int j = 0; j < 3 && same; ++j) same = a->rotations[k][i][j] == rotation[i][j];
    if (same) return;
  }
  if (a->n_operations == 192) return; // a point group has at most 48 operations, 96 with primes
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) a->rotations[a->n_operations][i][j] = rotation[i][j];
  a->time_reversals[a->n_operations++] = primed ? 1 : 0;
}

// spglib's own reason for an empty answer.
void note_failure(SpglibAnswer* a) {
  const SpglibError code = spg_get_error_code();
  copy_text(a->problem, sizeof a->problem, code == SPGLIB_SUCCESS ? "no result" : spg_get_error_message(code));
}

// Order of a crystallographic point group from spglib's symbol; 0 if unknown.
int point_group_order(const std::string& symbol) {
  static const std::map<std::string, int> orders = {
      {"1", 1},    {"-1", 2},   {"2", 2},     {"m", 2},    {"2/m", 4},  {"222", 4},   {"mm2", 4},  {"mmm", 8},
      {"4", 4},    {"-4", 4},   {"4/m", 8},   {"422", 8},  {"4mm", 8},  {"-42m", 8},  {"4/mmm", 16}, {"3", 3},
      {"-3", 6},   {"32", 6},   {"3m", 6},    {"-3m", 12}, {"6", 6},    {"-6", 6},    {"6/m", 12}, {"622", 12},
      {"6mm", 12}, {"-6m2", 12}, {"6/mmm", 24}, {"23", 12},  {"m-3", 24}, {"432", 24},  {"-43m", 24}, {"m-3m", 48}};
  auto it = orders.find(symbol);
  return it == orders.end() ? 0 : it->second;
}

SpglibAnswer spglib_search(double lattice[3][3], double (*positions)[3], const int* types, const double* moments, int n,
                           bool magnetic, double symprec) {
  SpglibAnswer a;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) a.lattice[i][j] = lattice[j][i];
  if (!magnetic) {
    SpglibDataset* ds = spg_get_dataset(lattice, positions, types, n, symprec);
    if (!ds || ds->n_operations <= 0) {
      note_failure(&a);
      if (ds) spg_free_dataset(ds);
      return a;
    }
    a.space_group_number = ds->spacegroup_number;
    copy_text(a.space_group_symbol, sizeof a.space_group_symbol, ds->international_symbol);
    copy_text(a.point_group_symbol, sizeof a.point_group_symbol, ds->pointgroup_symbol);
    for (int k = 0; k < ds->n_operations; ++k) keep_operation(&a, ds->rotations[k], false);
    spg_free_dataset(ds);
  } else {
    // Moments are axial rank-1 site tensors: a mirror keeps the component
    // normal to it and reverses the others; time reversal reverses all.
    SpglibMagneticDataset* ds =
        spg_get_magnetic_dataset(lattice, positions, types, moments, /*tensor_rank=*/1, n, /*is_axial=*/1, symprec);
    if (!ds || ds->n_operations <= 0) {
      note_failure(&a);
      if (ds) spg_free_magnetic_dataset(ds);
      return a;
    }
    a.uni_number = ds->uni_number;
    a.magnetic_type = ds->msg_type;
    copy_text(a.bns_number, sizeof a.bns_number, spg_get_magnetic_spacegroup_type(ds->uni_number).bns_number);
    const SpglibSpacegroupType sg = spg_get_spacegroup_type(ds->hall_number);
    a.space_group_number = sg.number;
    copy_text(a.space_group_symbol, sizeof a.space_group_symbol, sg.international_short);
    copy_text(a.point_group_symbol, sizeof a.point_group_symbol, sg.pointgroup_international);
    for (int k = 0; k < ds->n_operations; ++k) keep_operation(&a, ds->rotations[k], ds->time_reversals[k] != 0);
    spg_free_magnetic_dataset(ds);
  }
  a.ok = true;
  return a;
}

// spglib writes the operations in the axes it is given and leaves out those
// whose matrix there is not an integer one: a hexagonal crystal in an
// orthohexagonal (C-centred) cell loses its threefold axis that way. When fewer
// rotations come back than the point group has, the search is repeated on the
// primitive cell of the same atoms (moments kept apart by giving each
// species-and-moment its own type), with the Cartesian frame unchanged.
SpglibAnswer spglib_answer(double lattice[3][3], double (*positions)[3], const int* types, const double* moments, int n,
                           bool magnetic, double symprec) {
  SpglibAnswer a = spglib_search(lattice, positions, types, moments, n, magnetic, symprec);
  if (!a.ok) return a;
  std::set<std::array<int, 9>> rotations;
  for (int k = 0; k < a.n_operations; ++k) {
    std::array<int, 9> r{};
    for (int i = 0; i < 9; ++i) r[i] = a.rotations[k][i / 3][i % 3];
    rotations.insert(r);
  }
  const int order = point_group_order(a.point_group_symbol);
  if (order == 0 || static_cast<int>(rotations.size()) >= order) return a;

  std::map<std::pair<int, std::array<double, 3>>, int> kinds;
  std::vector<int> kind(static_cast<std::size_t>(n));
  std::vector<std::pair<int, std::array<double, 3>>> kind_of;
  for (int i = 0; i < n; ++i) {
    std::array<double, 3> m{};
    for (int k = 0; k < 3; ++k) m[k] = magnetic ? std::round(moments[3 * i + k] * 1e4) / 1e4 : 0.0;
    auto it = kinds.emplace(std::make_pair(types[i], m), static_cast<int>(kinds.size()) + 1).first;
    if (it->second > static_cast<int>(kind_of.size())) kind_of.push_back(it->first);
    kind[static_cast<std::size_t>(i)] = it->second;
  }
  double prim_lattice[3][3];
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) prim_lattice[i][j] = lattice[i][j];
  std::unique_ptr<double[][3]> prim_positions(new double[static_cast<std::size_t>(n)][3]);
  for (int i = 0; i < n; ++i)
    for (int k = 0; k < 3; ++k) prim_positions[i][k] = positions[i][k];
  std::vector<int> prim_kind = kind;
  const int m = spg_standardize_cell(prim_lattice, prim_positions.get(), prim_kind.data(), n, /*to_primitive=*/1,
                                     /*no_idealize=*/1, symprec);
  if (m <= 0 || m > n) return a;
  std::vector<int> prim_types(static_cast<std::size_t>(m));
  std::vector<double> prim_moments(3 * static_cast<std::size_t>(m));
  for (int i = 0; i < m; ++i) {
    const auto& km = kind_of[static_cast<std::size_t>(prim_kind[static_cast<std::size_t>(i)] - 1)];
    prim_types[static_cast<std::size_t>(i)] = km.first;
    for (int k = 0; k < 3; ++k) prim_moments[3 * static_cast<std::size_t>(i) + k] = km.second[k];
  }
  SpglibAnswer b = spglib_search(prim_lattice, prim_positions.get(), prim_types.data(), prim_moments.data(), m,
                                 magnetic, symprec);
  if (!b.ok || b.n_operations <= a.n_operations) return a;
  b.primitive_basis = true;
  return b;
}

// spglib runs in a child process: a crash inside it (found with near-flat
// cells and large tolerances on magnetic cells) ends the child, not the run,
// and becomes an error of this one structure. The child also has its own copy
// of spglib's global error code, so searches on several threads need no lock
// and run in parallel.
std::atomic<bool> g_isolated{true};

SpglibAnswer run_isolated(const std::function<SpglibAnswer()>& search) {
  // A process that is itself a disposable worker (screening) calls spglib
  // directly: a fork per call from a process holding the catalogues cost two
  // thirds of a screening's time.
  if (!g_isolated) return search();
  int fds[2];
  SpglibAnswer failed;
  failed.crashed = true;
  if (::pipe(fds) != 0) {
    copy_text(failed.problem, sizeof failed.problem, "no pipe to a child process");
    return failed;
  }
  const pid_t pid = ::fork();
  if (pid < 0) {
    ::close(fds[0]);
    ::close(fds[1]);
    copy_text(failed.problem, sizeof failed.problem, "no child process");
    return failed;
  }
  if (pid == 0) {
    ::close(fds[0]);
    // Another thread may have held a stream's lock at the fork; spglib's warnings
    // must not wait for it in this copy, where nobody will release it.
    __fsetlocking(stderr, FSETLOCKING_BYCALLER);
    __fsetlocking(stdout, FSETLOCKING_BYCALLER);
    const SpglibAnswer a = search();
    const char* p = reinterpret_cast<const char*>(&a);
    std::size_t left = sizeof a;
    while (left > 0) {
      const ssize_t w = ::write(fds[1], p, left);
      if (w < 0 && errno == EINTR) continue;
      if (w <= 0) ::_exit(3);
      p += w;
      left -= static_cast<std::size_t>(w);
    }
    ::_exit(0);
  }
  ::close(fds[1]);
  SpglibAnswer a;
  char* p = reinterpret_cast<char*>(&a);
  std::size_t got = 0;
  while (got < sizeof a) {
    const ssize_t r = ::read(fds[0], p + got, sizeof a - got);
    if (r < 0 && errno == EINTR) continue;
    if (r <= 0) break;
    got += static_cast<std::size_t>(r);
  }
  ::close(fds[0]);
  int status = 0;
  while (::waitpid(pid, &status, 0) < 0 && errno == EINTR) {
  }
  if (got == sizeof a && WIFEXITED(status) && WEXITSTATUS(status) == 0) return a;
  const std::string why = WIFSIGNALED(status) ? std::string("signal ") + std::to_string(WTERMSIG(status)) + ", " +
                                                    ::strsignal(WTERMSIG(status))
                                              : "the search ended without an answer";
  copy_text(failed.problem, sizeof failed.problem, why.c_str());
  return failed;
}

// Entries of point operations in Cartesian frames aligned with the lattice are
// 0, ±1/2, ±1 and ±√3/2; removing the rounding noise of M^T W M^-T there lets
// the exact group engine recognise them without a tolerance of its own.
double snapped(double v) {
  static const double exact[] = {0, 0.5, 1, 0.86602540378443864676};
  for (double e : exact) {
    if (std::fabs(v - e) < 1e-12) return e;
    if (std::fabs(v + e) < 1e-12) return -e;
  }
  return v;
}


} // namespace

void set_symmetry_library_isolation(bool on) { g_isolated = on; }

bool lattice_from_cell_parameters(const std::array<double, 6>& p, std::array<std::array<double, 3>, 3>* lattice) {
  // An angle within 1e-6 degrees of 0 or 180 flattens the cell: sin(gamma)
  // rounds to zero and the lattice would be NaN, which crashed spglib.
  for (int i = 0; i < 6; ++i)
    if (!std::isfinite(p[i]) || p[i] <= 0) return false;
  for (int i = 3; i < 6; ++i)
    if (p[i] < 1e-6 || p[i] > 180 - 1e-6) return false;
  const double ca = cos_degrees(p[3]), cb = cos_degrees(p[4]), cg = cos_degrees(p[5]);
  const double sg = std::sqrt(1 - cg * cg);
  if (!(sg > 1e-9)) return false;
  const double cy = (ca - cb * cg) / sg;
  const double cz2 = 1 - cb * cb - cy * cy;
  if (!(cz2 > 1e-12)) return false;
  // a along x, b in the xy plane, c completing a right-handed set.
  Mat& m = *lattice;
  m[0] = {p[0], 0, 0};
  m[1] = {p[1] * cg, p[1] * sg, 0};
  m[2] = {p[2] * cb, p[2] * cy, p[2] * std::sqrt(cz2)};
  return true;
}

std::array<double, 3> fractional_to_cartesian(const CrystalStructure& cell, const std::array<double, 3>& f) {
  return to_cartesian(cell.lattice, f);
}

CrystalStructure parse_structure(const toml::table& block, const std::string& where) {
  reject_unknown_keys(block, {"lattice", "a", "b", "c", "alpha", "beta", "gamma", "sites", "symprec"}, where,
                      "the structure");
  CrystalStructure cell;
  cell.where = where;
  cell.lattice = read_lattice(block, where);

  const std::string sites_valid =
      "sites = [ { species = \"Sr\", at = [0, 0, 0] }, { species = \"Ti\", at = [0.5, 0.5, 0.5] }, ... ]";
  const toml::node* s = block.get("sites");
  if (!s) bad(where, &block, "sites", "missing", sites_valid);
  const toml::array* sites = s->as_array();
  if (!sites) bad(where, s, "sites", std::string("expected an array of tables, got ") + type_name(*s), sites_valid);
  if (sites->empty()) bad(where, s, "sites", "empty; a structure needs at least one atom", sites_valid);
  bool has_moment = false;
  for (std::size_t i = 0; i < sites->size(); ++i) cell.sites.push_back(read_site(*sites->get(i), i, where, &has_moment));
  cell.magnetic = has_moment;
  reject_coincident_sites(cell, *sites, where);

  if (const toml::node* p = block.get("symprec")) {
    const std::string valid = "a distance tolerance in Angstrom, 0 < symprec < 1 (default 1e-5)";
    cell.symprec = read_number(*p, where, "symprec", valid);
    if (!(cell.symprec > 0 && cell.symprec < 1))
      bad(where, p, "symprec", "out of range: " + number_text(cell.symprec), valid);
  }
  return cell;
}

StructureSymmetry find_structure_symmetry(const CrystalStructure& cell) {
  return find_structure_symmetry(cell, cell.symprec);
}

StructureSymmetry find_structure_symmetry(const CrystalStructure& cell, double symprec) {
  const std::string where = cell.where.empty() ? std::string("crystal structure") : cell.where;
  if (!(symprec > 0 && std::isfinite(symprec)))
    fail(ErrorKind::bad_file, "symprec must be a positive distance, got " + number_text(symprec), where,
         "0 < symprec < 1 Angstrom");
  if (cell.sites.empty()) fail(ErrorKind::bad_file, "the structure has no atoms", where, "at least one site");

  const std::size_t n = cell.sites.size();
  double lattice[3][3]; // spglib: lattice vectors as columns
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) lattice[i][j] = cell.lattice[j][i];
  std::unique_ptr<double[][3]> positions(new double[n][3]);
  std::vector<int> types(n);
  std::vector<double> moments(3 * n);
  std::map<std::string, int> type_of;
  for (std::size_t i = 0; i < n; ++i) {
    const AtomSite& s = cell.sites[i];
    for (int k = 0; k < 3; ++k) {
      positions[i][k] = s.frac[k];
      moments[3 * i + k] = s.moment[k];
    }
    auto it = type_of.emplace(s.species, static_cast<int>(type_of.size()) + 1).first;
    types[i] = it->second;
  }

  // A lattice or position that is not finite reaches spglib only as a crash.
  const double scale = norm(cell.lattice[0]) * norm(cell.lattice[1]) * norm(cell.lattice[2]);
  bool finite = std::isfinite(scale) && scale > 0 && std::fabs(det3(cell.lattice)) > 1e-6 * scale;
  for (std::size_t i = 0; i < n; ++i)
    for (int k = 0; k < 3; ++k)
      finite = finite && std::isfinite(positions[i][k]) && std::isfinite(moments[3 * i + k]);
  if (!finite)
    fail(ErrorKind::bad_file, "the cell is degenerate (flat, zero or not a number) or a site is not a finite position",
         where, "three independent lattice vectors, angles away from 0 and 180 degrees, finite coordinates");

  // A search that finds nothing is tried again at a tenth and a hundredth of
  // the tolerance: atoms or moments closer than symprec are what usually stops
  // it, and a larger tolerance would only merge more of them.
  SpglibAnswer answer;
  std::string tried;
  double used = symprec;
  for (double factor : {1.0, 0.1, 0.01}) {
    used = symprec * factor;
    answer = run_isolated([&] {
      return spglib_answer(lattice, positions.get(), types.data(), moments.data(), static_cast<int>(n), cell.magnetic,
                           used);
    });
    if (answer.ok || answer.crashed) break;
    tried += (tried.empty() ? "" : ", ") + number_text(used);
  }
  if (answer.crashed)
    fail(ErrorKind::bad_file,
         "the symmetry library (spglib) crashed on this " + std::string(cell.magnetic ? "magnetic " : "") +
             "structure at symprec " + number_text(symprec) + " Angstrom (" + answer.problem +
             "); the search ran in a process of its own, so nothing else was lost",
         where, "a smaller symprec (atoms or moments closer than symprec confuse the search), or a cleaner cell");
  if (!answer.ok)
    fail(ErrorKind::bad_file,
         "spglib found no symmetry for " + std::string(cell.magnetic ? "this magnetic" : "this") + " structure (" +
             answer.problem + "), tried at symprec " + tried + " Angstrom",
         where, kSpglibValid);
  StructureSymmetry out;
  out.symprec = used;
  out.space_group_number = answer.space_group_number;
  out.space_group_symbol = answer.space_group_symbol;
  out.point_group_symbol = answer.point_group_symbol;
  out.magnetic_uni_number = answer.uni_number;
  out.magnetic_type = answer.magnetic_type;
  out.bns_number = answer.bns_number;
  std::vector<IMat> rotations;
  std::vector<bool> primed;
  for (int k = 0; k < answer.n_operations; ++k) {
    IMat w{};
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) w[i][j] = answer.rotations[k][i][j];
    rotations.push_back(w);
    primed.push_back(answer.time_reversals[k] != 0);
  }

  // R_cart = M^T W M^-T, with M the matrix whose rows are a, b, c (of the basis
  // the search wrote W in: the cell's, or its primitive cell's, same Cartesian frame).
  Mat m{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) m[i][j] = answer.lattice[i][j];
  out.primitive_basis = answer.primitive_basis;
  const Mat m_inv = inverse3(m);
  std::set<std::pair<IMat, bool>> seen;
  for (std::size_t k = 0; k < rotations.size(); ++k) {
    if (!seen.insert({rotations[k], primed[k]}).second) continue;
    PointOperation op;
    op.rotation_lattice = rotations[k];
    op.time_reversal = primed[k];
    Mat wm{}; // W M^-T
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j)
        for (int l = 0; l < 3; ++l) wm[i][j] += rotations[k][i][l] * m_inv[j][l];
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) {
        double v = 0;
        for (int l = 0; l < 3; ++l) v += m[l][i] * wm[l][j];
        op.rotation_cartesian[i][j] = snapped(v);
      }
    out.point_operations.push_back(op);
  }
  return out;
}

} // namespace ts
