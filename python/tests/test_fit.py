"""Scan fits from Python (docs/fit.md): the same fit from a file and from arrays
(numpy arrays when numpy is installed, plain lists either way), against the
command line's JSON. The example scan is invented (examples/make_threefold_scan.py)."""

import csv
import json
import os
import subprocess

import pytest

import tensorsieve as ts

BINARY = os.environ["TENSORSIEVE_BINARY"]
EXAMPLES = os.path.join(os.environ["TENSORSIEVE_SOURCE_DIR"], "examples")
SCENARIO = os.path.join(EXAMPLES, "threefold-film-scan.toml")
SCAN = os.path.join(EXAMPLES, "threefold-film-scan.csv")


def columns():
    with open(SCAN) as f:
        rows = [r for r in csv.reader(line for line in f if not line.startswith("#"))]
    header = [h.strip() for h in rows[0]]
    return {h: [float(r[i]) for r in rows[1:]] for i, h in enumerate(header)}


def cli_fit():
    out = subprocess.run([BINARY, "fit", SCENARIO, "-f", "json"], check=True, stdout=subprocess.PIPE, text=True).stdout
    return json.loads(out)["fits"][0]


def test_fit_from_file_matches_the_command_line():
    py = ts.fit(SCENARIO, SCAN, harmonic=2)
    cli = cli_fit()
    assert py["verdict"] == cli["verdict"]
    assert [h["hypothesis"] for h in py["hypotheses"]] == [h["hypothesis"] for h in cli["hypotheses"]]


def test_fit_from_lists_gives_the_same_verdict():
    py = ts.fit(SCENARIO, columns(), harmonic=2)
    assert py["verdict"]["accepted"] == cli_fit()["verdict"]["accepted"]
    assert py["verdict"]["accepted"].startswith("m1'")


def test_fit_from_numpy_arrays_returns_numpy_models():
    np = pytest.importorskip("numpy")
    data = {k: np.asarray(v) for k, v in columns().items()}
    py = ts.fit(SCENARIO, data, harmonic=2)
    best = py["hypotheses"][0]
    assert isinstance(best["model"], np.ndarray)
    assert best["model"].shape == (36,)
    residual = data["Y_uV"] * 1e-6 - best["model"]
    assert float(np.sqrt(np.mean(residual**2))) < 1e-7


def test_bad_arrays_raise_located_errors():
    data = columns()
    data["Y_uV"][3] = float("nan")
    with pytest.raises(ts.Error) as e:
        ts.fit(SCENARIO, data, harmonic=2)
    assert "NaN" in e.value.problem
    with pytest.raises(ts.Error) as e:
        ts.fit(SCENARIO, {"phi": [0.0], "Y": [1.0]}, harmonic=2)
    assert e.value.valid == "phi_deg or phi_rad"
