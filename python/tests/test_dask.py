"""Screening on a Dask cluster (python/tensorsieve/distributed.py): a LocalCluster
of two worker processes gives the rows of ``tensorsieve screen -f jsonl``, in the
same order. Skipped where Dask (Debian: python3-dask, python3-distributed) is not
installed; scripts/setup --with-tests installs it."""

import json
import os
import subprocess

import pytest

import tensorsieve as ts

distributed = pytest.importorskip("dask.distributed")

BINARY = os.environ["TENSORSIEVE_BINARY"]
DATA = os.path.join(os.environ["TENSORSIEVE_SOURCE_DIR"], "tests", "data")
RESPONSES = ["anomalous-hall", "linear-magnetoelectric", "electric-dipole-shg"]


@pytest.fixture(scope="module")
def client():
    cluster = distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True,
                                       dashboard_address=None, silence_logs=40)
    with distributed.Client(cluster) as c:
        yield c
    cluster.close()


def test_a_local_cluster_gives_the_rows_of_screen(client):
    rows = ts.screen_on_dask(client, [DATA], RESPONSES, cuts=["(001)", "(111)"], files_per_task=2)
    args = [BINARY, "screen", DATA, "--cut", "(001)", "--cut", "(111)", "-f", "jsonl"]
    for r in RESPONSES:
        args += ["--response", r]
    # exit 5: a file failed (a monoclinic (111) cut needs the full metric): an error row
    cli = subprocess.run(args, stdout=subprocess.PIPE, stderr=subprocess.DEVNULL, text=True)
    assert cli.returncode in (0, 5)
    expected = [json.loads(line) for line in cli.stdout.splitlines()]
    assert any(row.get("error") for row in expected)
    assert len(expected) == len(ts.structure_files([DATA])) > 2
    assert rows == expected
    assert len(client.scheduler_info()["workers"]) == 2  # the cluster the rows came from


def test_a_mistaken_response_id_fails_before_any_task(client):
    with pytest.raises(ts.Error) as e:
        ts.screen_on_dask(client, [DATA], ["anomalous-hal"])
    assert "anomalous-hal" in str(e.value)
    with pytest.raises(ValueError):
        ts.screen_on_dask(client, [DATA], RESPONSES, files_per_task=0)


def test_the_documented_script_runs(client, tmp_path, capsys):
    import runpy
    script = runpy.run_path(os.path.join(os.environ["TENSORSIEVE_SOURCE_DIR"], "docs", "python",
                                         "screen_on_dask.py"))
    rows = script["screen_folder"](client, DATA, out=str(tmp_path / "screened.jsonl"))
    written = [json.loads(line) for line in (tmp_path / "screened.jsonl").read_text().splitlines()]
    assert written == rows
    out = capsys.readouterr().out
    # Cr2O3 (Dzyaloshinskii 1960) and bcc Fe along [001] (common practice)
    assert "-3'm'" in out and "4/mm'm'" in out
