"""Reports' expressions as sympy objects, and their numerical values.

Every expression in a report (a component's value, a Hall-bar signal, an optical
amplitude) is plain text that sympy parses as it stands: products are written
with ``*``, powers with ``^`` (sympy reads it as ``**``), angles as ``sin(3*phi)``.
:func:`expr` reads one such text into a sympy expression in which every name is a
plain :class:`sympy.Symbol` (so ``E``, ``I``, ``S`` or ``N`` in a name never turn
into sympy's constants or functions); :func:`tensor` and :func:`matrix` give a
whole form; :func:`evaluate` gives numbers, with numpy arrays when numpy is
installed and plain floats without it.
"""

import keyword
import re

import sympy
from sympy.parsing.sympy_parser import convert_xor, implicit_multiplication, parse_expr, standard_transformations

# The functions and constants our expressions use; every other name is a symbol.
_FUNCTIONS = {"sin": sympy.sin, "cos": sympy.cos, "tan": sympy.tan, "sqrt": sympy.sqrt, "exp": sympy.exp,
              "pi": sympy.pi}
_NAME = re.compile(r"[A-Za-z_][A-Za-z_0-9]*")
# Implicit products are accepted too, so texts written by hand ("sin(3phi)") read the same.
_TRANSFORMATIONS = standard_transformations + (convert_xor, implicit_multiplication)


def expr(text):
    """Read an expression of a report into sympy.

    ``text`` is a string such as ``"sqrt(3)/2*d_yyy"``, ``"chi_xxy*sin(3*phi)"`` or
    ``"-chi_xxy*Lx_w^2*Lx_2w*cos(3*phi)"``; a sympy expression or a number is
    returned as a sympy object unchanged. Every name except sin, cos, tan, sqrt,
    exp and pi becomes ``sympy.Symbol(name)`` (no assumptions, the same symbol as
    ``sympy.Symbol("phi")`` in your own code).

    >>> expr("sqrt(3)/2*d_yyy + d_xxx")
    d_xxx + sqrt(3)*d_yyy/2
    """
    if isinstance(text, sympy.Basic):
        return text
    if isinstance(text, (int, float)):
        return sympy.sympify(text)
    if not isinstance(text, str):
        raise TypeError(f"expr() takes a report's expression text, not {type(text).__name__}")
    names = {}
    for name in _NAME.findall(text):
        if name in _FUNCTIONS:
            names[name] = _FUNCTIONS[name]
        elif keyword.iskeyword(name):
            raise ValueError(f"'{name}' in {text!r} is a Python keyword, not a symbol tensorsieve writes")
        else:
            names[name] = sympy.Symbol(name)
    return parse_expr(text, local_dict=names, global_dict={"Integer": sympy.Integer, "Float": sympy.Float,
                                                           "Rational": sympy.Rational, "Symbol": sympy.Symbol},
                      transformations=_TRANSFORMATIONS)


def _form_of(report):
    """The form report inside what a function returned (a form, or one found in a response part)."""
    if "components" in report and "tensor" in report:
        return report
    raise ValueError("expected a form report (ts.form(...), or a part's 'final' form of a scenario), "
                     "with 'tensor' and 'components' keys")


def components(report):
    """Nonzero components of a form report as ``{name: sympy expression}``.

    Components not listed are zero. ``components(ts.form("6mm", "V2"))`` gives
    ``{'T_xx': T_xx, 'T_yy': T_xx, 'T_zz': T_zz}``."""
    return {c["component"]: expr(c["value"]) for c in _form_of(report)["components"]}


def tensor(report):
    """All 3^rank components of a form report as a sympy ``Array`` of shape (3,)*rank,
    indexed 0, 1, 2 for x, y, z in the report's frame; zeros where the form has none."""
    form = _form_of(report)
    rank = form["tensor"]["rank"]
    if rank == 0:
        values = [c["value"] for c in form["components"]]
        return sympy.Array([expr(values[0]) if values else sympy.Integer(0)])
    flat = [sympy.Integer(0)] * (3 ** rank)
    for c in form["components"]:
        pos = 0
        for letter in c["index"]:
            pos = 3 * pos + "xyz".index(letter)
        flat[pos] = expr(c["value"])
    return sympy.Array(flat, (3,) * rank)


