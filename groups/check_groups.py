#!/usr/bin/env python3
"""Independent checker of tensorsieve's point-group data files (groups/*.toml).

It shares no code with the C++ loader. Every operation symbol is turned into an
exact 3x3 matrix in the Cartesian frame, with entries in Q(sqrt 3) held as pairs
of fractions, and every group is closed from its generators. It then checks, for
each [[group]] entry:

  * the schema: every key present with the right type, the enumerations valid,
    `name` unique across all files and aliases, the file matching `system`;
  * that the operation symbols parse, give crystallographic matrices (integer in
    the lattice basis) and carry no prime (the 32 ordinary groups have none);
  * closure: the generators close to a group of exactly `order` operations, and
    no generator is redundant (the set is minimal);
  * the symbol tokens: their texts concatenate to `name`, each text names the
    kind of its operation ("m" and "/m" a mirror, "4" a 4-fold rotation, ...),
    each "/m" is normal to the axis before it, and each operation is in the group;
  * the fingerprint: the number of operations of each (det, trace) kind equals
    that of the standard group of its type (REFERENCE below, from ITA);
  * for a variant: the same fingerprint as its standard entry, and the
    operation set is an orthogonal conjugate of the standard entry's (same
    geometric class), while differing from it (a genuinely other setting);
  * `laue`: the entry named there holds exactly G together with -1 times G;
  * `centrosymmetric` (whether -1 is in G) and `polar` (whether some direction
    is left unmoved by every operation) against the computed values;
  * the setting facts of the frame conventions (SETTING_FACTS: e.g. 321 has a
    2-fold axis along [100] and 312 has none);
  * in all: the 32 standard names, 11 centrosymmetric and 10 polar among them,
    the 13 expected variants, no two entries with the same operation set.

Before reading the data it checks its own matrix builder against coordinate
triplets of ITA (SPOT_CHECKS), and it round-trips every operation of every group
through its own symbol writer.

Usage: python3 groups/check_groups.py [--list NAME ...] [--quiet] [DIR]
  DIR         the folder with the *.toml files (default: the folder of this script)
  --list NAME print every operation of the named group(s) after the checks
  --quiet     print only failures and the closing line
Exit status 0 when everything passes, 1 on any failure (each one is printed).
"""

import glob
import os
import re
import sys
from fractions import Fraction

try:  # the Debian package python3-toml
    import toml as _toml

    def load_toml(path):
        with open(path, encoding="utf-8") as f:
            return _toml.load(f)
except ImportError:  # Python >= 3.11 has a TOML reader of its own
    import tomllib as _tomllib

    def load_toml(path):
        with open(path, "rb") as f:
            return _tomllib.load(f)


# ---------------------------------------------------------------------------
# Q(sqrt 3): a + b*sqrt(3) with rational a, b
# ---------------------------------------------------------------------------


class Q3:
    __slots__ = ("a", "b")

    def __init__(self, a=0, b=0):
        self.a = Fraction(a)
        self.b = Fraction(b)

    @staticmethod
    def of(x):
        return x if isinstance(x, Q3) else Q3(x)

    def __add__(self, o):
        o = Q3.of(o)
        return Q3(self.a + o.a, self.b + o.b)

    __radd__ = __add__

    def __sub__(self, o):
        o = Q3.of(o)
        return Q3(self.a - o.a, self.b - o.b)

    def __rsub__(self, o):
        return Q3.of(o) - self

    def __neg__(self):
        return Q3(-self.a, -self.b)

    def __mul__(self, o):
        o = Q3.of(o)
        return Q3(self.a * o.a + 3 * self.b * o.b, self.a * o.b + self.b * o.a)

    __rmul__ = __mul__

    def inverse(self):
        n = self.a * self.a - 3 * self.b * self.b  # never 0 for a nonzero number: sqrt 3 is irrational
        if n == 0:
            raise ZeroDivisionError("division by zero in Q(sqrt 3)")
        return Q3(self.a / n, -self.b / n)

    def __truediv__(self, o):
        return self * Q3.of(o).inverse()

    def __eq__(self, o):
        o = Q3.of(o)
        return self.a == o.a and self.b == o.b

    def __hash__(self):
        return hash((self.a, self.b))

    def is_zero(self):
        return self.a == 0 and self.b == 0

    def is_rational(self):
        return self.b == 0

    def is_integer(self):
        return self.b == 0 and self.a.denominator == 1

    def sign(self):
        """Sign of the real number a + b sqrt 3."""
        sa, sb = (self.a > 0) - (self.a < 0), (self.b > 0) - (self.b < 0)
        if sa == 0 or sa == sb:
            return sb if sa == 0 else sa
        if sb == 0:
            return sa
        # opposite signs: compare a^2 with 3 b^2
        return sa if self.a * self.a > 3 * self.b * self.b else sb

    def __repr__(self):
        if self.b == 0:
            return str(self.a)
        b = abs(self.b)
        rt = ("" if b.numerator == 1 else str(b.numerator)) + "√3" + ("" if b.denominator == 1 else f"/{b.denominator}")
        if self.a == 0:
            return ("-" if self.b < 0 else "") + rt
        return f"{self.a}{'-' if self.b < 0 else '+'}{rt}"


ZERO, ONE = Q3(0), Q3(1)
SQRT3 = Q3(0, 1)


def exact_sqrt(r):
    """sqrt of a non-negative rational r as a Q3, or None when it is not in Q(sqrt 3)."""
    r = Fraction(r)
    if r < 0:
        return None

    def rational_sqrt(x):
        n, d = x.numerator, x.denominator
        rn, rd = _isqrt(n), _isqrt(d)
        if rn * rn == n and rd * rd == d:
            return Fraction(rn, rd)
        return None

    s = rational_sqrt(r)
    if s is not None:
        return Q3(s)
    s = rational_sqrt(r / 3)  # r = 3 s^2  ->  sqrt r = s sqrt 3
    if s is not None:
        return Q3(0, s)
    return None


