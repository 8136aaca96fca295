"""Reports as tables: pandas DataFrames when pandas is installed, lists of flat
dicts otherwise (the same rows and columns either way)."""


def _flatten(row, prefix=""):
    """One row as {column: value}: nested objects become dotted columns
    ("responses.anomalous-hall.allowed"), lists of plain values a comma-separated text."""
    out = {}
    for key, value in row.items():
        name = prefix + key
        if isinstance(value, dict):
            out.update(_flatten(value, name + "."))
        elif isinstance(value, list) and all(not isinstance(v, (dict, list)) for v in value):
            out[name] = ", ".join(str(v) for v in value)
        elif isinstance(value, list):
            # a list of objects (a screened file's cuts): one column group per entry, keyed by its first value
            for k, item in enumerate(value):
                label = str(next(iter(item.values()))) if isinstance(item, dict) and item else str(k)
                if isinstance(item, dict):
                    out.update(_flatten(item, f"{name}[{label}]."))
                else:
                    out[f"{name}[{k}]"] = item
        else:
            out[name] = value
    return out


def _observation_rows(report):
    rows = []
    for k, o in enumerate(report["observations"]):
        base = {"observation": k + 1, "label": o["label"], "observed": o["observed"],
                "components": ", ".join(o["components"]), "type": o["type"],
                "allowed_in_parent": o["allowed_in_parent"]}
        if o["allowed_in_parent"] or not o["maximal_subgroups"]:
            rows.append(dict(base, subgroup="", order=None, index=None, shown_by="", produced_by="",
                             equal_domains=""))
        for s in o["maximal_subgroups"]:
            rows.append(dict(base, subgroup=s["sample_frame_symbol"] or s["type"], order=s["order"],
                             index=s["index"], shown_by=", ".join(s["shown_by"]),
                             produced_by="; ".join(s["produced_by"]), equal_domains=s["equal_domains"]))
    return rows


def rows(report):
    """The rows :func:`table` shows, as a list of flat dicts (see table())."""
    if isinstance(report, list):
        return [_flatten(r) for r in report]
    if not isinstance(report, dict):
        raise TypeError(f"table() takes a report (dict) or a list of screened files, not {type(report).__name__}")
    if "components" in report and "tensor" in report:
        return [{"component": c["component"], "index": c["index"], "value": c["value"]} for c in report["components"]]
    if "observations" in report and "parent" in report:
        return _observation_rows(report)
    if "parts" in report and "response" in report:
        return [{"part": k + 1, "label": p["label"], "spec": p["spec"], "verdict": p["verdict"],
                 "independent": p["independent"]} for k, p in enumerate(report["parts"])]
    for key in ("groups", "responses", "subgroups"):
        entries = report.get(key)
        if isinstance(entries, list) and entries and all(isinstance(r, dict) for r in entries):
            return [_flatten({k: v for k, v in r.items() if k != "parts"}) for r in report[key]]
    raise ValueError("table() takes a form, response, survey, groups, group (with subgroups), responses or observe "
                     "report, or the list screen() returns; this report has keys " + ", ".join(sorted(report)))


def table(report):
    """A report as a table.

    - form: one row per nonzero component (component, index, value);
    - response: one row per part (verdict, independent count);
    - survey: one row per group (group, schoenflies, kind, independent, allowed);
    - groups / responses / group(..., subgroups=True): one row per entry;
    - observe (or a scenario with observations): one row per maximal subgroup;
    - the list screen() returns: one row per file, nested keys as dotted columns
      ("responses.anomalous-hall.allowed", "cuts[(001)].point_group").

    Returns a ``pandas.DataFrame`` when pandas is installed, else the same rows
    as a list of dicts (column name to value).
    """
    data = rows(report)
    try:
        import pandas
    except ImportError:
        return data
    return pandas.DataFrame(data)
