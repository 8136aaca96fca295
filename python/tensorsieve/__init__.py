"""tensorsieve: which responses a crystal, film or interface may show.

Exact answers from Neumann's principle on (magnetic) point groups. Every
function returns the same report as the command line's JSON output (dicts and
lists); errors raise tensorsieve.Error with the command line's located message
(attributes: problem, where, valid, exit_code).

    >>> import tensorsieve as ts
    >>> f = ts.form("-3'm'", "aeV2")       # the linear magnetoelectric tensor of Cr2O3
    >>> ts.components(f)
    {'T_xx': 'T_xx', 'T_yy': 'T_xx', 'T_zz': 'T_zz'}
"""

from fractions import Fraction

from ._tensorsieve import (  # noqa: F401  (the public functions)
    Error,
    fit,
    form,
    group,
    groups,
    identify,
    operations,
    response,
    responses,
    scenario,
    screen,
    structure,
)


def components(report):
    """Nonzero components of a form report as {name: text}, where each text is
    a linear combination of the parameters that sympy.sympify parses,
    e.g. {"d_xxx": "sqrt(3)/2*d_yyy"}."""
    return {c["component"]: c["value"] for c in report["components"]}


def exact_components(report):
    """Nonzero components as {name: {parameter: coefficient}}, each coefficient
    exact: a tuple of (Fraction, radicand) terms standing for the sum of
    fraction * sqrt(radicand), e.g. ((Fraction(1, 2), 3),) for sqrt(3)/2.
    Numerators and denominators beyond 64 bits arrive as strings of digits."""
    out = {}
    for c in report["components"]:
        terms = {}
        for t in c["terms"]:
            terms[t["parameter"]] = tuple(
                (Fraction(int(k["numerator"]), int(k["denominator"])), int(k["sqrt_of"])) for k in t["coefficient_terms"])
        out[c["component"]] = terms
    return out


__all__ = ["Error", "form", "group", "groups", "identify", "operations", "response", "responses", "scenario",
           "screen", "structure", "components", "exact_components"]
