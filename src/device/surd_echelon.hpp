// Exact linear algebra over the real numbers that Surds are (sums of rational
// multiples of square roots): the inverse of a nonzero Surd and the reduced row
// echelon form of a matrix of them. A measurement plan's rank, which mechanisms
// it separates and which combinations it fixes together are decided here, so
// that no claim about separation rests on a rounding threshold.
#pragma once

#include "core/surd.hpp"

#include <vector>

namespace ts {

// 1/a for a nonzero a: multiplying by the conjugates that flip the sign of √p,
// one prime p at a time, leaves a rational (the field norm).
Surd surd_inverse(const Surd& a);

using SurdRow = std::vector<Surd>;

// The reduced row echelon form of the rows seen so far: each basis row has a 1
// at its pivot column and zeros in the other pivot columns.
class SurdEchelon {
public:
  explicit SurdEchelon(int columns) : columns_(columns) {}
  // Adds a row; returns whether it raised the rank.
  bool add(SurdRow row);
  int rank() const { return static_cast<int>(rows_.size()); }
  int columns() const { return columns_; }
  bool full() const { return rank() == columns_; }
  const std::vector<SurdRow>& rows() const { return rows_; }
  const std::vector<int>& pivots() const { return pivots_; }
  // A basis of the null space {v : row·v = 0 for every row}, one vector per free column.
  std::vector<SurdRow> null_space() const;

private:
  int columns_;
  std::vector<SurdRow> rows_;
  std::vector<int> pivots_;
};

// The exact rank of a set of rows (stops early at full column rank).
int surd_rank(const std::vector<SurdRow>& rows, int columns);

} // namespace ts
