"""The spec's JSON Schemas, read once: validators, what each field holds, and the sentence for each error.

Two schemas ship with specgen: the machine spec (``machine-spec.schema.json``) and the motor parts
file a spec may name (``motor-parts.schema.json``). Each is read from disk once per process.

- References: the machine-spec validator runs on a copy whose local ``$ref``s are inlined
  (``inline_local_refs``); it accepts and refuses exactly what the schema as written does.
- Kinds: a field whose schema is (or ``$ref``s, through any chain) a ``$defs`` entry named like a
  kind in ``units.KINDS`` ("pressure", "torque", "ratio" ...) holds that kind. ``efficiency``
  refs ``ratio``, so efficiencies are ratios. A field may offer several shapes
  (``oneOf``/``anyOf``, e.g. a fixed displacement string or a ``{min, max}`` mapping); the shape
  that fits the value decides. A field added to the schema later gets its kind with no change here.
- Examples: every quantity field carries an ``examples`` entry; a number written without its
  unit is answered with the nearest example on the way to the error.

Example: in ``{"supplies": {"main": {"relief_setting": "250 bar"}}}`` the field
``("supplies", "main", "relief_setting")`` has kind "pressure"; writing ``relief_setting: 250``
is refused with "'250' has no unit; write it with its unit, e.g. '250 bar'".
"""

from __future__ import annotations

import json
from dataclasses import dataclass
from functools import lru_cache

from specgen import units
from specgen.resources import data_dir

SCHEMA_FILE = "machine-spec.schema.json"
PARTS_SCHEMA_FILE = "motor-parts.schema.json"


@lru_cache(maxsize=1)
def schema() -> dict:
    """The machine-spec schema as written (``specgen schema`` prints it)."""
    return json.loads((data_dir("schemas") / SCHEMA_FILE).read_text(encoding="utf-8"))


@lru_cache(maxsize=1)
def parts_schema() -> dict:
    return json.loads((data_dir("schemas") / PARTS_SCHEMA_FILE).read_text(encoding="utf-8"))


@lru_cache(maxsize=1)
def validator():
    """The machine-spec validator: same verdicts and messages as the schema as written, without a
    reference lookup per value."""
    import jsonschema

    return jsonschema.Draft202012Validator(inline_local_refs(schema()))


@lru_cache(maxsize=1)
def parts_validator():
    import jsonschema

    return jsonschema.Draft202012Validator(parts_schema())


# --- local references ---------------------------------------------------------------------------
# jsonschema resolves a "$ref" each time an instance reaches it: on a 1,000-drive spec that is
# some 39,000 lookups and half the time of the whole schema stage. A "$ref" with sibling keywords
# becomes {"allOf": [target], siblings...}, which JSON Schema 2020-12 defines as the same thing,
# and the referenced schema is the one the error names in both. A reference to a schema already
# being inlined (a recursive one) is kept as it is; so are references to other documents.

# Keywords whose values are data, not schemas: never walked.
_DATA = frozenset({"enum", "const", "examples", "default"})


def inline_local_refs(schema: dict) -> dict:
    """A new schema with every non-recursive "#/..." reference replaced by what it points to.

    Example: {"$defs": {"p": {"type": "string"}}, "properties": {"a": {"$ref": "#/$defs/p"}}}
    becomes {"$defs": {...}, "properties": {"a": {"type": "string"}}}.
    """

    def target(ref: str):
        node = schema
        for part in ref[2:].split("/"):
            node = node[part.replace("~1", "/").replace("~0", "~")]  # JSON Pointer escapes (RFC 6901)
        return node

    def walk(node, open_refs: frozenset):
        if isinstance(node, list):
            return [walk(x, open_refs) for x in node]
        if not isinstance(node, dict):
            return node
        ref = node.get("$ref")
        if isinstance(ref, str) and ref.startswith("#/") and ref not in open_refs:
            body = walk(target(ref), open_refs | {ref})
            rest = {k: walk(v, open_refs) for k, v in node.items() if k != "$ref"}
            return {"allOf": [body], **rest} if rest else body
        return {k: v if k in _DATA else walk(v, open_refs) for k, v in node.items()}

    return walk(schema, frozenset())


# --- error sentences ----------------------------------------------------------------------------


def dotted(path) -> str:
    return ".".join(str(p) for p in path)


