"""The Python module against the command line and against sympy.

Run by ctest (python_module_test) with PYTHONPATH at the built package,
TENSORSIEVE_BINARY at the built executable and TENSORSIEVE_SOURCE_DIR at the
source tree.
"""

import itertools
import json
import os
import subprocess

import pytest
import sympy

import tensorsieve as ts

BINARY = os.environ["TENSORSIEVE_BINARY"]
DATA = os.path.join(os.environ["TENSORSIEVE_SOURCE_DIR"], "tests", "data")


def cli_json(*args):
    out = subprocess.run([BINARY, *args, "-f", "json"], check=True, stdout=subprocess.PIPE, text=True).stdout
    return json.loads(out)


FORM_CASES = [
    ("4mm", "V[V2]", "", ""),
    ("-3'm'", "aeV2", "", ""),
    ("6mm1'", "d_ijk: polar, sym(jk)", "", ""),
    ("m-3m", "[[V2]2]", "[110]", "[001]"),
    ("4/mm'm'", "sigma_ab: onsager(a,b)", "", ""),
    ("-43m", "V3", "", ""),
]


@pytest.mark.parametrize("group,spec,z,x", FORM_CASES)
def test_form_is_the_cli_json(group, spec, z, x):
    frame = ["--z", z, "--x", x] if z else []
    assert ts.form(group, spec, z=z, x=x) == cli_json("form", group, spec, *frame)


def test_group_identify_and_responses_are_the_cli_json():
    assert ts.group("m'm2'") == cli_json("group", "m'm2'")
    assert ts.groups(magnetic=True) == cli_json("groups", "--magnetic")
    assert ts.identify(["4+ [001]", "m' [100]"]) == cli_json("identify", "4+ [001]", "m' [100]")
    assert ts.responses() == cli_json("responses")
    assert ts.response("anomalous-hall", "4m'm'") == cli_json("response", "anomalous-hall", "4m'm'")


def full_tensor(report):
    """{index tuple: sympy expression} for all 3^n components of a form report."""
    rank = report["tensor"]["rank"]
    values = {c["index"]: sympy.sympify(c["value"]) for c in report["components"]}
    axis = {"x": 0, "y": 1, "z": 2}
    tensor = {idx: sympy.Integer(0) for idx in itertools.product(range(3), repeat=rank)}
    for index, value in values.items():
        tensor[tuple(axis[a] for a in index)] = value
    return tensor


# Neumann's principle (common practice): every operation R of the group leaves
# the tensor unchanged, T'_{i...} = s R_ia ... T_a... with s = det R for an
# axial tensor and a further -1 for a time-odd one under a primed operation.
SYMPY_CASES = [("-3'm'", "aeV2"), ("6mm", "V2"), ("3m", "V3"), ("4'/m", "aeV"), ("-6m2", "eV3"), ("m'm2'", "aV2")]


@pytest.mark.parametrize("group,spec", SYMPY_CASES)
def test_form_is_invariant_under_every_operation(group, spec):
    report = ts.form(group, spec)
    tensor = full_tensor(report)
    rank = report["tensor"]["rank"]
    axial, odd = report["tensor"]["axial"], report["tensor"]["time_odd"]
    assert any(v != 0 for v in tensor.values()) or report["independent"] == 0
    for op in ts.operations(group):
        R = sympy.Matrix([[sympy.sympify(e) for e in row] for row in op["matrix"]])
        sign = (R.det() if axial else 1) * (-1 if (odd and op["primed"]) else 1)
        for idx in tensor:
            image = 0
            for src in itertools.product(range(3), repeat=rank):
                factor = 1
                for i, a in zip(idx, src):
                    factor *= R[i, a]
                if factor != 0:
                    image += factor * tensor[src]
            assert sympy.simplify(sign * image - tensor[idx]) == 0, (op["symbol"], idx)


def test_components_as_text_and_as_exact_values():
    report = ts.form("6mm", "d_ijk: polar, sym(jk)")
    text = ts.components(report)
    exact = ts.exact_components(report)
    assert set(text) == set(exact)
    for name, value in text.items():
        rebuilt = sum(sympy.Rational(f.numerator, f.denominator) * sympy.sqrt(r) * sympy.Symbol(p)
                      for p, terms in exact[name].items() for f, r in terms)
        assert sympy.simplify(sympy.sympify(value) - rebuilt) == 0
    # a surd in a rotated frame: hexagonal elastic-type tensor with x along [1-10]
    rotated = ts.form("3m", "V2", z="[001]", x="[1-10]")
    assert rotated == cli_json("form", "3m", "V2", "--z", "[001]", "--x", "[1-10]")