def matrix(report):
    """A rank-1 or rank-2 form as a sympy ``Matrix`` (a column for rank 1; rows i,
    columns j for T_ij). Higher ranks: use :func:`tensor`."""
    form = _form_of(report)
    rank = form["tensor"]["rank"]
    t = tensor(form)
    if rank == 1:
        return sympy.Matrix(3, 1, list(t))
    if rank == 2:
        return sympy.Matrix(3, 3, lambda i, j: t[i, j])
    raise ValueError(f"matrix() takes a rank-1 or rank-2 form; this one has rank {rank}: use tensor()")


def _numpy():
    try:
        import numpy
    except ImportError:
        return None
    return numpy


def evaluate(expression, **values):
    """The value of an expression at given parameters and angles.

    ``expression`` is a report's text or a sympy expression; every keyword names
    one of its symbols: ``evaluate("chi_xxy*sin(3*phi)", phi=angles, chi_xxy=1.0)``.
    Angles are in radians. Each value is a number, a sequence, or (with numpy) an
    array; sequences broadcast against each other like numpy arrays.

    With numpy installed the result is a numpy array when any value is a sequence
    or array (a float or complex number otherwise); without numpy it is a list of
    floats (or complex numbers) for a sequence, a number for numbers. A symbol left
    without a value raises ValueError naming it, so a parameter is never silently
    taken as zero. The result is complex only where the imaginary part is nonzero
    (local-field factors make amplitudes complex).
    """
    e = expr(expression)
    missing = sorted(str(s) for s in e.free_symbols if str(s) not in values)
    if missing:
        raise ValueError(f"no value given for {', '.join(missing)} in {e}; pass them as keywords, "
                         f"e.g. evaluate(..., {missing[0]}=1.0)")
    scalars = {k: v for k, v in values.items() if not _is_sequence(v)}
    arrays = {k: v for k, v in values.items() if _is_sequence(v)}
    e = e.subs({sympy.Symbol(k): sympy.sympify(v) for k, v in scalars.items()})
    np = _numpy()
    if not arrays:
        return _number(complex(sympy.N(e)))
    names = sorted(arrays)
    symbols = [sympy.Symbol(n) for n in names]
    if np is not None:
        args = np.broadcast_arrays(*[np.asarray(arrays[n], dtype=complex if _has_complex(arrays[n]) else float)
                                     for n in names])
        if e.free_symbols:
            f = sympy.lambdify(symbols, e, modules="numpy")
            out = np.asarray(f(*args), dtype=complex)
            out = np.broadcast_to(out, args[0].shape).copy()
        else:
            # A constant (zero included) is no function of the angles: lambdify would hand
            # numpy a bare sympy number, so fill the array instead.
            out = np.full(args[0].shape, complex(sympy.N(e)))
        return out.real.copy() if not np.any(out.imag) else out
    columns = [list(arrays[n]) for n in names]
    length = max(len(c) for c in columns)
    for n, c in zip(names, columns):
        if len(c) not in (1, length):
            raise ValueError(f"'{n}' has {len(c)} values where the others have {length}")
    f = sympy.lambdify(symbols, e, modules="mpmath") if e.free_symbols else None
    out = []
    for k in range(length):
        point = [c[k if len(c) > 1 else 0] for c in columns]
        out.append(_number(complex(f(*point)) if f else complex(sympy.N(e))))
    return out


def _is_sequence(v):
    if hasattr(v, "shape"):
        return v.shape != ()
    return hasattr(v, "__len__") and not isinstance(v, (str, bytes))


def _has_complex(v):
    np = _numpy()
    return np.iscomplexobj(np.asarray(v))


def _number(z):
    return z.real if z.imag == 0 else z
