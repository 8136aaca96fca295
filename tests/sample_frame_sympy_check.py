"""Films with measured lattice parameters, checked exactly and independently.

For a cut (hkl) of a crystal with orthogonal axes (or a bulk crystal in an oblique
frame), this script builds the point group from its generators, keeps the operations
that fix the surface normal, finds the
invariant tensors in the crystal frame (sympy's exact rational nullspace), rotates
them into the sample frame the tool reports, and checks every coefficient of the
tool's JSON form against the rotated tensors. Nothing of the tool's solver is used:
only its frame (three lattice directions) and its answer.

Zeros of sums of square roots are decided exactly: two terms r1*sqrt(x1) and
r2*sqrt(x2) (x rational) are merged when x1*x2 is a perfect square, and a sum of
terms in pairwise different square classes is zero only when every coefficient is
(A. S. Besicovitch, "On the linear independence of fractional powers of integers",
J. London Math. Soc. 15 (1940) 3-6; from memory).

Usage: python3 sample_frame_sympy_check.py TENSORSIEVE_BINARY
"""

import itertools
import json
import math
import re
import subprocess
import sys
from fractions import Fraction

import sympy

AXIS = {"x": 0, "y": 1, "z": 2}


def closure(generators):
    """All products of the generators (3x3 sympy matrices)."""
    group = [sympy.eye(3)]
    frontier = list(group)
    while frontier:
        new = []
        for g in frontier:
            for h in generators:
                p = g * h
                if p not in group and p not in new:
                    new.append(p)
        group += new
        frontier = new
    return group


def diag(*d):
    return sympy.diag(*d)


# Generators in the conventional Cartesian frame (x along a, z along c); common practice.
FOUR_Z = sympy.Matrix([[0, -1, 0], [1, 0, 0], [0, 0, 1]])
GROUPS = {
    "4/mmm": [FOUR_Z, diag(-1, 1, 1), diag(-1, -1, -1)],
    "mmm": [diag(-1, 1, 1), diag(1, -1, 1), diag(1, 1, -1)],
    "4mm": [FOUR_Z, diag(-1, 1, 1)],
}


def run(binary, args):
    out = subprocess.run([binary] + args + ["-f", "json"], capture_output=True, text=True, check=False)
    if out.returncode != 0:
        raise AssertionError(f"{' '.join(args)}: exit {out.returncode}: {out.stderr.strip()}")
    return json.loads(out.stdout)


def lattice_vector(label):
    """The last [u,v,w] or [uvw] of a frame label, as integers."""
    inner = re.findall(r"\[([^\]]*)\]", label)[-1]
    if "," in inner:
        return [int(t) for t in inner.split(",")]
    values = [int(t) for t in re.findall(r"-?\d", inner)]
    assert len(values) == 3, label
    return values


def square_class_zero(terms):
    """True when sum of c*sqrt(x) over (c, x) with rational x > 0 is exactly zero."""
    classes = []  # [representative x, summed coefficient]
    for c, x in terms:
        if c == 0:
            continue
        for entry in classes:
            prod = x * entry[0]
            n, d = prod.numerator, prod.denominator
            rn, rd = math.isqrt(n), math.isqrt(d)
            if rn * rn == n and rd * rd == d:
                # sqrt(x) = sqrt(x * x0) / x0 * sqrt(x0), with sqrt(x * x0) = rn / rd rational
                entry[1] += c * Fraction(rn, rd) / entry[0]
                break
        else:
            classes.append([x, c])
    return all(c == 0 for _, c in classes)


