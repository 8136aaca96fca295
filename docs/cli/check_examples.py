#!/usr/bin/env python3
"""Check (or refresh) the worked examples in the docs against the real binary.

Every fenced block marked ```console in the given Markdown files records a shell session:
lines starting with "$ " are commands, the lines after each one (up to the next
command or the end of the block) are what it printed, standard output and
standard error together. "$ echo $?" prints the exit status of the command before.
Commands run in bash, in one scratch directory per file (so "-o FILE" followed by
"cat FILE" works), with `tensorsieve` standing for the binary under test.

  docs/cli/check_examples.py BIN FILE.md...           exit 0 when every output matches
  docs/cli/check_examples.py --update BIN FILE.md...  rewrite the outputs from real runs

Trailing spaces are ignored in the comparison (Markdown editors strip them).
"""

import os
import re
import subprocess
import sys
import tempfile

FENCE = re.compile(r"^```console\s*$")


def run(binary, command, cwd, previous_rc):
    if command.strip() == "echo $?":
        return f"{previous_rc}\n", 0
    script = 'tensorsieve() { (exec -a tensorsieve "$TS_BIN" "$@"); }\n' + command + "\n"
    env = dict(os.environ, TS_BIN=binary, LC_ALL=os.environ.get("LC_ALL", "C.UTF-8"))
    p = subprocess.run(["bash", "-c", script], cwd=cwd, env=env, stdout=subprocess.PIPE,
                       stderr=subprocess.STDOUT, text=True)
    return p.stdout, p.returncode


def normalise(text):
    return "\n".join(line.rstrip() for line in text.rstrip("\n").split("\n"))


def process(binary, path, update):
    with open(path, encoding="utf-8") as f:
        lines = f.read().split("\n")
    out, failures, checked = [], 0, 0
    i = 0
    with tempfile.TemporaryDirectory(prefix="ts-doc-") as scratch:
        # Commands run in a scratch directory, with the repository's examples/ beside
        # them, so a page can run `tensorsieve run examples/NAME.toml` as a reader would.
        repo = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
        os.symlink(os.path.join(repo, "examples"), os.path.join(scratch, "examples"))
        rc = 0
        while i < len(lines):
            line = lines[i]
            out.append(line)
            i += 1
            if not FENCE.match(line):
                continue
            block_start = i
            body = []
            while i < len(lines) and lines[i].strip() != "```":
                body.append(lines[i])
                i += 1
            # split the block into (command, expected output)
            steps, current = [], None
            for b in body:
                if b.startswith("$ "):
                    current = [b[2:], []]
                    steps.append(current)
                elif current is not None:
                    current[1].append(b)
            new_body = []
            for command, expected in steps:
                actual, rc = run(binary, command, scratch, rc)
                checked += 1
                if normalise(actual) != normalise("\n".join(expected)):
                    failures += 1
                    if not update:
                        print(f"{path}:{block_start}: output of '$ {command}' differs", file=sys.stderr)
                        exp, act = normalise("\n".join(expected)).split("\n"), normalise(actual).split("\n")
                        for k in range(max(len(exp), len(act))):
                            e = exp[k] if k < len(exp) else "<missing>"
                            a = act[k] if k < len(act) else "<missing>"
                            if e != a:
                                print(f"  line {k + 1}: expected: {e}\n  line {k + 1}: actual:   {a}", file=sys.stderr)
                                break
                new_body.append("$ " + command)
                text = normalise(actual)
                if text:
                    new_body.extend(text.split("\n"))
            out.extend(new_body if update else body)
    if update and failures:
        with open(path, "w", encoding="utf-8") as f:
            f.write("\n".join(out))
        print(f"{path}: refreshed {failures} of {checked} outputs")
    return failures, checked


def main(argv):
    update = "--update" in argv
    args = [a for a in argv if a != "--update"]
    if len(args) < 2:
        print(__doc__, file=sys.stderr)
        return 2
    binary = os.path.abspath(args[0])
    if not os.access(binary, os.X_OK):
        print(f"check_examples.py: '{args[0]}' is not an executable", file=sys.stderr)
        return 2
    total_fail = total = 0
    for path in args[1:]:
        f, n = process(binary, path, update)
        total_fail += f
        total += n
    if update:
        return 0
    print(f"{total - total_fail} of {total} example outputs match")
    return 1 if total_fail else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