def message(error, root: dict | None = None) -> tuple[tuple, str]:
    """A plain sentence for one schema error, and the path it belongs to.

    ``root``: the schema the error was found with (examples are looked up in it); None: the
    machine-spec validator's."""
    path = tuple(error.absolute_path)
    v = error.validator
    if v == "additionalProperties":
        extra = sorted(set(error.instance) - set(error.schema.get("properties", {})))
        known = ", ".join(sorted(error.schema.get("properties", {}))) or "none"
        if extra:
            return path + (extra[0],), f"unknown key '{extra[0]}' (allowed here: {known})"
    if v == "required":
        return path, error.message.replace("is a required property", "is required here")
    if v == "enum":
        allowed = ", ".join(str(x) for x in error.validator_value)
        return path, f"{error.instance!r} is not one of: {allowed}"
    if v == "oneOf" or v == "anyOf":
        desc = error.schema.get("description", "")
        return path, f"{_short(error.instance)} does not fit. {desc}".strip()
    if v == "type":
        found = example(error.schema_path, root)
        if found and isinstance(error.instance, (int, float)) and not isinstance(error.instance, bool):
            return path, f"'{error.instance}' has no unit; write it with its unit, e.g. '{found}'"
        return path, f"{_short(error.instance)} should be {_type_words(error.validator_value)}"
    if v == "pattern" and len(path) >= 1 and error.validator_value.startswith("^[A-Za-z]"):
        if "propertyNames" in error.schema_path:  # an id used as a key: point at the key itself
            path = path + (error.instance,)
        return path, f"'{error.instance}' is not a valid id (letters, digits, '-' and '_', starting with a letter)"
    if v == "pattern" and isinstance(error.instance, str) and any(c in error.instance for c in "\n\r\u2028\u2029"):
        return path, f"{_short(error.instance)} must be one line: line breaks are not allowed here"
    if v == "propertyNames":  # point at the offending key itself
        return path + (error.instance,), f"'{error.instance}' is not a valid id (letters, digits, '-' and '_', starting with a letter)"
    if v == "maxLength":
        return path, f"text of {len(error.instance)} characters is longer than the {error.validator_value} allowed here"
    if v in ("minLength", "minProperties"):
        return path, "is empty; at least one entry is needed here" if v == "minProperties" else "must not be empty"
    if v == "const":
        return path, f"{_short(error.instance)} is not supported; this version of specgen reads format {error.validator_value}"
    return path, error.message


def example(schema_path, root: dict | None = None) -> str | None:
    """The nearest 'examples' entry on the way to a schema error: set on every quantity field.

    ``root``: the schema ``schema_path`` was taken in; None: the machine-spec validator's (refs inlined)."""
    root = validator().schema if root is None else root
    node, found = root, None
    for part in schema_path:
        if isinstance(node, dict) and "examples" in node:
            found = node["examples"][0]
        try:
            node = node[part]
        except (KeyError, IndexError, TypeError):
            return found
        while isinstance(node, dict) and "$ref" in node and part != "$ref":
            if "examples" in node:
                found = node["examples"][0]
            node = _pointer(root, node["$ref"])
    return found


def _pointer(root: dict, ref: str) -> dict:
    node = root
    for part in ref.lstrip("#/").split("/"):
        node = node[part]
    return node


def _type_words(expected) -> str:
    words = {"string": "text", "object": "a mapping of keys", "array": "a list", "number": "a number",
             "integer": "a whole number", "boolean": "true or false"}
    names = expected if isinstance(expected, list) else [expected]
    return " or ".join(words.get(n, n) for n in names)


def _short(value) -> str:
    text = repr(value)
    return text if len(text) <= 60 else text[:57] + "..."


# --- what each field holds ----------------------------------------------------------------------


@dataclass(frozen=True)
class Field:
    """What the schema says of one place in a spec.

    ``kind``: the units kind of a quantity leaf, else None. ``noun``: for a mapping or item, the
    name of the schema definition it follows ("drive", "duty point", "supply"), else None.
    """

    kind: str | None = None
    noun: str | None = None
    quantity: bool = False  # a number-with-unit string, even where the schema names no single kind


def fields(data: dict) -> dict[tuple, Field]:
    """Every place in ``data`` (mappings, items and leaves) with what the machine-spec schema says of it."""
    root = schema()
    out: dict[tuple, Field] = {}
    _describe([root], data, (), root, out)
    return out


