"""The notebook side of the module: sympy objects, numbers with and without numpy,
tables with and without pandas, rich display, survey/observe, version and packaging.

Run by ctest (python_module_test) like test_module.py. The cases without numpy or
pandas run in a child interpreter in which importing them fails (sys.modules entry
set to None), so they are tested whether or not the machine has them.
"""

import inspect
import json
import math
import os
import re
import shutil
import subprocess
import sys

import pytest
import sympy

import tensorsieve as ts

BINARY = os.environ["TENSORSIEVE_BINARY"]
SOURCE = os.environ["TENSORSIEVE_SOURCE_DIR"]


def cli_json(*args):
    out = subprocess.run([BINARY, *args, "-f", "json"], check=True, stdout=subprocess.PIPE, text=True).stdout
    return json.loads(out)


def run_without(modules, code):
    """Run python code in a child interpreter where importing each of modules fails."""
    block = "import sys\n" + "".join(f"sys.modules[{m!r}] = None\n" for m in modules)
    p = subprocess.run([sys.executable, "-c", block + code], stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                       text=True, env=dict(os.environ))
    assert p.returncode == 0, p.stderr
    return p.stdout


def test_version_agrees_with_cmake_pyproject_and_cli():
    with open(os.path.join(SOURCE, "CMakeLists.txt"), encoding="utf-8") as f:
        cmake = re.search(r"project\(tensorsieve VERSION ([0-9.]+)", f.read()).group(1)
    with open(os.path.join(SOURCE, "pyproject.toml"), encoding="utf-8") as f:
        pyproject = re.search(r'^version = "([0-9.]+)"', f.read(), re.M).group(1)
    with open(os.path.join(SOURCE, "CITATION.cff"), encoding="utf-8") as f:
        citation = re.search(r"^version: ([0-9.]+)$", f.read(), re.M).group(1)
    cli = subprocess.run([BINARY, "--version"], check=True, stdout=subprocess.PIPE, text=True).stdout.split()[-1]
    assert ts.__version__ == cmake == pyproject == citation == cli
    assert ts.form("1", "scalar")["version"] == cmake


def test_survey_and_observe_are_the_cli_json():
    assert ts.survey("V3") == cli_json("survey", "V3")
    assert ts.survey("aeV", magnetic=True) == cli_json("survey", "aeV", "-m")
    assert ts.survey("aeV", colourless=True) == cli_json("survey", "aeV", "--colourless")
    seen = ts.observe("m-3m", cut="(001)", response="second-order-conductivity", components=["chi_xxx"])
    cli = cli_json("observe", "m-3m", "--cut", "(001)", "--response", "second-order-conductivity",
                   "--component", "chi_xxx")
    # the same answer; only the source differs (a dict here, the command line there)
    seen.pop("source"), cli.pop("source")
    assert seen == cli
    path = os.path.join(SOURCE, "examples", "hall-signal-to-explain.toml")
    assert ts.observe(path) == cli_json("observe", "--scenario", path)
    with pytest.raises(ts.Error) as caught:
        ts.survey("V3", magnetic=True, colourless=True)
    assert caught.value.exit_code == 2


def test_expressions_are_sympy_objects():
    # the 6mm SHG tensor (Boyd, Nonlinear Optics, 3rd ed. 2008, section 1.5: d_15 = d_24,
    # d_31 = d_32, d_33): three parameters, as sympy symbols
    form = ts.form("6mm", "d_ijk: polar, sym(jk)")
    comps = ts.components(form)
    assert all(isinstance(v, sympy.Expr) for v in comps.values())
    assert comps["d_yyz"] == sympy.Symbol("d_xxz")
    t = ts.tensor(form)
    assert t.shape == (3, 3, 3) and t[2, 2, 2] == sympy.Symbol("d_zzz") and t[0, 1, 2] == 0
    # hexagonal 3m in a rotated frame brings sqrt(3): the matrix is exact
    m = ts.matrix(ts.form("-3'm'", "aeV2"))
    assert m == sympy.diag(sympy.Symbol("T_xx"), sympy.Symbol("T_xx"), sympy.Symbol("T_zz"))
    with pytest.raises(ValueError, match="rank-1 or rank-2"):
        ts.matrix(form)
    # reports' texts parse as they stand; names that are sympy constants stay symbols
    assert ts.expr("sin(3*phi)") == sympy.sin(3 * sympy.Symbol("phi"))
    assert ts.expr("sin(3phi)") == ts.expr("sin(3*phi)")  # hand-written implicit products too
    assert ts.expr("E*I + S")  == sympy.Symbol("E") * sympy.Symbol("I") + sympy.Symbol("S")
    assert ts.expr("chi_xxy*Lx_w^2") == sympy.Symbol("chi_xxy") * sympy.Symbol("Lx_w") ** 2


