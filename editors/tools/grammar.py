#!/usr/bin/env python3
"""Writes the highlighting grammars of hmb calc files from one set of rules:

  vscode/syntaxes/hmb.tmLanguage.json   TextMate grammar (VS Code; tested by vscode-tmgrammar-test)
  sublime/hmb.sublime-syntax            Sublime Text

usage: tools/grammar.py          rewrite both files
       tools/grammar.py --check  fail if either file differs from what the rules give

The words (unit kinds, roles, properties, settings) are read from tools/words.json, which the Go
tests generate from the kind catalogue. The rules follow the scanner of the notation (lang/token): "#" comments to the end of the line,
double-quoted strings with backslash escapes that end at the line's end if left open, names of
letters, digits, "_" and "-", numbers, and a unit spelling after a number running to the next
space or punctuation mark (spaces allowed inside parentheses: kJ/(kg K)).
"""
import json
import os
import sys

NAME = r"[\p{L}_][\p{L}\p{N}_-]*"
B = r"(?<![\p{L}\p{N}_-])"  # not inside a name
E = r"(?![\p{L}\p{N}_-])"
KEY = r"(?:^|(?<=[{;]))[ \t]*"  # where a statement or a block entry begins
# The notation's words come from the kind catalogue and the checker, through words.json (written
# by `go test ./cmd/hmb -run EditorWords -update`, which then runs this script).
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "words.json"), encoding="utf-8") as _f:
    WORDS = json.load(_f)
KINDS = "|".join(WORDS["kinds"])
ROLES = "|".join(WORDS["roles"])
PROPS = "|".join(WORDS["properties"])
SETTINGS = "|".join(WORDS["settings"])
NUMBER = r"[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?"
UNIT = r"(?!(?:within|to|step|count)" + E + r")(?:[^\s{},;#\"=<>±(]|\([^)\n]*\))+"

# Each rule: a single match with captures, or a begin/end region (name, begin, end, inner rules).
RULES = [
    ("comment", dict(match=r"(#).*$", name="comment.line.number-sign.hmb",
                     captures={1: "punctuation.definition.comment.hmb"})),
    ("string", dict(begin='"', end='"|$', name="string.quoted.double.hmb",
                    begin_scope="punctuation.definition.string.begin.hmb",
                    end_scope="punctuation.definition.string.end.hmb",
                    inner=[dict(match=r"\\.", name="constant.character.escape.hmb")])),
    ("stream", dict(comment='stream NAME {, NAME} ["label"] [{ ... }]',
                    begin=B + "(stream)" + E, end=r'(?=[{"#;}])|$',
                    begin_captures={1: "keyword.other.stream.hmb"},
                    inner=[dict(match=NAME, name="entity.name.type.stream.hmb"),
                           dict(match=",", name="punctuation.separator.comma.hmb")])),
    ("expect", dict(match=B + "(expect)" + E + r"(?:[ \t]+(" + NAME + r"))?(?:[ \t]+(" + NAME + r"))?",
                    captures={1: "keyword.other.expect.hmb", 2: "variable.other.hmb",
                              3: "support.type.property-name.hmb"})),
    ("study", dict(comment='case NAME ["label"] { ... }, sweep NAME ["label"] { ... }; in a sweep: case NAME',
                   match=KEY + "(case|sweep)" + E + r"(?:[ \t]+(" + NAME + r"))?",
                   captures={1: "keyword.other.study.hmb", 2: "entity.name.section.case.hmb"})),
    ("unit", dict(comment='KIND NAME ["label"] { ... }',
                  match=KEY + "(" + KINDS + ")" + E + r"(?:[ \t]+(" + NAME + r"))?",
                  captures={1: "storage.type.unit.hmb", 2: "entity.name.function.unit.hmb"})),
    ("display", dict(match=KEY + "(display)" + E + r"(?:[ \t]+(SI|US)" + E + ")?",
                     captures={1: "keyword.other.setting.hmb", 2: "constant.language.unit-system.hmb"})),
    ("setting", dict(match=KEY + "(" + SETTINGS + ")" + E, captures={1: "keyword.other.setting.hmb"})),
    ("ports", dict(comment="a port role and the streams on it: in S6, S7",
                   begin=KEY + "(" + ROLES + ")" + E + r"(?=[ \t]+[\p{L}_])", end=r"(?=[;}#])|$",
                   begin_captures={1: "variable.parameter.role.hmb"},
                   inner=[dict(match=NAME, name="variable.other.stream.hmb"),
                          dict(match=",", name="punctuation.separator.comma.hmb")])),
    ("fluid", dict(match=KEY + "(fluid)" + E + r"(?:[ \t]+(" + NAME + "))?",
                   captures={1: "support.type.property-name.hmb", 2: "constant.language.fluid.hmb"})),
    ("property", dict(match=KEY + "(" + PROPS + ")" + E, captures={1: "support.type.property-name.hmb"})),
    ("within", dict(match=B + "within" + E, name="keyword.operator.word.hmb")),
    ("studyword", dict(comment="the words of cases and sweeps: FW T free; from 4 kg/s to 8 kg/s step 1 kg/s; show",
                       match=B + "(?:free|from|to|step|count|show)" + E, name="keyword.other.study.hmb")),
    ("plusminus", dict(match=r"±|\+/-|\+-", name="keyword.operator.tolerance.hmb")),
    ("comparison", dict(match="<=|>=|=|<|>", name="keyword.operator.comparison.hmb")),
    ("quantity", dict(comment="a number and its unit spelling: 150 psig, 9000 lbm/h, 480 °F, 1.2 kJ/(kg K)",
                      match=r"(?<![\p{L}\p{N}_.-])(" + NUMBER + r")(?:[ \t]*(" + UNIT + "))?",
                      captures={1: "constant.numeric.hmb", 2: "keyword.other.unit.hmb"})),
    ("name", dict(match=B + NAME + E, name="variable.other.hmb")),
    ("lbrace", dict(match=r"\{", name="punctuation.section.block.begin.hmb")),
    ("rbrace", dict(match=r"\}", name="punctuation.section.block.end.hmb")),
    ("comma", dict(match=",", name="punctuation.separator.comma.hmb")),
    ("semi", dict(match=";", name="punctuation.terminator.hmb")),
]


