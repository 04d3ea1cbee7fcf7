"""Load a YAML spec keeping the line and column of every key, refusing duplicate keys.

Only plain YAML data is built (SafeLoader): no tag can construct a Python object. File size,
value count (also after alias expansion) and nesting are bounded by MAX_BYTES, MAX_NODES and
MAX_DEPTH, checked while reading, so a hostile file is refused before it costs time or memory.
Every message is one printable line: text quoted from the spec has its control characters escaped.

Plain (unquoted) values are read by the YAML 1.2 core rules, not PyYAML's YAML 1.1 ones, so no
value turns into a number the writer did not write: ``true``/``false`` are booleans; ``12``,
``-3``, ``0.92``, ``2.5e3`` are numbers. A whole value ``1:4`` or ``30:1`` (YAML 1.1: the base-60
numbers 64 and 1801) is refused where it stands with the number to write instead ("write a
ratio as a number, e.g. 0.25 or 4"). Everything else is text: ``017`` (YAML 1.1: octal 15),
``0x1F``, ``1_000``, ``yes``/``on``, ``2025-03-14``, ``.inf`` and ``.nan``, so a field that needs
a number or a boolean refuses them with its located message and no value is infinite or not a
number. A number too large for a float (``1e400``, an integer of hundreds of digits) is refused
where it is written. Explicit tags for anything but plain text, numbers, booleans, null,
mappings and lists (``!!binary``, ``!!set``, ``!!timestamp``, ``!!python/...``) are refused.
"""

from __future__ import annotations

import math
import os
import re
import stat
from dataclasses import dataclass, field
from pathlib import Path

import yaml

from specgen.errors import Location, Problem, SpecError

# A machine spec is a few kB with about a thousand values and nests about 6 deep. The pure-Python
# YAML reader needs about 2 s and 80 MB for a 1 MiB file of 100,000 values, so far larger
# is refused as a mistake or an attack before it can take a CI runner's time or memory.
MAX_BYTES = 1024 * 1024
MAX_NODES = 100_000  # values as written, and again after alias expansion ("billion laughs")
MAX_DEPTH = 64


def one_line(text: str) -> str:
    """Text from a spec made safe for a one-line message: line breaks and control characters
    (ANSI escapes included) are shown escaped, so a key or value cannot split or recolour it."""
    return "".join(c if c.isprintable() or c == " " else repr(c)[1:-1] for c in text)


def problem(location: Location, path: str, message: str) -> Problem:
    """A Problem whose path and sentence are each one printable line."""
    return Problem(location, one_line(path), one_line(message))


class MarkedDict(dict):
    """A mapping that remembers where each key was written."""

    marks: dict
    start: tuple[int, int]


class MarkedList(list):
    """A sequence that remembers where each item was written."""

    marks: list
    start: tuple[int, int]


def plain_data(value):
    """A loaded value as plain dicts and lists with text keys (the marked types above are dict and list)."""
    if isinstance(value, dict):
        return {str(k): plain_data(v) for k, v in value.items()}
    if isinstance(value, list):
        return [plain_data(v) for v in value]
    return value


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


def _reader_base() -> type:
    """libyaml's C scanner and parser under PyYAML's Python composer and safe constructor.

    The C scanner reads a 1,000-drive spec several times faster than the pure-Python one (the
    largest cost of ``check`` on it); composing stays in Python so the depth and size limits
    below apply as values arrive. Without libyaml, the pure-Python SafeLoader does it all.
    """
    try:
        from yaml.cyaml import CParser
    except ImportError:
        return yaml.SafeLoader
    from yaml.composer import Composer
    from yaml.constructor import SafeConstructor
    from yaml.resolver import Resolver

    class _CReader(Composer, CParser, SafeConstructor, Resolver):
        def __init__(self, stream):
            CParser.__init__(self, stream)
            Composer.__init__(self)
            SafeConstructor.__init__(self)
            Resolver.__init__(self)

    return _CReader