def test_errors_raise_our_class_with_the_cli_message():
    with pytest.raises(ts.Error) as caught:
        ts.form("4mn", "V")
    cli = subprocess.run([BINARY, "form", "4mn", "V"], stderr=subprocess.PIPE, text=True)
    assert cli.stderr == "tensorsieve: error: " + str(caught.value) + "\n"
    assert caught.value.exit_code == cli.returncode == 3
    assert "closest" in caught.value.valid
    with pytest.raises(ts.Error) as broken:
        ts.structure(os.path.join(DATA, "malformed", "open-operations.mcif"))
    assert broken.value.where.endswith("open-operations.mcif:13 (data_open_operations)")
    assert broken.value.exit_code == 5


def test_scenario_from_file_and_from_dict(tmp_path):
    text = ('title = "strained film"\nresponses = ["anomalous-hall"]\n'
            '[crystal]\ngroup = "m-3m"\n[sample]\ncut = "(001)"\n'
            '[[lowering]]\nkind = "moment"\nalong = "[001]"\n')
    path = tmp_path / "film.toml"
    path.write_text(text)
    from_file = ts.scenario(str(path))
    assert from_file == cli_json("run", str(path))
    from_dict = ts.scenario({"title": "strained film", "responses": ["anomalous-hall"],
                             "crystal": {"group": "m-3m"}, "sample": {"cut": "(001)"},
                             "lowering": [{"kind": "moment", "along": "[001]"}]})
    from_file.pop("source")
    from_dict.pop("source")
    assert from_dict == from_file
    with pytest.raises(ts.Error) as caught:
        ts.scenario({"crystal": {"group": "m-3m"}, "responses": ["anomalous-hall"], "sample": {"cutt": "(001)"}})
    assert "unknown key 'cutt' in [sample]" in str(caught.value)


def test_scenario_with_observations_answers_them_as_run_does():
    path = os.path.join(os.environ["TENSORSIEVE_SOURCE_DIR"], "examples", "hall-signal-to-explain.toml")
    report = ts.scenario(path)
    assert report == cli_json("run", path)
    first = report["observations"][0]
    assert first["allowed_in_parent"] is False
    assert [s["type"] for s in first["maximal_subgroups"]] == ["m1'", "m1'", "m1'"]


def test_bar_signals_from_a_scenario_dict():
    # A (111) interface of a cubic crystal (3m1'): the zero-field 2w signal of a turning bar is
    # L = chi_xxy sin 3phi, T = chi_xxy cos 3phi with no dipole (Sodemann & Fu, PRL 115, 216806 (2015)).
    report = ts.scenario({"title": "3m interface", "responses": ["second-order-conductivity"],
                          "crystal": {"group": "m-3m"}, "sample": {"cut": "(111)"},
                          "bar": [{"current": "rotating", "field": "none"}]})
    signals = report["bars"][0]["signals"]
    chi = signals[0]
    assert [t["function"] for t in chi["longitudinal"]["terms"]] == ["sin(3*phi)"]
    assert [t["function"] for t in chi["transverse"]["terms"]] == ["cos(3*phi)"]
    assert chi["transverse"]["hall_terms"] == []
    assert signals[1]["reads"] is False  # the dipole is allowed but no planar bar reads it
    assert chi["lock_in"][1] == {"harmonic": 2, "x_factor": "0", "y_factor": "-sqrt(2)/2"}


