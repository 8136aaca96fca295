#!/usr/bin/env python3
"""Check real JSON output of every command against its schema in docs/.

  python3 docs/check_json_schemas.py PATH/TO/tensorsieve

docs/json_schema_cases.json lists, for each schema docs/<name>.schema.json, the command
lines whose `-f json` output (`-f jsonl` for screen: each line) must validate against it;
the cases are run from the source tree. The `form` schema is checked by
check_form_schema.py, which this script runs too, with its checks beyond the schema.
Every document must carry the "version" the binary's --version prints. Validation uses
the small validator of check_form_schema.py (and the jsonschema module when installed).
Exit status 0 when every check passes.
"""

import json
import os
import subprocess
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import check_form_schema  # noqa: E402  (the validator)


def main(argv):
    if len(argv) != 1:
        print(__doc__, file=sys.stderr)
        return 2
    binary = os.path.abspath(argv[0])
    root = os.path.dirname(HERE)
    version = subprocess.run([binary, "--version"], check=True, stdout=subprocess.PIPE, text=True).stdout.split()[-1]
    with open(os.path.join(HERE, "json_schema_cases.json"), encoding="utf-8") as f:
        cases = json.load(f)
    try:
        import jsonschema
    except ImportError:
        jsonschema = None
    failures = 0
    documents = 0
    for name, lines in cases.items():
        with open(os.path.join(HERE, name + ".schema.json"), encoding="utf-8") as f:
            schema = json.load(f)
        for args in lines:
            jsonl = args[0] == "screen"
            p = subprocess.run([binary, *args, "-f", "jsonl" if jsonl else "json"], cwd=root,
                               capture_output=True, text=True)
            label = f"{name}: tensorsieve {' '.join(args)}"
            # screen exits 5 when a file could not be screened, after writing its row with the error
            if p.returncode != 0 and not (jsonl and p.stdout):
                print(f"FAIL {label}: exit {p.returncode}: {p.stderr.strip()}")
                failures += 1
                continue
            docs = p.stdout.splitlines() if jsonl else [p.stdout]
            try:
                for text in docs:
                    doc = json.loads(text)
                    check_form_schema.validate(doc, schema, schema)
                    if jsonschema is not None:
                        jsonschema.Draft202012Validator(schema).validate(doc)
                    if doc.get("version") != version:
                        raise check_form_schema.Invalid(f"version {doc.get('version')!r}, not {version!r}")
                    documents += 1
            except (check_form_schema.Invalid, ValueError) as e:
                print(f"FAIL {label}: {e}")
                failures += 1
                continue
            except Exception as e:  # jsonschema.ValidationError
                print(f"FAIL {label}: {type(e).__name__}: {str(e).splitlines()[0]}")
                failures += 1
                continue
            print(f"ok   {label}")
    print(f"{documents} documents valid against {len(cases)} schemas")
    form = check_form_schema.main([binary])
    return 1 if failures or form else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