class _Loader(_reader_base()):
    _depth = 0
    _nodes = 0

    def compose_node(self, parent, index):
        # The composer recurses once per level: stop at the depth limit with a position, long
        # before Python's recursion limit turns a deep file into a crash; count values as they
        # come so a huge file is refused before its whole tree sits in memory.
        self._depth += 1
        self._nodes += 1
        try:
            if self._depth > MAX_DEPTH:
                raise _LoadProblem(self.peek_event().start_mark, f"nesting deeper than {MAX_DEPTH} levels")
            if self._nodes > MAX_NODES:
                raise _LoadProblem(self.peek_event().start_mark, f"the spec holds more than {MAX_NODES} values")
            return super().compose_node(parent, index)
        finally:
            self._depth -= 1

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


# YAML 1.2 core scalars only (see the module text). A resolver is tried by a value's first
# character; the first pattern that matches the whole value gives its type, else it is text.
_BOOL = re.compile(r"^(?:true|True|TRUE|false|False|FALSE)$")
_INT = re.compile(r"^[-+]?(?:0|[1-9][0-9]*)$")  # "017" stays text: YAML 1.1 read it as octal 15
_FLOAT = re.compile(r"^[-+]?(?:\.[0-9]+|[0-9]+\.[0-9]*|[0-9]+(?=[eE]))(?:[eE][-+]?[0-9]+)?$")
_MAX_DIGITS = 300  # a float holds up to about 1.8e308; Python refuses ints of over 4300 digits
_TAGS = {"bool": "tag:yaml.org,2002:bool", "int": "tag:yaml.org,2002:int", "float": "tag:yaml.org,2002:float"}
_ALLOWED_TAGS = {"tag:yaml.org,2002:" + t for t in ("str", "int", "float", "bool", "null", "map", "seq")}

_Loader.yaml_implicit_resolvers = {
    first: [(tag, rx) for tag, rx in resolvers if tag in ("tag:yaml.org,2002:null", "tag:yaml.org,2002:merge")]
    for first, resolvers in _Loader.yaml_implicit_resolvers.items()
}
_Loader.add_implicit_resolver(_TAGS["bool"], _BOOL, list("tTfF"))
_Loader.add_implicit_resolver(_TAGS["int"], _INT, list("-+0123456789"))
_Loader.add_implicit_resolver(_TAGS["float"], _FLOAT, list("-+.0123456789"))
_Loader.yaml_constructors = {tag: f for tag, f in _Loader.yaml_constructors.items()
                             if tag is None or tag in _ALLOWED_TAGS}


def _construct_number(loader, node):
    """An int or finite float written in decimal; anything else (also under an explicit !!int or
    !!float tag: 0x1F, 1_000, .nan) is refused where it stands."""
    text = loader.construct_scalar(node)
    if not (_INT.match(text) or node.tag == _TAGS["float"] and _FLOAT.match(text)):
        raise _LoadProblem(node.start_mark, f"'{one_line(text[:40])}' is not a decimal number such as 12 or 0.92")
    if sum(c.isdigit() for c in text) > _MAX_DIGITS:
        raise _LoadProblem(node.start_mark, f"a number of more than {_MAX_DIGITS} digits is too large to compute with")
    value = int(text) if node.tag == _TAGS["int"] else float(text)
    if isinstance(value, float) and not math.isfinite(value) or isinstance(value, int) and abs(value) > 1e300:
        raise _LoadProblem(node.start_mark, f"{text} is too large a number to compute with")
    return value


def _construct_bool(loader, node):
    text = loader.construct_scalar(node)
    if not _BOOL.match(text):
        raise _LoadProblem(node.start_mark, f"'{one_line(text[:40])}' is not a boolean; write true or false")
    return text.lower() == "true"


# A whole plain value "1:4" or "30:1" is a ratio written the way a drawing writes it; YAML 1.1
# read it as a base-60 number (64, 1801). Said where it stands, with the number to write instead.
_COLON_RATIO_TAG = "tag:specgen,2025:colon-ratio"
_COLON_RATIO = re.compile(r"^[0-9]+(?:\.[0-9]*)?:[0-9]+(?:\.[0-9]*)?$")
_Loader.add_implicit_resolver(_COLON_RATIO_TAG, _COLON_RATIO, list("0123456789"))