def test_every_signal_text_of_a_scenario_parses_in_sympy():
    report = ts.scenario(os.path.join(SOURCE, "examples", "magnetised-film-optics.toml"))
    texts = []

    def walk(v, key=""):
        if isinstance(v, dict):
            for k, x in v.items():
                walk(x, k)
        elif isinstance(v, list):
            for x in v:
                walk(x, key)
        elif isinstance(v, str) and key in ("function", "coefficient", "amplitude", "value", "R_n"):
            texts.append(v)
    walk(report)
    assert len(texts) > 50
    for text in texts:
        assert not re.search(r"\d[A-Za-z]", re.sub(r"[A-Za-z_][A-Za-z_0-9]*", "", text)), text
        sympy.sympify(text)  # plain sympify, no transformations: the text is an expression as it stands


def test_evaluate_against_the_closed_form():
    # L = chi_xxy sin(3 phi) on a 3m interface (Sodemann & Fu, PRL 115, 216806 (2015))
    report = ts.scenario({"responses": ["second-order-conductivity"], "crystal": {"group": "m-3m"},
                          "sample": {"cut": "(111)"}, "bar": [{"current": "rotating", "field": "none"}]})
    term = report["bars"][0]["signals"][0]["longitudinal"]["terms"][0]
    text = term["coefficient"] + "*" + term["function"]
    angles = [k * math.pi / 12 for k in range(25)]
    want = [0.7 * math.sin(3 * a) for a in angles]
    got = ts.evaluate(text, phi=angles, chi_xxy=0.7)
    assert len(got) == 25 and all(abs(g - w) < 1e-12 for g, w in zip(got, want))
    assert abs(ts.evaluate(text, phi=math.pi / 6, chi_xxy=0.7) - 0.7) < 1e-12
    with pytest.raises(ValueError, match="chi_xxy"):
        ts.evaluate(text, phi=0.1)


def test_evaluate_with_numpy():
    np = pytest.importorskip("numpy")
    angles = np.linspace(0, 2 * np.pi, 7)
    got = ts.evaluate("chi_xxy*sin(3*phi)", phi=angles, chi_xxy=2.0)
    assert isinstance(got, np.ndarray) and got.dtype == float
    assert np.allclose(got, 2 * np.sin(3 * angles))
    zero = ts.evaluate("0", phi=angles)  # a constant fills the array: no sympy number reaches a ufunc
    assert isinstance(zero, np.ndarray) and zero.shape == (7,) and not zero.any()
    c = ts.evaluate("a*cos(phi)", phi=angles, a=1j)
    assert c.dtype == complex and np.allclose(c, 1j * np.cos(angles))


def test_evaluate_without_numpy():
    out = run_without(["numpy"], "import tensorsieve as ts, math\n"
                      "v = ts.evaluate('chi_xxy*sin(3*phi)', phi=[0, math.pi/6], chi_xxy=2.0)\n"
                      "z = ts.evaluate('0', phi=[0, 1, 2])\n"
                      "print(type(v).__name__, [round(x, 12) for x in v], z)\n")
    assert out == "list [0.0, 2.0] [0.0, 0.0, 0.0]\n"


def test_tables_with_pandas():
    pandas = pytest.importorskip("pandas")
    df = ts.table(ts.survey("V[V2]"))
    assert isinstance(df, pandas.DataFrame) and len(df) == 32
    # the piezoelectric tensor vanishes in the 11 centrosymmetric classes and in 432
    # (Nye, Physical Properties of Crystals, 1957, chapter VII)
    assert int((~df["allowed"]).sum()) == 12
    assert list(df.columns) == ["allowed", "group", "independent", "kind", "schoenflies"]
    rows = ts.table(ts.screen([os.path.join(SOURCE, "tests", "data")], ["anomalous-hall"], cuts=["(001)"]))
    assert "responses.anomalous-hall.allowed" in rows.columns and "cuts[(001)].point_group" in rows.columns


def test_tables_without_pandas_are_the_same_rows():
    code = ("import tensorsieve as ts, json\n"
            "t = ts.table(ts.survey('V[V2]'))\n"
            "print(type(t).__name__, json.dumps(t, sort_keys=True))\n")
    out = run_without(["pandas"], code)
    kind, rows = out.split(" ", 1)
    assert kind == "list"
    rows = json.loads(rows)
    assert rows == ts.tables.rows(ts.survey("V[V2]"))
    assert len(rows) == 32 and sum(not r["allowed"] for r in rows) == 12


def test_rich_display():
    form = ts.form("4mm", "V2")
    assert isinstance(form, ts.Report) and isinstance(form, dict)
    latex = form._repr_latex_()
    assert latex.startswith("$$T = ") and "\\left[\\begin{matrix}T_{xx} & 0 & 0" in latex
    assert "<table" in form._repr_html_() and "T_xx" in form._repr_html_()
    assert "allowed in 20 of 32 groups" in ts.survey("V[V2]")._repr_html_()  # 32 - 12 (Nye 1957, above)
    # rank 3: the nonzero components as aligned equations; a scenario has no table
    assert "\\begin{aligned}" in ts.form("6mm", "V3")._repr_latex_()
    assert ts.form("m-3m", "V3")._repr_latex_() == "$$T = 0$$"
    hall = ts.response("anomalous-hall", "4m'm'")
    assert hall._repr_latex_().startswith("$$") and "<table" in hall._repr_html_()
    assert ts.scenario({"crystal": {"group": "m-3m"}, "tensors": ["V2"]})._repr_html_() is None


