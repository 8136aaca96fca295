#!/usr/bin/env python3
"""Check real `tensorsieve form ... -f json` output against docs/form.schema.json.

  python3 docs/check_form_schema.py PATH/TO/tensorsieve [--builtin]

It runs the binary on a set of forms chosen to reach every kind of value (rank 0
to 6, polar and axial, i- and c-type, Onsager specs, colourless, grey and
black-white groups, hexagonal axes, sample frames with surd coefficients, a
tensor that vanishes), validates each JSON document against the schema, and then
checks what a schema cannot say: that the counts agree with the lists, that each
component's terms name listed parameters, that names and indices agree, that the
surd terms are canonical, and that each parameter equals its own component.

The schema is checked with the `jsonschema` module (Debian: python3-jsonschema)
when it is installed, and always with the small validator below, which covers
exactly the keywords docs/form.schema.json uses; --builtin skips the module.
Exit status 0 when every check passes.
"""

import json
import math
import os
import re
import subprocess
import sys

HERE = os.path.dirname(os.path.abspath(__file__))

CASES = [
    ["1", "scalar"],
    ["4mm", "T_: axial"],
    ["3m", "V[V2]"],
    ["6mm", "[V2]"],
    ["-3'm'", "aeV2"],
    ["m'm2'", "aeV"],
    ["4mm1'", "aeV"],                      # vanishes: c-type in a grey group
    ["4m'm'", "sigma_ab: onsager(a,b)"],
    ["2'", "rho_abk: axial, time-odd, onsager(a,b)"],
    ["m-3m", "[[V2]2]"],
    ["-43m", "d_ijk: polar, sym(jk)"],
    ["432", "eV[V2]V"],
    ["6/mmm", "V[V3]"],
    ["31m", "[V3]"],
    ["-6m2", "V6"],
    ["m-3m", "[[V2]2]", "--z", "[111]", "--x", "[1-10]"],
    ["4mm", "V[V2]", "--z", "[110]", "--x", "[001]"],
    ["6mm", "V[V2]", "--z", "[100]", "--x", "[120]"],
    ["-42m", "chi_ijkl: sym(jkl)", "--z", "[111]", "--x", "[-110]", "--a", "3.9", "--c", "4.1"],
    # measured lattice parameters: coefficients beyond 64 bits
    ["4mm", "[V4]", "--z", "[101]", "--x", "[010]", "--a", "3.9051", "--c", "4.1023"],
    ["mmm", "V2", "--z", "[111]", "--a", "5.4321", "--b", "5.5012", "--c", "7.6543"],  # radicands beyond 64 bits
]


# ---- a validator for the keywords the schema uses ------------------------------

class Invalid(Exception):
    pass


def resolve(schema_root, ref):
    if not ref.startswith("#/"):
        raise Invalid(f"unsupported $ref {ref}")
    node = schema_root
    for part in ref[2:].split("/"):
        node = node[part]
    return node


def type_ok(value, t):
    if t == "object":
        return isinstance(value, dict)
    if t == "array":
        return isinstance(value, list)
    if t == "string":
        return isinstance(value, str)
    if t == "integer":
        return isinstance(value, int) and not isinstance(value, bool)
    if t == "boolean":
        return isinstance(value, bool)
    if t == "number":
        return isinstance(value, (int, float)) and not isinstance(value, bool)
    raise Invalid(f"unsupported type {t}")


KNOWN = {"$schema", "$id", "title", "description", "type", "required", "additionalProperties",
         "properties", "items", "minItems", "maxItems", "minLength", "pattern", "enum", "minimum",
         "maximum", "$ref", "not", "const", "$defs", "oneOf"}


def validate(value, schema, root, path="$"):
    unknown = set(schema) - KNOWN
    if unknown:
        raise Invalid(f"{path}: the built-in validator does not know {sorted(unknown)}")
    if "$ref" in schema:
        validate(value, resolve(root, schema["$ref"]), root, path)
    types = schema["type"] if isinstance(schema.get("type"), list) else [schema["type"]] if "type" in schema else []
    if types and not any(type_ok(value, t) for t in types):
        raise Invalid(f"{path}: expected {schema['type']}, got {type(value).__name__}")
    if "enum" in schema and value not in schema["enum"]:
        raise Invalid(f"{path}: {value!r} is not one of {schema['enum']}")
    if "const" in schema and value != schema["const"]:
        raise Invalid(f"{path}: {value!r} is not {schema['const']!r}")
    if "oneOf" in schema:
        matches = 0
        for sub in schema["oneOf"]:
            try:
                validate(value, sub, root, path)
                matches += 1
            except Invalid:
                pass
        if matches != 1:
            raise Invalid(f"{path}: {value!r} matches {matches} of the oneOf alternatives, not one")
    if "not" in schema:
        try:
            validate(value, schema["not"], root, path)
        except Invalid:
            pass
        else:
            raise Invalid(f"{path}: {value!r} matches a forbidden schema")
    if isinstance(value, str):
        if len(value) < schema.get("minLength", 0):
            raise Invalid(f"{path}: string shorter than {schema['minLength']}")
        if "pattern" in schema and not re.search(schema["pattern"], value):
            raise Invalid(f"{path}: {value!r} does not match {schema['pattern']}")
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        if "minimum" in schema and value < schema["minimum"]:
            raise Invalid(f"{path}: {value} < {schema['minimum']}")
        if "maximum" in schema and value > schema["maximum"]:
            raise Invalid(f"{path}: {value} > {schema['maximum']}")
    if isinstance(value, list):
        if len(value) < schema.get("minItems", 0):
            raise Invalid(f"{path}: fewer than {schema['minItems']} items")
        if "maxItems" in schema and len(value) > schema["maxItems"]:
            raise Invalid(f"{path}: more than {schema['maxItems']} items")
        if "items" in schema:
            for k, item in enumerate(value):
                validate(item, schema["items"], root, f"{path}[{k}]")
    if isinstance(value, dict):
        for key in schema.get("required", []):
            if key not in value:
                raise Invalid(f"{path}: missing key '{key}'")
        props = schema.get("properties", {})
        if schema.get("additionalProperties", True) is False:
            extra = set(value) - set(props)
            if extra:
                raise Invalid(f"{path}: unexpected keys {sorted(extra)}")
        for key, sub in props.items():
            if key in value:
                validate(value[key], sub, root, f"{path}.{key}")