def _construct_colon_ratio(loader, node):
    text = loader.construct_scalar(node)
    a, b = (float(x) for x in text.split(":"))
    example = f"{a / b:.4g} or {b / a:.4g}" if a and b and math.isfinite(a / b) and math.isfinite(b / a) else "0.25 or 4"
    raise _LoadProblem(node.start_mark, f"'{text}': write a ratio as a number, e.g. {example} "
                                        f"(YAML 1.1 reads {text} as a base-60 number; quote it if it is text)")


_Loader.add_constructor(_COLON_RATIO_TAG, _construct_colon_ratio)
_Loader.add_constructor(_TAGS["int"], _construct_number)
_Loader.add_constructor(_TAGS["float"], _construct_number)
_Loader.add_constructor(_TAGS["bool"], _construct_bool)

# Build mappings and sequences eagerly through the overrides above so every one carries marks.
_Loader.add_constructor("tag:yaml.org,2002:map", lambda loader, node: loader.construct_mapping(node))
_Loader.add_constructor("tag:yaml.org,2002:seq", lambda loader, node: loader.construct_sequence(node))


class _LoadProblem(Exception):
    def __init__(self, mark, message):
        self.mark, self.message = mark, message


def _pos(mark) -> tuple[int, int]:
    return (mark.line + 1, mark.column + 1)


def _expanded_size(node, depth: int, memo: dict) -> tuple[int, int]:
    """Count nodes and levels as if aliases were copied out; refuse too deep or too large a tree.

    Returns (nodes, height). The memo keeps both, so an alias met again deeper down is still
    measured against the depth limit; a node that contains itself never finishes and is refused.
    """
    if depth > MAX_DEPTH:
        raise _LoadProblem(node.start_mark, f"nesting deeper than {MAX_DEPTH} levels (YAML aliases?)")
    key = id(node)
    if key in memo:
        size, height = memo[key]
        if depth + height > MAX_DEPTH:
            raise _LoadProblem(node.start_mark, f"nesting deeper than {MAX_DEPTH} levels (YAML aliases?)")
        return size, height
    children = ()
    if isinstance(node, yaml.MappingNode):
        children = [n for pair in node.value for n in pair]
    elif isinstance(node, yaml.SequenceNode):
        children = node.value
    size, height = 1, 0
    for child in children:
        s, h = _expanded_size(child, depth + 1, memo)
        size, height = size + s, max(height, h + 1)
        if size > MAX_NODES:
            raise _LoadProblem(node.start_mark, f"the spec expands to more than {MAX_NODES} values (YAML aliases?)")
    memo[key] = (size, height)
    return size, height


