"""Screening a folder of structure files on a Dask cluster.

    python3 screen_on_dask.py FOLDER                  # a local cluster, one worker per core
    python3 screen_on_dask.py FOLDER tcp://host:8786  # the scheduler of a running cluster

Every Dask worker needs tensorsieve installed and must see FOLDER under the same
path (a shared file system). The rows are those of
``tensorsieve screen FOLDER --response ... --cut ... -f jsonl``, in the same order;
this script prints a count per point group and the files that failed, and writes
every row to screened.jsonl.
"""

import collections
import json
import sys

from dask.distributed import Client, LocalCluster

import tensorsieve as ts

RESPONSES = ["anomalous-hall", "linear-magnetoelectric", "electric-dipole-shg"]
CUTS = ["(001)", "(111)"]


def screen_folder(client, folder, out="screened.jsonl"):
    # 64 files a task: a few seconds of work each, so Dask's own cost stays small.
    rows = ts.screen_on_dask(client, [folder], RESPONSES, cuts=CUTS, files_per_task=64)
    with open(out, "w", encoding="utf-8") as f:
        for row in rows:
            f.write(json.dumps(row, sort_keys=True) + "\n")
    groups = collections.Counter(row["point_group"] for row in rows if not row.get("error"))
    for group, n in sorted(groups.items(), key=lambda item: (-item[1], item[0])):
        print(f"{n:6d}  {group}")
    for row in rows:
        if row.get("error"):
            print(f"failed: {row['file']}: {row['error']}")
    return rows


if __name__ == "__main__":
    folder = sys.argv[1]
    if len(sys.argv) > 2:
        with Client(sys.argv[2]) as client:
            screen_folder(client, folder)
    else:
        with LocalCluster(threads_per_worker=1, dashboard_address=None) as cluster, Client(cluster) as client:
            screen_folder(client, folder)