def _isqrt(n):
    import math

    return math.isqrt(n)


# ---------------------------------------------------------------------------
# 3x3 matrices as tuples of 9 Q3 (row-major), vectors as tuples of 3 Q3
# ---------------------------------------------------------------------------


def mat(rows):
    return tuple(Q3.of(x) for row in rows for x in row)


def mmul(m, n):
    return tuple(
        sum((m[3 * i + k] * n[3 * k + j] for k in range(3)), ZERO) for i in range(3) for j in range(3)
    )


def mvec(m, v):
    return tuple(sum((m[3 * i + k] * v[k] for k in range(3)), ZERO) for i in range(3))


def mneg(m):
    return tuple(-x for x in m)


def mtrans(m):
    return tuple(m[3 * j + i] for i in range(3) for j in range(3))


def mdet(m):
    a, b, c, d, e, f, g, h, i = m
    return a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g)


def mtrace(m):
    return m[0] + m[4] + m[8]


def minv(m):
    a, b, c, d, e, f, g, h, i = m
    det = mdet(m)
    adj = (
        e * i - f * h, c * h - b * i, b * f - c * e,
        f * g - d * i, a * i - c * g, c * d - a * f,
        d * h - e * g, b * g - a * h, a * e - b * d,
    )
    return tuple(x / det for x in adj)


def dot(u, v):
    return u[0] * v[0] + u[1] * v[1] + u[2] * v[2]


def cross(u, v):
    return (u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0])


IDENTITY = mat([[1, 0, 0], [0, 1, 0], [0, 0, 1]])
INVERSION = mneg(IDENTITY)

# Lattice bases: the columns are a1, a2, c in Cartesian components.
BASIS = {
    "orthogonal": IDENTITY,
    # a1 = (1, 0, 0), a2 = (-1/2, sqrt3/2, 0), c = (0, 0, 1)
    "hexagonal": mat([[1, Q3(Fraction(-1, 2)), 0], [0, Q3(0, Fraction(1, 2)), 0], [0, 0, 1]]),
}
BASIS_INV = {k: minv(v) for k, v in BASIS.items()}


def lattice_to_cartesian(uvw, lattice):
    return mvec(BASIS[lattice], tuple(Q3(x) for x in uvw))


