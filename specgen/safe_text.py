"""Text from a spec or a file name, made safe to print on one line of terminal, CI log or error text.

A spec's author controls its file names, ids, titles and messages quoted back. Printed raw, a
line break would start a line of their choosing (a forged ``PASS`` in ``check -q`` output), an
ANSI escape would recolour or erase the terminal, a bidirectional mark would make text read other
than it runs, and a line starting with ``::`` is a command to a CI runner. ``escape`` shows every
character that is not printable as a Python-style escape: line breaks (``\\n``, ``\\r``, U+2028,
U+2029), C0/C1 controls (``\\x1b``), format characters such as the bidi marks and overrides
(``\\u202e``, ``\\u200f``) and unusual spaces (``\\xa0``); ordinary letters of any script stay.
``clip`` shortens an echo of input to a bounded length, saying how long it was.

Example: ``escape("a.yaml\\nPASS")`` is ``'a.yaml\\\\nPASS'`` (one line); ``escape("::error x")``
starts with ``\\x3a``.
"""

from __future__ import annotations

ECHO_LIMIT = 80  # characters of one quoted echo of input in a message
LINE_LIMIT = 400  # characters of one whole message line


def escape(text: object) -> str:
    """``text`` on one printable line: every non-printable character shown escaped, a leading
    ``::`` (a CI runner's command) broken."""
    s = str(text)
    out = "".join(c if c.isprintable() else repr(c)[1:-1] for c in s)
    return "\\x3a" + out[1:] if out.startswith("::") else out


def clip(text: str, limit: int = ECHO_LIMIT) -> str:
    """``text`` cut to ``limit`` characters, with a note of its full length when cut."""
    if len(text) <= limit:
        return text
    return f"{text[:limit]}... ({len(text)} characters)"