def check(binary, group, placement, lengths, tensor, rank, symmetric):
    """placement: a cut "(hkl)", or a bulk frame ("[uvw] for z", "[uvw] for x")."""
    bulk = isinstance(placement, tuple)
    where = (["--z", placement[0]] + (["--x", placement[1]] if placement[1] else [])) if bulk else ["--cut", placement]
    args = ["sample", group] + where + ["--tensor", tensor]
    for name, value in lengths.items():
        args += [f"--{name}", value]
    report = run(binary, args)
    final = report["parts"][0]["final"]
    a, b, c = (Fraction(lengths.get(k, lengths["a"])) for k in ("a", "b", "c"))
    # the frame axes as unnormalised Cartesian vectors u a + v b + w c (orthogonal axes)
    frame = final["frame"]
    axes = [[Fraction(u) * a, Fraction(v) * b, Fraction(w) * c]
            for u, v, w in (lattice_vector(frame[k]) for k in ("x", "y"))]
    if bulk or "=" in frame["z"]:
        u, v, w = lattice_vector(frame["z"])
        axes.append([Fraction(u) * a, Fraction(v) * b, Fraction(w) * c])
    else:  # a normal without 64-bit [uvw] indices is labelled by its plane: h a* + k b* + l c*
        h, k, l = (int(t) for t in re.findall(r"-?\d", placement))
        axes.append([Fraction(h) / a, Fraction(k) / b, Fraction(l) / c])
    dot = lambda p, q: sum(s * t for s, t in zip(p, q))
    for i, j in ((0, 1), (0, 2), (1, 2)):
        assert dot(axes[i], axes[j]) == 0, (args, "frame axes not orthogonal")
    len2 = [dot(v, v) for v in axes]

    # a bulk sample keeps the whole group; a cut, the operations that fix its normal
    # h a* + k b* + l c*
    stabiliser = closure(GROUPS[group])
    if not bulk:
        hkl = [int(t) for t in re.findall(r"-?\d", placement)]
        normal = sympy.Matrix([sympy.Rational(hkl[0]) / sympy.Rational(a), sympy.Rational(hkl[1]) / sympy.Rational(b),
                               sympy.Rational(hkl[2]) / sympy.Rational(c)])
        stabiliser = [g for g in stabiliser if g * normal == normal]

    # invariant tensors in the crystal frame: exact nullspace of (R x...x R - 1) stacked
    codes = list(itertools.product(range(3), repeat=rank))
    index = {code: i for i, code in enumerate(codes)}
    rows = []
    for g in stabiliser:
        for out in codes:
            row = [0] * len(codes)
            for src in codes:
                row[index[src]] += math.prod(g[o, s] for o, s in zip(out, src))
            row[index[out]] -= 1
            rows.append(row)
    if symmetric:
        for code in codes:
            if tuple(sorted(code)) != code:
                row = [0] * len(codes)
                row[index[code]] += 1
                row[index[tuple(sorted(code))]] -= 1
                rows.append(row)
    basis = sympy.Matrix(rows).nullspace()

    # the tool's form: component -> [(pivot component, [(r, sqrt_of)])]
    params = [p.split("_", 1)[1] for p in final["parameters"]]
    assert len(params) == len(basis), (args, len(params), len(basis))
    form = {}
    for comp in final["components"]:
        form[comp["index"]] = [
            (t["parameter"].split("_", 1)[1],
             [(Fraction(int(x["numerator"]), int(x["denominator"])), x["sqrt_of"]) for x in t["coefficient_terms"]])
            for t in comp["terms"]]

    def rotated(vec, out):
        # unnormalised sample-frame component P and Q = product of its axes' len2:
        # the normalised component is P / sqrt(Q)
        p = Fraction(0)
        for src in codes:
            v = vec[index[src]]
            if v != 0:
                p += Fraction(int(sympy.numer(v)), int(sympy.denom(v))) * math.prod(
                    axes[o][s] for o, s in zip(out, src))
        return p, math.prod(len2[o] for o in out)

    checked = 0
    for vec in basis:
        values = {}
        for out in codes:
            values["".join("xyz"[i] for i in out)] = rotated(vec, out)
        for name, (p, q) in values.items():
            terms = [(-p, 1 / q)]
            for param, coef in form.get(name, []):
                pp, pq = values[param]
                terms += [(r * pp, Fraction(s) / pq) for r, s in coef]
            assert square_class_zero(terms), (args, name, "coefficient differs from the rotated crystal-frame form")
            checked += 1
    print(f"ok: {' '.join(args)}: {len(basis)} parameters, {checked} component checks")


def main():
    binary = sys.argv[1]
    # films of textbook tetragonal and orthorhombic crystals with measured (4-5 digit)
    # lattice parameters; every 64-bit version of the solver overflowed on these
    tetragonal = {"a": "3.9051", "c": "4.1023"}
    for tensor, rank, symmetric in (("V", 1, False), ("V2", 2, False), ("V3", 3, False), ("[V3]", 3, True),
                                    ("[V4]", 4, True)):
        check(binary, "4/mmm", "(101)", tetragonal, tensor, rank, symmetric)
    check(binary, "4mm", "(201)", {"a": "3.99", "c": "4.036"}, "V3", 3, False)
    orthorhombic = {"a": "5.4321", "b": "5.5012", "c": "7.6543"}
    for tensor, rank, symmetric in (("V2", 2, False), ("V3", 3, False), ("[V4]", 4, True)):
        check(binary, "mmm", "(101)", orthorhombic, tensor, rank, symmetric)
        check(binary, "mmm", "(011)", orthorhombic, tensor, rank, symmetric)
    check(binary, "mmm", "(111)", {"a": "5.43", "b": "5.51", "c": "7.65"}, "V3", 3, False)
    # three nonzero indices with 4-5 digit parameters: square roots of numbers beyond
    # 64 bits in the frame's normalisation
    for tensor, rank, symmetric in (("V", 1, False), ("V3", 3, False), ("[V4]", 4, True)):
        check(binary, "mmm", "(111)", orthorhombic, tensor, rank, symmetric)
    check(binary, "mmm", "(111)", {"a": "3.905", "b": "3.912", "c": "4.101"}, "V2", 2, False)
    # bulk crystals in oblique frames: relations between components with coefficients
    # of 20 digits and more (strings in the JSON)
    for placement in (("[101]", "[010]"), ("[111]", "[1-10]")):
        for tensor, rank, symmetric in (("V3", 3, False), ("[V4]", 4, True), ("V4", 4, False)):
            check(binary, "4mm", placement, tetragonal, tensor, rank, symmetric)
    check(binary, "mmm", ("[101]", "[010]"), orthorhombic, "[V4]", 4, True)
    # all three axes oblique (x chosen by the tool, [-b^2, a^2, 0] in lowest terms): the
    # square roots of |y|^2 = |z|^2 |x|^2 go beyond 64 bits
    for tensor, rank, symmetric in (("V2", 2, False), ("V3", 3, False), ("[V4]", 4, True)):
        check(binary, "mmm", ("[111]", None), orthorhombic, tensor, rank, symmetric)
    print("all sample-frame forms agree with the rotated crystal-frame forms")


if __name__ == "__main__":
    main()
