#!/usr/bin/env python3
"""Write (or check) docs/outside-checks.md: every outside reference the tests compare with.

  python3 docs/write_outside_checks.py            rewrite docs/outside-checks.md
  python3 docs/write_outside_checks.py --check     exit 1 when the page is not what the tests say

The page is read from the test sources, so it cannot drift from them: every test case
(Catch2 TEST_CASE, pytest test_ function) whose comments name an outside source, and every
test file whose header names one. A source is a comment sentence that cites a year (a
handbook or paper: author, title or journal, year), names a reference library from Debian
(spglib, sympy, numpy), or says `common practice` or `from memory`. The ctest
outside_checks_page runs --check.
"""

import glob
import os
import re
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
PAGE = os.path.join(ROOT, "docs", "outside-checks.md")
SOURCES = ["tests/*_test.cpp", "tests/*.py", "python/tests/test_*.py", "groups/check_groups.py"]

YEAR = re.compile(r"\b(1[89]\d\d|20[0-2]\d)\b")
LIBRARY = re.compile(r"\b(spglib|sympy|numpy)\b", re.I)
TAGS = ("common practice", "from memory")


# A library counts as a source where a sentence compares with it, not where it merely names it.
AS_REFERENCE = re.compile(r"\b(against|agrees?|by|reference|independent\w*|computes?|checked|"
                          r"factorint)\b|\((spglib|sympy|numpy)\b", re.I)


def is_source(sentence):
    low = sentence.lower()
    library = LIBRARY.search(sentence) and AS_REFERENCE.search(sentence)
    return bool(YEAR.search(sentence) or library or any(t in low for t in TAGS))


# Words a period may follow inside a citation ("Phys. Rev. B 94", "3rd ed.", "Nye, ch. VII").
ABBREVIATIONS = {"phys", "rev", "lett", "mater", "nat", "appl", "soc", "acad", "cryst", "proc", "sci", "chem",
                 "math", "mod", "opt", "commun", "ed", "eds", "ch", "vol", "no", "eq", "eqs", "fig", "sec", "al",
                 "e.g", "i.e", "cf", "vs", "pp", "p", "j", "jpn", "am", "acta", "z", "ann", "adv", "res"}


def sentences(block):
    """One comment block split into sentences, not at the periods of abbreviations."""
    text = re.sub(r"\s+", " ", block).strip()
    out, start = [], 0
    for m in re.finditer(r"[.;]\s+(?=[A-Z(\"'`])", text):
        word = re.search(r"([A-Za-z.]+)$", text[start:m.start()])
        if m.group(0)[0] == "." and word and (word.group(1).lower() in ABBREVIATIONS or len(word.group(1)) == 1):
            continue
        out.append(text[start:m.start() + 1].strip())
        start = m.end()
    out.append(text[start:].strip())
    return [s for s in out if s]


def sources_in(blocks):
    out = []
    for block in blocks:
        for s in sentences(block):
            if is_source(s) and s not in out:
                out.append(s)
    return out


def comment_blocks(lines, marker):
    """Runs of consecutive lines that carry a comment, each run joined into one block."""
    blocks, current = [], []
    for line in lines:
        m = re.search(re.escape(marker) + r"(.*)$", line) if marker in line else None
        if m:
            current.append(m.group(1).strip())
        elif current:
            blocks.append(" ".join(current))
            current = []
    if current:
        blocks.append(" ".join(current))
    return blocks


def cpp_cases(text):
    """(header comment blocks, [(test name, comment blocks above and inside the case)])."""
    lines = text.split("\n")
    header = []
    for line in lines:
        if not line.startswith("//"):
            break
        header.append(line)
    cases = []
    starts = [i for i, line in enumerate(lines) if line.startswith("TEST_CASE(")]
    for k, i in enumerate(starts):
        name = re.match(r'TEST_CASE\("((?:[^"\\]|\\.)*)"', lines[i]).group(1)
        j = i
        while j > 0 and lines[j - 1].lstrip().startswith("//"):
            j -= 1
        end = starts[k + 1] if k + 1 < len(starts) else len(lines)
        cases.append((name.replace('\\"', '"'), comment_blocks(lines[j:end], "//")))
    return comment_blocks(header, "//"), cases


def py_cases(text):
    lines = text.split("\n")
    doc = re.match(r'\s*(?:#[^\n]*\n)*\s*"""(.*?)"""', text, re.S)
    header = [doc.group(1)] if doc else []
    cases = []
    starts = [i for i, line in enumerate(lines) if re.match(r"def test_\w+", line)]
    for k, i in enumerate(starts):
        name = re.match(r"def (test_\w+)", lines[i]).group(1)
        j = i
        while j > 0 and (lines[j - 1].startswith("#") or lines[j - 1].startswith("@")):
            j -= 1
        end = starts[k + 1] if k + 1 < len(starts) else len(lines)
        body = [line for line in lines[j:end] if not line or line[0] in " #@" or line.startswith("def test_")]
        cases.append((name, comment_blocks(body, "#")))
    return header, cases


def cell(text):
    return text.replace("|", "\\|").replace("\n", " ")


def page():
    out = ["# Outside checks", "",
           "Every outside reference the test suite compares tensorsieve with: handbook tables and",
           "papers (author, title or journal, year), Debian's reference libraries (spglib, sympy,",
           "numpy), and facts of the trade (`common practice`). A value the test states from memory",
           "is marked `from memory` in its sentence. Each row is a test case and the sentences of its",
           "comments that name a source; a file's header names the sources all its cases share.",
           "Every check listed here passes in the test suite (ctest runs each file).", "",
           "This page is generated from the test sources by `docs/write_outside_checks.py`; do not",
           "edit it by hand. The ctest `outside_checks_page` fails when it is out of date; run",
           "`python3 docs/write_outside_checks.py` after changing a test's sources.", ""]
    total = 0
    tags = {t: 0 for t in TAGS}
    body = []
    for pattern in SOURCES:
        for path in sorted(glob.glob(os.path.join(ROOT, pattern))):
            rel = os.path.relpath(path, ROOT)
            with open(path, encoding="utf-8") as f:
                text = f.read()
            header, cases = cpp_cases(text) if rel.endswith(".cpp") else py_cases(text)
            file_sources = sources_in(header)
            rows = [(name, sources_in(comments)) for name, comments in cases]
            rows = [(n, s) for n, s in rows if s]
            if not file_sources and not rows:
                continue
            body += [f"## {rel}", ""]
            if file_sources:
                body += ["Sources of the whole file: " + " ".join(file_sources), ""]
            if rows:
                body += ["| test case | source named beside the check |", "| --- | --- |"]
                for name, srcs in rows:
                    body.append(f"| {cell(name)} | {cell(' '.join(srcs))} |")
                body.append("")
            for s in file_sources + [x for _, srcs in rows for x in srcs]:
                total += 1
                for t in TAGS:
                    tags[t] += t in s.lower()
    out += [f"{total} source statements in all; {tags['common practice']} say `common practice`, "
            f"{tags['from memory']} `from memory`.", ""]
    return "\n".join(out + body).rstrip("\n") + "\n"


def main(argv):
    text = page()
    if "--check" in argv:
        try:
            with open(PAGE, encoding="utf-8") as f:
                current = f.read()
        except FileNotFoundError:
            current = ""
        if current != text:
            print("docs/outside-checks.md is out of date: run python3 docs/write_outside_checks.py", file=sys.stderr)
            return 1
        print("docs/outside-checks.md is up to date")
        return 0
    with open(PAGE, "w", encoding="utf-8") as f:
        f.write(text)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
