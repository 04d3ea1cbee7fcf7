"""Check results as GitHub Actions workflow commands, so a failing check marks the spec's line.

One command a line: ``::error file=F,line=L,title=T::message`` for each failing check and
``::warning ...`` for each warning, at the spec file and the line of the key the check is about
(the duty point, else the drive, the supply or the mode; else the ``machine`` key), read from the
loaded Source's positions. Passing checks print nothing.

Escaping follows the workflow command syntax: in the message ``%``, ``\\r`` and ``\\n`` become
``%25``, ``%0D`` and ``%0A``; in a property value ``:`` and ``,`` become ``%3A`` and ``%2C`` too.
Text from the spec (ids, titles, file names) is first made printable (``safe_text.escape``), and
since no line break survives, nothing from the spec can start a line of its own and forge a
command (``::add-mask::``, ``::stop-commands::``). Every line this module prints starts with a
command of its own; the caution line goes out as a ``::notice``.

Example: the demo harvester's warning at ``drives.track_left.duty_points.climb`` (line 76) prints
``::warning file=example_specs/reed_harvester.yaml,line=76,title=pressure_margin (drive
track_left, duty point climb)::Inlet pressure 253.5 bar ...``.
"""

from __future__ import annotations

from specgen.cautions import SHORT
from specgen.pipeline import Outcome
from specgen.safe_text import escape
from specgen.variants import own_problems

LEVELS = {"fail": "error", "warn": "warning"}


def data(text: object) -> str:
    """A command's message: printable, with ``%``, CR and LF escaped."""
    return escape(text).replace("%", "%25").replace("\r", "%0D").replace("\n", "%0A")


def prop(text: object) -> str:
    """A command's property value: as ``data`` and ``:`` and ``,`` escaped too."""
    return data(text).replace(":", "%3A").replace(",", "%2C")


def key_path(check) -> tuple:
    """The spec key a check is about: duty point, drive, supply, mode, else the machine."""
    if check.drive and check.duty:
        return ("drives", check.drive, "duty_points", check.duty)
    if check.drive:
        return ("drives", check.drive)
    if check.supply:
        return ("supplies", check.supply)
    if check.prime_mover:
        return ("prime_movers", check.prime_mover)
    if check.mode:
        return ("modes", check.mode)
    return ("machine",)


def command(level: str, file: str, line: int, title: str, message: str) -> str:
    where = f"file={prop(file)}" + (f",line={line}" if line else "")
    return f"::{level} {where},title={prop(title)}::{data(message)}"


def lines(o: Outcome, checks=None, suffix: str = "") -> list[str]:
    """One workflow command for each failing or warning check of one spec, failures first;
    ``checks`` and ``suffix``: a design variant's own, their titles naming it."""
    out = []
    for status in ("fail", "warn"):
        for c in o.results.checks if checks is None else checks:
            if c.status != status:
                continue
            loc = o.source.location(key_path(c))
            title = c.name + suffix
            out.append(command(LEVELS[status], o.source.name, loc.line, title, c.message))
    return out


def render(outcomes: list[Outcome]) -> str:
    out = []
    for o in outcomes:
        out += lines(o)
        for v in getattr(o, "variants", ()):  # a failing variant is said at the spec's own lines, never hidden
            out += lines(o, own_problems(o.results, v.results), f" [variant {v.id}]")
        counts = o.results.counts()
        out.append(f"::notice file={prop(o.source.name)},title={prop('specgen ' + o.results.verdict.upper())}::"
                   + data(f"{o.machine.title} rev {o.machine.revision}: {counts['pass']} pass, "
                          f"{counts['warn']} warn, {counts['fail']} fail"))
    out.append(f"::notice title=caution::{data(SHORT)}")
    return "\n".join(out) + "\n"
