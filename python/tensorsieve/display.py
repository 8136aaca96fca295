"""Rich display in notebooks: every report is a :class:`Report`, a dict (equal to
the command line's JSON) that Jupyter shows as LaTeX and HTML."""

import html

import sympy

from . import expressions, tables


def _form_latex(form):
    name = form["tensor"]["name"]
    rank = form["tensor"]["rank"]
    if not form["components"]:
        return f"{name} = 0"
    if rank in (1, 2):
        return f"{name} = " + sympy.latex(expressions.matrix(form))
    lines = [f"{name}_{{{c['index']}}} &= " + sympy.latex(expressions.expr(c["value"])) for c in form["components"]]
    return "\\begin{aligned}" + " \\\\ ".join(lines) + "\\end{aligned}"


def _latex_lines(report):
    """Display-mode LaTeX of what a report says in formulas, or [] when it holds none."""
    if "components" in report and "tensor" in report:
        return [_form_latex(report)]
    if "parts" in report and "response" in report:
        return [_form_latex(p["form"]) for p in report["parts"] if p["form"]["components"]]
    return []


def _html_table(data):
    if not data:
        return "<p>(no rows)</p>"
    try:
        import pandas
    except ImportError:
        pandas = None
    if pandas is not None:
        return pandas.DataFrame(data).to_html(index=False)
    columns = list(data[0])
    head = "".join(f"<th>{html.escape(str(c))}</th>" for c in columns)
    body = "".join("<tr>" + "".join(f"<td>{html.escape(str(r.get(c, '')))}</td>" for c in columns) + "</tr>"
                   for r in data)
    return f"<table><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>"


def _caption(report):
    if "tensor" in report and "group" in report:
        g = report["group"]
        return f"{report['tensor']['spec']} in {g['symbol']} ({g['schoenflies']}): {report['independent']} independent"
    if "response" in report and "group" in report:
        return f"{report['response']['name']} in {report['group']['symbol']}: {report['allowed_parts']} of " \
               f"{len(report['parts'])} parts allowed"
    if "allowed_in" in report:
        return f"{report['tensor']['spec']}: allowed in {report['allowed_in']} of {report['count']} groups"
    return ""


class Report(dict):
    """A report: the dict of the command line's JSON output (``==`` compares it with
    one), which notebooks display as LaTeX (forms as matrices) and HTML tables."""

    def _repr_latex_(self):
        lines = _latex_lines(self)
        return "$$" + " \\quad ".join(lines) + "$$" if lines else None

    def _repr_html_(self):
        try:
            data = tables.rows(self)
        except ValueError:
            return None  # a report with no table (a scenario, a group): the plain dict is shown
        caption = _caption(self)
        head = f"<p>{html.escape(caption)}</p>" if caption else ""
        return head + _html_table(data)


def wrap(value):
    """A returned dict as a Report (lists of dicts: each element)."""
    if isinstance(value, dict):
        return Report(value)
    if isinstance(value, list):
        return [wrap(v) for v in value]
    return value
