"""Exit statuses of every command, decided here.

    0  OK          the checks pass (warnings allowed unless --strict); nothing got worse
    1  FAILED      a check fails (or warns, with --strict); a required review is missing;
                   diff: a check got worse and now stands at the --fail-on status or beyond
    2  BAD_INPUT   a spec or an option is invalid, or a file cannot be read or written
    3  INTERNAL    an error in specgen itself
  130  INTERRUPTED Ctrl-C (128 + SIGINT, the shell's convention)
"""

from __future__ import annotations

OK = 0
FAILED = 1
BAD_INPUT = 2
INTERNAL = 3
INTERRUPTED = 130


def verdict_status(verdicts, strict: bool = False) -> int:
    """FAILED if any verdict is "fail", or "warn" with ``strict``; else OK.

    ``verdicts``: the machines' overall check statuses, e.g. ["pass", "warn"] -> OK, strict FAILED."""
    worst = set(verdicts)
    return FAILED if "fail" in worst or (strict and "warn" in worst) else OK


def outcomes_status(outcomes, strict: bool = False) -> int:
    """``verdict_status`` of checked outcomes (pipeline.Outcome): the base design and every design
    variant that ran, so a failing variant is never hidden."""
    return verdict_status((getattr(o, "verdict", None) or o.results.verdict for o in outcomes), strict)


def review_status(status: int, covered: bool) -> int:
    """A status raised to FAILED when a required review does not cover the spec's content."""
    return status if covered else max(status, FAILED)


def diff_status(diff, fail_on: str = "fail") -> int:
    """FAILED when the diff has a regression at ``fail_on`` ("warn" or "fail") or beyond; else OK."""
    return FAILED if diff.regressions(fail_on) else OK
