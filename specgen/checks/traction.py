"""Traction checks of the machine as a vehicle (resolve/travel.py): adhesion at every travel duty point,
whether the transmission can spin the wheels, and every driving travel duty point inside the tractive
effort the transmission gives at its speed.

Margins as defined in checks/status.py; warning band: thresholds.traction_margin_warn [10 %].

wheel_spin is informative (pass either way): a transmission whose effort at the pressure limit exceeds
the adhesion limit can spin its wheels or tracks (the operator, not the relief valve, then keeps the
wheels from slipping), and one below it leaves part of the ground's grip unused. Neither is a fault by
itself: a loader is meant to reach adhesion, a carrier on soft ground may be meant not to. The message
says which, with both efforts, so the reviewer judges it.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.calc.traction import FLOW
from specgen.checks.status import Check, Fmt, against, below, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results

_WHEELS = {"wheels": "wheels", "tracks": "tracks"}


def adhesion(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Tractive (or braking) effort of every travel duty point against the adhesion limit there: at or above
    it the driven wheels or tracks slip."""
    tr = results.travel
    if tr is None:
        return
    warn = machine.thresholds.traction_margin_warn.value
    gear = _WHEELS[machine.travel.running_gear]
    for (drive, duty), values in tr.duties.items():
        f, limit = values["tractive_effort"].value, values["adhesion_limit"].value
        margin = below(f, limit)
        st = status(margin, warn)
        braking = "tractive effort" if "envelope_effort" in values else "braking effort"  # braking: no envelope
        yield Check("adhesion", "Effort within adhesion", st, f, limit, "force",
                    f"The {braking} {fmt(f, 'force')} is {against(f, limit, st != 'fail', ('below', 'above'))} the "
                    f"adhesion limit {fmt(limit, 'force')}" + {
                        "fail": f": the {gear} slip; the duty cannot be done on this ground.",
                        "warn": f": within {warn:.0%}, the {gear} are near slipping.", "pass": "."}[st],
                    drive=drive, duty=duty, margin=margin)


def wheel_spin(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Whether the transmission at its pressure limit can exceed adhesion (informative)."""
    tr = results.travel
    if tr is None:
        return
    f, limit = tr["relief_effort"], tr["adhesion_limit"]
    gear = _WHEELS[machine.travel.running_gear]
    if f >= limit:
        text = (f"At the pressure limit the drives give {fmt(f, 'force')}, at or above the adhesion limit "
                f"{fmt(limit, 'force')}: the {gear} can be spun (wear, ground damage); the whole grip can be used.")
    else:
        text = (f"At the pressure limit the drives give {fmt(f, 'force')}, below the adhesion limit "
                f"{fmt(limit, 'force')}: the {gear} cannot be spun, and {(limit - f) / limit:.0%} of the grip is "
                "out of reach of the transmission.")
    yield Check("wheel_spin", "Wheel spin at the pressure limit", status(None, worst="pass"), f, limit, "force", text)


_LINES = {"relief": "the drives' pressure limit", "engine power": "the engine's power"}


def tractive_envelope(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Every driving travel duty point inside the transmission's tractive effort at its ground speed,
    naming the line that limits it there (the pressure limit, the engine's power, or the flow above the
    top speed)."""
    tr = results.travel
    if tr is None:
        return
    warn = machine.thresholds.traction_margin_warn.value
    v_max = tr["top_speed"]
    for (drive, duty), values in tr.duties.items():
        if "envelope_effort" not in values:
            continue  # braking: the transmission does not drive it
        line = tr.lines[(drive, duty)]
        v = values["ground_speed"].value
        if line == FLOW:
            margin = below(v, v_max)
            yield Check("tractive_envelope", "Effort within the travel envelope", status(margin, warn), v, v_max,
                        "velocity", f"The ground speed {fmt(v, 'velocity')} is above the top travel speed "
                        f"{fmt(v_max, 'velocity')} that the flow, the minimum displacement and the speed ratings "
                        "allow.", drive=drive, duty=duty, margin=margin)
            continue
        f, limit = values["tractive_effort"].value, values["envelope_effort"].value
        margin = below(f, limit)
        st = status(margin, warn)
        yield Check("tractive_envelope", "Effort within the travel envelope", st, f, limit, "force",
                    f"The tractive effort {fmt(f, 'force')} at {fmt(v, 'velocity')} is "
                    f"{against(f, limit, st != 'fail', ('within', 'above'))} the {fmt(limit, 'force')} that "
                    f"{_LINES[line]} allows there" + {"fail": ".", "warn": f": under {warn:.0%} in hand.", "pass": "."}[st],
                    drive=drive, duty=duty, margin=margin)
