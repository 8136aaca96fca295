#!/usr/bin/env python3
"""Check the generated man page and bash completion (tools/write_cli_docs.py).

  check_cli_docs.py BINARY CLI_DOCS_DIR

The man page renders with groff without a warning and documents every subcommand and
every option the binary's --help lists; the bash completion, sourced in bash, completes
subcommands, options and the listed values of an option (-f json).
"""

import os
import re
import subprocess
import sys


def complete(completion, words):
    """The completions bash offers for the command line `words` (last word: being typed)."""
    script = (f"source {completion!r}\n"
              f"COMP_WORDS=({' '.join(repr(w) for w in words)})\n"
              f"COMP_CWORD={len(words) - 1}\n"
              "_tensorsieve\n"
              'printf "%s\\n" "${COMPREPLY[@]}"\n')
    out = subprocess.run(["bash", "-c", script], check=True, stdout=subprocess.PIPE, text=True).stdout
    return set(out.split())


def main(binary, folder):
    failures = []
    page = os.path.join(folder, "tensorsieve.1")
    groff = subprocess.run(["groff", "-man", "-Tutf8", "-ww", "-z", page], stderr=subprocess.PIPE, text=True)
    if groff.returncode != 0 or groff.stderr:
        failures.append(f"groff warns about the man page: {groff.stderr.strip()}")
    with open(page, encoding="utf-8") as f:
        roff = f.read().replace("\\-", "-")
    top = subprocess.run([binary, "--help"], check=True, stdout=subprocess.PIPE, text=True).stdout
    commands = re.findall(r"^  ([a-z]+)\s{2,}", top.split("Subcommands:")[1], re.M)
    if len(commands) < 10:
        failures.append(f"--help lists only {commands}")
    for c in commands:
        if f'.SS "tensorsieve {c} ' not in roff and f'.SS "tensorsieve {c}"' not in roff:
            failures.append(f"the man page has no section for {c}")
        helptext = subprocess.run([binary, c, "--help"], check=True, stdout=subprocess.PIPE, text=True).stdout
        for option in re.findall(r"^  (?:-\w,)?(--[\w-]+)", helptext, re.M):
            if option != "--help" and f"\\fB{option}" not in roff and f",{option}" not in roff:
                failures.append(f"the man page misses {c} {option}")
    completion = os.path.join(folder, "tensorsieve.bash")
    cases = [(["tensorsieve", "fo"], {"form"}),
             (["tensorsieve", "s"], {"survey", "sample", "screen"}),
             (["tensorsieve", "form", "4mm", "--vi"], {"--view"}),
             (["tensorsieve", "form", "4mm", "--view", ""], {"auto", "components", "matrix", "dmatrix", "voigt"})]
    for words, want in cases:
        got = complete(completion, words)
        if got != want:
            failures.append(f"completing {' '.join(words)!r}: {sorted(got)}, expected {sorted(want)}")
    formats = complete(completion, ["tensorsieve", "run", "-f", ""])
    if not {"text", "json"} <= formats:
        failures.append(f"completing run -f: {sorted(formats)}")
    for f in failures:
        print("FAIL", f)
    if not failures:
        print(f"man page and bash completion cover {len(commands)} subcommands")
    return 1 if failures else 0


if __name__ == "__main__":
    if len(sys.argv) != 3:
        print(__doc__, file=sys.stderr)
        sys.exit(2)
    sys.exit(main(*sys.argv[1:]))