def test_probe_sums_and_plans_from_a_scenario_dict():
    # Unidirectional magnetoresistance ∝ (z × m)·j on a magnetised (001) film (Avci et al., Nat. Phys. 11,
    # 570 (2015), from memory) meets the anomalous Nernst voltage of the Joule gradient with the same
    # parities and angle functions: symmetry cannot separate them (Avci et al., PRB 90, 224427 (2014)).
    report = ts.scenario({"title": "magnetised film", "responses": ["unidirectional-magnetoresistance"],
                          "crystal": {"group": "m-3m"}, "sample": {"cut": "(001)"},
                          "bar": [{"current": "[100]", "field": "in-plane"}],
                          "layout": [{"harmonic": 2, "rosette": [0, 45, 90]}]})
    total = report["probe_sums"][0]
    labels = [m["label"] for m in total["mechanisms"]]
    assert any("anomalous Nernst" in label for label in labels)
    longitudinal = [r for r in total["readings"] if r["probe"] == "longitudinal" and r["harmonic"] == 2][0]
    handles = {(labels[s["a"]], labels[s["b"]]): s["handle"] for s in longitudinal["separations"]}
    umr_ane = [h for (a, b), h in handles.items() if "unidirectional" in a and "Nernst of the magnetisation, i" in b]
    assert umr_ane == ["indistinguishable by symmetry"]
    plan = report["plans"][0]
    assert plan["harmonic"] == 2 and plan["rank"] == plan["rank_all"]


def test_structure_files_and_screening():
    s = ts.structure(os.path.join(DATA, "cr2o3-afm.mcif"))
    # Cr2O3: -3'm' (Dzyaloshinskii 1960); BNS 167.106 from memory, spglib agrees.
    assert (s["point_group"], s["bns_number"], s["magnetic_type"]) == ("-3'm'", "167.106", 3)
    m = ts.structure(os.path.join(DATA, "mno-afm.mcif"))
    assert m["magnetic_type"] == 4 and m["point_group"] == "2/m1'"
    assert any("type IV" in n for n in m["notes"])
    rows = ts.screen([DATA], ["anomalous-hall", "linear-magnetoelectric"], cuts=["(001)"], threads=2)
    cli = subprocess.run([BINARY, "screen", DATA, "--response", "anomalous-hall", "--response",
                          "linear-magnetoelectric", "--cut", "(001)", "-f", "jsonl"],
                         check=True, stdout=subprocess.PIPE, text=True).stdout
    assert rows == [json.loads(line) for line in cli.splitlines()]


def test_the_documented_example_runs(capsys):
    import runpy
    runpy.run_path(os.path.join(os.environ["TENSORSIEVE_SOURCE_DIR"], "docs", "python", "screen_and_plot.py"))
    out = capsys.readouterr().out
    # the ferromagnet along [001] allows the anomalous Hall effect, the
    # two-sublattice antiferromagnet (type IV, grey) does not: common practice
    assert "fm-001.mcif  4/mm'm'" in out and "AHE 1" in out
    assert "afm-001.mcif 4/mmm1'" in out
    assert "P(2w) = [d_xxz*sin(2*phi), 0, d_zxx*cos(phi)**2 + d_zzz*sin(phi)**2]" in out


# Fresnel / local-field factors of SHG in reflection, two-medium model: sympy
# computes them independently from Snell's law with a complex angle and the
# transmission coefficients of Born and Wolf, Principles of Optics, section 1.5.2
# (from memory): t_s = 2 n1 cos t1 / (n1 cos t1 + n2 cos t2), t_p = 2 n1 cos t1 /
# (n2 cos t1 + n1 cos t2); then L_x = t_p cos t2 / cos t1, L_y = t_s and
# L_z = t_p sin t2 / sin t1 (the x and z components of the transmitted P wave).
# cos t2 is taken on the branch Im(n2 cos t2) >= 0: the wave decays into medium 2.
def sympy_local_field(n1, n2, degrees):
    t1 = sympy.rad(degrees)
    s2 = n1 * sympy.sin(t1) / n2
    c2 = sympy.sqrt(1 - s2 ** 2)
    if sympy.im(sympy.N(n2 * c2, 30)) < 0:
        c2 = -c2
    ts_ = 2 * n1 * sympy.cos(t1) / (n1 * sympy.cos(t1) + n2 * c2)
    tp_ = 2 * n1 * sympy.cos(t1) / (n2 * sympy.cos(t1) + n1 * c2)
    lz = tp_ * n1 / n2 if degrees == 0 else tp_ * s2 / sympy.sin(t1)
    return [complex(sympy.N(v, 20)) for v in (tp_ * c2 / sympy.cos(t1), ts_, lz)]


