"""Errors that point at the user's file, line, column and key."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Location:
    """Where in a spec file a value sits. Line and column are 1-based; 0 means unknown."""

    file: str
    line: int = 0
    column: int = 0

    def __str__(self) -> str:
        if self.line:
            return f"{self.file}:{self.line}:{self.column}"
        return self.file


@dataclass(frozen=True)
class Problem:
    """One thing wrong with a spec: where, which key (dotted path) and a plain sentence."""

    location: Location
    path: str
    message: str

    def __str__(self) -> str:
        where = f" {self.path}:" if self.path else ""
        return f"{self.location}:{where} {self.message}"


class SpecError(Exception):
    """A spec cannot be used. Carries every problem found, so the user fixes them in one pass."""

    def __init__(self, problems: list[Problem]):
        self.problems = list(problems)
        super().__init__("\n".join(str(p) for p in self.problems))
