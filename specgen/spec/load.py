"""Load a YAML spec keeping the line and column of every key, refusing duplicate keys.

Only plain YAML data is built (SafeLoader): no tag can construct a Python object.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

import yaml

from specgen.errors import Location, Problem, SpecError

MAX_BYTES = 5 * 1024 * 1024  # a machine spec is a few kB; far larger is a mistake or an attack
MAX_NODES = 500_000  # after alias expansion; stops "billion laughs"
MAX_DEPTH = 64  # the format nests about 6 deep


class MarkedDict(dict):
    """A mapping that remembers where each key was written."""

    marks: dict
    start: tuple[int, int]


class MarkedList(list):
    """A sequence that remembers where each item was written."""

    marks: list
    start: tuple[int, int]


@dataclass
class Source:
    """A loaded spec: the data, its file name for messages, and the raw bytes for fingerprints."""

    name: str
    data: dict
    raw: bytes = field(repr=False)

    def location(self, path: tuple) -> Location:
        """The best known location of a dotted path: the key itself, else its nearest parent."""
        node, best = self.data, getattr(self.data, "start", (0, 0))
        for part in path:
            marks = getattr(node, "marks", None)
            try:
                if isinstance(node, dict) and marks is not None and part in marks:
                    best = marks[part]
                elif isinstance(node, list) and marks is not None and isinstance(part, int) and part < len(marks):
                    best = marks[part]
                node = node[part]
            except (KeyError, IndexError, TypeError):
                break
        return Location(self.name, best[0], best[1])


class _Loader(yaml.SafeLoader):
    def construct_mapping(self, node, deep=False):
        if not isinstance(node, yaml.MappingNode):
            return super().construct_mapping(node, deep)
        self.flatten_mapping(node)
        result = MarkedDict()
        result.marks = {}
        result.start = _pos(node.start_mark)
        for key_node, value_node in node.value:
            key = self.construct_object(key_node, deep=True)
            if not isinstance(key, (str, int, float, bool)) or isinstance(key, bool):
                raise _LoadProblem(key_node.start_mark, "a key must be a plain name")
            key = str(key)
            if key in result:
                first = result.marks[key]
                raise _LoadProblem(
                    key_node.start_mark,
                    f"duplicate key '{key}' (first written at line {first[0]}); YAML would keep only the last",
                )
            result[key] = self.construct_object(value_node, deep=True)
            result.marks[key] = _pos(key_node.start_mark)
        return result

    def construct_sequence(self, node, deep=False):
        result = MarkedList(self.construct_object(child, deep=True) for child in node.value)
        result.marks = [_pos(child.start_mark) for child in node.value]
        result.start = _pos(node.start_mark)
        return result


# Build mappings and sequences eagerly through the overrides above so every one carries marks.
_Loader.add_constructor("tag:yaml.org,2002:map", lambda loader, node: loader.construct_mapping(node))
_Loader.add_constructor("tag:yaml.org,2002:seq", lambda loader, node: loader.construct_sequence(node))


class _LoadProblem(Exception):
    def __init__(self, mark, message):
        self.mark, self.message = mark, message


def _pos(mark) -> tuple[int, int]:
    return (mark.line + 1, mark.column + 1)


def _expanded_size(node, depth: int, memo: dict) -> int:
    """Count nodes as if aliases were copied out; refuse too deep or too large a tree."""
    if depth > MAX_DEPTH:
        raise _LoadProblem(node.start_mark, f"nesting deeper than {MAX_DEPTH} levels")
    key = id(node)
    if key in memo:
        return memo[key]
    size = 1
    if isinstance(node, yaml.MappingNode):
        for k, v in node.value:
            size += _expanded_size(k, depth + 1, memo) + _expanded_size(v, depth + 1, memo)
    elif isinstance(node, yaml.SequenceNode):
        for v in node.value:
            size += _expanded_size(v, depth + 1, memo)
    if size > MAX_NODES:
        raise _LoadProblem(node.start_mark, f"the spec expands to more than {MAX_NODES} values (YAML aliases?)")
    memo[key] = size
    return size


def load_text(raw: bytes, name: str) -> Source:
    """Parse spec bytes. Raises SpecError with a located problem for anything unreadable."""
    where = Location(name)
    if len(raw) > MAX_BYTES:
        raise SpecError([Problem(where, "", f"file is {len(raw)} bytes; specs are limited to {MAX_BYTES} bytes")])
    if b"\x00" in raw:
        raise SpecError([Problem(where, "", "file is binary, not a YAML text spec")])
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        line = raw[: exc.start].count(b"\n") + 1
        raise SpecError([Problem(Location(name, line, 0), "", "file is not UTF-8 text")]) from None
    try:
        loader = _Loader(text)
        try:
            node = loader.get_single_node()
            if node is not None:
                _expanded_size(node, 0, {})
            data = loader.construct_document(node) if node is not None else None
        finally:
            loader.dispose()
    except _LoadProblem as exc:
        raise SpecError([Problem(Location(name, *_pos(exc.mark)), "", exc.message)]) from None
    except yaml.MarkedYAMLError as exc:
        mark = exc.problem_mark or exc.context_mark
        loc = Location(name, *_pos(mark)) if mark else where
        what = exc.problem or exc.context or "invalid YAML"
        raise SpecError([Problem(loc, "", f"YAML syntax error: {what}")]) from None
    except yaml.YAMLError as exc:
        raise SpecError([Problem(where, "", f"YAML error: {exc}")]) from None
    except RecursionError:
        raise SpecError([Problem(where, "", "nesting too deep to read")]) from None
    if data is None:
        raise SpecError([Problem(where, "", "file is empty; a spec is a YAML mapping starting with 'format: 1'")])
    if not isinstance(data, dict):
        raise SpecError([Problem(Location(name, 1, 1), "", "a spec must be a YAML mapping of keys, not a list or a single value")])
    return Source(name=name, data=data, raw=raw)


def load_file(path: str | Path) -> Source:
    p = Path(path)
    name = str(path)
    if p.is_dir():
        raise SpecError([Problem(Location(name), "", "is a folder, not a spec file")])
    try:
        raw = p.read_bytes()
    except FileNotFoundError:
        raise SpecError([Problem(Location(name), "", "no such file")]) from None
    except OSError as exc:
        raise SpecError([Problem(Location(name), "", f"cannot read: {exc.strerror or exc}")]) from None
    return load_text(raw, name)
