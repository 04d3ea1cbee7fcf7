"""Duty points of a table-driven motor against the maker's efficiency table's grid.

Outside the grid nothing is extrapolated: the duty point was computed with the constant efficiencies
and the check fails, naming where it left the table (the maker's data does not cover it). A breakaway
differential outside the starting row, or an iteration that did not settle, warns.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results

TITLE = "Duty point within the maker's efficiency table"


def efficiency_table(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Each duty point of a motor with an efficiency table: pass inside it, fail outside (no margin)."""
    for drive in machine.drives:
        if drive.motor.efficiency_table is None:
            continue
        for duty_id, r in results.drive_duties(drive.id).items():
            where = {"drive": drive.id, "duty": duty_id}
            if "table_outside_at" in r.values:
                v = r.values["table_outside_at"]
                yield Check("efficiency_table", TITLE, status(None), v.value, None, "pressure",
                            f"The duty point lies {v.note} ({fmt(v.value, 'pressure')}, "
                            f"{fmt(r['motor_speed'], 'speed')}): nothing is extrapolated; it was computed with the "
                            "constant efficiencies. Get the maker's figures for this point.", **where)
                continue
            problems = []
            if "table_not_converged" in r.values:
                problems.append(f"the pressure differential did not settle ({r.values['table_not_converged'].note})")
            if "table_starting_outside_at" in r.values:
                problems.append(f"breakaway {r.values['table_starting_outside_at'].note}: the constant starting "
                                "efficiency was used")
            hm = r.values["table_hydromechanical_efficiency"]
            yield Check("efficiency_table", TITLE, status(None, worst="warn" if problems else "pass"),
                        r["pressure_differential"], None,
                        "pressure", f"Efficiencies {hm.note}" + (f"; {'; '.join(problems)}." if problems else "."),
                        **where)