def cartesian_to_lattice(v, lattice):
    """Smallest integer [uvw] along the Cartesian vector v, first nonzero entry positive; None if none."""
    l = mvec(BASIS_INV[lattice], v)
    pivot = next((x for x in l if not x.is_zero()), None)
    if pivot is None:
        return None
    r = [x / pivot for x in l]
    if not all(x.is_rational() for x in r):
        return None
    fr = [x.a for x in r]
    den = 1
    for x in fr:
        den = den * x.denominator // _gcd(den, x.denominator)
    ints = [int(x * den) for x in fr]
    g = 0
    for x in ints:
        g = _gcd(g, abs(x))
    return tuple(x // g for x in ints)


def _gcd(a, b):
    import math

    return math.gcd(a, b)


def direction_str(uvw):
    return "[" + "".join(str(x) for x in uvw) + "]"


# cos and sin of 360/n degrees
COS_SIN = {
    1: (ONE, ZERO),
    2: (Q3(-1), ZERO),
    3: (Q3(Fraction(-1, 2)), Q3(0, Fraction(1, 2))),
    4: (ZERO, ONE),
    6: (Q3(Fraction(1, 2)), Q3(0, Fraction(1, 2))),
}


class SymbolError(Exception):
    pass


def rotation(n, sense, d):
    """Rotation by sense*360/n degrees about the Cartesian vector d (right-hand rule)."""
    c, s = COS_SIN[n]
    if sense < 0:
        s = -s
    len2 = dot(d, d)
    if len2.is_zero():
        raise SymbolError("the direction [000] has no orientation")
    if not len2.is_rational():
        raise SymbolError("axis length not rational")
    # sin/|d| must be exact: (sin/|d|)^2 = sin^2/|d|^2
    s_over_len = ZERO
    if not s.is_zero():
        q = (s * s) / len2
        root = exact_sqrt(q.a) if q.is_rational() else None
        if root is None:
            raise SymbolError(f"a {n}-fold rotation about this axis leaves Q(sqrt 3): not a crystallographic axis")
        s_over_len = root if s.sign() > 0 else -root
    k = (ZERO, -d[2], d[1], d[2], ZERO, -d[0], -d[1], d[0], ZERO)  # [d]x
    one_minus_c = ONE - c
    return tuple(
        (c if i == j else ZERO) + s_over_len * k[3 * i + j] + one_minus_c * d[i] * d[j] / len2
        for i in range(3)
        for j in range(3)
    )


def reflection(normal):
    len2 = dot(normal, normal)
    if len2.is_zero():
        raise SymbolError("the direction [000] has no orientation")
    return tuple(
        (ONE if i == j else ZERO) - 2 * normal[i] * normal[j] / len2 for i in range(3) for j in range(3)
    )


OP_RE = re.compile(
    r"^(?P<rot>-1|1|2|m|-?[346][+-])(?P<prime>')?(?: \[(?P<dir>(?:-?[0-9]){3})\])?$"
)


def parse_op(text, lattice):
    """Symbol -> (matrix, primed). Raises SymbolError."""
    if not isinstance(text, str):
        raise SymbolError(f"operation {text!r} is not a string")
    mt = OP_RE.match(text)
    if not mt:
        raise SymbolError(
            f"operation {text!r} is not of the form 1, -1, 2 [uvw], m [uvw], 3+ [uvw], -4- [uvw], ... "
            "(one space before the direction, single digits, '-' before a negative digit)"
        )
    rot, primed, dtext = mt.group("rot"), mt.group("prime") is not None, mt.group("dir")
    if rot in ("1", "-1"):
        if dtext is not None:
            raise SymbolError(f"operation {text!r}: {rot} takes no direction")
        return (IDENTITY if rot == "1" else INVERSION), primed
    if dtext is None:
        raise SymbolError(f"operation {text!r}: a direction [uvw] is required")
    uvw = tuple(int(x) for x in re.findall(r"-?[0-9]", dtext))
    if uvw == (0, 0, 0):
        raise SymbolError(f"operation {text!r}: the direction [000] has no orientation")
    if lattice == "hexagonal" and uvw[2] != 0 and (uvw[0], uvw[1]) != (0, 0):
        raise SymbolError(
            f"operation {text!r}: in hexagonal axes a symmetry direction is [001] or lies in the ab plane"
        )
    d = lattice_to_cartesian(uvw, lattice)
    if rot == "m":
        return reflection(d), primed
    if rot == "2":
        return rotation(2, 1, d), primed
    improper = rot.startswith("-")
    n = int(rot[-2])
    sense = 1 if rot[-1] == "+" else -1
    r = rotation(n, sense, d)
    return (mneg(r) if improper else r), primed


def check_op_matrix(m, lattice):
    """Return a list of problems: not orthogonal, not crystallographic in the lattice."""
    probs = []
    if mmul(m, mtrans(m)) != IDENTITY:
        probs.append("matrix is not orthogonal")
    lm = mmul(mmul(BASIS_INV[lattice], m), BASIS[lattice])
    if not all(x.is_integer() for x in lm):
        probs.append(f"matrix is not integral in the {lattice} lattice basis (not crystallographic)")
    return probs


# (det, trace) -> kind; the trace of a crystallographic operation is an integer
KINDS = {
    (1, 3): "1", (1, -1): "2", (1, 0): "3", (1, 1): "4", (1, 2): "6",
    (-1, -3): "-1", (-1, 1): "m", (-1, 0): "-3", (-1, -1): "-4", (-1, -2): "-6",
}
KIND_ORDER = ["1", "2", "3", "4", "6", "-1", "m", "-3", "-4", "-6"]


def kind(m):
    det, tr = mdet(m), mtrace(m)
    if not det.is_integer() or not tr.is_integer():
        return None
    return KINDS.get((int(det.a), int(tr.a)))


def fingerprint(ops):
    fp = {}
    for m, _ in ops:
        k = kind(m)
        fp[k] = fp.get(k, 0) + 1
    return fp


def fp_str(fp):
    return " ".join(f"{k}:{fp[k]}" for k in KIND_ORDER if fp.get(k)) or "(empty)"


def op_symbol(m, primed, lattice):
    """The Seitz-type symbol of a matrix: the inverse of parse_op (canonical direction)."""
    p = "'" if primed else ""
    k = kind(m)
    if k is None:
        return None
    if k in ("1", "-1"):
        return k + p
    proper = k in ("2", "3", "4", "6")
    a = (m if proper else mneg(m))  # proper part: its fixed line is the axis (the normal for m)
    a_minus_1 = tuple(a[i] - IDENTITY[i] for i in range(9))
    rows = [a_minus_1[0:3], a_minus_1[3:6], a_minus_1[6:9]]
    axis = None
    for i in range(3):
        for j in range(i + 1, 3):
            c = cross(rows[i], rows[j])
            if any(not x.is_zero() for x in c):
                axis = c
                break
        if axis:
            break
    if axis is None:
        return None
    uvw = cartesian_to_lattice(axis, lattice)
    if uvw is None:
        return None
    n = {"2": 2, "m": 2, "3": 3, "-3": 3, "4": 4, "-4": 4, "6": 6, "-6": 6}[k]
    if n == 2:
        cand = [("m" if k == "m" else "2") + p + " " + direction_str(uvw)]
    else:
        cand = [f"{k}{s}{p} {direction_str(uvw)}" for s in "+-"]
    for c in cand:
        try:
            if parse_op(c, lattice) == (m, primed):
                return c
        except SymbolError:
            pass
    return None


def close(gens, limit=200):
    """Closure of a list of (matrix, primed) under multiplication; None past `limit`."""
    group = {(IDENTITY, False)}
    frontier = [(IDENTITY, False)]
    while frontier:
        nxt = []
        for g in frontier:
            for h in gens:
                p = (mmul(g[0], h[0]), g[1] != h[1])
                if p not in group:
                    group.add(p)
                    nxt.append(p)
                    if len(group) > limit:
                        return None
        frontier = nxt
    return frozenset(group)


# ---------------------------------------------------------------------------
# Reference data (ITA Vol. A ch. 10; see README.md for provenance)
# ---------------------------------------------------------------------------

# The 32 crystallographic point-group types: Schoenflies symbol, crystal system,
# full HM symbol, and the number of operations of each kind.
REFERENCE = {
    "1":     ("C1",  "triclinic",    "1",           {"1": 1}),
    "-1":    ("Ci",  "triclinic",    "-1",          {"1": 1, "-1": 1}),
    "2":     ("C2",  "monoclinic",   "1 2 1",       {"1": 1, "2": 1}),
    "m":     ("Cs",  "monoclinic",   "1 m 1",       {"1": 1, "m": 1}),
    "2/m":   ("C2h", "monoclinic",   "1 2/m 1",     {"1": 1, "2": 1, "-1": 1, "m": 1}),
    "222":   ("D2",  "orthorhombic", "2 2 2",       {"1": 1, "2": 3}),
    "mm2":   ("C2v", "orthorhombic", "m m 2",       {"1": 1, "2": 1, "m": 2}),
    "mmm":   ("D2h", "orthorhombic", "2/m 2/m 2/m", {"1": 1, "2": 3, "-1": 1, "m": 3}),
    "4":     ("C4",  "tetragonal",   "4",           {"1": 1, "2": 1, "4": 2}),
    "-4":    ("S4",  "tetragonal",   "-4",          {"1": 1, "2": 1, "-4": 2}),
    "4/m":   ("C4h", "tetragonal",   "4/m",         {"1": 1, "2": 1, "4": 2, "-1": 1, "m": 1, "-4": 2}),
    "422":   ("D4",  "tetragonal",   "4 2 2",       {"1": 1, "2": 5, "4": 2}),
    "4mm":   ("C4v", "tetragonal",   "4 m m",       {"1": 1, "2": 1, "4": 2, "m": 4}),
    "-42m":  ("D2d", "tetragonal",   "-4 2 m",      {"1": 1, "2": 3, "m": 2, "-4": 2}),
    "4/mmm": ("D4h", "tetragonal",   "4/m 2/m 2/m", {"1": 1, "2": 5, "4": 2, "-1": 1, "m": 5, "-4": 2}),
    "3":     ("C3",  "trigonal",     "3",           {"1": 1, "3": 2}),
    "-3":    ("C3i", "trigonal",     "-3",          {"1": 1, "3": 2, "-1": 1, "-3": 2}),
    "32":    ("D3",  "trigonal",     "3 2 1",       {"1": 1, "2": 3, "3": 2}),
    "3m":    ("C3v", "trigonal",     "3 m 1",       {"1": 1, "3": 2, "m": 3}),
    "-3m":   ("D3d", "trigonal",     "-3 2/m 1",    {"1": 1, "2": 3, "3": 2, "-1": 1, "m": 3, "-3": 2}),
    "6":     ("C6",  "hexagonal",    "6",           {"1": 1, "2": 1, "3": 2, "6": 2}),
    "-6":    ("C3h", "hexagonal",    "-6",          {"1": 1, "3": 2, "m": 1, "-6": 2}),
    "6/m":   ("C6h", "hexagonal",    "6/m",         {"1": 1, "2": 1, "3": 2, "6": 2, "-1": 1, "m": 1, "-3": 2, "-6": 2}),
    "622":   ("D6",  "hexagonal",    "6 2 2",       {"1": 1, "2": 7, "3": 2, "6": 2}),
    "6mm":   ("C6v", "hexagonal",    "6 m m",       {"1": 1, "2": 1, "3": 2, "6": 2, "m": 6}),
    "-6m2":  ("D3h", "hexagonal",    "-6 m 2",      {"1": 1, "2": 3, "3": 2, "m": 4, "-6": 2}),
    "6/mmm": ("D6h", "hexagonal",    "6/m 2/m 2/m", {"1": 1, "2": 7, "3": 2, "6": 2, "-1": 1, "m": 7, "-3": 2, "-6": 2}),
    "23":    ("T",   "cubic",        "2 3",         {"1": 1, "2": 3, "3": 8}),
    "m-3":   ("Th",  "cubic",        "2/m -3",      {"1": 1, "2": 3, "3": 8, "-1": 1, "m": 3, "-3": 8}),
    "432":   ("O",   "cubic",        "4 3 2",       {"1": 1, "2": 9, "3": 8, "4": 6}),
    "-43m":  ("Td",  "cubic",        "-4 3 m",      {"1": 1, "2": 3, "3": 8, "m": 6, "-4": 6}),
    "m-3m":  ("Oh",  "cubic",        "4/m -3 2/m",  {"1": 1, "2": 9, "3": 8, "4": 6, "-1": 1, "m": 9, "-3": 8, "-4": 6}),
}

# The non-standard settings the data must hold: name -> (type, full symbol).
EXPECTED_VARIANTS = {
    "112": ("2", "1 1 2"),
    "211": ("2", "2 1 1"),
    "11m": ("m", "1 1 m"),
    "m11": ("m", "m 1 1"),
    "112/m": ("2/m", "1 1 2/m"),
    "2/m11": ("2/m", "2/m 1 1"),
    "2mm": ("mm2", "2 m m"),
    "m2m": ("mm2", "m 2 m"),
    "-4m2": ("-42m", "-4 m 2"),
    "312": ("32", "3 1 2"),
    "31m": ("3m", "3 1 m"),
    "-31m": ("-3m", "-3 1 2/m"),
    "-62m": ("-6m2", "-6 2 m"),
}

# Aliases the brief asks for (others may be added).
REQUIRED_ALIASES = {"32": "321", "3m": "3m1", "-3m": "-3m1", "2": "121", "m": "1m1", "2/m": "12/m1"}

# Frame conventions of README.md: operations each setting must have (+) and must not have (-).
SETTING_FACTS = {
    "2": ["+2 [010]"], "m": ["+m [010]"], "2/m": ["+2 [010]", "+m [010]"],
    "112": ["+2 [001]"], "11m": ["+m [001]"], "112/m": ["+2 [001]", "+m [001]"],
    "211": ["+2 [100]"], "m11": ["+m [100]"], "2/m11": ["+2 [100]", "+m [100]"],
    "mm2": ["+2 [001]", "+m [100]", "+m [010]"],
    "2mm": ["+2 [100]", "+m [010]", "+m [001]"],
    "m2m": ["+2 [010]", "+m [100]", "+m [001]"],
    "4": ["+4+ [001]"], "-4": ["+-4+ [001]"],
    "422": ["+2 [100]", "+2 [110]"],
    "4mm": ["+m [100]", "+m [110]"],
    "-42m": ["+-4+ [001]", "+2 [100]", "+m [1-10]", "-m [100]", "-2 [110]"],
    "-4m2": ["+-4+ [001]", "+m [100]", "+2 [110]", "-2 [100]", "-m [1-10]"],
    "3": ["+3+ [001]"], "-3": ["+-3+ [001]"],
    "32": ["+2 [100]", "+2 [010]", "+2 [110]", "-2 [1-10]", "-2 [120]"],
    "312": ["+2 [1-10]", "+2 [120]", "+2 [210]", "-2 [100]"],
    "3m": ["+m [100]", "+m [010]", "+m [110]", "-m [1-10]", "-m [120]"],
    "31m": ["+m [1-10]", "+m [120]", "+m [210]", "-m [100]"],
    "-3m": ["+2 [100]", "+m [100]", "-m [1-10]"],
    "-31m": ["+2 [1-10]", "+m [1-10]", "+m [120]", "-m [100]"],
    "6": ["+6+ [001]"], "-6": ["+-6+ [001]", "+m [001]"],
    "622": ["+2 [100]", "+2 [1-10]"],
    "6mm": ["+m [100]", "+m [1-10]"],
    "-6m2": ["+m [001]", "+m [100]", "+2 [1-10]", "-2 [100]", "-m [1-10]"],
    "-62m": ["+m [001]", "+2 [100]", "+m [1-10]", "-m [100]", "-2 [1-10]"],
    "6/mmm": ["+m [001]", "+m [100]", "+m [1-10]"],
    "23": ["+2 [001]", "+3+ [111]", "-4+ [001]"],
    "m-3": ["+m [001]", "+-3+ [111]"],
    "432": ["+4+ [001]", "+3+ [111]", "+2 [110]"],
    "-43m": ["+-4+ [001]", "+m [1-10]", "-m [001]"],
    "m-3m": ["+m [001]", "+-3+ [111]", "+m [1-10]"],
}

# ITA coordinate triplets (x', y', z' in the lattice basis) of a few operations,
# from memory of the general-position lists of ITA Vol. A (P6/mmm, P622, P3m1,
# P-6, Pm-3m, P4, P-4): a self-test of the matrix builder.
SPOT_CHECKS = [
    ("hexagonal", "3+ [001]", "-y,x-y,z"),
    ("hexagonal", "3- [001]", "-x+y,-x,z"),
    ("hexagonal", "6+ [001]", "x-y,x,z"),
    ("hexagonal", "6- [001]", "y,-x+y,z"),
    ("hexagonal", "2 [100]", "x-y,-y,-z"),
    ("hexagonal", "2 [010]", "-x,-x+y,-z"),
    ("hexagonal", "2 [110]", "y,x,-z"),
    ("hexagonal", "2 [1-10]", "-y,-x,-z"),
    ("hexagonal", "2 [120]", "-x+y,y,-z"),
    ("hexagonal", "2 [210]", "x,x-y,-z"),
    ("hexagonal", "m [100]", "-x+y,y,z"),
    ("hexagonal", "m [1-10]", "y,x,z"),
    ("hexagonal", "m [001]", "x,y,-z"),
    ("hexagonal", "-6+ [001]", "-x+y,-x,-z"),
    ("hexagonal", "-6- [001]", "-y,x-y,-z"),
    ("hexagonal", "-3+ [001]", "y,-x+y,-z"),
    ("orthogonal", "4+ [001]", "-y,x,z"),
    ("orthogonal", "-4+ [001]", "y,-x,-z"),
    ("orthogonal", "3+ [111]", "z,x,y"),
    ("orthogonal", "3- [111]", "y,z,x"),
    ("orthogonal", "-3+ [111]", "-z,-x,-y"),
    ("orthogonal", "2 [110]", "y,x,-z"),
    ("orthogonal", "2 [1-10]", "-y,-x,-z"),
    ("orthogonal", "m [1-10]", "y,x,z"),
    ("orthogonal", "m [110]", "-y,-x,z"),
    ("orthogonal", "4+ [100]", "x,-z,y"),
    ("orthogonal", "3+ [-11-1]", "z,-x,-y"),
    ("orthogonal", "3+ [1-1-1]", "-z,-x,y"),
]


def triplet_matrix(text):
    rows = []
    for part in text.split(","):
        coeffs = [0, 0, 0]
        for sign, var in re.findall(r"([+-]?)([xyz])", part):
            coeffs["xyz".index(var)] = -1 if sign == "-" else 1
        rows.append(coeffs)
    return mat(rows)


def self_test(fail):
    for lattice, sym, trip in SPOT_CHECKS:
        try:
            m, _ = parse_op(sym, lattice)
        except SymbolError as e:
            fail(f"self-test: {sym} ({lattice}): {e}")
            continue
        lm = mmul(mmul(BASIS_INV[lattice], m), BASIS[lattice])
        if lm != triplet_matrix(trip):
            fail(f"self-test: {sym} ({lattice}) should be {trip} in the lattice basis, got {lm}")
    # explicit Cartesian checks of the brief
    m, _ = parse_op("3+ [001]", "hexagonal")
    if mvec(m, (ONE, ZERO, ZERO)) != (Q3(Fraction(-1, 2)), Q3(0, Fraction(1, 2)), ZERO):
        fail("self-test: 3+ [001] must map x to (-1/2, sqrt3/2, 0)")
    m, _ = parse_op("m [1-10]", "hexagonal")
    n = (Q3(0, Fraction(1, 2)), Q3(Fraction(-1, 2)), ZERO)  # unit vector at -30 deg
    if mvec(m, n) != tuple(-x for x in n):
        fail("self-test: m [1-10] (hexagonal) must reverse the unit vector at -30 degrees")
    if mvec(m, (Q3(Fraction(1, 2)), Q3(0, Fraction(1, 2)), ZERO)) != (Q3(Fraction(1, 2)), Q3(0, Fraction(1, 2)), ZERO):
        fail("self-test: m [1-10] (hexagonal) must fix the direction at 60 degrees")
    if lattice_to_cartesian((1, 2, 0), "hexagonal") != (ZERO, SQRT3, ZERO):
        fail("self-test: [120] in hexagonal axes must be (0, sqrt3, 0)")
    m, _ = parse_op("4+ [001]", "orthogonal")
    if mvec(m, (ONE, ZERO, ZERO)) != (ZERO, ONE, ZERO):
        fail("self-test: 4+ [001] must map x to y")
    for lattice, bad in (("orthogonal", "4+ [110]"), ("orthogonal", "3+ [100]"), ("orthogonal", "6+ [111]"),
                         ("hexagonal", "4+ [001]"), ("hexagonal", "3+ [100]"), ("hexagonal", "2 [101]")):
        try:
            m, _ = parse_op(bad, lattice)
        except SymbolError:
            continue
        if not check_op_matrix(m, lattice):
            fail(f"self-test: {bad} ({lattice}) should be refused as non-crystallographic")


# ---------------------------------------------------------------------------
# The checks
# ---------------------------------------------------------------------------

SYSTEMS = ["triclinic", "monoclinic", "orthorhombic", "tetragonal", "trigonal", "hexagonal", "cubic"]
KEYS = {
    "name": str, "full": str, "schoenflies": str, "system": str, "laue": str, "order": int,
    "lattice": str, "standard": bool, "type": str, "centrosymmetric": bool, "polar": bool,
    "setting": str, "aliases": list, "generators": list, "symbol": list,
}
# Optional keys: magnetic_names lists the standard symbols of black-white types that occur
# in more than one orientation in this group (the C++ loader picks the type's name from it).
OPTIONAL_KEYS = {"magnetic_names": list}
# text of a symbol token -> kind of its operation
TOKEN_KIND = {"1": "1", "-1": "-1", "2": "2", "m": "m", "/m": "m", "3": "3", "-3": "-3",
              "4": "4", "-4": "-4", "6": "6", "-6": "-6"}


def conjugators():
    """Changes of setting to try, as pairs (P, P^-1): signed axis permutations times z rotations by
    30k degrees, each also times a z rotation by 45 degrees (scaled by sqrt 2 to stay in Q(sqrt 3);
    the scale cancels in P g P^-1)."""
    import itertools

    perms = []
    for p in itertools.permutations(range(3)):
        for signs in itertools.product((1, -1), repeat=3):
            rows = [[0, 0, 0] for _ in range(3)]
            for i in range(3):
                rows[i][p[i]] = signs[i]
            perms.append(mat(rows))
    c30, s30 = Q3(0, Fraction(1, 2)), Q3(Fraction(1, 2))
    rz30 = mat([[c30, -s30, 0], [s30, c30, 0], [0, 0, 1]])
    rz = [IDENTITY]
    for _ in range(11):
        rz.append(mmul(rz[-1], rz30))
    rz45 = mat([[1, -1, 0], [1, 1, 0], [0, 0, 1]])  # sqrt2 times the rotation by 45 deg about z
    out = []
    for extra, extra_inv in ((IDENTITY, IDENTITY), (rz45, minv(rz45))):
        for s in perms:
            for r in rz:
                sr = mmul(s, r)  # orthogonal: its inverse is its transpose
                out.append((mmul(sr, extra), mmul(extra_inv, mtrans(sr))))
    return out


def main(argv):
    args = argv[1:]
    quiet = "--quiet" in args
    args = [a for a in args if a != "--quiet"]
    to_list = []
    while "--list" in args:
        i = args.index("--list")
        if i + 1 >= len(args):
            print("usage: check_groups.py [--list NAME ...] [--quiet] [DIR]", file=sys.stderr)
            return 2
        to_list.append(args[i + 1])
        del args[i : i + 2]
    folder = args[0] if args else os.path.dirname(os.path.abspath(__file__))

    failures = []

    def fail(msg):
        failures.append(msg)
        print("FAIL: " + msg)

    self_test(fail)

    files = sorted(glob.glob(os.path.join(folder, "*.toml")))
    expected_files = {s + ".toml" for s in SYSTEMS}
    found = {os.path.basename(f) for f in files}
    for missing in sorted(expected_files - found):
        fail(f"missing file {missing}")
    for extra in sorted(found - expected_files):
        fail(f"unexpected file {extra} (one file per crystal system)")

    entries = []  # dicts with the parsed data and computed group
    names = {}
    for path in files:
        base = os.path.basename(path)
        with open(path, encoding="utf-8") as f:
            text = f.read()
        if "International Tables" not in text.split("[[group]]")[0]:
            fail(f"{base}: no provenance comment (International Tables ...) before the first [[group]]")
        try:
            data = load_toml(path)
        except Exception as e:  # noqa: BLE001 - any parse error is a failure
            fail(f"{base}: not valid TOML: {e}")
            continue
        if set(data) != {"group"} or not isinstance(data["group"], list):
            fail(f"{base}: must hold only an array of tables [[group]] (found keys {sorted(data)})")
            continue
        for idx, g in enumerate(data["group"]):
            where = f"{base}: group #{idx + 1} ({g.get('name', '?')})"
            ok = True
            for k, t in KEYS.items():
                if k not in g:
                    fail(f"{where}: missing key '{k}'")
                    ok = False
                elif not isinstance(g[k], t) or (t is int and isinstance(g[k], bool)):
                    fail(f"{where}: key '{k}' must be a {t.__name__}")
                    ok = False
            for k in g:
                if k not in KEYS and k not in OPTIONAL_KEYS:
                    fail(f"{where}: unknown key '{k}'")
            if not ok:
                continue
            where = f"{base}: {g['name']}"
            if g["system"] not in SYSTEMS:
                fail(f"{where}: system {g['system']!r} not one of {SYSTEMS}")
                continue
            if base != g["system"] + ".toml":
                fail(f"{where}: system {g['system']} belongs in {g['system']}.toml")
            want_lattice = "hexagonal" if g["system"] in ("trigonal", "hexagonal") else "orthogonal"
            if g["lattice"] != want_lattice:
                fail(f"{where}: lattice must be {want_lattice!r} for the {g['system']} system")
                continue
            for k in ("aliases", "generators"):
                if not all(isinstance(x, str) for x in g[k]):
                    fail(f"{where}: '{k}' must be a list of strings")
                    ok = False
            if not all(isinstance(t, list) and len(t) == 2 and all(isinstance(x, str) for x in t) for t in g["symbol"]):
                fail(f"{where}: 'symbol' must be a list of [text, operation] pairs of strings")
                ok = False
            if not ok:
                continue
            for n in [g["name"]] + g["aliases"]:
                if n in names:
                    fail(f"{where}: name or alias {n!r} already used by {names[n]}")
                names[n] = where
            entries.append({"g": g, "where": where})

    by_name = {e["g"]["name"]: e for e in entries}

    # ---- per entry: operations, closure, tokens ----
    for e in entries:
        g, where = e["g"], e["where"]
        lat = g["lattice"]
        e["group"] = None

        def op(text, what):
            try:
                m, primed = parse_op(text, lat)
            except SymbolError as ex:
                fail(f"{where}: {what}: {ex}")
                return None
            if primed:
                fail(f"{where}: {what}: {text!r} is primed; the ordinary point groups use no time reversal")
            for p in check_op_matrix(m, lat):
                fail(f"{where}: {what}: {text!r}: {p}")
            return (m, primed)

        gens = [op(t, "generator") for t in g["generators"]]
        if not gens:
            fail(f"{where}: no generators (write [\"1\"] for the trivial group)")
            continue
        if any(x is None for x in gens):
            continue
        grp = close(gens)
        if grp is None:
            fail(f"{where}: the generators do not close to a finite group of at most 200 operations")
            continue
        e["group"] = grp
        if len(grp) != g["order"]:
            fail(f"{where}: generators close to {len(grp)} operations, order says {g['order']}")
        # minimality: no generator can be dropped (the identity alone is allowed for the trivial group)
        if len(gens) == 1 and gens[0][0] == IDENTITY and len(grp) == 1:
            pass
        else:
            for i in range(len(gens)):
                rest = gens[:i] + gens[i + 1 :]
                if close(rest) == grp:
                    fail(f"{where}: generator {g['generators'][i]!r} is redundant (the set is not minimal)")
        if len(set(g["generators"])) != len(g["generators"]):
            fail(f"{where}: a generator is repeated")

        # symbol tokens
        joined = "".join(t[0] for t in g["symbol"])
        if joined != g["name"]:
            fail(f"{where}: symbol tokens concatenate to {joined!r}, not to the name {g['name']!r}")
        prev = None
        for text, optext in g["symbol"]:
            o = op(optext, f"symbol token {text!r}")
            if o is None:
                prev = None
                continue
            if o not in grp:
                fail(f"{where}: symbol token [{text!r}, {optext!r}]: the operation is not in the group")
            want = TOKEN_KIND.get(text)
            if want is None:
                fail(f"{where}: symbol token text {text!r} is not one of {sorted(TOKEN_KIND)}")
            elif kind(o[0]) != want:
                fail(f"{where}: symbol token [{text!r}, {optext!r}]: the text names a {want} but the operation is a {kind(o[0])}")
            if text == "/m":
                if prev is None or prev[1] not in ("2", "3", "4", "6", "-3", "-4", "-6"):
                    fail(f"{where}: '/m' must follow a rotation token")
                else:
                    axis_of = lambda s: s.split(" ", 1)[1] if " " in s else None  # noqa: E731
                    if axis_of(optext) != axis_of(prev[0]):
                        fail(f"{where}: '/m' token {optext!r} is not normal to the axis of {prev[0]!r}")
            prev = (optext, want)

        # round trip every operation through the symbol writer
        for m, primed in grp:
            s = op_symbol(m, primed, lat)
            if s is None:
                fail(f"{where}: an operation of the group has no Seitz symbol in {lat} axes: {m}")
        e["fp"] = fingerprint(grp)

    # ---- per entry: reference data, type, Laue, flags ----
    conj = conjugators()
    standard_names = set()
    for e in entries:
        g, where, grp = e["g"], e["where"], e["group"]
        name, typ = g["name"], g["type"]
        if g["standard"]:
            standard_names.add(name)
            if typ != name:
                fail(f"{where}: a standard entry must have type = name")
            if name not in REFERENCE:
                fail(f"{where}: {name!r} is not one of the 32 standard short symbols")
                continue
        else:
            if name in REFERENCE:
                fail(f"{where}: {name!r} is a standard symbol but standard = false")
            if name not in EXPECTED_VARIANTS:
                fail(f"{where}: variant {name!r} is not in EXPECTED_VARIANTS of check_groups.py (add it there when adding a setting)")
            elif EXPECTED_VARIANTS[name][0] != typ:
                fail(f"{where}: type {typ!r}, expected {EXPECTED_VARIANTS[name][0]!r}")
            elif EXPECTED_VARIANTS[name][1] != g["full"]:
                fail(f"{where}: full symbol {g['full']!r}, expected {EXPECTED_VARIANTS[name][1]!r}")
        if typ not in REFERENCE:
            fail(f"{where}: type {typ!r} is not one of the 32 standard short symbols")
            continue
        schoen, system, full, fp_ref = REFERENCE[typ]
        if g["schoenflies"] != schoen:
            fail(f"{where}: schoenflies {g['schoenflies']!r}, expected {schoen!r} for type {typ}")
        if g["system"] != system:
            fail(f"{where}: system {g['system']!r}, expected {system!r} for type {typ}")
        if g["standard"] and g["full"] != full:
            fail(f"{where}: full symbol {g['full']!r}, expected {full!r}")
        if g["order"] != sum(fp_ref.values()):
            fail(f"{where}: order {g['order']}, the type {typ} has {sum(fp_ref.values())}")
        if grp is None:
            continue
        if e["fp"] != fp_ref:
            fail(f"{where}: operation counts {fp_str(e['fp'])} differ from those of type {typ}: {fp_str(fp_ref)}")
        # the standard entry of the type
        std = by_name.get(typ)
        if std is None or not std["g"]["standard"]:
            fail(f"{where}: type {typ!r} names no standard entry")
        elif not g["standard"] and std.get("group") is not None:
            if e["fp"] != std["fp"]:
                fail(f"{where}: fingerprint {fp_str(e['fp'])} differs from the standard entry {typ}: {fp_str(std['fp'])}")
            if grp == std["group"]:
                fail(f"{where}: the same operation set as the standard entry {typ}: make it an alias instead")
            elif g["schoenflies"] != std["g"]["schoenflies"]:
                fail(f"{where}: schoenflies differs from the standard entry {typ}")
            else:
                # P maps the standard group onto this one when it maps the standard generators into it:
                # the image is then a subgroup of G of the same order.
                sgens = [parse_op(t, std["g"]["lattice"])[0] for t in std["g"]["generators"]]
                target = {m for m, _ in grp}
                if not any(all(mmul(mmul(p, m), pinv) in target for m in sgens) for p, pinv in conj):
                    fail(f"{where}: not conjugate to the standard entry {typ} by any tried change of setting "
                         "(signed axis permutations x z rotations by 30k or 30k+45 degrees)")
        # flags
        cs = (INVERSION, False) in grp
        if g["centrosymmetric"] != cs:
            fail(f"{where}: centrosymmetric = {str(g['centrosymmetric']).lower()}, computed {str(cs).lower()}")
        total = tuple(sum((m[i] for m, _ in grp), ZERO) for i in range(9))
        polar = any(not x.is_zero() for x in total)  # the average of G projects onto its fixed space
        if g["polar"] != polar:
            fail(f"{where}: polar = {str(g['polar']).lower()}, computed {str(polar).lower()}")
        # Laue: the named entry is exactly G + (-1)G
        laue = by_name.get(g["laue"])
        want = frozenset(grp | {(mneg(m), p) for m, p in grp})
        if laue is None:
            fail(f"{where}: laue {g['laue']!r} names no entry")
        elif laue.get("group") is not None and laue["group"] != want:
            ln = next((x["g"]["name"] for x in entries if x.get("group") == want), None)
            hint = f" (that is {ln!r})" if ln else ""
            fail(f"{where}: laue {g['laue']!r} is not the group generated by G and -1{hint}")
        # setting facts
        for fact in SETTING_FACTS.get(name, []):
            must, optext = fact[0] == "+", fact[1:]
            try:
                o = parse_op(optext, g["lattice"])
            except SymbolError as ex:
                fail(f"checker: bad SETTING_FACTS entry {fact!r} for {name}: {ex}")
                continue
            if (o in grp) != must:
                fail(f"{where}: the setting convention says {optext!r} is {'in' if must else 'not in'} this group")

    # ---- totals ----
    for n in sorted(set(REFERENCE) - standard_names):
        fail(f"missing standard entry {n!r}")
    if len(standard_names) != 32:
        fail(f"{len(standard_names)} standard entries, expected 32")
    for n in sorted(set(EXPECTED_VARIANTS) - set(by_name)):
        fail(f"missing variant {n!r}")
    for typ, alias in REQUIRED_ALIASES.items():
        if typ in by_name and alias not in by_name[typ]["g"]["aliases"]:
            fail(f"{typ}: missing alias {alias!r}")
    std_entries = [e for e in entries if e["g"]["standard"]]
    ncs = sum(1 for e in std_entries if e["g"]["centrosymmetric"])
    npol = sum(1 for e in std_entries if e["g"]["polar"])
    if ncs != 11:
        fail(f"{ncs} centrosymmetric standard entries, expected 11 (the Laue classes)")
    if npol != 10:
        fail(f"{npol} polar standard entries, expected 10 (the pyroelectric classes)")
    seen = {}
    for e in entries:
        if e.get("group") is None:
            continue
        if e["group"] in seen:
            fail(f"{e['where']}: the same operation set as {seen[e['group']]} (one of them should be an alias)")
        seen[e["group"]] = e["g"]["name"]

    # ---- report ----
    if not quiet:
        print(f"{'name':7} {'type':6} {'std':3} {'order':>5}  operations by kind")
        for e in entries:
            g = e["g"]
            print(f"{g['name']:7} {g['type']:6} {'yes' if g['standard'] else 'no':3} {g['order']:>5}  "
                  f"{fp_str(e['fp']) if e.get('fp') else '-'}")
    for n in to_list:
        e = by_name.get(n) or next((x for x in entries if n in x["g"]["aliases"]), None)
        if e is None or e.get("group") is None:
            fail(f"--list {n}: no such group (or it failed to close)")
            continue
        lat = e["g"]["lattice"]
        ops = sorted(e["group"], key=lambda o: (KIND_ORDER.index(kind(o[0])), op_symbol(o[0], o[1], lat) or "?"))
        syms = [op_symbol(m, p, lat) or "?" for m, p in ops]
        print(f"{e['g']['name']} ({lat} axes, {len(syms)} operations): " + ", ".join(syms))

    nstd = len(standard_names)
    nvar = sum(1 for e in entries if not e["g"]["standard"])
    if failures:
        print(f"check_groups: {len(failures)} failure(s) in {len(entries)} entries ({nstd} standard, {nvar} variants)")
        return 1
    print(f"check_groups: {len(entries)} entries ({nstd} standard, {nvar} variants) pass every check")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
