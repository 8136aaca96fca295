#include "device/surd_echelon.hpp"

#include "core/error.hpp"

#include <algorithm>

namespace ts {

namespace {

// A prime factor of the first radicand above 1, by trial division (radicands of
// sample frames are small; a cofactor without small factors stands for itself,
// which is enough while it shares no factor with another radicand of the number).
Rational prime_of_radicands(const Surd& a) {
  for (const auto& [radicand, coefficient] : a.terms()) {
    if (radicand == Rational(1)) continue;
    if (!radicand.is_small())
      fail(ErrorKind::too_large, "a square root of a number beyond 64 bits in a measurement plan", "",
           "lattice parameters with fewer digits");
    std::int64_t n = radicand.num();
    for (std::int64_t p = 2; p * p <= n && p < (std::int64_t(1) << 21); ++p)
      if (n % p == 0) return Rational(p);
    return radicand;
  }
  return Rational(1);
}

bool divides(const Rational& p, const Rational& n) {
  if (p.is_small() && n.is_small()) return n.num() % p.num() == 0;
  const Rational q = n / p;
  return q.is_small() ? q.den() == 1 : false;
}

} // namespace

Surd surd_inverse(const Surd& a) {
  if (a.is_zero()) fail(ErrorKind::internal, "surd_inverse of zero");
  Surd num = Rational(1), rest = a;
  for (int guard = 0; !rest.is_rational(); ++guard) {
    if (guard > 64) fail(ErrorKind::internal, "surd_inverse did not reach a rational norm");
    const Rational p = prime_of_radicands(rest);
    Surd conj;
    for (const auto& [radicand, coefficient] : rest.terms()) {
      Surd term = Surd::sqrt_of(radicand) * Surd(coefficient);
      conj += divides(p, radicand) ? -term : term;
    }
    num = num * conj;
    rest = rest * conj;
  }
  const Rational norm = rest.terms().empty() ? Rational(0) : rest.terms()[0].second;
  return num * Surd(Rational(1) / norm);
}

bool SurdEchelon::add(SurdRow row) {
  if (static_cast<int>(row.size()) != columns_) fail(ErrorKind::internal, "SurdEchelon: a row of another length");
  for (std::size_t r = 0; r < rows_.size(); ++r) {
    const Surd f = row[pivots_[r]];
    if (f.is_zero()) continue;
    for (int c = 0; c < columns_; ++c)
      if (!rows_[r][c].is_zero()) row[c] = row[c] - f * rows_[r][c];
  }
  int pivot = -1;
  for (int c = 0; c < columns_; ++c)
    if (!row[c].is_zero()) {
      pivot = c;
      break;
    }
  if (pivot < 0) return false;
  const Surd inv = surd_inverse(row[pivot]);
  for (int c = 0; c < columns_; ++c)
    if (!row[c].is_zero()) row[c] = row[c] * inv;
  // Keep the form reduced: clear the new pivot column from the rows before.
  for (auto& other : rows_) {
    const Surd f = other[pivot];
    if (f.is_zero()) continue;
    for (int c = 0; c < columns_; ++c)
      if (!row[c].is_zero()) other[c] = other[c] - f * row[c];
  }
  // Rows stay sorted by pivot column.
  auto at = std::lower_bound(pivots_.begin(), pivots_.end(), pivot);
  const auto k = at - pivots_.begin();
  pivots_.insert(at, pivot);
  rows_.insert(rows_.begin() + k, std::move(row));
  return true;
}

std::vector<SurdRow> SurdEchelon::null_space() const {
  std::vector<SurdRow> out;
  for (int free = 0; free < columns_; ++free) {
    if (std::binary_search(pivots_.begin(), pivots_.end(), free)) continue;
    SurdRow v(columns_);
    v[free] = Rational(1);
    for (std::size_t r = 0; r < rows_.size(); ++r) v[pivots_[r]] = -rows_[r][free];
    out.push_back(std::move(v));
  }
  return out;
}

int surd_rank(const std::vector<SurdRow>& rows, int columns) {
  SurdEchelon e(columns);
  for (const auto& r : rows) {
    if (e.full()) break;
    e.add(r);
  }
  return e.rank();
}

} // namespace ts
