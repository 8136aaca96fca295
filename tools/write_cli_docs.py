#!/usr/bin/env python3
"""Write the man page and the bash completion of tensorsieve from its own help texts.

  python3 tools/write_cli_docs.py BINARY VERSION OUT_DIR

runs `BINARY --help` and `BINARY SUBCOMMAND --help` for every subcommand the top-level
help lists, and writes OUT_DIR/tensorsieve.1 (roff, man section 1) and
OUT_DIR/tensorsieve.bash (a bash completion function). The build runs it after the
binary is linked, so both always say what the binary's CLI11 help says; nothing of
either is written by hand except the fixed sections below.
"""

import os
import re
import subprocess
import sys

ENTRY = re.compile(r"^  (\S.*?)(?:\s{2,}(\S.*))?$")


def help_text(binary, *args):
    p = subprocess.run([binary, *args, "--help"], stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True,
                       env=dict(os.environ, COLUMNS="200"))
    if p.returncode != 0:
        raise SystemExit(f"{binary} {' '.join(args)} --help failed: {p.stderr.strip()}")
    return p.stdout


def parse(text):
    """{'description': str, 'usage': str, sections: {name: [(names, description)]}}."""
    lines = text.rstrip("\n").split("\n")
    out = {"description": lines[0].strip(), "usage": "", "sections": {}}
    section = None
    for line in lines[1:]:
        if line.startswith("Usage:"):
            out["usage"] = re.sub(r"^Usage: \S+", "tensorsieve", line).strip()
        elif re.match(r"^[A-Z][A-Za-z ]*:$", line):
            section = line[:-1]
            out["sections"][section] = []
        elif section and line.startswith(" " * 4) and out["sections"][section]:
            names, desc = out["sections"][section][-1]  # a wrapped description continues
            out["sections"][section][-1] = (names, (desc + " " + line.strip()).strip())
        elif section and (m := ENTRY.match(line)):
            out["sections"][section].append((m.group(1).strip(), (m.group(2) or "").strip()))
    return out


def option_names(entry):
    """'-f,--format TEXT=text' -> (['-f', '--format'], 'TEXT=text')."""
    first, _, rest = entry.partition(" ")
    return first.split(","), rest.strip()


def listed_values(description):
    """'text (default), markdown, latex or json' -> ['text', 'markdown', 'latex', 'json']."""
    plain = re.sub(r"\s*\([^()]*\)", "", description).strip()
    m = re.fullmatch(r"([\w-]+(?:, [\w-]+)*),? or ([\w-]+)", plain)
    if not m:
        return []
    return m.group(1).split(", ") + [m.group(2)]


def takes_file(names, description):
    return any(n in ("-o", "--output", "--scenario") for n in names) or re.search(r"\bfiles?\b|\bpath", description)


# ---- the man page --------------------------------------------------------------

def roff(text):
    text = text.replace("\\", "\\e").replace("-", "\\-")
    return "\\&" + text if text[:1] in (".", "'") else text


def man_page(top, commands, version):
    out = [f'.TH TENSORSIEVE 1 "" "tensorsieve {version}" "User Commands"',
           ".SH NAME", "tensorsieve \\- " + roff(top["description"].split(": ", 1)[-1]),
           ".SH SYNOPSIS", ".B tensorsieve", "\\fISUBCOMMAND\\fR [\\fIOPTIONS\\fR] [\\fIARGUMENTS\\fR]",
           ".br", ".B tensorsieve", "\\-\\-help | \\-\\-version",
           ".SH DESCRIPTION", roff(top["description"]) + ".",
           "Every subcommand writes a report in text, Markdown, LaTeX or JSON; the JSON of each is",
           "described by a JSON schema in the documentation. Errors name the file, line, field or",
           "option at fault and what would be valid, and end the program with a non\\-zero status.",
           ".SH OPTIONS"]
    for names, desc in top["sections"].get("Options", []):
        out += [".TP", "\\fB" + roff(names) + "\\fR", roff(desc)]
    out.append(".SH COMMANDS")
    for name, sub in commands:
        out += [f'.SS "{roff(sub["usage"])}"', roff(sub["description"]) + "."]
        for section in ("Positionals", "Options"):
            entries = [e for e in sub["sections"].get(section, []) if not e[0].startswith("-h,")]
            for names, desc in entries:
                head, arg = option_names(names)
                label = ",".join(head)
                out += [".TP", "\\fB" + roff(label) + "\\fR" + (" \\fI" + roff(arg) + "\\fR" if arg else ""),
                        roff(desc)]
    out += [".SH EXIT STATUS",
            "0 when the report was written; a non\\-zero status names the kind of error",
            "(the table is in the CLI documentation, docs/cli.md).",
            ".SH FILES",
            "The group data (groups/*.toml) and the response catalogue are read from",
            "share/tensorsieve beside the installed program, or from the directory named by",
            ".BR TENSORSIEVE_DATA .",
            ".SH SEE ALSO",
            "The Markdown documentation installed with the program (docs/ in the source tree):",
            "cli.md, scenarios.md, json\\-schema.md, python.md."]
    return "\n".join(out) + "\n"


