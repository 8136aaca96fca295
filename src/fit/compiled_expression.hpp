// A GiNaC expression compiled once into a small postfix program of double
// operations, so a model and its exact derivatives (GiNaC's diff) are
// evaluated at every point of a scan without walking GiNaC's trees or parsing
// anything per point. Only what the fit models use is compiled: numbers,
// symbols, sums, products, powers, sin, cos, exp and log; anything else is an
// internal error (a model built here never contains it).
#pragma once

#include <ginac/ginac.h>

#include <vector>

namespace ts {

class CompiledExpression {
public:
  CompiledExpression() = default;
  // `variables` fixes the order of the values passed to evaluate().
  CompiledExpression(const GiNaC::ex& e, const std::vector<GiNaC::symbol>& variables);
  double evaluate(const double* values) const;

private:
  enum class Op { constant, variable, add, mul, pow_int, pow, sin, cos, exp, log };
  struct Instruction {
    Op op;
    int n = 0;      // operand count (add, mul), variable index, integer exponent
    double c = 0;   // constant
  };
  void compile(const GiNaC::ex& e, const std::vector<GiNaC::symbol>& variables);
  std::vector<Instruction> code_;
  int depth_ = 0;
};

} // namespace ts