def test_the_examples_of_python_md(monkeypatch):
    import doctest
    monkeypatch.chdir(SOURCE)  # the page's paths are relative to the source tree
    path = os.path.join(SOURCE, "docs", "python.md")
    with open(path, encoding="utf-8") as f:
        # a code fence ends an example's expected output, as a blank line does
        text = "\n".join("" if line.startswith("```") else line for line in f.read().split("\n"))
    test = doctest.DocTestParser().get_doctest(text, {}, "python.md", path, 0)
    runner = doctest.DocTestRunner(optionflags=doctest.NORMALIZE_WHITESPACE)
    runner.run(test)
    result = runner.summarize(verbose=False)
    assert result.failed == 0 and result.attempted >= 10


def test_every_public_function_has_a_real_docstring():
    for name in ts.__all__:
        obj = getattr(ts, name)
        if callable(obj) and not isinstance(obj, type):
            doc = inspect.getdoc(obj) or ""
            assert len(doc.split()) >= 12, name


def test_the_documented_example_without_numpy():
    # The example draws with matplotlib when it is there; neither numpy nor matplotlib here.
    path = os.path.join(SOURCE, "docs", "python", "screen_and_plot.py")
    out = run_without(["numpy", "matplotlib"], f"import runpy\nrunpy.run_path({path!r})\n")
    assert "P(2w) = [d_xxz*sin(2*phi), 0, d_zxx*cos(phi)**2 + d_zzz*sin(phi)**2]" in out
    assert "phi =  90 deg: |P|^2 = 0.490" in out  # d_zzz^2 with d_zzz = 0.7


def test_the_documented_example_with_numpy():
    pytest.importorskip("numpy")
    path = os.path.join(SOURCE, "docs", "python", "screen_and_plot.py")
    out = run_without(["matplotlib"], f"import numpy, runpy\nrunpy.run_path({path!r})\n")
    # at phi = 0 the field is along x: P = (0, 0, d_zxx) with d_zxx = 0.4 (the second invented value)
    assert "phi =   0 deg: |P|^2 = 0.160" in out
    assert "phi =  90 deg: |P|^2 = 0.490" in out
    # the same printout as without numpy
    without = run_without(["numpy", "matplotlib"], f"import runpy\nrunpy.run_path({path!r})\n")
    strip = lambda text: [line for line in text.splitlines() if not line.startswith(("fm-", "afm-"))]
    assert strip(out) == strip(without)


def test_pip_install_packs_module_and_data(tmp_path):
    # `pip install --no-build-isolation .` from a copy of the sources, with the module built by
    # this build (TENSORSIEVE_PREBUILT_MODULE; setup.py otherwise runs CMake itself), into a
    # target folder; the installed package reads its own data/ copy, not the source tree.
    pip = subprocess.run([sys.executable, "-m", "pip", "--version"], stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    if pip.returncode != 0:
        pytest.skip("pip is not installed (Debian: python3-pip)")
    src = tmp_path / "src"
    src.mkdir()
    for f in ("pyproject.toml", "setup.py", "README.md", "LICENSE"):
        shutil.copy(os.path.join(SOURCE, f), src / f)
    shutil.copytree(os.path.join(SOURCE, "python", "tensorsieve"), src / "python" / "tensorsieve",
                    ignore=shutil.ignore_patterns("__pycache__"))
    shutil.copytree(os.path.join(SOURCE, "groups"), src / "groups")
    (src / "src" / "response").mkdir(parents=True)
    for f in ("catalogue.toml", "families.toml"):
        shutil.copy(os.path.join(SOURCE, "src", "response", f), src / "src" / "response" / f)
    env = dict(os.environ, TENSORSIEVE_PREBUILT_MODULE=ts._tensorsieve.__file__)
    target = tmp_path / "site"
    p = subprocess.run([sys.executable, "-m", "pip", "install", "--no-build-isolation", "--no-deps", "--no-index",
                        "--target", str(target), str(src)], stdout=subprocess.PIPE, stderr=subprocess.STDOUT,
                       text=True, env=env)
    assert p.returncode == 0, p.stdout
    assert (target / "tensorsieve" / "data" / "groups" / "cubic.toml").is_file()
    assert (target / "tensorsieve" / "data" / "responses" / "catalogue.toml").is_file()
    check = ("import tensorsieve as ts, tensorsieve._tensorsieve as m\n"
             "assert m.__file__.startswith(%r)\n"
             "print(ts.__version__, ts.form('4mm', 'V[V2]')['independent'], m._data_directory())\n"
             % str(target))
    env = {k: v for k, v in os.environ.items() if k not in ("PYTHONPATH", "TENSORSIEVE_DATA")}
    env["PYTHONPATH"] = str(target)
    out = subprocess.run([sys.executable, "-c", check], stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True,
                         env=env, cwd=str(tmp_path))
    assert out.returncode == 0, out.stderr
    version, independent, data = out.stdout.split()
    assert (version, independent) == (ts.__version__, "3")
    assert data == str(target / "tensorsieve" / "data")