# ---- what a schema cannot say ------------------------------------------------------

def square_free(n):
    p = 2
    while p * p <= n:
        if n % (p * p) == 0:
            return False
        p += 1
    return True


def gcd(a, b):
    while b:
        a, b = b, a % b
    return abs(a)


def semantic_checks(doc):
    t = doc["tensor"]
    name, rank = t["name"], t["rank"]
    params = doc["parameters"]
    if doc["independent"] != len(params):
        raise Invalid("independent != len(parameters)")
    if doc["nonzero_components"] != len(doc["components"]):
        raise Invalid("nonzero_components != len(components)")
    if len(set(params)) != len(params):
        raise Invalid("a parameter is listed twice")
    if doc["group"]["order"] != len(doc["group"]["operations"]):
        raise Invalid("group order != number of operations")
    if doc["group"]["operations"][0] != "1":
        raise Invalid("the identity is not the first operation")
    by_name = {}
    indices = [c["index"] for c in doc["components"]]
    if indices != sorted(indices, key=lambda s: ["xyz".index(ch) for ch in s]):
        raise Invalid("components are not in lexicographic x<y<z order")
    for c in doc["components"]:
        if len(c["index"]) != rank:
            raise Invalid(f"{c['component']}: index length {len(c['index'])} != rank {rank}")
        if c["component"] != f"{name}_{c['index']}":
            raise Invalid(f"{c['component']}: name does not match tensor name and index")
        for term in c["terms"]:
            if term["parameter"] not in params:
                raise Invalid(f"{c['component']}: unknown parameter {term['parameter']}")
            radicands = [int(s["sqrt_of"]) for s in term["coefficient_terms"]]
            if radicands != sorted(set(radicands)):
                raise Invalid(f"{c['component']}: surd terms not sorted or repeated")
            for r in radicands:
                # within 64 bits square-free; beyond, only distinct square classes are promised
                if r < 2**63 and not square_free(r):
                    raise Invalid(f"{c['component']}: sqrt_of {r} is not square-free")
            for i, r in enumerate(radicands):
                for q in radicands[:i]:
                    if math.isqrt(r * q) ** 2 == r * q:
                        raise Invalid(f"{c['component']}: sqrt_of {q} and {r} are in one square class")
            for s in term["coefficient_terms"]:
                if gcd(int(s["numerator"]), int(s["denominator"])) != 1:
                    raise Invalid(f"{c['component']}: {s['numerator']}/{s['denominator']} not in lowest terms")
        by_name[c["component"]] = c
    for p in params:
        c = by_name.get(p)
        ok = (c is not None and len(c["terms"]) == 1 and c["terms"][0]["parameter"] == p
              and c["terms"][0]["coefficient_terms"] == [{"denominator": 1, "numerator": 1, "sqrt_of": 1}])
        if not ok:
            raise Invalid(f"parameter {p} does not equal its own component")


def main(argv):
    builtin_only = "--builtin" in argv
    args = [a for a in argv if a != "--builtin"]
    if len(args) != 1:
        print(__doc__, file=sys.stderr)
        return 2
    binary = args[0]
    with open(os.path.join(HERE, "form.schema.json"), encoding="utf-8") as f:
        schema = json.load(f)
    module = None
    if not builtin_only:
        try:
            import jsonschema  # noqa: F401
            module = jsonschema
            module.Draft202012Validator.check_schema(schema)
        except ImportError:
            module = None
    failures = 0
    for case in CASES:
        cmd = [binary, "form", *case, "-f", "json"]
        p = subprocess.run(cmd, capture_output=True, text=True)
        label = "form " + " ".join(case)
        if p.returncode != 0:
            print(f"FAIL {label}: exit {p.returncode}: {p.stderr.strip()}")
            failures += 1
            continue
        try:
            doc = json.loads(p.stdout)
            validate(doc, schema, schema)
            if module is not None:
                module.Draft202012Validator(schema).validate(doc)
            semantic_checks(doc)
        except (Invalid, ValueError) as e:
            print(f"FAIL {label}: {e}")
            failures += 1
            continue
        except Exception as e:  # jsonschema.ValidationError and friends
            print(f"FAIL {label}: {type(e).__name__}: {str(e).splitlines()[0]}")
            failures += 1
            continue
        print(f"ok   {label}: {doc['independent']} parameters, {doc['nonzero_components']} components")
    validators = "built-in validator" + (" and the jsonschema module" if module else "")
    print(f"{len(CASES) - failures} of {len(CASES)} outputs valid ({validators})")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