def _resolve(node: dict, root: dict) -> tuple[dict, list[str]]:
    """Follow a chain of local ``$ref``s; return the final node and every definition name passed."""
    names: list[str] = []
    seen = set()
    while isinstance(node, dict) and "$ref" in node and node["$ref"].startswith("#/") and node["$ref"] not in seen:
        ref = node["$ref"]
        seen.add(ref)
        names.append(ref.rsplit("/", 1)[-1])
        target = root
        for part in ref[2:].split("/"):
            target = target.get(part, {}) if isinstance(target, dict) else {}
        node = target
    return node, names


_BRANCHES: dict[int, tuple[dict, list]] = {}  # id(schema node) -> (node, its branches); the schema is loaded once


def _branches(node: dict, root: dict) -> list[tuple[dict, list[str]]]:
    """The node and every alternative it offers (oneOf, anyOf, allOf, then, else), resolved."""
    hit = _BRANCHES.get(id(node))
    if hit is not None and hit[0] is node:
        return hit[1]
    out = _expand(node, root)
    _BRANCHES[id(node)] = (node, out)
    return out


def _expand(node: dict, root: dict) -> list[tuple[dict, list[str]]]:
    out, todo = [], [(node, [])]
    while todo:
        n, carried = todo.pop(0)
        n, names = _resolve(n, root)
        if not isinstance(n, dict):
            continue
        names = carried + names
        out.append((n, names))
        for key in ("allOf", "oneOf", "anyOf"):
            todo += [(b, names) for b in n.get(key, []) if isinstance(b, dict)]
        todo += [(n[key], names) for key in ("then", "else") if isinstance(n.get(key), dict)]
    return out


def _kind(names: list[str]) -> str | None:
    return next((n for n in names if n in units.KINDS), None)


def _fits(node: dict, value) -> bool:
    """Could ``value`` take this shape? Only the type is asked: enough to choose among branches."""
    t = node.get("type")
    if t is None:
        return True
    types = t if isinstance(t, list) else [t]
    checks = {"object": isinstance(value, dict), "array": isinstance(value, list),
              "string": isinstance(value, str), "boolean": isinstance(value, bool),
              "number": isinstance(value, (int, float)) and not isinstance(value, bool),
              "integer": isinstance(value, int) and not isinstance(value, bool), "null": value is None}
    return any(checks.get(x, False) for x in types)


def _child_nodes(candidates: list[tuple[dict, list[str]]], key) -> list[dict]:
    out = []
    for node, _ in candidates:
        if isinstance(key, int):
            if isinstance(node.get("items"), dict):
                out.append(node["items"])
            continue
        props = node.get("properties", {})
        if key in props:
            out.append(props[key])
        elif isinstance(node.get("additionalProperties"), dict):
            out.append(node["additionalProperties"])
    return out


def _describe(nodes: list[dict], value, path: tuple, root: dict, out: dict) -> None:
    candidates = [(n, names) for node in nodes for n, names in _branches(node, root) if _fits(n, value)]
    names = [name for _, ns in candidates for name in ns]
    if isinstance(value, dict):
        noun = next((n for n in names if n not in units.KINDS), None)
        out[path] = Field(noun=noun.replace("_", " ") if noun else None)
        for k, v in value.items():
            _describe(_child_nodes(candidates, k), v, path + (k,), root, out)
    elif isinstance(value, list):
        out[path] = Field()
        for i, v in enumerate(value):
            _describe(_child_nodes(candidates, i), v, path + (i,), root, out)
    else:
        out[path] = Field(kind=_kind(names), quantity=_kind(names) is not None or "quantity" in names)


def field_at(path: tuple, value) -> Field | None:
    """What the machine-spec schema says of ``path`` when it holds ``value``; None where the schema
    has no such place. Every step above the leaf is taken as a mapping (ids match any key).

    Example: field_at(("supplies", "main", "relief_setting"), "290 bar").kind == "pressure";
    field_at(("supplies", "main", "relief"), "290 bar") is None.
    """
    root = schema()
    nodes = [root]
    for key in path:
        candidates = [(n, names) for node in nodes for n, names in _branches(node, root) if _fits(n, {})]
        nodes = _child_nodes(candidates, key)
        if not nodes:
            return None
    candidates = [(n, names) for node in nodes for n, names in _branches(node, root) if _fits(n, value)]
    if not candidates:
        return Field()
    names = [name for _, ns in candidates for name in ns]
    return Field(kind=_kind(names), quantity=_kind(names) is not None or "quantity" in names)
