"""Every automatic check, in the order they are reported, and the run that attaches them.

A check reads computed results and the model's ratings and thresholds; it never recomputes a
relation. One status rule and one order of severity for all of them: checks/status.py. Topics:
pressure.py, speed.py, flow_power.py, lines_heat.py (lines, heat, oil temperature), motors.py (sizing and
motors), valves.py (port relief, counterbalance, pump inlet), efficiency.py (duty points against a maker's
efficiency table), intermittent.py (time above the continuous rating over a duty cycle), load_sensing.py
(the speed each drive on a load-sensing supply reaches), prime_mover.py (a prime mover shared by several
pumps: summed load, braking, overspeed), traction.py (adhesion, wheel spin and the travel envelope of the machine as a vehicle),
closed_loop.py (charge flow, pump stroke and direction of a hydrostatic transmission).
To add a check: write a function taking (machine, results, fmt) and yielding Check records with
their margin, and list it in CHECKS (DEVELOPERS.md has the details).
"""

from __future__ import annotations

from dataclasses import replace
from typing import TYPE_CHECKING

from specgen.checks.closed_loop import charge_flow, loop_direction, pump_stroke
from specgen.checks.efficiency import efficiency_table
from specgen.checks.flow_power import makeup_flow, prime_mover_power, pump_flow
from specgen.checks.intermittent import intermittent_share
from specgen.checks.load_sensing import reached_speed
from specgen.checks.lines_heat import heat_load, line_velocity, oil_temperature
from specgen.checks.prime_mover import engine_braking, prime_mover_load, prime_mover_overspeed
from specgen.checks.motors import breakaway, displacement_choice, load_holding
from specgen.checks.pressure import (port_pressures, pressure_margin, pressure_ratings, series_outlet_pressure,
                                     supply_pressure)
from specgen.checks.speed import min_displacement_speed, speed_ratings
from specgen.checks.traction import adhesion, tractive_envelope, wheel_spin
from specgen.checks.valves import counterbalance_setting, port_relief_braking, pump_inlet_pressure
from specgen.intake.model import Machine
from specgen.units import format_si

if TYPE_CHECKING:
    from specgen.results import Results

# Report order. pressure_ratings (peak, continuous), speed_ratings (max, min) and port_pressures
# (outlet, case) go drive by drive, so a drive's ratings stand together.
CHECKS = [pressure_margin, pressure_ratings, speed_ratings, breakaway, efficiency_table, port_pressures, load_holding,
          pump_flow, reached_speed, prime_mover_power, prime_mover_load, engine_braking, prime_mover_overspeed,
          supply_pressure, displacement_choice, min_displacement_speed, line_velocity,
          makeup_flow, heat_load, oil_temperature, intermittent_share, series_outlet_pressure, port_relief_braking,
          counterbalance_setting, pump_inlet_pressure, adhesion, tractive_envelope, wheel_spin,
          pump_stroke, charge_flow, loop_direction]


def run_checks(machine: Machine, results: Results) -> Results:
    """Return ``results`` with every check attached, in a stable order."""
    system = machine.display_units

    def fmt(value: float, kind: str) -> str:
        return format_si(value, kind, system)

    checks = [c for fn in CHECKS for c in fn(machine, results, fmt)]
    return replace(results, checks=tuple(checks))