def sympy_index(text):
    return sympy.nsimplify(sympy.sympify(text.replace("i", "*I")), rational=True)


LOCAL_FIELD_CASES = [
    ("1", "1.5", "1.6", 45),            # glass-like, transparent
    ("1", "2.2+0.01i", "2.3+0.05i", 60),  # weakly absorbing at both frequencies
    ("1", "0.2+3.4i", "1.1+1.9i", 30),   # a metal at omega: n'' > n'
    ("1.5", "1", "1.2", 60),            # from a prism: total internal reflection at both frequencies
    ("1", "3.5", "3.9+0.2i", 0),         # normal incidence
]


@pytest.mark.parametrize("ambient,n_omega,n_2omega,incidence", LOCAL_FIELD_CASES)
def test_local_field_factors_against_sympy(ambient, n_omega, n_2omega, incidence):
    report = ts.scenario({"responses": ["electric-dipole-shg"], "crystal": {"group": "m-3m"},
                          "sample": {"cut": "(111)"},
                          "shg": [{"incidence": incidence, "n_ambient": ambient, "n_omega": n_omega,
                                   "n_2omega": n_2omega, "channels": ["PP", "SS"]}]})
    shg = report["shg"][0]
    assert shg["local_field_factors"] is True
    lf = shg["local_field"]
    assert (lf["n_ambient"], lf["n_omega"], lf["n_2omega"]) == (ambient, n_omega, n_2omega)
    n1 = sympy_index(ambient)
    want = sympy_local_field(n1, sympy_index(n_omega), incidence) + \
        sympy_local_field(n1, sympy_index(n_2omega), incidence)
    for name, value in zip(lf["symbols"], want):
        got = complex(lf["values"][name]["re"], lf["values"][name]["im"])
        assert abs(got - value) < 1e-9, name
    # The amplitudes carry the symbols, and the same dark channels as without factors.
    # At normal incidence S and P are one wave: the in-plane factors are written as L_x.
    pp, ss = shg["sources"][0]["channels"]
    if incidence == 0:
        assert pp["amplitude"] == "chi_xxy*Lx_w^2*Lx_2w*sin(3*phi)"
        assert ss["amplitude"] == "-chi_xxy*Lx_w^2*Lx_2w*cos(3*phi)"
    else:
        assert "Lz_2w" in pp["amplitude"] and "L_{z}(2\\omega)" in pp["amplitude_latex"]
        assert "Ly_w^2*Ly_2w" in ss["amplitude"]
    bare = ts.scenario({"responses": ["electric-dipole-shg"], "crystal": {"group": "m-3m"},
                        "sample": {"cut": "(111)"}, "shg": [{"incidence": incidence, "channels": ["PP", "SS"]}]})
    assert bare["shg"][0]["dark_channels"] == shg["dark_channels"]
    assert bare["shg"][0]["local_field_factors"] is False


def test_local_field_bad_index_names_the_field():
    with pytest.raises(ts.Error, match="n_2omega"):
        ts.scenario({"responses": ["electric-dipole-shg"], "crystal": {"group": "m-3m"},
                     "shg": [{"incidence": 45, "n_omega": "2.2", "n_2omega": "2.2+-1i"}]})


def test_exact_components_with_square_roots_beyond_64_bits():
    # An orthorhombic crystal seen along [111] with 5-digit lattice parameters: the
    # normalisation of y = z x x brings square roots of integers beyond 64 bits, written as
    # strings in the JSON; exact_components reads them back as Python integers (the values
    # themselves are checked against sympy in tests/sample_frame_sympy_check.py).
    report = ts.scenario({"title": "oblique mmm", "tensors": ["V2"],
                          "crystal": {"group": "mmm", "lattice": {"a": 5.4321, "b": 5.5012, "c": 7.6543}},
                          "sample": {"z": "[111]"}})
    final = report["parts"][0]["final"]
    big = [k["sqrt_of"] for c in final["components"] for t in c["terms"] for k in t["coefficient_terms"]
           if isinstance(k["sqrt_of"], str)]
    assert big, "expected a radicand beyond 64 bits"
    exact = ts.exact_components(final)
    assert all(isinstance(r, int) for terms in exact.values() for coefs in terms.values() for _, r in coefs)
