#!/usr/bin/env python3
"""Checks the #include lines of src/ against the module order in DEVELOPERS.md.

DEVELOPERS.md states the order on one line, `Module order: core < data < ...`.
A file of module M may include its own module and modules before M, never one
after it, so no include cycle between modules can come back. Also checked:
toml++ is included only by src/data/ (the reading helper), the loader headers
`*_table.hpp` and src/report/ (JSON writing); cairo only by src/figure/cairo_*.cpp.
Exits 1 and lists every offending line.
"""
import pathlib
import re
import sys

root = pathlib.Path(sys.argv[1] if len(sys.argv) > 1 else pathlib.Path(__file__).resolve().parent.parent)
developers = (root / "DEVELOPERS.md").read_text(encoding="utf-8")
match = re.search(r"^Module order: (.+)$", developers, re.MULTILINE)
if not match:
    sys.exit("DEVELOPERS.md has no 'Module order: a < b < ...' line")
order = [m.strip(" `") for m in match.group(1).split("<")]
rank = {m: i for i, m in enumerate(order)}

src = root / "src"
problems = []
modules_seen = set()
for path in sorted(src.rglob("*")):
    if path.suffix not in (".hpp", ".cpp"):
        continue
    module = path.relative_to(src).parts[0]
    modules_seen.add(module)
    if module not in rank:
        problems.append(f"{path.relative_to(root)}: module '{module}' is not in the module order of DEVELOPERS.md")
        continue
    for number, line in enumerate(path.read_text(encoding="utf-8").splitlines(), 1):
        where = f"{path.relative_to(root)}:{number}"
        local = re.match(r'\s*#\s*include\s+"([^"/]+)/', line)
        if local:
            target = local.group(1)
            if target not in rank:
                problems.append(f"{where}: includes unknown module '{target}'")
            elif rank[target] > rank[module]:
                problems.append(f"{where}: {module} includes {target}, which comes after it in the module order")
        system = re.match(r"\s*#\s*include\s+<([^>]+)>", line)
        if system:
            header = system.group(1)
            if header.startswith("toml++") and not (module in ("data", "report") or path.name.endswith("_table.hpp")):
                problems.append(f"{where}: toml++ outside src/data, src/report and the loader headers *_table.hpp")
            if header.startswith("cairo") and not (module == "figure" and path.name.startswith("cairo_")):
                problems.append(f"{where}: cairo outside src/figure/cairo_*.cpp")

for missing in sorted(set(order) - modules_seen):
    problems.append(f"DEVELOPERS.md: module '{missing}' of the module order has no directory in src/")
for p in problems:
    print(p)
sys.exit(1 if problems else 0)
