#include "fit/compiled_expression.hpp"

#include "core/error.hpp"

#include <algorithm>
#include <cmath>

namespace ts {

CompiledExpression::CompiledExpression(const GiNaC::ex& e, const std::vector<GiNaC::symbol>& variables) {
  compile(e, variables);
  // The stack depth the program needs, found by a dry run over the operand counts.
  int d = 0;
  for (const auto& in : code_) {
    switch (in.op) {
    case Op::constant:
    case Op::variable: ++d; break;
    case Op::add:
    case Op::mul: d -= in.n - 1; break;
    case Op::pow: --d; break;
    default: break;
    }
    depth_ = std::max(depth_, d);
  }
}

void CompiledExpression::compile(const GiNaC::ex& e, const std::vector<GiNaC::symbol>& variables) {
  using namespace GiNaC;
  if (is_a<numeric>(e)) {
    const numeric& n = ex_to<numeric>(e);
    if (!n.is_real()) fail(ErrorKind::internal, "a fit model has a complex constant");
    code_.push_back({Op::constant, 0, n.to_double()});
    return;
  }
  if (is_a<symbol>(e)) {
    for (std::size_t i = 0; i < variables.size(); ++i)
      if (e.is_equal(variables[i])) {
        code_.push_back({Op::variable, static_cast<int>(i), 0});
        return;
      }
    fail(ErrorKind::internal, "a fit model has a symbol without a value");
  }
  if (is_a<add>(e) || is_a<mul>(e)) {
    for (std::size_t i = 0; i < e.nops(); ++i) compile(e.op(i), variables);
    code_.push_back({is_a<add>(e) ? Op::add : Op::mul, static_cast<int>(e.nops()), 0});
    return;
  }
  if (is_a<power>(e)) {
    compile(e.op(0), variables);
    const ex x = e.op(1);
    if (is_a<numeric>(x) && ex_to<numeric>(x).is_integer() && abs(ex_to<numeric>(x)) < 64) {
      code_.push_back({Op::pow_int, ex_to<numeric>(x).to_int(), 0});
      return;
    }
    compile(x, variables);
    code_.push_back({Op::pow, 0, 0});
    return;
  }
  if (is_ex_the_function(e, sin) || is_ex_the_function(e, cos) || is_ex_the_function(e, exp) ||
      is_ex_the_function(e, log)) {
    compile(e.op(0), variables);
    const Op op = is_ex_the_function(e, sin)   ? Op::sin
                  : is_ex_the_function(e, cos) ? Op::cos
                  : is_ex_the_function(e, exp) ? Op::exp
                                               : Op::log;
    code_.push_back({op, 0, 0});
    return;
  }
  fail(ErrorKind::internal, "a fit model holds an expression the evaluator does not know");
}

double CompiledExpression::evaluate(const double* values) const {
  // Small programs: a stack on the C++ stack when it fits, the heap otherwise.
  double local[64];
  std::vector<double> heap;
  double* s = local;
  if (depth_ > 64) {
    heap.resize(depth_);
    s = heap.data();
  }
  int top = 0;
  for (const auto& in : code_) {
    switch (in.op) {
    case Op::constant: s[top++] = in.c; break;
    case Op::variable: s[top++] = values[in.n]; break;
    case Op::add: {
      double r = 0;
      for (int i = 0; i < in.n; ++i) r += s[--top];
      s[top++] = r;
      break;
    }
    case Op::mul: {
      double r = 1;
      for (int i = 0; i < in.n; ++i) r *= s[--top];
      s[top++] = r;
      break;
    }
    case Op::pow_int: {
      const double b = s[top - 1];
      double r = 1;
      for (int i = 0; i < std::abs(in.n); ++i) r *= b;
      s[top - 1] = in.n < 0 ? 1.0 / r : r;
      break;
    }
    case Op::pow: {
      const double x = s[--top];
      s[top - 1] = std::pow(s[top - 1], x);
      break;
    }
    case Op::sin: s[top - 1] = std::sin(s[top - 1]); break;
    case Op::cos: s[top - 1] = std::cos(s[top - 1]); break;
    case Op::exp: s[top - 1] = std::exp(s[top - 1]); break;
    case Op::log: s[top - 1] = std::log(s[top - 1]); break;
    }
  }
  return top ? s[0] : 0.0;
}

} // namespace ts