# ---- the bash completion ---------------------------------------------------------

def bash_completion(top, commands):
    names = [n for n, _ in commands]
    out = ["# bash completion for tensorsieve, written from its --help texts by tools/write_cli_docs.py",
           "_tensorsieve() {",
           '  local cur="${COMP_WORDS[COMP_CWORD]}" prev="${COMP_WORDS[COMP_CWORD-1]}" sub="" i',
           f'  local commands="{" ".join(names)}"',
           "  for ((i = 1; i < COMP_CWORD; i++)); do",
           '    case " $commands " in *" ${COMP_WORDS[i]} "*) sub="${COMP_WORDS[i]}"; break ;; esac',
           "  done",
           '  if [[ -z $sub ]]; then',
           '    COMPREPLY=($(compgen -W "$commands --help --version" -- "$cur"))',
           "    return",
           "  fi",
           '  local opts="" files=0',
           '  case "$sub" in']
    for name, sub in commands:
        opts, value_cases, file_opts = [], [], []
        for entry, desc in sub["sections"].get("Options", []):
            flags, arg = option_names(entry)
            opts += flags
            if not arg or arg.startswith("["):
                continue
            values = listed_values(desc)
            if values:
                value_cases.append(("|".join(flags), " ".join(values)))
            elif takes_file(flags, desc):
                file_opts.append("|".join(flags))
        positional_files = any(takes_file([], d) or re.search(r"\bTOML\b", d) for _, d in sub["sections"].get("Positionals", []))
        out.append(f"    {name})")
        out.append(f'      opts="{" ".join(opts)}"; files={1 if positional_files else 0}')
        if value_cases or file_opts:
            out.append('      case "$prev" in')
            for flags, values in value_cases:
                out.append(f'        {flags}) COMPREPLY=($(compgen -W "{values}" -- "$cur")); return ;;')
            if file_opts:
                out.append(f'        {"|".join(file_opts)}) COMPREPLY=($(compgen -f -- "$cur")); return ;;')
            out.append("      esac")
        out.append("      ;;")
    out += ["  esac",
            '  if [[ $cur == -* ]]; then',
            '    COMPREPLY=($(compgen -W "$opts" -- "$cur"))',
            "  elif ((files)); then",
            '    COMPREPLY=($(compgen -f -- "$cur"))',
            "  fi",
            "}",
            "complete -F _tensorsieve tensorsieve"]
    return "\n".join(out) + "\n"


def main(argv):
    if len(argv) != 3:
        print(__doc__, file=sys.stderr)
        return 2
    binary, version, out_dir = argv
    top = parse(help_text(binary))
    commands = [(name.split()[0], parse(help_text(binary, name.split()[0])))
                for name, _ in top["sections"].get("Subcommands", [])]
    if not commands:
        raise SystemExit(f"{binary} --help lists no subcommands")
    os.makedirs(out_dir, exist_ok=True)
    for name, text in (("tensorsieve.1", man_page(top, commands, version)),
                       ("tensorsieve.bash", bash_completion(top, commands))):
        path = os.path.join(out_dir, name)
        with open(path + ".tmp", "w", encoding="utf-8") as f:
            f.write(text)
        os.replace(path + ".tmp", path)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
