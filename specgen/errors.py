"""Errors that point at the user's file, line, column and key.

A problem prints as one line, ``file:line:col: dotted.path: sentence``, whatever the spec holds:
the file name, the path and the sentence are escaped (``safe_text.escape``: no line break, control
character or bidi mark reaches the terminal), every quoted echo of input ('...') is cut to
``safe_text.ECHO_LIMIT`` characters, the path to PATH_LIMIT and the sentence to
``safe_text.LINE_LIMIT``, so a 30,000-item list in a spec gives a short line, not its whole text.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from specgen.safe_text import ECHO_LIMIT, LINE_LIMIT, clip, escape

PATH_LIMIT = 200
_QUOTED = re.compile(r"(?<![A-Za-z])'([^']*)'(?![A-Za-z])")  # an apostrophe (spec's) opens no echo


def bounded(message: str) -> str:
    """``message`` escaped, each quoted echo of input cut to ECHO_LIMIT, the whole to LINE_LIMIT."""
    text = _QUOTED.sub(lambda m: f"'{clip(m.group(1), ECHO_LIMIT)}'", escape(message))
    return clip(text, LINE_LIMIT)


@dataclass(frozen=True)
class Location:
    """Where in a spec file a value sits. Line and column are 1-based; 0 means unknown."""

    file: str
    line: int = 0
    column: int = 0

    def __str__(self) -> str:
        if self.line:
            return f"{escape(self.file)}:{self.line}:{self.column}"
        return escape(self.file)


@dataclass(frozen=True)
class Problem:
    """One thing wrong with a spec: where, which key (dotted path) and a plain sentence."""

    location: Location
    path: str
    message: str

    def __str__(self) -> str:
        where = f" {clip(escape(self.path), PATH_LIMIT)}:" if self.path else ""
        return f"{self.location}:{where} {bounded(self.message)}"


class SpecError(Exception):
    """A spec cannot be used. Carries every problem found, so the user fixes them in one pass."""

    def __init__(self, problems: list[Problem]):
        self.problems = list(problems)
        super().__init__("\n".join(str(p) for p in self.problems))