def load_text(raw: bytes, name: str) -> Source:
    """Parse spec bytes. Raises SpecError with a located problem for anything unreadable."""
    where = Location(name)
    if len(raw) > MAX_BYTES:
        raise SpecError([problem(where, "", _too_big(len(raw)))])
    if b"\x00" in raw:
        at = _byte_location(raw, raw.index(b"\x00"), name)
        raise SpecError([problem(at, "", "file is binary (a zero byte), not a YAML text spec")])
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        at = _byte_location(raw, exc.start, name)
        raise SpecError([problem(at, "", f"file is not UTF-8 text (byte 0x{raw[exc.start]:02x}); save it as UTF-8")]) from None
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
        raise SpecError([problem(Location(name, *_pos(exc.mark)), "", exc.message)]) from None
    except yaml.constructor.ConstructorError as exc:
        mark = exc.problem_mark or exc.context_mark
        loc = Location(name, *_pos(mark)) if mark else where
        what = exc.problem or "cannot be read"
        if "constructor for the tag" in what:
            tag = what.split("tag", 1)[1].strip(" '").replace("tag:yaml.org,2002:", "!!")
            what = f"the YAML tag '{tag}' is not allowed; a spec holds only plain keys, text, numbers and lists"
        raise SpecError([problem(loc, "", what)]) from None
    except yaml.reader.ReaderError as exc:
        at = Location(name, text.count("\n", 0, exc.position) + 1, exc.position - text.rfind("\n", 0, exc.position))
        raise SpecError([problem(at, "", f"control character #x{exc.character:04x} is not allowed in a YAML spec")]) from None
    except yaml.MarkedYAMLError as exc:
        what = exc.problem or "invalid YAML"
        mark = exc.problem_mark or exc.context_mark
        if "end of stream" in what and exc.context_mark:  # point at what was opened, not at the end
            mark, what = exc.context_mark, f"{what}: what starts here is never closed"
        loc = Location(name, *_pos(mark)) if mark else where
        if "tab" in what:
            what += "; indent with spaces"
        if "nesting depth" in what:  # the YAML scanner's own limit, met before ours in deep flow style
            raise SpecError([problem(loc, "", f"nesting deeper than {MAX_DEPTH} levels")]) from None
        if exc.context:  # e.g. "while scanning a simple key: could not find expected ':'"
            what = f"{exc.context}{' ' if what.startswith('but') else ': '}{what}"
        raise SpecError([problem(loc, "", f"YAML syntax error: {what}")]) from None
    except yaml.YAMLError as exc:
        raise SpecError([problem(where, "", f"YAML error: {exc}")]) from None
    except RecursionError:
        raise SpecError([problem(where, "", "nesting too deep to read")]) from None
    if data is None:
        raise SpecError([problem(where, "", "file is empty; a spec is a YAML mapping starting with 'format: 1'")])
    if not isinstance(data, dict):
        raise SpecError([problem(Location(name, 1, 1), "", "a spec must be a YAML mapping of keys, not a list or a single value")])
    return Source(name=name, data=data, raw=raw)


def _byte_location(raw: bytes, offset: int, name: str) -> Location:
    line_start = raw.rfind(b"\n", 0, offset) + 1
    return Location(name, raw.count(b"\n", 0, offset) + 1, offset - line_start + 1)


def _too_big(size: int) -> str:
    return f"file is {size} bytes; specs are limited to {MAX_BYTES} bytes ({MAX_BYTES // 1024} KiB)"


def load_file(path: str | Path, inside: str | Path | None = None) -> Source:
    """Read and parse one spec file; never reads more than MAX_BYTES + 1 bytes of it.

    Only a regular file is read: a folder, FIFO (which would block), device (/dev/zero never
    ends) or socket is refused, also behind a symbolic link, by the type of what was opened, so
    nothing can be swapped in between a test and the read. ``inside``: a folder the file's real
    path (links followed) must lie in, for files that sit beside a spec (its review record).
    """
    p = Path(path)
    name = str(path)
    where = Location(name)
    if inside is not None:
        base = os.path.realpath(inside)
        real = os.path.realpath(p)
        if os.path.commonpath([base, real]) != base:
            raise SpecError([problem(where, "", f"resolves to {real}, outside the folder {base}; "
                                                "a file beside a spec must lie in the spec's folder tree")])
    try:
        fd = os.open(p, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_NOCTTY", 0))
    except FileNotFoundError:
        raise SpecError([problem(where, "", "no such file")]) from None
    except IsADirectoryError:
        raise SpecError([problem(where, "", "is a folder, not a spec file")]) from None
    except OSError as exc:
        raise SpecError([problem(where, "", f"cannot read: {exc.strerror or exc}")]) from None
    try:
        mode = os.fstat(fd).st_mode
        if stat.S_ISDIR(mode):
            raise SpecError([problem(where, "", "is a folder, not a spec file")])
        if not stat.S_ISREG(mode):  # a FIFO or device would block or never end
            raise SpecError([problem(where, "", "is not a regular file")])
        with os.fdopen(os.dup(fd), "rb") as fh:
            raw = fh.read(MAX_BYTES + 1)
            if len(raw) > MAX_BYTES:
                size = os.fstat(fh.fileno()).st_size
                raise SpecError([problem(where, "", _too_big(max(size, len(raw))))])
    except OSError as exc:
        raise SpecError([problem(where, "", f"cannot read: {exc.strerror or exc}")]) from None
    finally:
        os.close(fd)
    return load_text(raw, name)
