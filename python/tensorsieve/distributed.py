"""Screening a folder too large for one machine on a Dask cluster.

The files are cut into batches; each batch is one Dask task that runs
:func:`tensorsieve.screen` on a worker with ``jobs`` worker processes of its
own, and the rows come back in the order ``screen`` would print them, equal to
``tensorsieve screen -f jsonl`` on the same files. Dask itself is not imported
here: any client with ``map`` and ``gather`` (``dask.distributed.Client``) will do.
"""


def _screen_batch(batch, responses, cuts, jobs, occupancy, symprec):
    # Runs on a Dask worker: the module is imported there, not pickled.
    import tensorsieve

    return [dict(row) for row in tensorsieve.screen(batch, responses, cuts=cuts, jobs=jobs,
                                                      occupancy=occupancy, symprec=symprec)]


def screen_on_dask(client, paths, responses, cuts=(), files_per_task=64, jobs=1, occupancy="refuse",
                   symprec=1e-2):
    """Screen structure files on a Dask cluster: the rows of :func:`tensorsieve.screen`.

    ``client`` is a ``dask.distributed.Client``; every worker must have tensorsieve
    installed and see the files under the same paths (a shared file system).
    ``files_per_task`` files make one task (a few seconds of work keeps Dask's own
    cost small); ``jobs`` is the number of worker processes each task starts (1 suits
    a cluster with one Dask worker per core). A file that cannot be read, or that
    crashes a library, is a row with an ``error``, as in ``screen``; a problem with
    the request itself (an unknown response id) raises :class:`tensorsieve.Error`.
    """
    from . import _tensorsieve, wrap

    if files_per_task < 1:
        raise ValueError("files_per_task must be at least 1, got %r" % (files_per_task,))
    responses, cuts = list(responses), list(cuts)
    # Checked here, once, so that a mistaken response id fails before any task is sent.
    for response in responses:
        _tensorsieve.response(response, "1")
    files = _tensorsieve.structure_files(list(paths))
    batches = [files[i:i + files_per_task] for i in range(0, len(files), files_per_task)]
    futures = client.map(_screen_batch, batches, responses=responses, cuts=cuts, jobs=jobs,
                         occupancy=occupancy, symprec=symprec, pure=False)
    rows = []
    for part in client.gather(futures):
        rows.extend(part)
    return wrap(rows)
