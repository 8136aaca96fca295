#include "tensor/allowed_form.hpp"

#include "core/error.hpp"
#include "group/identify.hpp"

#include <algorithm>
#include <map>
#include <numeric>
#include <optional>

namespace ts {

namespace {

using Row = std::vector<QSqrt3>; // dense over the reduced basis

// cos and sin of k·30°, k = 0..11: the phases of monomial actions.
const QSqrt3& zeta_cos(int k) {
  static const QSqrt3 h3(0, Rational(1, 2)), half(Rational(1, 2));
  static const QSqrt3 table[12] = {QSqrt3(1), h3, half, QSqrt3(0), -half, -h3,
                                   QSqrt3(-1), -h3, -half, QSqrt3(0), half, h3};
  return table[((k % 12) + 12) % 12];
}
const QSqrt3& zeta_sin(int k) { return zeta_cos(k - 3); }

std::optional<int> root_of_unity_exponent(const QSqrt3& re, const QSqrt3& im) {
  for (int k = 0; k < 12; ++k)
    if (zeta_cos(k) == re && zeta_sin(k) == im) return k;
  return std::nullopt;
}

// g e_b = ζ^phase[b] e_image[b] on the three basis vectors.
struct Monomial {
  std::array<int, 3> image{};
  std::array<int, 3> phase{};
};

std::optional<Monomial> cartesian_monomial(const Mat3& R) {
  Monomial m;
  for (int b = 0; b < 3; ++b) {
    int found = -1;
    for (int i = 0; i < 3; ++i) {
      if (R(i, b).is_zero()) continue;
      if (found >= 0) return std::nullopt;
      found = i;
    }
    if (found < 0) return std::nullopt;
    const QSqrt3& v = R(found, b);
    if (v == QSqrt3(1)) m.phase[b] = 0;
    else if (v == QSqrt3(-1)) m.phase[b] = 6;
    else return std::nullopt;
    m.image[b] = found;
  }
  return m;
}

// Basis f0 = x + iy, f1 = x - iy, f2 = z.
std::optional<Monomial> circular_monomial(const Mat3& R) {
  if (!R(2, 0).is_zero() || !R(2, 1).is_zero() || !R(0, 2).is_zero() || !R(1, 2).is_zero()) return std::nullopt;
  const QSqrt3 half(Rational(1, 2));
  const QSqrt3 &a = R(0, 0), &b = R(0, 1), &c = R(1, 0), &d = R(1, 1);
  QSqrt3 alpha_re = (a + d) * half, alpha_im = (b - c) * half;
  QSqrt3 beta_re = (a - d) * half, beta_im = (b + c) * half;
  Monomial m;
  bool alpha_zero = alpha_re.is_zero() && alpha_im.is_zero();
  bool beta_zero = beta_re.is_zero() && beta_im.is_zero();
  if (alpha_zero == beta_zero) return std::nullopt;
  auto k = alpha_zero ? root_of_unity_exponent(beta_re, beta_im) : root_of_unity_exponent(alpha_re, alpha_im);
  if (!k) return std::nullopt;
  if (!alpha_zero) { // f+ -> α f+, f- -> conj(α) f-
    m.image = {0, 1, 2};
    m.phase[0] = *k;
    m.phase[1] = (12 - *k) % 12;
  } else {           // f+ -> β f-, f- -> conj(β) f+
    m.image = {1, 0, 2};
    m.phase[0] = *k;
    m.phase[1] = (12 - *k) % 12;
  }
  if (R(2, 2) == QSqrt3(1)) m.phase[2] = 0;
  else if (R(2, 2) == QSqrt3(-1)) m.phase[2] = 6;
  else return std::nullopt;
  return m;
}

struct GeneratorAction {
  Monomial mono;
  int extra_phase; // 6 when the tensor picks up -1 (axial and improper; time-odd and primed)
  bool transpose;  // Onsager-Kleiner exchange for a primed operation
};

int tensor_sign_phase(const TensorSpec& spec, const Operation& op) {
  int phase = 0;
  if (spec.axial && op.det() < 0) phase += 6;
  if (spec.time_odd && op.primed) phase += 6;
  return phase % 12;
}

// Orbits of reduced components under monomial generators; each consistent
// orbit gives one invariant Σ ζ^phase e_r.
std::vector<std::vector<std::pair<int, int>>> invariant_orbits(const TensorSpec& spec, const IndexSymmetry& sym,
                                                              const std::vector<GeneratorAction>& gens) {
  const int n = sym.size();
  const int rank = sym.rank();
  std::vector<std::vector<int>> image(gens.size(), std::vector<int>(n)), phase(gens.size(), std::vector<int>(n));
  for (std::size_t g = 0; g < gens.size(); ++g)
    for (int r = 0; r < n; ++r) {
      std::vector<int> d = sym.digits(sym.rep_code(r));
      int ph = gens[g].extra_phase;
      for (int p = 0; p < rank; ++p) {
        ph += gens[g].mono.phase[d[p]];
        d[p] = gens[g].mono.image[d[p]];
      }
      int code = sym.code_of(d);
      if (gens[g].transpose) code = sym.permuted(code, spec.onsager);
      int red = sym.reduced_of(code);
      image[g][r] = red;
      phase[g][r] = red < 0 ? -1 : (ph + (sym.sign_of(code) < 0 ? 6 : 0)) % 12;
    }
  std::vector<int> root(n, -1), ph(n, 0);
  std::vector<std::vector<std::pair<int, int>>> orbits;
  for (int r0 = 0; r0 < n; ++r0) {
    if (root[r0] >= 0) continue;
    std::vector<int> orbit{r0};
    root[r0] = r0;
    ph[r0] = 0;
    bool consistent = true;
    for (std::size_t i = 0; i < orbit.size(); ++i) {
      int r = orbit[i];
      for (std::size_t g = 0; g < gens.size(); ++g) {
        int t = image[g][r];
        if (t < 0) {
          consistent = false;
          continue;
        }
        int p = (ph[r] + phase[g][r]) % 12;
        if (root[t] < 0) {
          root[t] = r0;
          ph[t] = p;
          orbit.push_back(t);
        } else if (ph[t] != p) {
          consistent = false;
        }
      }
    }
    if (!consistent) continue;
    std::vector<std::pair<int, int>> o;
    for (int r : orbit) o.emplace_back(r, ph[r]);
    orbits.push_back(std::move(o));
  }
  return orbits;
}

// Real Cartesian invariants from orbits found in the circular basis.
std::vector<Row> circular_to_cartesian(const IndexSymmetry& sym,
                                       const std::vector<std::vector<std::pair<int, int>>>& orbits) {
  const int n = sym.size(), rank = sym.rank();
  // u-phase of Cartesian index c in circular basis vector b: f± = x ± iy.
  static const int u_phase[3][3] = {{0, 0, -1}, {3, 9, -1}, {-1, -1, 0}}; // [c][b], -1: zero
  std::vector<Row> rows;
  std::vector<bool> done_conjugate;
  for (const auto& orbit : orbits) {
    Row re(n), im(n);
    bool any = false;
    for (const auto& [r, k] : orbit)
      for (int code : sym.members(r)) {
        int s = sym.sign_of(code);
        std::vector<int> b = sym.digits(code);
        std::vector<int> free_pos;
        for (int p = 0; p < rank; ++p)
          if (b[p] != 2) free_pos.push_back(p);
        const int m = static_cast<int>(free_pos.size());
        for (int mask = 0; mask < (1 << m); ++mask) {
          std::vector<int> c(rank, 2);
          for (int q = 0; q < m; ++q) c[free_pos[q]] = (mask >> q) & 1;
          int ccode = sym.code_of(c);
          int red = sym.reduced_of(ccode);
          if (red < 0 || sym.rep_code(red) != ccode) continue;
          int e = k + (s < 0 ? 6 : 0);
          for (int p = 0; p < rank; ++p) e += u_phase[c[p]][b[p]];
          re[red] += zeta_cos(e);
          im[red] += zeta_sin(e);
          any = true;
        }
      }
    if (!any) continue;
    auto nonzero = [](const Row& v) { return std::any_of(v.begin(), v.end(), [](const QSqrt3& x) { return !x.is_zero(); }); };
    if (nonzero(re)) rows.push_back(std::move(re));
    if (nonzero(im)) rows.push_back(std::move(im));
  }
  return rows;
}

// Bits of the largest numerator or denominator: the size of the exact number.
int height(const QSqrt3& x) { return std::max(x.rational_part().bit_height(), x.sqrt3_part().bit_height()); }

// Gauss-Jordan elimination in place; returns pivot columns. Rows that vanish are
// removed. Numbers that outgrow 64 bits become big rationals inside Rational.
std::vector<int> rref(std::vector<Row>& rows, int ncols) {
  std::vector<int> pivots;
  std::size_t r = 0;
  for (int c = 0; c < ncols && r < rows.size(); ++c) {
    // Pivot on the simplest nonzero entry (rational and small before irrational
    // or large): keeps the exact numbers short through the elimination.
    std::size_t p = rows.size();
    std::pair<bool, int> best{};
    for (std::size_t q = r; q < rows.size(); ++q) {
      const QSqrt3& x = rows[q][c];
      if (x.is_zero()) continue;
      std::pair<bool, int> h{!x.is_rational(), height(x)};
      if (p == rows.size() || h < best) {
        p = q;
        best = h;
      }
    }
    if (p == rows.size()) continue;
    std::swap(rows[r], rows[p]);
    QSqrt3 inv = QSqrt3(1) / rows[r][c];
    for (int j = c; j < ncols; ++j)
      if (!rows[r][j].is_zero()) rows[r][j] = rows[r][j] * inv;
    for (std::size_t i = 0; i < rows.size(); ++i) {
      if (i == r || rows[i][c].is_zero()) continue;
      QSqrt3 f = rows[i][c];
      for (int j = c; j < ncols; ++j)
        if (!rows[r][j].is_zero()) rows[i][j] -= f * rows[r][j];
    }
    pivots.push_back(c);
    ++r;
  }
  rows.resize(r);
  return pivots;
}

// Row-reduce a set of spanning vectors block by block: vectors that share no
// component are independent problems, which keeps big tensors cheap.
std::vector<int> rref_blocks(std::vector<Row>& rows, int ncols) {
  std::vector<int> parent(ncols);
  std::iota(parent.begin(), parent.end(), 0);
  auto find = [&](int x) {
    while (parent[x] != x) x = parent[x] = parent[parent[x]];
    return x;
  };
  std::vector<int> first(rows.size(), -1);
  for (std::size_t i = 0; i < rows.size(); ++i)
    for (int c = 0; c < ncols; ++c)
      if (!rows[i][c].is_zero()) {
        if (first[i] < 0) first[i] = c;
        else parent[find(c)] = find(first[i]);
      }
  std::map<int, std::vector<std::size_t>> blocks;
  for (std::size_t i = 0; i < rows.size(); ++i)
    if (first[i] >= 0) blocks[find(first[i])].push_back(i);
  std::vector<Row> out;
  for (auto& [root, members] : blocks) {
    std::vector<int> cols;
    for (int c = 0; c < ncols; ++c)
      if (find(c) == root) cols.push_back(c);
    std::vector<Row> local;
    for (std::size_t i : members) {
      Row v(cols.size());
      for (std::size_t k = 0; k < cols.size(); ++k) v[k] = rows[i][cols[k]];
      local.push_back(std::move(v));
    }
    rref(local, static_cast<int>(cols.size()));
    for (auto& v : local) {
      Row full(ncols);
      for (std::size_t k = 0; k < cols.size(); ++k) full[cols[k]] = v[k];
      out.push_back(std::move(full));
    }
  }
  auto lead = [&](const Row& v) {
    for (int c = 0; c < ncols; ++c)
      if (!v[c].is_zero()) return c;
    return ncols;
  };
  std::sort(out.begin(), out.end(), [&](const Row& a, const Row& b) { return lead(a) < lead(b); });
  rows = std::move(out);
  std::vector<int> pivots;
  for (const auto& v : rows) pivots.push_back(lead(v));
  return pivots;
}

// Exact nullspace of the stacked (D(g) - 1) for groups that are monomial in no basis we know.
std::vector<Row> general_invariants(const TensorSpec& spec, const IndexSymmetry& sym, const std::vector<Operation>& gens) {
  const int n = sym.size(), rank = sym.rank();
  std::vector<Row> constraints;
  for (const auto& g : gens) {
    int sign_phase = tensor_sign_phase(spec, g);
    bool transpose = g.primed && !spec.onsager.empty();
    for (int C = 0; C < n; ++C) {
      Row row(n);
      int ccode = sym.rep_code(C);
      if (transpose) ccode = sym.permuted(ccode, spec.onsager);
      std::vector<int> c = sym.digits(ccode);
      for (int r = 0; r < n; ++r)
        for (int code : sym.members(r)) {
          std::vector<int> d = sym.digits(code);
          QSqrt3 prod(sym.sign_of(code));
          for (int p = 0; p < rank && !prod.is_zero(); ++p) prod = prod * g.R(c[p], d[p]);
          if (!prod.is_zero()) row[r] += prod;
        }
      for (auto& x : row)
        if (sign_phase) x = -x;
      row[C] -= QSqrt3(1);
      constraints.push_back(std::move(row));
    }
  }
  std::vector<int> pivots = rref(constraints, n);
  std::vector<bool> is_pivot(n, false);
  for (int p : pivots) is_pivot[p] = true;
  std::vector<Row> basis;
  for (int f = 0; f < n; ++f) {
    if (is_pivot[f]) continue;
    Row v(n);
    v[f] = QSqrt3(1);
    for (std::size_t i = 0; i < pivots.size(); ++i) v[pivots[i]] = -constraints[i][f];
    basis.push_back(std::move(v));
  }
  return basis;
}

std::vector<Row> invariant_rows(const TensorSpec& spec, const IndexSymmetry& sym, const PointGroup& group) {
  std::vector<Operation> gens = group.generators();
  for (int mode = 0; mode < 2; ++mode) {
    std::vector<GeneratorAction> acts;
    bool ok = true;
    for (const auto& g : gens) {
      auto m = mode == 0 ? cartesian_monomial(g.R) : circular_monomial(g.R);
      if (!m) {
        ok = false;
        break;
      }
      acts.push_back({*m, tensor_sign_phase(spec, g), g.primed && !spec.onsager.empty()});
    }
    if (!ok) continue;
    auto orbits = invariant_orbits(spec, sym, acts);
    if (mode == 0) {
      std::vector<Row> rows;
      for (const auto& orbit : orbits) {
        Row v(sym.size());
        for (const auto& [r, k] : orbit) v[r] = k == 0 ? QSqrt3(1) : QSqrt3(-1);
        rows.push_back(std::move(v));
      }
      return rows;
    }
    return circular_to_cartesian(sym, orbits);
  }
  return general_invariants(spec, sym, gens);
}

// Components of each basis row in the frame, before the per-axis normalisation
// (axes are used unnormalised; the lengths enter as exact square roots later).
std::vector<Row> rotate_rows(const IndexSymmetry& sym, const std::vector<Row>& rows, const Frame& frame) {
  const int rank = sym.rank(), full = sym.full_size();
  std::vector<Row> out;
  for (const auto& row : rows) {
    std::vector<QSqrt3> t(full);
    for (int code = 0; code < full; ++code) {
      int r = sym.reduced_of(code);
      if (r >= 0 && !row[r].is_zero()) t[code] = sym.sign_of(code) > 0 ? row[r] : -row[r];
    }
    int stride = full;
    for (int p = 0; p < rank; ++p) {
      stride /= 3;
      std::vector<QSqrt3> u(full);
      for (int code = 0; code < full; ++code) {
        int digit = (code / stride) % 3;
        int base = code - digit * stride;
        QSqrt3 s;
        for (int a = 0; a < 3; ++a) {
          const QSqrt3& m = frame.axes[digit][a];
          const QSqrt3& v = t[base + a * stride];
          if (!m.is_zero() && !v.is_zero()) s += m * v;
        }
        u[code] = s;
      }
      t.swap(u);
    }
    Row red(sym.size());
    for (int r = 0; r < sym.size(); ++r) red[r] = t[sym.rep_code(r)];
    out.push_back(std::move(red));
  }
  return out;
}

AllowedForm build_form(const TensorSpec& spec, std::shared_ptr<const IndexSymmetry> sym, std::vector<Row> rows,
                       const std::array<Rational, 3>& len2) {
  AllowedForm form;
  form.spec = spec;
  form.symmetry = sym;
  const int n = sym->size();
  std::vector<int> pivots = rref_blocks(rows, n);
  form.parameter_components = pivots;
  form.components.assign(n, {});
  // How often each axis occurs in the indices of a component.
  auto axis_counts = [&](int red) {
    std::array<int, 3> k{};
    for (int d : sym->digits(sym->rep_code(red))) ++k[d];
    return k;
  };
  bool unit = len2[0] == Rational(1) && len2[1] == Rational(1) && len2[2] == Rational(1);
  std::array<Surd, 3> root_len2;
  if (!unit)
    for (int d = 0; d < 3; ++d) root_len2[d] = Surd::sqrt_of(len2[d]);
  // Normalising the axes multiplies a component by sqrt(q_pivot / q_c), q the product of
  // the squared lengths of its axes. The even powers are exact rational factors (big
  // ones for measured lattice parameters: a (101) normal of a = 3.91, c = 4.1 has
  // |n|^2 ~ 5e10) and only the odd square roots stay as surds, so radicands stay small.
  auto normalised = [&](const QSqrt3& entry, const std::array<int, 3>& kj, const std::array<int, 3>& kc) {
    QSqrt3 scaled = entry;
    std::vector<int> odd;
    for (int d = 0; d < 3; ++d) {
      int e = kj[d] - kc[d];
      int half = e >= 0 ? e / 2 : -((-e + 1) / 2); // floor(e / 2)
      for (int i = 0; i < (half >= 0 ? half : -half); ++i)
        scaled = half >= 0 ? scaled * QSqrt3(len2[d]) : scaled / QSqrt3(len2[d]);
      if (e - 2 * half) odd.push_back(d);
    }
    Surd coef(scaled);
    for (int d : odd) coef = coef * root_len2[d];
    return coef;
  };
  for (std::size_t j = 0; j < rows.size(); ++j) {
    const std::array<int, 3> kj = axis_counts(pivots[j]);
    for (int c = 0; c < n; ++c) {
      if (rows[j][c].is_zero()) continue;
      Surd coef = unit ? Surd(rows[j][c]) : normalised(rows[j][c], kj, axis_counts(c));
      form.components[c].push_back({static_cast<int>(j), coef});
    }
  }
  return form;
}

} // namespace

SolverPath solver_path(const PointGroup& group) {
  auto all = [&](auto test) {
    for (const auto& g : group.generators())
      if (!test(g.R)) return false;
    return true;
  };
  if (all([](const Mat3& R) { return cartesian_monomial(R).has_value(); })) return SolverPath::signed_permutation;
  if (all([](const Mat3& R) { return circular_monomial(R).has_value(); })) return SolverPath::circular_basis;
  return SolverPath::general_elimination;
}

namespace {

// A group that is monomial in no basis we know is usually a tabulated group
// seen in a rotated frame. When a frame built from the group's own axes (rescaled
// to equal lengths where the ratio of lengths is an exact square) makes it
// monomial, the tensor is solved in that frame by orbits and rotated back exactly,
// instead of by elimination, which is slow for large tensors. The frame comes from
// the operations alone: the solver needs no catalogue and reads no file. Which
// frame is found does not matter: the rows are reduced to the one echelon form.
struct StandardRoute {
  PointGroup standard; // the group seen in the frame M, monomial
  Mat3 M;              // rows: the frame's axes in the group's frame, all of squared length N
};

// The axes r rescaled to the squared length of r[0]; false when a ratio is not an exact square.
bool equal_lengths(std::array<Vec3, 3>& r) {
  const QSqrt3 n0 = dot(r[0], r[0]);
  if (!n0.is_rational()) return false;
  for (int j = 1; j < 3; ++j) {
    QSqrt3 nj = dot(r[j], r[j]);
    if (!nj.is_rational()) return false;
    QSqrt3 scale;
    if (!exact_sqrt_of_rational(n0.rational_part() / nj.rational_part(), &scale)) return false;
    r[j] = scaled(r[j], scale);
  }
  return true;
}

// Q g Qᵀ with Q = M/√N: M g Mᵀ / N, exact because N is rational.
Mat3 seen_in(const Mat3& M, const QSqrt3& inverse_n, const Mat3& g) { return (M * g * M.transpose()).scaled(inverse_n); }

bool monomial_in_one_basis(const std::vector<Operation>& ops, const Mat3& M, const QSqrt3& inverse_n) {
  bool cartesian = true, circular = true;
  for (const auto& g : ops) {
    Mat3 R = seen_in(M, inverse_n, g.R);
    cartesian = cartesian && cartesian_monomial(R).has_value();
    circular = circular && circular_monomial(R).has_value();
    if (!cartesian && !circular) return false;
  }
  return true;
}

std::optional<StandardRoute> standard_route(const PointGroup& group) {
  if (solver_path(group) != SolverPath::general_elimination) return std::nullopt;
  const std::vector<Operation> gens = group.generators();
  try {
    const std::vector<Vec3> lines = candidate_lines(group);
    for (const auto& zl : lines)
      for (int zs : {1, -1})
        for (const auto& xl : lines)
          for (int xs : {1, -1}) {
            const Vec3 z = zs > 0 ? zl : -zl, x = xs > 0 ? xl : -xl;
            if (!dot(x, z).is_zero()) continue;
            Vec3 y = cross(z, x);
            if (!rational_length(y)) continue;
            std::array<Vec3, 3> r{x, y, z};
            if (!equal_lengths(r)) continue;
            StandardRoute route;
            for (int i = 0; i < 3; ++i) route.M.m[i] = r[i];
            const QSqrt3 inverse_n(Rational(1) / dot(r[0], r[0]).rational_part());
            if (!monomial_in_one_basis(gens, route.M, inverse_n)) continue;
            std::vector<Operation> ops;
            for (const auto& g : group.operations()) ops.push_back({seen_in(route.M, inverse_n, g.R), g.primed});
            route.standard = PointGroup::from_closed_set(std::move(ops), group.lattice());
            // The solver uses the canonical generators of the group it is given.
            if (solver_path(route.standard) == SolverPath::general_elimination) continue;
            return route;
          }
  } catch (const Error&) {
    // a frame whose numbers outgrow 64 bits: leave it to elimination
  }
  return std::nullopt;
}

// The frame axes (given in the group's frame) seen from the standard setting: M·a.
Frame through(const StandardRoute& route, const Frame& frame) {
  Frame f = frame;
  for (int k = 0; k < 3; ++k) f.axes[k] = route.M * frame.axes[k];
  return f;
}

AllowedForm solve_in_frame(const TensorSpec& spec, const PointGroup& group, const Frame& frame) {
  auto sym = index_symmetry_of(spec);
  if (frame.is_identity())
    return build_form(spec, sym, invariant_rows(spec, *sym, group), {Rational(1), Rational(1), Rational(1)});
  std::vector<Row> rows = invariant_rows(spec, *sym, group);
  std::array<Rational, 3> len2;
  for (int i = 0; i < 3; ++i) len2[i] = dot(frame.axes[i], frame.axes[i]).rational_part();
  // A group that constrains nothing (1, 11') leaves every component free in
  // any frame: rotating the whole space and reducing it again gives the unit
  // rows back, at a cost that grows as the cube of the component count (a
  // rank-6 tensor on a cut with measured lattice parameters took minutes).
  if (rref_blocks(rows, sym->size()).size() == static_cast<std::size_t>(sym->size())) {
    std::vector<Row> unit(sym->size(), Row(sym->size()));
    for (int i = 0; i < sym->size(); ++i) unit[i][i] = QSqrt3(1);
    return build_form(spec, sym, std::move(unit), len2);
  }
  return build_form(spec, sym, rotate_rows(*sym, rows, frame), len2);
}

} // namespace

AllowedForm allowed_form(const TensorSpec& spec, const PointGroup& group) { return allowed_form(spec, group, Frame{}); }

AllowedForm allowed_form(const TensorSpec& spec, const PointGroup& group, const Frame& frame) {
  if (!frame.is_identity()) frame.validate();
  if (auto route = standard_route(group)) return solve_in_frame(spec, route->standard, through(*route, frame));
  return solve_in_frame(spec, group, frame);
}

int independent_count(const TensorSpec& spec, const PointGroup& group) {
  if (auto route = standard_route(group)) return independent_count(spec, route->standard);
  auto sym = index_symmetry_of(spec);
  std::vector<Row> rows = invariant_rows(spec, *sym, group);
  return static_cast<int>(rref_blocks(rows, sym->size()).size());
}

std::string AllowedForm::parameter_name(int j) const {
  return spec.name + "_" + index_string(symmetry->rep_code(parameter_components[j]), spec.rank);
}

std::string AllowedForm::component_name(int code) const { return spec.name + "_" + index_string(code, spec.rank); }

std::vector<LinearTerm> AllowedForm::value(int code) const {
  int r = symmetry->reduced_of(code);
  if (r < 0) return {};
  std::vector<LinearTerm> v = components[r];
  if (symmetry->sign_of(code) < 0)
    for (auto& t : v) t.coefficient = -t.coefficient;
  return v;
}

int AllowedForm::nonzero_components() const {
  int count = 0;
  for (int code = 0; code < symmetry->full_size(); ++code)
    if (!is_zero(code)) ++count;
  return count;
}

} // namespace ts
