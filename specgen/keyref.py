"""The key reference: every key of the machine spec, its meaning, its kind or units and an example,
generated from the JSON Schema (schemas/machine-spec.schema.json) as markdown.

Regenerate the committed copy after any schema change with one command::

    python -m specgen.keyref -o schemas/keys.md        (or: specgen schema --keys -o schemas/keys.md)

tests/test_keyref.py fails, naming that command, when the committed file differs from the schema.

A key's path is dotted from the top of the spec; ``<id>`` stands for a name the user chooses (a
drive id, a duty point id) and ``[]`` for an item of a list. Kind: the units kind of a quantity
(``pressure``: "250 bar" or "3625 psi"), else the JSON type or the allowed words. Example: the
schema's own example, else its default, else the first allowed word, else the kind's example.
"""

from __future__ import annotations

import argparse
import json
import sys

from specgen.units import KINDS

HEADER = ("# Machine spec keys\n\n"
          "Generated from `schemas/machine-spec.schema.json` by `python -m specgen.keyref -o schemas/keys.md`\n"
          "(or `specgen schema --keys -o schemas/keys.md`); do not edit by hand. `<id>` is a name you choose\n"
          "(a drive, duty point, supply or mode id); `[]` is an item of a list. A quantity is a number with\n"
          "its unit in quotes or plain: `250 bar`, `3625 psi`.\n")
COLUMNS = "| key | meaning | kind / units | example |\n|---|---|---|---|"


def _pointer(root: dict, ref: str) -> dict:
    node = root
    for part in ref.lstrip("#/").split("/"):
        node = node[part]
    return node


def _resolve(node: dict, root: dict) -> tuple[dict, list[str], dict]:
    """The node behind its $ref chain, the $defs names passed, and the first-found annotations."""
    names, notes = [], {}
    while True:
        for k in ("description", "examples", "default"):
            if k in node and k not in notes:
                notes[k] = node[k]
        if "$ref" not in node:
            return node, names, notes
        names.append(node["$ref"].rsplit("/", 1)[-1])
        node = _pointer(root, node["$ref"])


def _kind(node: dict, names: list[str]) -> str:
    for n in names:
        if n in KINDS:
            k = KINDS[n]
            return f"{n} ({k.si_unit.replace('**', '^')} in SI)" if n != "ratio" else "ratio (0.92 or '92 %')"
    if names and names[0] == "quantity":
        return "quantity (number with unit)"
    if "enum" in node:
        return "one of: " + ", ".join(f"`{v}`" for v in node["enum"])
    if "const" in node:
        return f"`{node['const']}`"
    t = node.get("type")
    if isinstance(t, list):
        return " or ".join(t)
    if t:
        return t
    branches = node.get("oneOf") or node.get("anyOf") or []
    kinds = list(dict.fromkeys(_kind(*_resolve(b, {"$defs": {}})[:2]) if "$ref" not in b else b["$ref"].rsplit("/", 1)[-1]
                               for b in branches))
    return " or ".join(k for k in kinds if k) or "any"


def _example(node: dict, names: list[str], notes: dict) -> str:
    if notes.get("examples"):
        value = notes["examples"][0]
    elif "default" in notes:
        value = notes["default"]
    elif "enum" in node:
        value = node["enum"][0]
    elif "const" in node:
        value = node["const"]
    elif node.get("type") == "boolean":
        value = True
    else:
        value = next((KINDS[n].example for n in names if n in KINDS), None)
    if value is None:
        return ""
    text = value if isinstance(value, str) else json.dumps(value)
    return f"`{text}`"


def _cell(text: str) -> str:
    return " ".join(str(text).split()).replace("|", "\\|")


def _walk(node: dict, path: str, root: dict, rows: list, seen: tuple) -> None:
    node, names, notes = _resolve(node, root)
    if path:
        rows.append((path, notes.get("description", ""), _kind(node, names), _example(node, names, notes)))
    if any(n in seen for n in names):
        return  # a recursive definition: listed once
    seen = seen + tuple(names)
    for branch in node.get("oneOf", []) + node.get("anyOf", []) + node.get("allOf", []):
        sub, _, _ = _resolve(branch, root)
        for k, child in sub.get("properties", {}).items():
            _walk(child, f"{path}.{k}" if path else k, root, rows, seen)
    for k, child in node.get("properties", {}).items():
        _walk(child, f"{path}.{k}" if path else k, root, rows, seen)
    extra = node.get("additionalProperties")
    if isinstance(extra, dict):
        _walk(extra, f"{path}.<id>", root, rows, seen)
    items = node.get("items")
    if isinstance(items, dict):
        _walk(items, f"{path}[]", root, rows, seen)


def rows(schema: dict) -> list[tuple[str, str, str, str]]:
    """(dotted key, meaning, kind, example) for every key, in the schema's order, each path once."""
    out: list = []
    _walk(schema, "", schema, out, ())
    seen, unique = set(), []
    for r in out:
        if r[0] not in seen:
            seen.add(r[0])
            unique.append(r)
    return unique


def render(schema: dict | None = None) -> str:
    """The whole reference as markdown: one table per top-level key."""
    if schema is None:
        from specgen.intake.schema import schema as spec_schema

        schema = spec_schema()
    out, section = [HEADER], None
    for key, meaning, kind, example in rows(schema):
        top = key.split(".")[0].split("[")[0]
        if top != section:
            section = top
            out += [f"\n## `{top}`\n", COLUMNS]
        out.append(f"| `{_cell(key)}` | {_cell(meaning)} | {_cell(kind)} | {_cell(example)} |")
    return "\n".join(out) + "\n"


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(prog="python -m specgen.keyref", description="Write the spec key reference.")
    ap.add_argument("-o", "--output", metavar="FILE", help="write to FILE (schemas/keys.md) instead of stdout")
    args = ap.parse_args(argv)
    text = render()
    if args.output:
        from specgen.output import write_atomic

        write_atomic(args.output, text)
    else:
        sys.stdout.write(text)
    return 0


if __name__ == "__main__":
    sys.exit(main())
