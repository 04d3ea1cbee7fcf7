"""Dates given on the command line, one rule for every command that takes one.

A date is an ISO 8601 calendar date: the extended form YYYY-MM-DD (2025-03-14) or the basic form
YYYYMMDD (20250314), and a real day (2025-02-29 is refused). It is always written back in the
extended form. Week dates (2025-W11-5), ordinal dates (2025-073), times and other spellings such
as 14/03/2025 are refused, with the one message ``NOT_A_DATE``.

Without --date, a command that prints a date takes SOURCE_DATE_EPOCH, the reproducible-builds
convention: whole seconds since 1970-01-01T00:00:00Z, read as a UTC calendar day. Example:
SOURCE_DATE_EPOCH=1700000000 is 2023-11-14T22:13:20Z, so the date is 2023-11-14.
"""

from __future__ import annotations

import re
from collections.abc import Mapping
from datetime import date as Date, datetime, timezone

from specgen.errors import Location, Problem, SpecError

EPOCH_VARIABLE = "SOURCE_DATE_EPOCH"
NOT_A_DATE = "'{text}' is not a date written YYYY-MM-DD (or YYYYMMDD)"
NOT_SECONDS = "'{text}' is not a whole number of seconds since 1970-01-01"
_FORMS = re.compile(r"(\d{4})-(\d{2})-(\d{2})|(\d{4})(\d{2})(\d{2})", re.ASCII)  # not other scripts' digits


def parse_date(text: str, where: str = "--date") -> str:
    """``text`` as an ISO 8601 calendar date, extended form: "20250314" -> "2025-03-14".

    A SpecError naming ``where`` (the option) for anything else."""
    m = _FORMS.fullmatch(text.strip()) if isinstance(text, str) else None
    if m:
        year, month, day = (int(g) for g in m.groups() if g is not None)
        try:
            return Date(year, month, day).isoformat()
        except ValueError:
            pass
    raise SpecError([Problem(Location(where), "", NOT_A_DATE.format(text=text))])


def epoch_date(text: str) -> str:
    """The UTC calendar day of SOURCE_DATE_EPOCH: "1700000000" -> "2023-11-14"."""
    try:
        return datetime.fromtimestamp(int(text.strip()), tz=timezone.utc).date().isoformat()
    except (ValueError, OverflowError, OSError):
        raise SpecError([Problem(Location(EPOCH_VARIABLE), "", NOT_SECONDS.format(text=text))]) from None


def given_date(option: str | None, environ: Mapping[str, str]) -> str | None:
    """The date a command was given: --date, else SOURCE_DATE_EPOCH, else None."""
    if option:
        return parse_date(option)
    epoch = environ.get(EPOCH_VARIABLE)
    return epoch_date(epoch) if epoch else None


def date_or_today(option: str | None, environ: Mapping[str, str]) -> str:
    """As ``given_date``, falling back on today's local date (a review is recorded when it is made)."""
    return given_date(option, environ) or Date.today().isoformat()