def tm_match(r):
    out = {}
    if "comment" in r:
        out["comment"] = r["comment"]
    out["match"] = r["match"]
    if "name" in r:
        out["name"] = r["name"]
    if "captures" in r:
        out["captures"] = {str(k): {"name": v} for k, v in r["captures"].items()}
    return out


def textmate():
    repo = {}
    for key, r in RULES:
        if "begin" not in r:
            repo[key] = tm_match(r)
            continue
        x = {}
        if "comment" in r:
            x["comment"] = r["comment"]
        x.update(begin=r["begin"], end=r["end"])
        if "name" in r:
            x["name"] = r["name"]
        if "begin_scope" in r:
            x["beginCaptures"] = {"0": {"name": r["begin_scope"]}}
        if "begin_captures" in r:
            x["beginCaptures"] = {str(k): {"name": v} for k, v in r["begin_captures"].items()}
        if "end_scope" in r:
            x["endCaptures"] = {"0": {"name": r["end_scope"]}}
        x["patterns"] = [tm_match(i) for i in r["inner"]]
        repo[key] = x
    g = {
        "$schema": "https://raw.githubusercontent.com/martinring/tmlanguage/master/tmlanguage.json",
        "comment": "Generated by editors/tools/grammar.py; edit that file, not this one.",
        "name": "hmb",
        "scopeName": "source.hmb",
        "fileTypes": ["hmb"],
        "patterns": [{"include": "#" + key} for key, _ in RULES],
        "repository": repo,
    }
    return json.dumps(g, indent=2, ensure_ascii=False) + "\n"


def yq(s):
    """A YAML single-quoted scalar."""
    return "'" + s.replace("'", "''") + "'"


def sublime():
    out = ["%YAML 1.2", "---",
           "# Generated by editors/tools/grammar.py; edit that file, not this one.",
           "name: hmb", "scope: source.hmb", "file_extensions:", "  - hmb", "contexts:", "  main:"]
    out += [f"    - include: {key}" for key, _ in RULES]

    def match(r, indent, scope=None, pop=False, push=None):
        p = " " * indent
        lines = [f"{p}- match: {yq(r['match'])}"]
        if scope or r.get("name"):
            lines.append(f"{p}  scope: {scope or r['name']}")
        if r.get("captures"):
            lines.append(f"{p}  captures:")
            lines += [f"{p}    {k}: {v}" for k, v in sorted(r["captures"].items())]
        if push:
            lines.append(f"{p}  push: {push}")
        if pop:
            lines.append(f"{p}  pop: true")
        return lines

    for key, r in RULES:
        out.append(f"  {key}:")
        if "begin" not in r:
            out += match(r, 4)
            continue
        scope = None
        if r.get("begin_scope"):
            scope = (r.get("name", "") + " " + r["begin_scope"]).strip()
        out += match(dict(match=r["begin"], captures=r.get("begin_captures")), 4, scope=scope,
                     push=key + "-body")
    for key, r in RULES:
        if "begin" not in r:
            continue
        out.append(f"  {key}-body:")
        if r.get("name"):
            out.append(f"    - meta_scope: {r['name']}")
        for i in r["inner"]:
            out += match(i, 4)
        out += match(dict(match=r["end"]), 4, scope=r.get("end_scope"), pop=True)
    return "\n".join(out) + "\n"


def main():
    editors = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    files = {
        os.path.join(editors, "vscode", "syntaxes", "hmb.tmLanguage.json"): textmate(),
        os.path.join(editors, "sublime", "hmb.sublime-syntax"): sublime(),
    }
    check = sys.argv[1:] == ["--check"]
    stale = []
    for path, text in files.items():
        try:
            with open(path, encoding="utf-8") as f:
                old = f.read()
        except FileNotFoundError:
            old = None
        if old == text:
            continue
        if check:
            stale.append(path)
            continue
        tmp = path + ".tmp"
        with open(tmp, "w", encoding="utf-8") as f:
            f.write(text)
        os.replace(tmp, path)
        print("wrote", os.path.relpath(path, editors))
    if stale:
        print("out of date (run editors/tools/grammar.py):", *stale, sep="\n  ", file=sys.stderr)
        sys.exit(1)


if __name__ == "__main__":
    main()
